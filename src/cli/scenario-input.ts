import { loadScenarioFileWithTerrain, type LoadedScenario } from '../scenario/file.js';
import { machWarnings, railExitSpeedWarnings } from '../scenario/warnings.js';
import { apogeeWarnings } from '../scenario/plausibility.js';
import { stabilityWarnings } from '../flight/stability-warnings.js';
import { flyNominal } from '../dispersion/runner.js';
import type { Issue } from '../scenario/types.js';

/** Loads a scenario and adds the warnings the scenario layer cannot give: the static margin, and those only a flight can give (rail-exit speed). */
export async function loadForCommand(path: string, maxSamples?: number, allowOutsideFiles = false): Promise<LoadedScenario & { nominal: ReturnType<typeof flyNominal> }> {
  const loaded = await loadScenarioFileWithTerrain(path, { maxSamples, allowOutsideFiles });
  const nominal = flyNominal(loaded.scenario);
  const warnings: Issue[] = [...loaded.warnings, ...stabilityWarnings(loaded.scenario), ...railExitSpeedWarnings(loaded.scenario, nominal.railExitSpeed), ...machWarnings(loaded.scenario, nominal.maxMach), ...apogeeWarnings(nominal.apogee)];
  return { ...loaded, warnings, nominal };
}

export function printWarnings(warnings: Issue[], stream: NodeJS.WriteStream = process.stderr): void {
  for (const w of warnings) stream.write(`warning: ${w.path}: ${w.message}\n`);
}
