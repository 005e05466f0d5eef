import type { RunResult } from '../dispersion/results.js';
import { analyze } from '../analysis/index.js';
import { landingSetFromRun } from '../analysis/from-run.js';
import type { Scenario } from '../scenario/types.js';
import { windCase } from './wind-case.js';
import { aimedScenario, railOf, type Aim } from './aim.js';
import { judgeZone } from './zone-tests.js';

/** Flies one grid point: the CLI passes the worker pool, tests may fly in-thread. */
export type Execute = (scenario: Scenario, samples: number, seed: string, signal?: AbortSignal) => Promise<RunResult>;

export interface EnvelopeOptions {
  directions: number[];
  speeds: number[];
  samples: number;
  seed: string;
  /** Fly every grid point instead of bisecting each direction's speeds. */
  exhaustive?: boolean;
  execute: Execute;
  /** How the launcher is aimed for each wind direction (default: fixed at the scenario's azimuth). */
  aim?: Aim;
  /** Called after each grid point with points flown and the most that may still be flown. */
  onCase?: (done: number, planned: number) => void;
  signal?: AbortSignal;
}

export interface CaseResult {
  speed: number;
  pass: boolean;
  failing: string[];
  keepOutArea_m2: number;
  keepOutMaxDistance_m: number;
  failedSamples: number;
  /** The launcher as flown at this grid point: azimuth and lean from vertical, degrees. */
  rail?: { azimuth: number; tilt: number };
}

export interface DirectionLimit {
  /** Wind direction (from), degrees. */
  from: number;
  /** Highest grid speed at which every test holds, below the first speed that fails; null when the lowest fails. */
  limit: number | null;
  /** True when every speed of the grid passed (the limit is at least the top of the grid). */
  aboveGrid: boolean;
  /** Tests that fail at the first failing speed. */
  firstFailure: string[];
  /** Grid points flown for this direction, by speed. */
  cases: CaseResult[];
  /** The launcher as aimed for this direction (when an aim was given). */
  rail?: { azimuth: number; tilt: number };
}

export interface EnvelopeResult {
  name: string;
  samples: number;
  seed: string;
  directions: number[];
  speeds: number[];
  method: 'bisection' | 'exhaustive';
  forecast: { from: number; speed: number };
  /**
   * The launch window (scenarios with weather.forecast): the forecast wind at the reference height
   * for each hour of the day, judged against the limits. Absent without a forecast.
   */
  window?: WindowHour[];
  limits: DirectionLimit[];
  /** How the launcher was aimed (absent: fixed at the scenario's azimuth, as before aims existed). */
  aim?: Aim;
  casesFlown: number;
  elapsed_s: number;
}

export interface WindowHour {
  /** ISO 8601 UTC. */
  time: string;
  speed: number;
  from: number;
  /** Limit at that direction (interpolated between grid directions), null outside the grid. */
  limit: number | null;
  inside: boolean;
}

/**
 * The wind envelope: for each direction, the highest mean wind speed at which the keep-out zone
 * stays inside the site boundary and clear of protected areas.
 *
 * Every grid point uses the same seed, so each sample keeps its random numbers (common random
 * numbers): the zones change smoothly with the wind and a stronger wind does not pass by luck where
 * a weaker one failed. That makes the pass/fail answer monotone in speed, and each direction's limit
 * is found by bisection over the speeds: about log2(n) + 2 points instead of n.
 */
export async function windEnvelope(scenario: Scenario, options: EnvelopeOptions): Promise<EnvelopeResult> {
  const started = Date.now();
  const { directions, speeds } = options;
  const perDirection = options.exhaustive ? speeds.length : Math.min(speeds.length, 2 + Math.ceil(Math.log2(Math.max(1, speeds.length - 1))));
  let planned = directions.length * perDirection;
  let done = 0;

  const limits: DirectionLimit[] = [];
  for (const from of directions) {
    const cases = new Map<number, CaseResult>();
    const evaluate = async (k: number): Promise<CaseResult> => {
      const known = cases.get(k);
      if (known) return known;
      if (options.signal?.aborted) throw options.signal.reason;
      const c = aimedScenario(windCase(scenario, from, speeds[k]), from, options.aim);
      const run = await options.execute(c, options.samples, options.seed, options.signal);
      const result = judgeCase(c, run, speeds[k]);
      const rail = options.aim ? railOf(c) : null;
      if (rail !== null) result.rail = rail;
      cases.set(k, result);
      done++;
      options.onCase?.(done, Math.max(planned, done));
      return result;
    };
    let firstFail = -1;
    if (options.exhaustive) {
      for (let k = 0; k < speeds.length; k++) {
        const r = await evaluate(k);
        if (!r.pass && firstFail < 0) firstFail = k;
      }
    } else {
      const before = done;
      if (!(await evaluate(0)).pass) firstFail = 0;
      else if ((await evaluate(speeds.length - 1)).pass) firstFail = -1;
      else {
        let lo = 0; // passes
        let hi = speeds.length - 1; // fails
        while (hi - lo > 1) {
          const mid = (lo + hi) >> 1;
          if ((await evaluate(mid)).pass) lo = mid;
          else hi = mid;
        }
        firstFail = hi;
      }
      planned -= perDirection - (done - before);
      options.onCase?.(done, Math.max(planned, done));
    }
    const flown = [...cases.entries()].sort((a, b) => a[0] - b[0]).map(([, r]) => r);
    limits.push({
      from,
      limit: firstFail === 0 ? null : firstFail < 0 ? speeds[speeds.length - 1] : speeds[firstFail - 1],
      aboveGrid: firstFail < 0,
      firstFailure: firstFail >= 0 ? cases.get(firstFail)!.failing : [],
      cases: flown,
      ...(flown[0]?.rail ? { rail: flown[0].rail } : {}),
    });
  }
  return {
    name: scenario.name,
    samples: options.samples,
    seed: options.seed,
    directions,
    speeds,
    method: options.exhaustive ? 'exhaustive' : 'bisection',
    forecast: { from: scenario.weather.wind.from, speed: scenario.weather.wind.speed },
    limits,
    ...(options.aim ? { aim: options.aim } : {}),
    casesFlown: done,
    elapsed_s: (Date.now() - started) / 1000,
  };
}

/** Builds one grid point's keep-out zone and tests it. */
function judgeCase(scenario: Scenario, run: RunResult, speed: number): CaseResult {
  let failedSamples = 0;
  for (let i = 0; i < run.count; i++) if (run.status[i] !== 0) failedSamples++;
  const set = landingSetFromRun(run, scenario);
  if (set.east.length < 10) {
    return { speed, pass: false, failing: ['too few samples landed to draw a zone'], keepOutArea_m2: NaN, keepOutMaxDistance_m: NaN, failedSamples };
  }
  const analysis = analyze(set, scenario.site, scenario.run);
  const verdict = judgeZone(analysis, scenario);
  const k = analysis.keepOut.properties;
  return { speed, pass: verdict.pass, failing: verdict.failing, keepOutArea_m2: k.area_m2, keepOutMaxDistance_m: k.maxDistance_m, failedSamples };
}
