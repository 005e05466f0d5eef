/**
 * Expected casualties per flight in each marked area, and the largest individual risk in it.
 *
 *   E = ρ (1 − s) Σ_{i inside} w_i A_c,i P_i
 * with ρ the people per m² (the head count over the polygon's area, or the area's `density`), s the
 * sheltered share, w_i the probability per flight each landing stands for, A_c its casualty area
 * and P its casualty chance: people spread evenly, each impact inside harming those standing in
 * its casualty area.
 *
 * Upper bound (one-sided 95 %): the Clopper–Pearson bound (Clopper & Pearson, Biometrika 26, 1934)
 * on the chance p_h of a harmful landing inside the area, on the Kish effective sample size, times
 * the mean casualty expectation of one such landing (E / p_h). When no harmful landing fell inside,
 * the bound on p_h for zero hits (≈ 3 / n_eff) times that of the most harmful landing of the whole
 * run, so the bound stays above zero; it is zero only when no landing anywhere reaches the
 * casualty energy.
 *
 * @example
 *   const rows = areaRisks(site.areas, set, harm, surface, frame, nEff);
 */
import type { Area } from '../scenario/types.js';
import { weightedUpperBound } from '../analysis/clopperPearson.js';
import type { LocalFrame } from '../analysis/geodesy.js';
import { createPolygonIndex } from '../analysis/pointInPolygon.js';
import { polygonsArea, polygonsToEastNorth } from '../analysis/projectGeometry.js';
import type { LandingSet } from '../analysis/types.js';
import { riskAt, type RiskSurface } from './individual.js';
import type { ImpactHarm } from './impacts.js';
import { chanceOfAny, perFlightWeight } from '../analysis/parts.js';

export const UPPER_BOUND_METHOD =
  'one-sided 95 % Clopper-Pearson bound on the chance of a harmful landing in the area (Kish effective sample size), ' +
  "times the mean casualty expectation of the harmful landings inside, or of the run's most harmful landing when none landed inside";

export interface AreaRisk {
  name: string;
  kind: Area['kind'];
  area_m2: number;
  /** People per m² used; null when the area gives neither people nor density. */
  peoplePerM2: number | null;
  sheltered: number;
  /** Harmful landings inside. */
  harmfulHits: number;
  /** Expected casualties per flight; null without people. */
  expectedCasualties: number | null;
  upper95: number | null;
  /** Largest individual risk per flight in the area (nodes inside and the outline's corners). */
  maxIndividualRisk: number;
  /** Expected casualties per flight by mode (zeros without people). */
  byMode: number[];
  /** Expected casualties per flight by part (whole object, fragment classes; [] without parts). */
  byPart: number[];
}

export function areaRisks(
  areas: Area[],
  set: LandingSet,
  harm: ImpactHarm,
  surface: RiskSurface | null,
  frame: LocalFrame,
  effectiveN: number,
): AreaRisk[] {
  const total = perFlightWeight(set);
  let mostHarmful = 0;
  for (let i = 0; i < harm.exposure.length; i++) mostHarmful = Math.max(mostHarmful, harm.exposure[i]);
  return areas.map((area) => {
    const metres = polygonsToEastNorth(frame, area.geometry);
    const index = createPolygonIndex(metres);
    const areaM2 = polygonsArea(metres);
    const rho = area.density ?? (area.people !== undefined ? area.people / areaM2 : null);
    const sheltered = area.sheltered ?? 0;
    const byModeRisk = new Array<number>(set.modeNames.length).fill(0);
    const byPartRisk = new Array<number>(set.part && set.partNames ? set.partNames.length : 0).fill(0);
    let harmfulHits = 0;
    let riskSum = 0;
    const harmfulInside = new Uint8Array(set.east.length);
    for (let i = 0; i < set.east.length; i++) {
      if (!(harm.weight[i] > 0) || !index.contains(set.east[i], set.north[i])) continue;
      harmfulHits++;
      harmfulInside[i] = 1;
      riskSum += harm.weight[i];
      byModeRisk[set.mode[i]] += harm.weight[i];
      if (byPartRisk.length > 0) byPartRisk[set.part![i]] += harm.weight[i];
    }
    // The chance per flight of a harmful landing inside: a flight counts once however many of its pieces land there.
    const harmfulShare = harmfulHits > 0 ? chanceOfAny(set, (i) => harmfulInside[i] === 1, total) : 0;
    const exposed = rho === null ? 0 : rho * (1 - sheltered);
    let expected: number | null = null;
    let upper: number | null = null;
    if (rho !== null) {
      expected = exposed * riskSum;
      const perLanding = harmfulHits > 0 ? expected / harmfulShare : exposed * mostHarmful;
      upper = weightedUpperBound(harmfulShare, effectiveN) * perLanding;
    }
    return {
      name: area.name,
      kind: area.kind,
      area_m2: areaM2,
      peoplePerM2: rho,
      sheltered,
      harmfulHits,
      expectedCasualties: expected,
      upper95: upper,
      maxIndividualRisk: maxRiskInside(surface, metres, index),
      byMode: byModeRisk.map((r) => r * exposed),
      byPart: byPartRisk.map((r) => r * exposed),
    };
  });
}

/** Largest risk at the grid nodes inside the polygon and at its corners (small areas hold no node). */
function maxRiskInside(surface: RiskSurface | null, polygons: ReturnType<typeof polygonsToEastNorth>, index: ReturnType<typeof createPolygonIndex>): number {
  if (surface === null) return 0;
  const { grid } = surface;
  let best = 0;
  for (let j = 0; j < grid.ny; j++) {
    const y = grid.y0 + j * grid.dy;
    for (let i = 0; i < grid.nx; i++) {
      const x = grid.x0 + i * grid.dx;
      const v = grid.values[j * grid.nx + i];
      if (v > best && index.contains(x, y)) best = v;
    }
  }
  const xs: number[] = [];
  const ys: number[] = [];
  for (const rings of polygons) for (const ring of rings) for (const [x, y] of ring) { xs.push(x); ys.push(y); }
  const corners = riskAt(surface, Float64Array.from(xs), Float64Array.from(ys));
  for (const v of corners) best = Math.max(best, v);
  return best;
}
