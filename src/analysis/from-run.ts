import type { RunResult } from '../dispersion/results.js';
import { sampleWeights } from '../dispersion/results.js';
import type { Scenario } from '../scenario/types.js';
import type { LandingSet } from './types.js';

/**
 * The landed samples of a run as the analysis reads them. Failed samples are left out here (and
 * counted in the summary); the landed samples of each mode carry that mode's probability.
 *
 * With a breakup (scenario `breakup`) a sample that broke up lands as its pieces: one row per
 * piece that landed, in the sample's place, each with the piece's class as its part, the piece's
 * mass for the energy, and the sample's own weight (see parts.ts: a piece is an event per flight,
 * so the rows of a mode add up to the expected number of landings per flight). A sample that did
 * not break up lands whole (part 'whole').
 */
export function landingSetFromRun(run: RunResult, scenario: Scenario): LandingSet {
  const weights = sampleWeights(run);
  const breakup = scenario.breakup;
  const pieces = breakup && run.count > 0 ? run.pieceStatus.length / run.count : 0;
  let landed = 0;
  for (let i = 0; i < run.count; i++) {
    if (run.status[i] !== 0) continue;
    if (run.broken[i] === 1) {
      for (let p = 0; p < pieces; p++) if (run.pieceStatus[i * pieces + p] === 0) landed++;
    } else landed++;
  }
  if (breakup === undefined && landed === run.count) {
    // Every sample landed: the run's own columns are the landing set's (read only), no copies.
    return {
      east: run.east,
      north: run.north,
      weight: weights,
      mode: run.mode,
      modeNames: run.plan.names,
      modeProbability: Array.from(run.plan.probability),
      modeCarriesParachute: modesWithParachute(run, scenario),
      // Sample numbers are the positions themselves for a whole run (absent means 0, 1, 2, …).
      ...(run.start === 0 ? {} : { sample: Uint32Array.from({ length: run.count }, (_, i) => run.start + i) }),
      apogee: run.apogee,
      flightTime: run.flightTime,
      impactSpeed: run.impactSpeed,
      impactAngle: run.impactAngle,
      impactEnergy: impactEnergies(run),
    };
  }
  const set: Required<Omit<LandingSet, 'part' | 'partNames' | 'partRadius'>> = {
    east: new Float64Array(landed),
    north: new Float64Array(landed),
    weight: new Float64Array(landed),
    mode: new Uint8Array(landed),
    modeNames: run.plan.names,
    modeProbability: Array.from(run.plan.probability),
    modeCarriesParachute: modesWithParachute(run, scenario),
    sample: new Uint32Array(landed),
    apogee: new Float64Array(landed),
    flightTime: new Float64Array(landed),
    impactSpeed: new Float64Array(landed),
    impactAngle: new Float64Array(landed),
    impactEnergy: new Float64Array(landed),
  };
  const part = new Uint8Array(landed);
  // Piece slot → part index (class + 1; part 0 is the whole object).
  const classOf = breakup ? breakup.fragments.flatMap((f, c) => new Array<number>(f.count).fill(c + 1)) : [];
  let j = 0;
  for (let i = 0; i < run.count; i++) {
    if (run.status[i] !== 0) continue;
    if (run.broken[i] === 1) {
      for (let p = 0; p < pieces; p++) {
        const k = i * pieces + p;
        if (run.pieceStatus[k] !== 0) continue;
        const mass = breakup!.fragments[classOf[p] - 1].mass;
        set.east[j] = run.pieceEast[k];
        set.north[j] = run.pieceNorth[k];
        set.weight[j] = weights[i];
        set.mode[j] = run.mode[i];
        set.sample[j] = run.start + i;
        set.apogee[j] = run.apogee[i];
        set.flightTime[j] = run.pieceFlightTime[k];
        set.impactSpeed[j] = run.pieceImpactSpeed[k];
        set.impactAngle[j] = run.pieceImpactAngle[k];
        set.impactEnergy[j] = 0.5 * mass * run.pieceImpactSpeed[k] * run.pieceImpactSpeed[k];
        part[j] = classOf[p];
        j++;
      }
      continue;
    }
    set.east[j] = run.east[i];
    set.north[j] = run.north[i];
    set.weight[j] = weights[i];
    set.mode[j] = run.mode[i];
    set.sample[j] = run.start + i;
    set.apogee[j] = run.apogee[i];
    set.flightTime[j] = run.flightTime[i];
    set.impactSpeed[j] = run.impactSpeed[i];
    set.impactAngle[j] = run.impactAngle[i];
    // ½ m v² with the mass that lands (without propellant for rockets).
    set.impactEnergy[j] = 0.5 * run.impactMass[i] * run.impactSpeed[i] * run.impactSpeed[i];
    j++;
  }
  if (breakup === undefined) return set;
  return {
    ...set,
    part,
    partNames: ['whole', ...breakup.fragments.map((f) => f.name)],
    partRadius: [NaN, ...breakup.fragments.map((f) => f.radius)],
  };
}

/** A mode comes down under a canopy when at least one recovery stage still deploys in it. */
function modesWithParachute(run: RunResult, scenario: Scenario): boolean[] {
  const stages = scenario.vehicle.kind === 'projectile' ? [] : scenario.recovery.map((s) => s.name);
  return run.plan.stops.map((stop) => {
    if (stages.length === 0 || stop === 'all') return false;
    return stages.some((name) => name !== stop);
  });
}

/** ½ m v² of every sample with the mass that lands (without propellant for rockets). */
function impactEnergies(run: RunResult): Float64Array {
  const out = new Float64Array(run.count);
  for (let i = 0; i < run.count; i++) out[i] = 0.5 * run.impactMass[i] * run.impactSpeed[i] * run.impactSpeed[i];
  return out;
}
