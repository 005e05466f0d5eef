import type { RunResult } from '../dispersion/results.js';
import { sampleWeights } from '../dispersion/results.js';
import type { Scenario } from '../scenario/types.js';
import type { LandingSet } from './types.js';

/**
 * The landed samples of a run as the analysis reads them. Failed samples are left out here (and
 * counted in the summary); the landed samples of each mode carry that mode's probability.
 */
export function landingSetFromRun(run: RunResult, scenario: Scenario): LandingSet {
  const weights = sampleWeights(run);
  let landed = 0;
  for (let i = 0; i < run.count; i++) if (run.status[i] === 0) landed++;
  if (landed === run.count) {
    // Every sample landed: the run's own columns are the landing set's (read only), no copies.
    return {
      east: run.east,
      north: run.north,
      weight: weights,
      mode: run.mode,
      modeNames: run.plan.names,
      modeProbability: Array.from(run.plan.probability),
      modeCarriesParachute: modesWithParachute(run, scenario),
      sample: Uint32Array.from({ length: run.count }, (_, i) => run.start + i),
      apogee: run.apogee,
      flightTime: run.flightTime,
      impactSpeed: run.impactSpeed,
      impactAngle: run.impactAngle,
      impactEnergy: impactEnergies(run),
    };
  }
  const set: Required<LandingSet> = {
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
  let j = 0;
  for (let i = 0; i < run.count; i++) {
    if (run.status[i] !== 0) continue;
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
  return set;
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
