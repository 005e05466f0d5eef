import type { AnalysisResult } from '../analysis/index.js';
import type { LandingSet } from '../analysis/types.js';
import type { RunResult } from '../dispersion/results.js';
import type { Issue, Scenario } from '../scenario/types.js';
import { studySensitivity, type StudySensitivity } from '../sensitivity/study.js';
import { buildRunSummary, type RunSummary } from './run-summary.js';
import { landingSubset } from '../analysis/thinning.js';

/**
 * The parts of `studyOutcome` (src/report/study.ts) that do not need the analysis code: what drives
 * the spread, and the outcome put together. Kept apart so threads that only rank the inputs or only
 * compose the summary do not load the geometry libraries of the analysis.
 */

export interface StudyOutcome {
  set: LandingSet;
  analysis: AnalysisResult | null;
  summary: RunSummary;
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
