/**
 * Rigid-body figures (`node dist/test/bench/rigid.js` after `npm run build`): flights per second in
 * one thread for the demo club rocket with turbulence on, steps per flight by phase, landing
 * accuracy against the odex reference at 1e-11; then apogee offset and no-recovery reach, point
 * mass against rigid body, from a 2 m rail tilted 5° into a 6 m/s wind.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadScenarioFile } from '../../src/scenario/file.js';
import type { Scenario } from '../../src/scenario/types.js';
import { DispersionRunner, flyNominal } from '../../src/dispersion/runner.js';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import { InputDrawer } from '../../src/dispersion/draw.js';
import { planModes } from '../../src/dispersion/modes.js';
import { SampleStream } from '../../src/dispersion/random.js';
import { MotorModel } from '../../src/physics/motor.js';
import { odexFlight } from '../reference/odex-flight.js';
import { nominalWithTurbulence } from './engine.js';

const root = join(fileURLToPath(import.meta.url), '../../../..');
const club = loadScenarioFile(join(root, 'scenarios/club-rocket.json')).scenario;
const seconds = Number(process.env.BENCH_SECONDS ?? 3);

function speed(sc: Scenario, label: string): void {
  const s = nominalWithTurbulence(sc);
  const runner = new DispersionRunner(s, { samples: 1_000_000, seed: 'bench' });
  runner.runChunk(0, 100);
  let flights = 0;
  let steps = 0;
  const start = performance.now();
  while (performance.now() - start < seconds * 1000) {
    const c = runner.runChunk(flights, 100);
    for (let i = 0; i < c.count; i++) steps += c.steps[i];
    flights += c.count;
  }
  const rate = flights / ((performance.now() - start) / 1000);
  console.log(`${label}: ${rate.toFixed(0)} flights/s, ${(steps / flights).toFixed(0)} steps per flight (mean)`);
}

function phases(sc: Scenario): void {
  const s = nominalWithTurbulence(sc);
  const burn = new MotorModel(s.vehicle.motor!).burnTime;
  const model = new FlightModel(s);
  const drawer = new InputDrawer(s, planModes([], 1));
  const inputs = emptyInputs(s.recovery.length);
  const stream = new SampleStream();
  const count = { rail: 0, burn: 0, coast: 0, descent: 0 };
  let apogeeSeen = false;
  let railDone = false;
  stream.select('bench-phases', 0);
  drawer.draw(stream, 0, model.wind, inputs);
  let lastZ = -1;
  model.fly(inputs, () => stream.normal(), emptyResult(), (t, y) => {
    const r = Math.hypot(y[0], y[1], y[2]);
    if (!railDone && r < (s.launch.kind === 'rocket' ? s.launch.rail : 0) - 1e-9) count.rail++;
    else if (t <= burn) { railDone = true; count.burn++; }
    else if (!apogeeSeen && y[5] > 0) count.coast++;
    else { apogeeSeen = true; count.descent++; }
    lastZ = y[2];
  });
  void lastZ;
  console.log(`steps by phase (one nominal flight with turbulence): rail ${count.rail}, burn ${count.burn}, coast to apogee ${count.coast}, descent ${count.descent}`);
}

function accuracy(sc: Scenario, checks: number): void {
  const s = nominalWithTurbulence(sc);
  const model = new FlightModel(s);
  const drawer = new InputDrawer(s, planModes([], 1));
  const inputs = emptyInputs(s.recovery.length);
  const stream = new SampleStream();
  let worst = 0;
  for (let i = 0; i < checks; i++) {
    stream.select('bench-accuracy', i);
    drawer.draw(stream, 0, model.wind, inputs);
    const r = { ...model.fly(inputs, () => stream.normal(), emptyResult()) };
    stream.select('bench-accuracy', i);
    drawer.draw(stream, 0, model.wind, inputs);
    const ref = odexFlight(s, { tolerance: 1e-11, sigmaW: inputs.sigmaW, normal: () => stream.normal(), misalignmentDirection: inputs.misalignmentDirection });
    worst = Math.max(worst, Math.hypot(r.east - ref.east, r.north - ref.north));
  }
  console.log(`landing error against odex at 1e-11 over ${checks} turbulent flights: at most ${worst.toFixed(3)} m`);
}

function compare(): void {
  const wind = { ...club.weather, wind: { ...club.weather.wind, speed: 6, from: 45, gust: undefined, profile: undefined }, turbulence: false };
  const base: Scenario = { ...club, uncertainty: {}, failures: [], weather: wind };
  const point: Scenario = { ...base, vehicle: { ...base.vehicle, shape: undefined } };
  const bearing = (e: number, n: number) => ((Math.atan2(e, n) * 180) / Math.PI + 360) % 360;
  for (const [label, sc] of [['point mass', point], ['rigid body', base]] as const) {
    const a = flyNominal(sc);
    const b = flyNominal({ ...sc, recovery: [] });
    console.log(
      `${label.padEnd(10)}: apogee ${a.apogee.toFixed(0)} m, ${Math.hypot(a.apogeeEast, a.apogeeNorth).toFixed(0)} m from the pad toward ${bearing(a.apogeeEast, a.apogeeNorth).toFixed(0)}°; no recovery lands ${Math.hypot(b.east, b.north).toFixed(0)} m out toward ${bearing(b.east, b.north).toFixed(0)}°`,
    );
  }
}

console.log('Rigid-body rocket (club-rocket.json), one thread; machine shared with other work');
speed(club, 'rigid body, turbulence on');
speed({ ...club, vehicle: { ...club.vehicle, shape: undefined } }, 'same rocket as a point mass');
phases(club);
accuracy(club, 6);
console.log('2 m rail tilted 5° toward 45°, wind 6 m/s from 45° (into the wind), no turbulence:');
compare();
