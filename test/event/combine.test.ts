import { describe, expect, it } from 'vitest';
import { executeInThread } from '../../src/dispersion/execute.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { parseEventFile } from '../../src/event/event-file.js';
import { combineEvent, individualRiskAt } from '../../src/event/combine.js';
import { runEventItems } from '../../src/event/run-event.js';

const PAD = { lat: 47.3, lon: 8.0 };
const frame = createLocalFrame(PAD);
const box = (e0: number, n0: number, e1: number, n1: number) => ({
  type: 'Polygon',
  coordinates: [[[e0, n0], [e1, n0], [e1, n1], [e0, n1], [e0, n0]].map(([e, n]) => frame.toLonLat(e, n))],
});

/** An invented site: a crowd right where a falling object drifts. */
const site = {
  pad: PAD,
  areas: [
    { name: 'Crowd', kind: 'spectators', people: 300, geometry: box(-10, -30, 30, 10) },
    { name: 'Lane', kind: 'road', geometry: box(-200, 40, 200, 50) },
  ],
};

/** A dropped object without a parachute; invented. */
const dropped = {
  strewn: 1,
  name: 'dropped',
  site: { pad: { lat: 0, lon: 0 } },
  vehicle: { kind: 'release', mass: 0.5, referenceArea: 0.02, drag: 1 },
  launch: { height: 30, speed: 2, heading: 90 },
  weather: { wind: { speed: 3, from: 0 } },
  uncertainty: { 'wind.speed': { sd: 1.5 }, 'wind.from': { sd: 40 }, 'launch.azimuth': { range: [0, 360] } },
  run: { samples: 400, seed: 'event-test' },
};

const execute = (sc: any, n: number, seed: string) => executeInThread(sc, { samples: n, seed });

async function eventOf(items: { flights: number }[]) {
  const plan = parseEventFile({ strewnEvent: 1, name: 'test event', site, items: items.map((it, i) => ({ name: `item ${i}`, scenario: dropped, flights: it.flights })) });
  return combineEvent(plan, await runEventItems(plan, execute));
}

describe('event totals', () => {
  it('N identical flights give N times the expected landings, casualties and individual risk of one (expectations add; closed form)', async () => {
    const one = await eventOf([{ flights: 1 }]);
    const seven = await eventOf([{ flights: 7 }]);
    const split = await eventOf([{ flights: 3 }, { flights: 4 }]);
    const crowd1 = one.areas[0];
    expect(crowd1.expectedLandings).toBeGreaterThan(0.01);
    expect(crowd1.expectedCasualties!).toBeGreaterThan(0);
    for (const t of [seven, split]) {
      expect(t.areas[0].expectedLandings).toBeCloseTo(7 * crowd1.expectedLandings, 12);
      expect(t.areas[0].expectedCasualties!).toBeCloseTo(7 * crowd1.expectedCasualties!, 12);
      expect(t.total.expectedCasualties).toBeCloseTo(7 * one.total.expectedCasualties, 12);
      expect(t.areas[1].expectedLandings).toBeCloseTo(7 * one.areas[1].expectedLandings, 12);
      for (const [e, n] of [[5, -5], [20, 0], [0, 30]]) {
        expect(individualRiskAt(t, e, n)).toBeCloseTo(7 * individualRiskAt(one, e, n), 14);
      }
    }
    // At least one landing among N independent flights: 1 − (1 − p)^N (binomial), not N p.
    const p = crowd1.chanceOfAnyLanding;
    expect(seven.areas[0].chanceOfAnyLanding).toBeCloseTo(1 - (1 - p) ** 7, 12);
    // The per-flight figure is the run's own area figure (the sum the item sheet shows).
    expect(one.items[0].expectedCasualtiesPerFlight).toBeGreaterThan(0);
    expect(one.union).not.toBeNull();
  }, 20_000);

  it('individual risk integrates to the expected exposure: Σ over the grid ≈ flights × Σ w·A (kernel density integrates to 1)', async () => {
    const plan = parseEventFile({ strewnEvent: 1, name: 'test event', site, items: [{ name: 'item 0', scenario: dropped, flights: 5 }] });
    const outcomes = await runEventItems(plan, execute);
    const t = combineEvent(plan, outcomes);
    const g = t.individualRisk.grid!;
    let integral = 0;
    for (let k = 0; k < g.values.length; k++) integral += g.values[k] * g.dx * g.dy;
    // Each landing exposes probability × casualty area × casualty chance (src/risk); a kernel
    // density integrates to 1, so the grid integrates to flights × Σ exposure.
    const exposure = outcomes[0]!.harm!.exposure.reduce((a, b) => a + b, 0);
    expect(exposure).toBeGreaterThan(0.1);
    expect(integral / (5 * exposure)).toBeCloseTo(1, 2);
  }, 20_000);
});
