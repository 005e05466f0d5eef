import type { RunResult } from '../dispersion/results.js';
import { sampleWeights } from '../dispersion/results.js';
import { readSpreadUniforms } from '../dispersion/draw.js';
import { SampleStream } from '../dispersion/random.js';
import { UNCERTAINTY_NAMES, type Scenario } from '../scenario/types.js';
import { defaultClassCount, firstOrderIndex, uniformClass } from './first-order.js';

/** One input's first-order indices for the two outputs that size a landing zone. */
export interface InputSensitivity {
  /** A spread name from the scenario's `uncertainty`, or "failure mode". */
  input: string;
  /** Share of the variance of the landing distance from the pad explained by this input alone. */
  distance: number;
  /**
   * Share of the landing points' scatter (variance of east plus variance of north, which is what
   * the keep-out area grows with) explained by this input alone.
   */
  scatter: number;
}

export interface StudySensitivity {
  method: string;
  samples: number;
  classes: number;
  /** Sorted by `scatter`, largest first. */
  inputs: InputSensitivity[];
}

export const SENSITIVITY_METHOD =
  'first-order indices from given data (binned correlation ratio, Plischke, Borgonovo & Smith 2013) with the ε² bias correction (Kelley 1935)';

/**
 * Ranks the inputs of a finished run by how much of the landing spread each explains alone. The
 * uniform numbers behind every spread are read back from each sample's stream (they are its first
 * draws), so no extra flights are needed. Turbulence and interactions make up the rest.
 */
export function studySensitivity(scenario: Scenario, run: RunResult): StudySensitivity {
  const weights = sampleWeights(run);
  const n = run.count;
  const names = UNCERTAINTY_NAMES.map((name, j) => ({ name, j })).filter(({ name }) => scenario.uncertainty[name] !== undefined);
  const classes = defaultClassCount(n);
  // Only each uniform's class is kept (two bytes a sample, not eight): it is all the index needs.
  const classIndex = names.map(() => new Uint16Array(n));
  const stream = new SampleStream();
  const all = new Float64Array(UNCERTAINTY_NAMES.length);
  for (let i = 0; i < n; i++) {
    if (!(weights[i] > 0)) continue;
    stream.select(run.seed, i);
    readSpreadUniforms(stream, all);
    names.forEach(({ j }, k) => (classIndex[k][i] = uniformClass(all[j], classes)));
  }
  const distance = new Float64Array(n);
  for (let i = 0; i < n; i++) distance[i] = weights[i] > 0 ? Math.hypot(run.east[i], run.north[i]) : 0;
  // The run's own columns, not copies: every sum below skips the samples of weight 0 (failed
  // samples, whose positions may not be finite).
  const east = run.east;
  const north = run.north;
  const ve = weightedVariance(east, weights);
  const vn = weightedVariance(north, weights);
  const scatterIndex = (classOf: (i: number) => number, m: number) => {
    const se = firstOrderIndex(classOf, m, east, weights);
    const sn = firstOrderIndex(classOf, m, north, weights);
    return ve + vn > 0 ? (se * ve + sn * vn) / (ve + vn) : 0;
  };
  const inputs: InputSensitivity[] = names.map(({ name }, k) => {
    const column = classIndex[k];
    const classOf = (i: number) => column[i];
    return { input: name, distance: firstOrderIndex(classOf, classes, distance, weights), scatter: scatterIndex(classOf, classes) };
  });
  if (run.plan.names.length > 1) {
    const modes = run.plan.names.length;
    const classOf = (i: number) => run.mode[i];
    inputs.push({ input: 'failure mode', distance: firstOrderIndex(classOf, modes, distance, weights), scatter: scatterIndex(classOf, modes) });
  }
  inputs.sort((a, b) => b.scatter - a.scatter || b.distance - a.distance);
  return { method: SENSITIVITY_METHOD, samples: n, classes, inputs: inputs.map((s) => ({ ...s, distance: round3(s.distance), scatter: round3(s.scatter) })) };
}

function round3(x: number): number {
  return Math.round(x * 1000) / 1000;
}

function weightedVariance(y: Float64Array, w: Float64Array): number {
  let sw = 0, m = 0;
  for (let i = 0; i < y.length; i++) if (w[i] > 0) { sw += w[i]; m += w[i] * y[i]; }
  if (!(sw > 0)) return 0;
  m /= sw;
  let v = 0;
  for (let i = 0; i < y.length; i++) if (w[i] > 0) v += w[i] * (y[i] - m) ** 2;
  return v / sw;
}
