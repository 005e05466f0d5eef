import { parseScenario } from '../../../src/scenario/load.js';
import { ScenarioError } from '../../../src/scenario/errors.js';
import { hashScenario } from '../../../src/scenario/hash.js';
import type { Issue, Scenario } from '../../../src/scenario/types.js';
import { nominalFlight, type NominalFlight } from '../study/nominal.js';
import { nominalFigures, type NominalFigures } from '../../../src/report/stability.js';
import { attachedFileReader, type ScenarioDocument } from './document.js';

/**
 * The page's sample cap. The command line allows ten million; in a browser tab the result arrays
 * of that many samples would not fit comfortably, so the page stops at two million.
 */
export const PAGE_MAX_SAMPLES = 2_000_000;

/** A document that passed the same validator as the command line, with what it normalises to. */
export interface AcceptedScenario {
  document: ScenarioDocument;
  scenario: Scenario;
  /** Scenario warnings plus the rail-exit warning of the nominal flight, as the CLI reports them. */
  warnings: Issue[];
  hash: string;
  nominal: NominalFlight;
  /** Stability (rockets with a shape) and the apogee point, from that same nominal flight. */
  figures: NominalFigures;
}

export type Validation = { ok: true; accepted: AcceptedScenario } | { ok: false; issues: Issue[] };

/** Validates a document with parseScenario; every problem comes back with its field path. */
export function validateDocument(document: ScenarioDocument): Validation {
  try {
    const { scenario, warnings } = parseScenario(document.json, {
      readText: attachedFileReader(document.files),
      maxSamples: PAGE_MAX_SAMPLES,
    });
    const nominal = nominalFlight(scenario);
    return {
      ok: true,
      accepted: { document, scenario, warnings: [...warnings, ...nominal.warnings], hash: hashScenario(scenario), nominal, figures: nominalFigures(scenario, nominal.result) },
    };
  } catch (error) {
    if (error instanceof ScenarioError) return { ok: false, issues: error.issues };
    throw error;
  }
}
