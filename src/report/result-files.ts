import type { AnalysisResult } from '../analysis/index.js';
import type { LandingSet } from '../analysis/types.js';
import { createLocalFrame } from '../analysis/geodesy.js';
import { writeContoursGeoJSON, writeKeepOutGeoJSON, landingsGeoJSONChunks } from '../analysis/geojsonWriters.js';
import { writeAreasCsv } from '../analysis/areasCsv.js';
import { writeKml } from '../analysis/kml.js';
import type { Scenario } from '../scenario/types.js';
import { landingsCsvChunks } from './landings-csv.js';
import type { RunSummary } from './run-summary.js';

export type FileContent = string | Uint8Array | Iterable<string>;

/**
 * Every file of a results folder, by name, in a fixed order. Used by the command line (written to
 * disk) and the web page (offered as downloads), so both produce the same bytes.
 */
export function buildResultFiles(
  scenario: Scenario,
  set: LandingSet,
  analysis: AnalysisResult | null,
  summary: RunSummary,
): [string, FileContent][] {
  const frame = createLocalFrame(scenario.site.pad);
  const files: [string, FileContent][] = [
    ['landings.csv', landingsCsvChunks(set, frame)],
    ['summary.json', JSON.stringify(summary, null, 2) + '\n'],
    ['landings.geojson', landingsGeoJSONChunks(set, scenario.site.pad)],
  ];
  if (analysis !== null) {
    files.push(
      ['contours.geojson', writeContoursGeoJSON(analysis)],
      ['keepout.geojson', writeKeepOutGeoJSON(analysis)],
      ['areas.csv', writeAreasCsv(analysis.areas)],
      ['result.kml', writeKml(analysis, scenario.site, scenario.name)],
    );
  }
  return files;
}
