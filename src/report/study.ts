import { analyze, type AnalysisResult } from '../analysis/index.js';
import { landingSetFromRun } from '../analysis/from-run.js';
import type { LandingSet } from '../analysis/types.js';
import type { RunResult } from '../dispersion/results.js';
import type { Issue, Scenario } from '../scenario/types.js';
import { studySensitivity } from '../sensitivity/study.js';
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
  const analysis =
    set.east.length >= MIN_LANDINGS_FOR_ANALYSIS
      ? analyze(set, scenario.site, scenario.run, { risk: riskSettings(scenario), samples: run.count })
      : null;
  const varies = Object.keys(scenario.uncertainty).length > 0 || scenario.failures.length > 0;
  const sensitivity = varies ? studySensitivity(scenario, run) : undefined;
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
