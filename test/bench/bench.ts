/**
 * `npm run bench`: the figures the issues ask for, measured on this machine.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { demoScenarios, measureEngine } from './engine.js';
import { poolBench } from './pool.js';
import { scaleBench } from './scale.js';

const root = join(fileURLToPath(import.meta.url), '../../../..');
const seconds = Number(process.env.BENCH_SECONDS ?? 3);

console.log(`Strewn bench, ${new Date().toISOString()}: figures depend on how busy the machine is; other jobs share it unless said otherwise.`);
console.log('');
console.log('Engine: nominal flights with turbulence on, one thread');
console.log('(landing error against odex at 1e-11; odex "equal accuracy" is its loosest tolerance keeping every landing within 1 m)');
console.log('scenario                 flights/s  median steps  landing error  odex tol  odex flights/s  odex error  engine/odex');
for (const { name, scenario } of demoScenarios(join(root, 'scenarios'))) {
  const f = measureEngine(name, scenario, seconds);
  console.log(
    `${name.padEnd(24)} ${f.flightsPerSecond.toFixed(0).padStart(9)}  ${String(f.medianSteps).padStart(12)}  ${f.maxLandingError_m.toFixed(3).padStart(11)} m  ${f.odexEqualTolerance.toExponential(0).padStart(8)}  ${f.odexEqualFlightsPerSecond.toFixed(0).padStart(14)}  ${f.odexEqualMaxError_m.toFixed(3).padStart(8)} m  ${(f.flightsPerSecond / f.odexEqualFlightsPerSecond).toFixed(1).padStart(10)}×`,
  );
}

const clubRocket = demoScenarios(join(root, 'scenarios')).find((s) => s.name === 'club-rocket.json');
if (clubRocket) {
  const f = measureEngine('club-rocket.json', clubRocket.scenario, seconds);
  console.log(`point-mass club rocket, one core: ${f.flightsPerSecond.toFixed(0)} flights/s, median ${f.medianSteps} steps  (target >= 25,000 flights/s per core: ${f.flightsPerSecond >= 25_000 ? 'meets target' : 'MISSES target'})`);
}

console.log('');
if (process.env.BENCH_SKIP_POOL !== '1') await poolBench(root);
console.log('');
scaleBench(root);
