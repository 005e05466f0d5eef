/**
 * `npm run bench`: the figures the issues ask for, measured on this machine.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { demoScenarios, measureEngine } from './engine.js';
import { poolBench } from './pool.js';

const root = join(fileURLToPath(import.meta.url), '../../../..');
const seconds = Number(process.env.BENCH_SECONDS ?? 3);

console.log('Engine: nominal flights with turbulence on, one thread');
console.log('scenario                     flights/s   median steps   max landing error vs odex   odex flights/s');
for (const { name, scenario } of demoScenarios(join(root, 'scenarios'))) {
  const f = measureEngine(name, scenario, seconds);
  console.log(
    `${name.padEnd(28)} ${f.flightsPerSecond.toFixed(0).padStart(9)}   ${String(f.medianSteps).padStart(12)}   ${f.maxLandingError_m.toFixed(3).padStart(22)} m   ${f.odexFlightsPerSecond.toFixed(1).padStart(14)}`,
  );
}

console.log('');
await poolBench(root);
