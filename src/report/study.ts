import { analyze, type AnalysisResult } from '../analysis/index.js';
import { landingSetFromRun } from '../analysis/from-run.js';
import type { LandingSet } from '../analysis/types.js';
import type { RunResult } from '../dispersion/results.js';
import type { Issue, Scenario } from '../scenario/types.js';
import { riskSettings } from '../risk/settings.js';
import { outcomeFromParts, studySpreadSensitivity, type StudyOutcome } from './study-parts.js';

export { outcomeFromParts, studySpreadSensitivity, type StudyOutcome } from './study-parts.js';

/** A run is analysed only when at least this many samples landed; fewer draw no useful zone. */
export const MIN_LANDINGS_FOR_ANALYSIS = 10;

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

