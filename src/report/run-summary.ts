import type { RunResult } from '../dispersion/results.js';
import { failedPieces } from '../dispersion/breakup.js';
import { sampleWeights } from '../dispersion/results.js';
import type { AnalysisResult } from '../analysis/index.js';
import { summaryParts, type SummaryParts } from '../analysis/summary.js';
import { weightedQuantile } from '../analysis/weightedStats.js';
import { FAILURE_REASONS } from '../flight/status.js';
import type { Issue, Scenario } from '../scenario/types.js';
import { VERSION } from '../version.js';
import { chanceOverDuration } from '../scenario/normalize.js';
import { CAUTION } from './caution.js';
import { nominalFigures, type ApogeePoint, type StabilitySummary } from './stability.js';
import type { StudySensitivity } from '../sensitivity/study.js';
import { riskSummary, type RiskSummary } from '../risk/index.js';

export interface Spread5 {
  mean: number;
  p05: number;
  p50: number;
  p95: number;
  max: number;
}

/** summary.json: what a run did and found (the scenario format document lists the required keys). */
export interface RunSummary extends SummaryParts {
  name: string;
  samples: number;
  failedSamples: number;
  failures: { reason: string; samples: number }[];
  seed: string;
  scenarioHash: string;
  version: string;
  apogee_m: Spread5;
  flightTime_s: Spread5;
  farthestLanding: { distance_m: number; bearing_deg: number; sample: number; mode: string } | null;
  modes: { name: string; probability: number; samples: number; landed: number; rate_per_h?: number }[];
  /**
   * A released object's operation (a drone flight), when the file gives its duration or a rate:
   * every figure above is per release (per time the object comes down); with a rate, the chance
   * that it comes down at all in one operation is 1 − e^(−λT).
   */
  operation?: { duration_s: number | null; rate_per_h: number | null; chanceOfRelease: number | null };
  /** What drives the spread of the landings (absent when the scenario has no spreads). */
  sensitivity?: StudySensitivity;
  /** Rockets with a shape: stability figures (scenario format, "vehicle.shape"). */
  stability?: StabilitySummary;
  /** Where the nominal flight's apogee is (absent when it failed before apogee). */
  nominalApogee?: ApogeePoint;
  /** Risk to people, per flight (scenario-format.md, "Results"). */
  risk?: RiskSummary;
  scenarioWarnings: string[];
  caution: string;
  /**
   * Landings in each landing file: all of them, except that landings.geojson holds a stated,
   * stratified subset (points, of, method) above 100,000 landings (src/analysis/thinning.ts).
   */
  landingFiles?: Record<string, { points: number; of?: number; method?: string }>;
}

function round(x: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(x * f) / f;
}

/** Weighted mean, 5th/50th/95th percentiles and maximum over landed samples. */
function spread(values: Float64Array, weights: Float64Array, landed: Uint8Array): Spread5 {
  let count = 0;
  for (let i = 0; i < values.length; i++) if (landed[i] === 0) count++;
  if (count === 0) return { mean: NaN, p05: NaN, p50: NaN, p95: NaN, max: NaN };
  const vv = new Float64Array(count);
  const ww = new Float64Array(count);
  for (let i = 0, j = 0; i < values.length; i++) if (landed[i] === 0) { vv[j] = values[i]; ww[j++] = weights[i]; }
  let total = 0, first = 0, max = -Infinity;
  for (let i = 0; i < vv.length; i++) { total += ww[i]; first += ww[i] * vv[i]; if (vv[i] > max) max = vv[i]; }
  return {
    mean: round(first / total, 2),
    p05: round(weightedQuantile(vv, ww, 0.05), 2),
    p50: round(weightedQuantile(vv, ww, 0.5), 2),
    p95: round(weightedQuantile(vv, ww, 0.95), 2),
    max: round(max, 2),
  };
}

/** More than this share of failed samples is warned about wherever the results are shown. */
export const FAILED_SHARE_WARNING = 0.01;

function reasonsText(failures: { reason: string; samples: number }[]): string {
  return failures.map((f) => `${f.samples.toLocaleString('en')} ${f.reason}`).join(', ');
}

/** The warning for a run in which more than 1 % of the samples failed (none below that). */
export function failureWarnings(samples: number, failed: number, failures: { reason: string; samples: number }[]): string[] {
  if (!(samples > 0) || failed / samples <= FAILED_SHARE_WARNING || failed === samples) return [];
  const share = Number(((failed / samples) * 100).toPrecision(2));
  return [
    `${failed.toLocaleString('en')} of ${samples.toLocaleString('en')} samples (${share} %) failed to fly to the ground (${reasonsText(failures)}); the figures come from the landed samples only, so find the cause before relying on them`,
  ];
}

/** A breakup's pieces that failed to fly to the ground are named, with how many (not written as landings). */
function pieceWarnings(run: RunResult): string[] {
  const { flown, failed } = failedPieces(run);
  const total = [...failed.values()].reduce((a, b) => a + b, 0);
  if (total === 0) return [];
  const reasons = [...failed.entries()].sort((a, b) => a[0] - b[0]).map(([code, n]) => `${n.toLocaleString('en')} ${FAILURE_REASONS[code] ?? `code ${code}`}`).join(', ');
  return [`${total.toLocaleString('en')} of ${flown.toLocaleString('en')} fragment pieces failed to fly to the ground (${reasons}); they are not landings, so the expected pieces per flight are that much lower`];
}

/** For a run in which no sample landed: the message of exit 1, with the reasons counted. */
export function allFailedMessage(summary: Pick<RunSummary, 'samples' | 'failures'>): string {
  return `every one of the ${summary.samples.toLocaleString('en')} samples failed (${reasonsText(summary.failures)}); nothing was written. Check the scenario (strewn check) for the cause`;
}

export function buildRunSummary(
  scenario: Scenario,
  hash: string,
  run: RunResult,
  analysis: AnalysisResult | null,
  warnings: Issue[],
  sensitivity?: StudySensitivity,
): RunSummary {
  const weights = sampleWeights(run);
  const failures = new Map<number, number>();
  let farthest: RunSummary['farthestLanding'] = null;
  const landed = new Int32Array(run.plan.names.length);
  for (let i = 0; i < run.count; i++) {
    const s = run.status[i];
    if (s !== 0) {
      failures.set(s, (failures.get(s) ?? 0) + 1);
      continue;
    }
    landed[run.mode[i]]++;
    const d = Math.hypot(run.east[i], run.north[i]);
    if (farthest === null || d > farthest.distance_m) {
      const bearing = (Math.atan2(run.east[i], run.north[i]) * 180) / Math.PI;
      farthest = { distance_m: d, bearing_deg: (bearing + 360) % 360, sample: i, mode: run.plan.names[run.mode[i]] };
    }
  }
  if (farthest) farthest = { ...farthest, distance_m: round(farthest.distance_m, 2), bearing_deg: round(farthest.bearing_deg, 1) };
  const failedSamples = [...failures.values()].reduce((a, b) => a + b, 0);
  const failureList = [...failures.entries()].sort((a, b) => a[0] - b[0]).map(([code, n]) => ({ reason: FAILURE_REASONS[code] ?? `code ${code}`, samples: n }));
  const parts: SummaryParts = analysis
    ? summaryParts(analysis)
    : { contours: [], keepOut: { level: scenario.run.keepOut.level, margin_m: scenario.run.keepOut.margin, area_m2: NaN, maxDistance_m: NaN, outsideShare: NaN, outsideUpper95: NaN }, areas: [], warnings: [] };
  return {
    name: scenario.name,
    samples: run.count,
    failedSamples,
    failures: failureList,
    seed: run.seed,
    scenarioHash: hash,
    version: VERSION,
    apogee_m: spread(run.apogee, weights, run.status),
    flightTime_s: spread(run.flightTime, weights, run.status),
    farthestLanding: farthest,
    modes: run.plan.names.map((name, m) => ({
      name,
      probability: run.plan.probability[m],
      samples: run.plan.counts[m],
      landed: landed[m],
      ...(m > 0 && scenario.failures[m - 1]?.rate !== undefined ? { rate_per_h: scenario.failures[m - 1].rate! * 3600 } : {}),
    })),
    ...operationPart(scenario),
    ...parts,
    warnings: [...failureWarnings(run.count, failedSamples, failureList), ...pieceWarnings(run), ...parts.warnings],
    ...(sensitivity ? { sensitivity } : {}),
    ...nominalParts(scenario),
    ...(analysis?.risk ? { risk: riskSummary(analysis.risk) } : {}),
    scenarioWarnings: warnings.map((w) => `${w.path}: ${w.message}`),
    caution: CAUTION,
  };
}

function operationPart(scenario: Scenario): Pick<RunSummary, 'operation'> {
  const l = scenario.launch;
  if (l.kind !== 'release' || (l.duration === undefined && l.rate === undefined)) return {};
  const chance = l.rate !== undefined && l.duration !== undefined ? chanceOverDuration(l.rate, l.duration) : null;
  return { operation: { duration_s: l.duration ?? null, rate_per_h: l.rate === undefined ? null : l.rate * 3600, chanceOfRelease: chance } };
}

/** The stability figures and the nominal apogee point, from one nominal flight. */
function nominalParts(scenario: Scenario): { stability?: StabilitySummary; nominalApogee?: ApogeePoint } {
  const f = nominalFigures(scenario);
  return { ...(f.stability ? { stability: f.stability } : {}), ...(f.apogee ? { nominalApogee: f.apogee } : {}) };
}
