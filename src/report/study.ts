import { analyze, type AnalysisResult } from '../analysis/index.js';
import { landingSetFromRun } from '../analysis/from-run.js';
import type { LandingSet } from '../analysis/types.js';
import type { RunResult } from '../dispersion/results.js';
import type { Issue, Scenario } from '../scenario/types.js';
import { studySensitivity, type StudySensitivity } from '../sensitivity/study.js';
import { riskSettings } from '../risk/settings.js';
import { buildRunSummary, type RunSummary } from './run-summary.js';
import { landingSubset } from '../analysis/thinning.js';

/** A run is analysed only when at least this many samples landed; fewer draw no useful zone. */
export const MIN_LANDINGS_FOR_ANALYSIS = 10;

export interface StudyOutcome {
  set: LandingSet;
  analysis: AnalysisResult | null;
  summary: RunSummary;
}

/**
 * From a finished run to what every front end shows and writes: the landed samples, the analysis,
 * what drives the spread (when anything is spread or can fail) and the summary. The command line
 * and the web page both call this, so they cannot drift apart.
 *
 * @example
 * const { set, analysis, summary } = studyOutcome(scenario, hash, run, warnings);
 */
export function studyOutcome(scenario: Scenario, hash: string, run: RunResult, warnings: Issue[]): StudyOutcome {
  const set = landingSetFromRun(run, scenario);
  return outcomeFromParts(scenario, hash, run, warnings, set, studyAnalysis(scenario, run, set), studySpreadSensitivity(scenario, run));
}

/** The analysis of a run's landings (null below MIN_LANDINGS_FOR_ANALYSIS). A part of `studyOutcome`. */
export function studyAnalysis(scenario: Scenario, run: RunResult, set: LandingSet): AnalysisResult | null {
  return set.east.length >= MIN_LANDINGS_FOR_ANALYSIS ? analyze(set, scenario.site, scenario.run, { risk: riskSettings(scenario), samples: run.count }) : null;
}

/** What drives the spread, when anything is spread or can fail. A part of `studyOutcome`. */
export function studySpreadSensitivity(scenario: Scenario, run: RunResult): StudySensitivity | undefined {
  const varies = Object.keys(scenario.uncertainty).length > 0 || scenario.failures.length > 0;
  return varies ? studySensitivity(scenario, run) : undefined;
}

/**
 * The outcome from its parts, computed apart (the command line computes the analysis and the
 * sensitivity in other threads, at the same time); `studyOutcome` is this with the parts made here.
 */
export function outcomeFromParts(
  scenario: Scenario,
  hash: string,
  run: RunResult,
  warnings: Issue[],
  set: LandingSet,
  analysis: AnalysisResult | null,
  sensitivity: StudySensitivity | undefined,
): StudyOutcome {
  const subset = landingSubset(set);
  const summary: RunSummary = {
    ...buildRunSummary(scenario, hash, run, analysis, warnings, sensitivity),
    landingFiles: {
      'landings.csv': { points: set.east.length },
      'landings.fgb': { points: set.east.length },
      'landings.geojson': subset ? subset.description : { points: set.east.length },
    },
  };
  return { set, analysis, summary };
}
