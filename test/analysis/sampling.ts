/** Seeded random draws for the analysis tests (seedrandom's Alea generator, Box–Muller normals). */
import seedrandom from 'seedrandom';

export interface Normal2 {
  sigmaMajor: number;
  sigmaMinor: number;
  /** Direction of the major axis, degrees clockwise from north. */
  azimuthDeg: number;
  meanEast?: number;
  meanNorth?: number;
}

export function makeRandom(seed: string): () => number {
  return seedrandom.alea(seed);
}

/** Standard normal pair by Box–Muller. */
export function normalPair(random: () => number): [number, number] {
  let u = random();
  while (u <= 0) u = random();
  const v = random();
  const r = Math.sqrt(-2 * Math.log(u));
  return [r * Math.cos(2 * Math.PI * v), r * Math.sin(2 * Math.PI * v)];
}

/** Fill east/north from index `from` with draws of a rotated bivariate normal. */
export function drawNormal2(
  random: () => number,
  shape: Normal2,
  east: Float64Array,
  north: Float64Array,
  from = 0,
  count = east.length - from,
): void {
  const az = (shape.azimuthDeg * Math.PI) / 180;
  // Unit vectors of the major and minor axes in east/north.
  const majE = Math.sin(az);
  const majN = Math.cos(az);
  const minE = Math.cos(az);
  const minN = -Math.sin(az);
  for (let k = from; k < from + count; k++) {
    const [a, b] = normalPair(random);
    const u = a * shape.sigmaMajor;
    const w = b * shape.sigmaMinor;
    east[k] = (shape.meanEast ?? 0) + u * majE + w * minE;
    north[k] = (shape.meanNorth ?? 0) + u * majN + w * minN;
  }
}

/** Density of the rotated bivariate normal at a point. */
export function normal2Density(shape: Normal2, east: number, north: number): number {
  const az = (shape.azimuthDeg * Math.PI) / 180;
  const de = east - (shape.meanEast ?? 0);
  const dn = north - (shape.meanNorth ?? 0);
  const u = de * Math.sin(az) + dn * Math.cos(az);
  const w = de * Math.cos(az) - dn * Math.sin(az);
  const q = (u / shape.sigmaMajor) ** 2 + (w / shape.sigmaMinor) ** 2;
  return Math.exp(-q / 2) / (2 * Math.PI * shape.sigmaMajor * shape.sigmaMinor);
}
