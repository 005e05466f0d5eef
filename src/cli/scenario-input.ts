import { loadScenarioFile, type LoadedScenario } from '../scenario/file.js';
import { machWarnings, railExitSpeedWarnings } from '../scenario/warnings.js';
import { flyNominal } from '../dispersion/runner.js';
import type { Issue } from '../scenario/types.js';

/** Loads a scenario and adds the warnings only a flight can give (rail-exit speed). */
export function loadForCommand(path: string, maxSamples?: number): LoadedScenario & { nominal: ReturnType<typeof flyNominal> } {
  const loaded = loadScenarioFile(path, { maxSamples });
  const nominal = flyNominal(loaded.scenario);
  const warnings: Issue[] = [...loaded.warnings, ...railExitSpeedWarnings(loaded.scenario, nominal.railExitSpeed), ...machWarnings(loaded.scenario, nominal.maxMach)];
  return { ...loaded, warnings, nominal };
}

export function printWarnings(warnings: Issue[], stream: NodeJS.WriteStream = process.stderr): void {
  for (const w of warnings) stream.write(`warning: ${w.path}: ${w.message}\n`);
}
