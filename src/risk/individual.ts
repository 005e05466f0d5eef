/**
 * Individual risk: the chance per flight that a person standing at a point becomes a casualty.
 *
 * Each landing i stands for probability w_i of a flight; a person within its casualty area A_c,i
 * is struck, and a strike makes a casualty with chance P_i (from the impact energy). The person at
 * x is struck by impact i when the impact lands within A_c,i of x, so
 *   IR(x) = Σ_i w_i A_c,i P_i f_i(x)
 * with f_i the landing density of the flights sample i stands for. That is the weighted kernel
 * density of the landings with weights w_i A_c,i P_i: it is computed with the project's own
 * weighted KDE on a grid (src/analysis/density.ts), not a second one, and its lines are traced by
 * the same marching squares as the landing contours (src/analysis/contours.ts).
 *
 * How well a line is known: at a point, the estimate is a weighted sum of kernel contributions;
 * its Kish effective number of contributing samples n_loc = (Σ c_i)² / Σ c_i² (c_i = w_i A P K_h)
 * gives its relative standard error ≈ 1/√n_loc. A line is resolved when 90 % of its vertices rest
 * on n_loc ≥ 25 (about 20 % error in the risk there, a few per cent in its reach where the risk
 * falls steeply). Σ c_i² is itself a kernel sum: K_h² = K_{h/√2} / (4π h_e h_n) for the Gaussian
 * product kernel, so a second density on the same nodes gives it.
 *
 * @example
 *   const surface = riskSurface(set, harm.weight);
 *   const lines = riskLines(surface, [1e-4, 1e-5, 1e-6], 2000);
 */
import { scottBandwidth, type Bandwidth } from '../analysis/bandwidth.js';
import { densityAt, densityGrid, type DensityGrid } from '../analysis/density.js';
import { traceRegion } from '../analysis/contours.js';
import { farthestVertex, polygonsArea } from '../analysis/projectGeometry.js';
import type { Ring } from '../analysis/rings.js';

/** Effective samples a line's estimate should rest on (relative standard error ≈ 1/√25 = 20 %). */
export const MIN_LINE_SAMPLES = 25;
/** Share of a line's vertices that must reach MIN_LINE_SAMPLES. */
export const LINE_SUPPORT_SHARE = 0.9;

export interface RiskSurface {
  /** Individual risk per flight at the nodes. */
  grid: DensityGrid;
  /** Σ c_i² at the nodes (same nodes), for the effective counts. */
  squares: DensityGrid;
  bandwidth: Bandwidth;
  /** Landings with a non-zero risk weight. */
  harmful: number;
}

export interface RiskLine {
  level: number;
  resolved: boolean;
  area_m2: number;
  maxDistance_m: number;
  /** Samples the line would need to be resolved (estimate, two significant figures; null: no sample near it). */
  samplesNeeded: number | null;
  /** Effective samples that 90 % of the line's vertices reach. */
  effectiveSamples: number;
  /** East/north metres from the pad. */
  polygons: Ring[][];
}

/**
 * The individual-risk surface from risk weights (probability per flight × casualty area × casualty
 * chance, per landing). Null when no landing can harm anyone.
 */
export function riskSurface(
  east: Float64Array,
  north: Float64Array,
  riskWeight: Float64Array,
  options: { bandwidth?: number | { east: number; north: number }; maxGridNodes?: number } = {},
): RiskSurface | null {
  let harmful = 0;
  for (let i = 0; i < riskWeight.length; i++) if (riskWeight[i] > 0) harmful++;
  if (harmful === 0) return null;
  // When every landing can harm (the common case) its own columns are used, not copies of them.
  const all = harmful === riskWeight.length;
  const e = all ? east : new Float64Array(harmful);
  const n = all ? north : new Float64Array(harmful);
  const w = all ? riskWeight : new Float64Array(harmful);
  const w2 = new Float64Array(harmful);
  let total = 0;
  let totalSquares = 0;
  for (let i = 0, j = 0; i < riskWeight.length; i++) {
    if (!(riskWeight[i] > 0)) continue;
    if (!all) {
      e[j] = east[i];
      n[j] = north[i];
      w[j] = riskWeight[i];
    }
    w2[j] = riskWeight[i] * riskWeight[i];
    total += w[j];
    totalSquares += w2[j];
    j++;
  }
  const bandwidth = scottBandwidth(e, n, w, options.bandwidth);
  // densityGrid normalises the weights to sum 1; scale back to risk per flight.
  const grid = densityGrid(e, n, w, bandwidth, { maxNodes: options.maxGridNodes });
  for (let k = 0; k < grid.values.length; k++) grid.values[k] *= total;
  const { values: _v, ...frame } = grid;
  const narrow = { east: bandwidth.east / Math.SQRT2, north: bandwidth.north / Math.SQRT2 };
  const squares = densityGrid(e, n, w2, narrow, { frame });
  const factor = totalSquares / (4 * Math.PI * bandwidth.east * bandwidth.north);
  for (let k = 0; k < squares.values.length; k++) squares.values[k] *= factor;
  return { grid, squares, bandwidth, harmful };
}

/** Round up to two significant figures, so a suggestion reads as a count people would pick. */
export function roundUpNicely(n: number): number {
  if (n <= 100) return Math.ceil(n);
  const magnitude = Math.pow(10, Math.floor(Math.log10(n)) - 1);
  return Math.ceil(n / magnitude) * magnitude;
}

/** Effective contributing samples at points: (Σc)² / Σc². */
function effectiveAt(surface: RiskSurface, east: Float64Array, north: Float64Array): Float64Array {
  const s1 = densityAt(surface.grid, east, north);
  const s2 = densityAt(surface.squares, east, north);
  const out = new Float64Array(east.length);
  for (let k = 0; k < out.length; k++) out[k] = s2[k] > 0 ? (s1[k] * s1[k]) / s2[k] : 0;
  return out;
}

/** The (1 − LINE_SUPPORT_SHARE) quantile of the effective counts along the line's vertices. */
function lineSupport(surface: RiskSurface, polygons: Ring[][]): number {
  const xs: number[] = [];
  const ys: number[] = [];
  for (const rings of polygons) for (const ring of rings) for (const [x, y] of ring) { xs.push(x); ys.push(y); }
  if (xs.length === 0) return peakSupport(surface);
  const counts = Array.from(effectiveAt(surface, Float64Array.from(xs), Float64Array.from(ys))).sort((a, b) => a - b);
  return counts[Math.floor((1 - LINE_SUPPORT_SHARE) * (counts.length - 1))];
}

/** With no line at a level the question is whether the peak is known to be under it. */
function peakSupport(surface: RiskSurface): number {
  const { grid } = surface;
  let best = 0;
  for (let k = 1; k < grid.values.length; k++) if (grid.values[k] > grid.values[best]) best = k;
  const x = grid.x0 + (best % grid.nx) * grid.dx;
  const y = grid.y0 + Math.floor(best / grid.nx) * grid.dy;
  return effectiveAt(surface, Float64Array.of(x), Float64Array.of(y))[0];
}

/**
 * Iso-risk lines at the levels, with the samples each would need. `samples` is the run's sample
 * count; n_loc grows as n·h² ∝ n^(2/3) under Scott's bandwidth rule, so reaching MIN_LINE_SAMPLES
 * from n_loc takes n (MIN_LINE_SAMPLES / n_loc)^(3/2) samples.
 */
export function riskLines(surface: RiskSurface | null, levels: number[], samples: number): RiskLine[] {
  return levels.map((level) => {
    if (surface === null) {
      return { level, resolved: true, area_m2: 0, maxDistance_m: 0, samplesNeeded: 0, effectiveSamples: Infinity, polygons: [] };
    }
    const polygons = traceRegion(surface.grid, level);
    const support = lineSupport(surface, polygons);
    const exponent = surface.bandwidth.overridden ? 1 : 1.5;
    const needed = support > 0 ? samples * Math.pow(MIN_LINE_SAMPLES / support, exponent) : Infinity;
    return {
      level,
      resolved: support >= MIN_LINE_SAMPLES,
      area_m2: polygonsArea(polygons),
      maxDistance_m: farthestVertex(polygons),
      samplesNeeded: Number.isFinite(needed) ? roundUpNicely(needed) : null,
      effectiveSamples: support,
      polygons,
    };
  });
}

/** Individual risk at points (bilinear between the nodes). */
export function riskAt(surface: RiskSurface | null, east: Float64Array, north: Float64Array): Float64Array {
  return surface === null ? new Float64Array(east.length) : densityAt(surface.grid, east, north);
}
