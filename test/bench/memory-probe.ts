/**
 * Where the memory of analysing and writing a large run goes: reads a shard folder that holds a
 * whole run (strewn run --shard 0/1), then runs each stage of the results and prints the
 * resident set size after it. `node dist/test/bench/memory-probe.js SHARD_DIR OUT_DIR`
 */
import { mkdirSync, openSync, writeSync, closeSync } from 'node:fs';
import { join } from 'node:path';
import { readShardColumns, readShardManifest, readShardScenario } from '../../src/cli/shard-folder.js';
import { planModes } from '../../src/dispersion/modes.js';
import { landingSetFromRun } from '../../src/analysis/from-run.js';
import { analyze } from '../../src/analysis/index.js';
import { studySensitivity } from '../../src/sensitivity/study.js';
import { buildRunSummary } from '../../src/report/run-summary.js';
import { buildResultFiles } from '../../src/report/result-files.js';

const [folder, out] = process.argv.slice(2);
const mb = () => `${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MB rss, heap ${(process.memoryUsage().heapUsed / 2 ** 20).toFixed(0)} MB, external ${(process.memoryUsage().external / 2 ** 20).toFixed(0)} MB`;
let t = performance.now();
const lap = (what: string) => {
  const now = performance.now();
  console.log(`${what.padEnd(22)} ${(now - t).toFixed(0).padStart(6)} ms  ${mb()}`);
  t = now;
};
lap('start');
const manifest = readShardManifest(folder);
const scenario = readShardScenario(folder, manifest);
const chunk = readShardColumns(folder, manifest);
const run = { ...chunk, plan: planModes(scenario.failures, manifest.samples), seed: manifest.seed };
lap('columns read');
const set = landingSetFromRun(run, scenario);
lap('landing set');
const analysis = analyze(set, scenario.site, scenario.run);
lap('analysis');
console.log('   ', JSON.stringify(analysis.timing_ms, (_, v) => (typeof v === 'number' ? Math.round(v) : v)));
const sensitivity = studySensitivity(scenario, run);
lap('sensitivity');
const summary = buildRunSummary(scenario, manifest.scenarioHash, run, analysis, manifest.warnings, sensitivity);
lap('summary');
mkdirSync(out, { recursive: true });
for (const [name, content] of buildResultFiles(scenario, set, analysis, summary)) {
  const fd = openSync(join(out, name), 'w');
  if (typeof content === 'string' || content instanceof Uint8Array) writeSync(fd, typeof content === 'string' ? Buffer.from(content) : content);
  else for (const piece of content) writeSync(fd, typeof piece === 'string' ? Buffer.from(piece) : piece);
  closeSync(fd);
  lap(name);
}
