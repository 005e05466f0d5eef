/**
 * landings.fgb: every landed sample as a FlatGeobuf point (WGS 84 lon/lat, EPSG:4326), the open,
 * streamable binary vector format map programs read, for runs too large for GeoJSON.
 *
 * The file layout and its tables come from the `flatgeobuf` package (its generated FlatBuffers
 * classes) and `flatbuffers`. Its own per-feature helper builds a fresh builder and buffer for
 * every feature (about 7 µs each here), so the features are built here with one reused builder
 * and property buffer instead; the bytes follow the same FlatGeobuf 3 specification. There is no
 * spatial index (index node size 0), which the format allows and which lets the file be written
 * front to back in one pass.
 *
 * @example
 *   for (const piece of landingsFlatGeobufChunks(set, site.pad)) stream.write(piece);
 */
import { Builder } from 'flatbuffers';
import { Column } from 'flatgeobuf/lib/mjs/flat-geobuf/column.js';
import { ColumnType } from 'flatgeobuf/lib/mjs/flat-geobuf/column-type.js';
import { Crs } from 'flatgeobuf/lib/mjs/flat-geobuf/crs.js';
import { Feature } from 'flatgeobuf/lib/mjs/flat-geobuf/feature.js';
import { Geometry } from 'flatgeobuf/lib/mjs/flat-geobuf/geometry.js';
import { GeometryType } from 'flatgeobuf/lib/mjs/flat-geobuf/geometry-type.js';
import { Header } from 'flatgeobuf/lib/mjs/flat-geobuf/header.js';
import { createLocalFrame } from './geodesy.js';
import { landingFigures } from './landing-columns.js';
import type { LandingSet } from './types.js';

/** "fgb", version 3, "fgb", patch 0 (FlatGeobuf specification). */
const MAGIC = new Uint8Array([0x66, 0x67, 0x62, 0x03, 0x66, 0x67, 0x62, 0x00]);
/** Bytes per piece handed to the writer. */
const PIECE = 1 << 20;

interface ColumnSpec {
  name: string;
  type: ColumnType;
  description: string;
}

function header(set: LandingSet, columns: ColumnSpec[], title: string): Uint8Array {
  const b = new Builder(1024);
  const columnOffsets = columns.map((c) => {
    const name = b.createString(c.name);
    const description = b.createString(c.description);
    Column.startColumn(b);
    Column.addName(b, name);
    Column.addType(b, c.type);
    Column.addDescription(b, description);
    Column.addNullable(b, false);
    return Column.endColumn(b);
  });
  const columnsVector = Header.createColumnsVector(b, columnOffsets);
  const name = b.createString('landings');
  const titleOffset = b.createString(title);
  const description = b.createString(
    'One point per landed sample of a Strewn Monte-Carlo run (failed samples are counted in summary.json, not here). ' +
      'Results support, and never replace, the range-safety code that governs the site.',
  );
  const org = b.createString('EPSG');
  Crs.startCrs(b);
  Crs.addOrg(b, org);
  Crs.addCode(b, 4326);
  const crs = Crs.endCrs(b);
  Header.startHeader(b);
  Header.addName(b, name);
  Header.addGeometryType(b, GeometryType.Point);
  Header.addColumns(b, columnsVector);
  Header.addFeaturesCount(b, BigInt(set.east.length));
  Header.addIndexNodeSize(b, 0);
  Header.addCrs(b, crs);
  Header.addTitle(b, titleOffset);
  Header.addDescription(b, description);
  b.finishSizePrefixed(Header.endHeader(b));
  return b.asUint8Array().slice();
}

/** landings.fgb in pieces of about a megabyte. */
export function* landingsFlatGeobufChunks(set: LandingSet, pad: { lat: number; lon: number }, title = 'Strewn landings'): Generator<Uint8Array> {
  const frame = createLocalFrame(pad);
  const figures = landingFigures(set);
  const columns: ColumnSpec[] = [
    { name: 'sample', type: ColumnType.UInt, description: 'sample number in the run' },
    { name: 'mode', type: ColumnType.String, description: 'failure mode (nominal: none)' },
    { name: 'east_m', type: ColumnType.Double, description: 'metres east of the pad' },
    { name: 'north_m', type: ColumnType.Double, description: 'metres north of the pad' },
    ...figures.map((f) => ({ name: f.name, type: ColumnType.Double, description: f.name })),
    { name: 'weight', type: ColumnType.Double, description: 'probability this landing stands for' },
  ];
  // Which part landed, last, when the object may break up (absent otherwise: the file keeps its bytes).
  const partBytes = set.part && set.partNames ? set.partNames.map((name) => new TextEncoder().encode(name)) : null;
  if (partBytes) columns.push({ name: 'part', type: ColumnType.String, description: "part of the object: 'whole' or a fragment class" });
  const modeBytes = set.modeNames.map((name) => new TextEncoder().encode(name));
  const props = new Uint8Array(64 + columns.length * 10 + Math.max(0, ...modeBytes.map((m) => m.length)) + Math.max(0, ...(partBytes ?? []).map((m) => m.length)));
  const view = new DataView(props.buffer);
  const xy = new Float64Array(2);
  const b = new Builder(256);
  let piece = new Uint8Array(PIECE);
  let used = 0;
  const put = function* (bytes: Uint8Array): Generator<Uint8Array> {
    if (used + bytes.length > piece.length) {
      yield piece.subarray(0, used);
      piece = new Uint8Array(Math.max(PIECE, bytes.length));
      used = 0;
    }
    piece.set(bytes, used);
    used += bytes.length;
  };
  yield* put(MAGIC);
  yield* put(header(set, columns, title));
  for (let i = 0; i < set.east.length; i++) {
    let at = 0;
    const double = (column: number, value: number) => {
      view.setUint16(at, column, true);
      view.setFloat64(at + 2, value, true);
      at += 10;
    };
    view.setUint16(at, 0, true);
    view.setUint32(at + 2, set.sample ? set.sample[i] : i, true);
    at += 6;
    const mode = modeBytes[set.mode[i]];
    view.setUint16(at, 1, true);
    view.setUint32(at + 2, mode.length, true);
    props.set(mode, at + 6);
    at += 6 + mode.length;
    double(2, set.east[i]);
    double(3, set.north[i]);
    for (let k = 0; k < figures.length; k++) double(4 + k, figures[k].values[i]);
    double(4 + figures.length, set.weight[i]);
    if (partBytes) {
      const part = partBytes[set.part![i]];
      view.setUint16(at, 5 + figures.length, true);
      view.setUint32(at + 2, part.length, true);
      props.set(part, at + 6);
      at += 6 + part.length;
    }

    b.clear();
    const propertiesOffset = Feature.createPropertiesVector(b, props.subarray(0, at));
    [xy[0], xy[1]] = frame.toLonLat(set.east[i], set.north[i]);
    const xyOffset = Geometry.createXyVector(b, xy);
    Geometry.startGeometry(b);
    Geometry.addXy(b, xyOffset);
    const geometry = Geometry.endGeometry(b);
    Feature.startFeature(b);
    Feature.addGeometry(b, geometry);
    Feature.addProperties(b, propertiesOffset);
    b.finishSizePrefixed(Feature.endFeature(b));
    yield* put(b.asUint8Array());
  }
  if (used > 0) yield piece.subarray(0, used);
}
