/**
 * `npm run bench`: the figures the issues ask for, measured on this machine.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadavg } from 'node:os';
import { asPointMass, demoScenarios, engineHeader, engineRow, measureEngine, verdict, type EngineFigures } from './engine.js';
import { rigidComparison } from './rigid.js';
import { poolBench } from './pool.js';
import { scaleBench } from './scale.js';

const root = join(fileURLToPath(import.meta.url), '../../../..');
const seconds = Number(process.env.BENCH_SECONDS ?? 3);
const load = () => loadavg().map((l) => l.toFixed(1)).join(' ');

console.log(`Strewn bench, ${new Date().toISOString()}: figures depend on how busy the machine is; other jobs share it unless said otherwise.`);
console.log('');
console.log(`Engine: nominal flights with turbulence on, one thread (load average ${load()} at the start)`);
for (const line of engineHeader()) console.log(line);
const demos = demoScenarios(join(root, 'scenarios'));
const clubFigures: { rigid?: EngineFigures; point?: EngineFigures } = {};
for (const { name, scenario } of demos) {
  const rigid = scenario.vehicle.kind === 'rocket' && scenario.vehicle.shape !== undefined;
  const f = measureEngine(rigid ? `${name} (rigid body)` : name, scenario, seconds);
  console.log(engineRow(f));
  if (rigid) {
    const g = measureEngine(`${name} as point mass`, asPointMass(scenario), seconds);
    console.log(engineRow(g));
    if (name === 'club-rocket.json') Object.assign(clubFigures, { rigid: f, point: g });
  }
}
const club = demos.find((s) => s.name === 'club-rocket.json');
if (club && clubFigures.rigid && clubFigures.point) {
  const { rigid, point } = clubFigures;
  console.log(`club rocket as a point mass, one core: ${point.flightsPerSecond.toFixed(0)} flights/s (${point.flightsPerCpuSecond.toFixed(0)} per CPU second), median ${point.medianSteps} steps  (target >= 25,000 flights/s per core: ${verdict(point.flightsPerSecond >= 25_000)})`);
  console.log(`club rocket as a rigid body, one core: ${rigid.flightsPerSecond.toFixed(0)} flights/s (${rigid.flightsPerCpuSecond.toFixed(0)} per CPU second), median ${rigid.medianSteps} steps, landing within ${rigid.maxLandingError_m.toFixed(3)} m of odex at 1e-11  (target >= 5,000 flights/s per core: ${verdict(rigid.flightsPerSecond >= 5_000)}; within 1 m: ${verdict(rigid.maxLandingError_m <= 1)})`);
  console.log(`(load average ${load()} at the end of the engine figures)`);
  for (const line of rigidComparison(club.scenario)) console.log(line);
}

console.log('');
if (process.env.BENCH_SKIP_POOL !== '1') await poolBench(root);
console.log('');
scaleBench(root);
console.log('');
// The page against the command line needs chromium and a Vite build: a minute or two, so on request.
if (process.env.BENCH_PAGE === '1') await (await import('./page.js')).pageBench(root);
else console.log('Page against the command line at 20,000 samples: not run (BENCH_PAGE=1 runs it; needs /usr/bin/chromium)');
