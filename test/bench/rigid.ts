/**
 * Rigid body against point mass on the demo club rocket: the engine rows for both (flights per
 * second, steps by phase, landing error against odex at 1e-11; see engine.ts), then apogee offset
 * and no-recovery reach from a 2 m rail tilted 5° into a 6 m/s wind. `npm run bench` prints all of
 * it with the other engine rows; `node dist/test/bench/rigid.js` prints only this.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadScenarioFile } from '../../src/scenario/file.js';
import type { Scenario } from '../../src/scenario/types.js';
import { flyNominal } from '../../src/dispersion/runner.js';
import { asPointMass, engineHeader, engineRow, measureEngine } from './engine.js';

/** Apogee offset and no-recovery reach, point mass against rigid body, in the same wind. */
export function rigidComparison(club: Scenario): string[] {
  const wind = { ...club.weather, wind: { ...club.weather.wind, speed: 6, from: 45, gust: undefined, profile: undefined }, turbulence: false };
  const base: Scenario = { ...club, uncertainty: {}, failures: [], weather: wind };
  const bearing = (e: number, n: number) => ((Math.atan2(e, n) * 180) / Math.PI + 360) % 360;
  const lines = ['2 m rail tilted 5° toward 45°, wind 6 m/s from 45° (into the wind), no turbulence:'];
  for (const [label, sc] of [['point mass', asPointMass(base)], ['rigid body', base]] as const) {
    const a = flyNominal(sc);
    const b = flyNominal({ ...sc, recovery: [] });
    lines.push(
      `  ${label.padEnd(10)}: apogee ${a.apogee.toFixed(0)} m, ${Math.hypot(a.apogeeEast, a.apogeeNorth).toFixed(0)} m from the pad toward ${bearing(a.apogeeEast, a.apogeeNorth).toFixed(0)}°; no recovery lands ${Math.hypot(b.east, b.north).toFixed(0)} m out toward ${bearing(b.east, b.north).toFixed(0)}°`,
    );
  }
  return lines;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const root = join(fileURLToPath(import.meta.url), '../../../..');
  const club = loadScenarioFile(join(root, 'scenarios/club-rocket.json')).scenario;
  const seconds = Number(process.env.BENCH_SECONDS ?? 3);
  for (const line of engineHeader()) console.log(line);
  console.log(engineRow(measureEngine('club-rocket.json (rigid body)', club, seconds)));
  console.log(engineRow(measureEngine('club-rocket.json as point mass', asPointMass(club), seconds)));
  for (const line of rigidComparison(club)) console.log(line);
}
