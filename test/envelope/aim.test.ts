import { describe, expect, it } from 'vitest';
import { resolve } from 'node:path';
import { windEnvelope, type Execute } from '../../src/envelope/envelope.js';
import { executeInThread } from '../../src/dispersion/execute.js';
import { loadScenarioFile } from '../../src/scenario/file.js';
import { bearingAwayFrom } from '../../src/envelope/aim.js';
import { failureCode } from '../../src/envelope/polar-chart.js';
import type { Scenario } from '../../src/scenario/types.js';

const club = loadScenarioFile(resolve(import.meta.dirname, '../../scenarios/club-rocket.json')).scenario;

/** Flies in this thread and keeps every scenario flown, so the test reads the cases as flown. */
function recording(): { execute: Execute; flown: Scenario[] } {
  const flown: Scenario[] = [];
  return { flown, execute: (sc, n, seed, signal) => (flown.push(sc), executeInThread(sc, { samples: n, seed, signal })) };
}

const grid = { directions: [0, 90, 200, 290], speeds: [0, 3, 6], samples: 60, seed: 'aim', exhaustive: true };

describe('envelope --aim (the rail turns with the wind, as crews aim it; common practice, no source)', () => {
  it('into-wind: on a calm day the same zones as fixed; with wind the rail of every flown case points at the wind\u2019s from-direction', async () => {
    const fixed = recording();
    const into = recording();
    const a = await windEnvelope(club, { ...grid, execute: fixed.execute, aim: { mode: 'fixed', maxTilt: 20 } });
    const b = await windEnvelope(club, { ...grid, execute: into.execute, aim: { mode: 'into-wind', maxTilt: 20 } });
    expect(into.flown.length).toBe(grid.directions.length * grid.speeds.length);
    for (const sc of into.flown) {
      if (sc.launch.kind !== 'rocket') throw new Error('a rocket was expected');
      if (sc.weather.wind.speed === 0) expect(sc.launch.azimuth).toBe(45);
      else expect(sc.launch.azimuth).toBe(sc.weather.wind.from);
      expect(sc.launch.tilt).toBe(5);
    }
    for (const sc of fixed.flown) expect(sc.launch.kind === 'rocket' && sc.launch.azimuth).toBe(45);
    a.limits.forEach((d, i) => {
      const calmA = d.cases.find((c) => c.speed === 0)!;
      const calmB = b.limits[i].cases.find((c) => c.speed === 0)!;
      expect(calmB.keepOutArea_m2).toBe(calmA.keepOutArea_m2);
      expect(calmB.pass).toBe(calmA.pass);
      // The recorded rail of each case is the one flown.
      for (const c of b.limits[i].cases) if (c.speed > 0) expect(c.rail!.azimuth).toBe(d.from);
    });
  }, 60_000);

  it('the lean is capped at the maximum tilt; away-from leans away from the area centre', async () => {
    const rec = recording();
    await windEnvelope(club, { ...grid, directions: [90], speeds: [3], execute: rec.execute, aim: { mode: 'away-from', area: 'Spectator line', maxTilt: 2 } });
    const sc = rec.flown[0];
    expect(sc.launch.kind === 'rocket' && sc.launch.tilt).toBe(2);
    const away = bearingAwayFrom(club, 'Spectator line');
    expect(sc.launch.kind === 'rocket' && sc.launch.azimuth).toBeCloseTo(away, 9);
  }, 30_000);

  it('the chart letter says which test fails first', () => {
    expect(failureCode(['site boundary', 'spectators: Crowd'])).toBe('BS');
    expect(failureCode(['building: Barn', 'road: Lane', 'building: Shed'])).toBe('HR');
    expect(failureCode([])).toBe('');
  });
});
