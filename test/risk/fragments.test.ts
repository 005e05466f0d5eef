import { describe, expect, it } from 'vitest';
import { assessRisk } from '../../src/risk/index.js';
import { riskAt } from '../../src/risk/individual.js';
import { riskSettings } from '../../src/risk/settings.js';
import { impactHarm, landingCasualtyArea } from '../../src/risk/impacts.js';
import { casualtyArea } from '../../src/risk/casualty-area.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { assessAreas } from '../../src/analysis/areas.js';
import type { LandingSet } from '../../src/analysis/types.js';
import type { Area, PolygonGeometry, Site } from '../../src/scenario/types.js';
import { makeRandom } from '../analysis/sampling.js';

/**
 * Risk of an object that breaks into pieces: every piece is its own impact, with its own casualty
 * area and energy, and the sample's weight (a piece is an event per flight). Closed forms for
 * impacts uniform over a disc of area S: individual risk k A_c P / S inside and expected casualties
 * N k A_c P / S of a covered area, for k pieces per flight of a class (linearity of expectation).
 */
const PAD = { lat: 46.2, lon: 6.1, elevation: 400 };
const frame = createLocalFrame(PAD);

function box(e0: number, n0: number, e1: number, n1: number): PolygonGeometry {
  const ring = [[e0, n0], [e1, n0], [e1, n1], [e0, n1], [e0, n0]].map(([e, n]) => frame.toLonLat(e, n));
  return { type: 'Polygon', coordinates: [ring] };
}

describe('fragment impacts over a disc (closed form: IR = k A_c P / S, E = N k A_c P / S)', () => {
  const R = 500;
  const S = Math.PI * R * R;
  const flights = 10_000;
  // Per flight: 4 heavy pieces (100 J, radius 0.02 m) and 2 light ones (5 J, under the 15 J threshold).
  const heavy = 4;
  const light = 2;
  const k = heavy + light;
  const n = flights * k;
  const random = makeRandom('pieces');
  const set: LandingSet = {
    east: new Float64Array(n),
    north: new Float64Array(n),
    weight: new Float64Array(n).fill(1 / flights),
    mode: new Uint8Array(n),
    modeNames: ['nominal'],
    modeProbability: [1],
    sample: new Uint32Array(n),
    impactEnergy: new Float64Array(n),
    impactAngle: new Float64Array(n).fill(90),
    part: new Uint8Array(n),
    partNames: ['whole', 'plate', 'card'],
    partRadius: [NaN, 0.02, 0.04],
  };
  for (let i = 0; i < n; i++) {
    const r = Math.sqrt(random()) * R;
    const a = 2 * Math.PI * random();
    set.east[i] = r * Math.sin(a);
    set.north[i] = r * Math.cos(a);
    set.sample[i] = Math.floor(i / k);
    const isHeavy = i % k < heavy;
    set.part![i] = isHeavy ? 1 : 2;
    set.impactEnergy![i] = isHeavy ? 100 : 5;
  }
  // The whole object's radius would be 0.05 m (a 0.1 m body): the pieces must not use it.
  const settings = riskSettings({ vehicle: { kind: 'projectile', mass: 1, referenceArea: (Math.PI * 0.1 * 0.1) / 4, drag: { mach: [0], cd: [0.5] } } });
  const AC = casualtyArea(0.3, 0.02, 1.8, 90);
  const people = 300;
  const areas: Area[] = [{ name: 'crowd', kind: 'spectators', people, geometry: box(-100, -100, 100, 100) }];
  const site: Site = { pad: PAD, areas };
  const risk = assessRisk(set, site, settings);

  it('casualty area of each piece from its own radius (π (R_p + R_o)² for a vertical impact, worked by hand)', () => {
    expect(landingCasualtyArea(set, settings, 0)).toBeCloseTo(Math.PI * 0.32 * 0.32, 12);
    expect(landingCasualtyArea(set, settings, heavy)).toBeCloseTo(Math.PI * 0.34 * 0.34, 12);
    const harm = impactHarm(set, settings);
    expect(harm.exposure[0]).toBeCloseTo(Math.PI * 0.32 * 0.32, 12);
    expect(harm.chance[heavy]).toBe(0);
  });

  it('individual risk well inside the disc is heavy × A_c / S within 5 %', () => {
    const pts = [[0, 0], [150, -80], [-200, 120], [60, 250]];
    const ir = riskAt(risk.surface, Float64Array.from(pts.map((p) => p[0])), Float64Array.from(pts.map((p) => p[1])));
    for (const v of ir) expect(v / ((heavy * AC) / S)).toBeCloseTo(1, 1);
  });

  it('expected casualties of a covered area: N × heavy × A_c / S within 3 binomial sd; the light pieces add none', () => {
    const a = risk.areas[0];
    const expected = (people * heavy * AC) / S;
    const p = 40_000 / S;
    const sd = expected * Math.sqrt((1 - p) / (flights * heavy * p));
    expect(Math.abs(a.expectedCasualties! - expected)).toBeLessThan(3 * sd);
    expect(a.byPart[2]).toBe(0);
    expect(a.byPart[1]).toBeCloseTo(a.expectedCasualties!, 15);
    expect(risk.parts!.map((x) => x.name)).toEqual(['whole', 'plate', 'card']);
  });

  it('the area table: chance of at least one piece inside per flight 1 − (1 − p)^k, expected pieces k p (closed form, p the area share)', () => {
    const rows = assessAreas({ areas, set, frame, keepOut: { type: 'Feature', properties: {} as never, geometry: box(2000, 2000, 2001, 2001) }, effectiveN: flights });
    const p = 40_000 / S;
    // Sampling sd of a share over `flights` flights.
    const anyPiece = 1 - (1 - p) ** k;
    expect(Math.abs(rows[0].probability - anyPiece)).toBeLessThan(3 * Math.sqrt((anyPiece * (1 - anyPiece)) / flights));
    expect(Math.abs(rows[0].expectedLandings! - k * p)).toBeLessThan(3 * Math.sqrt((k * p * (1 - p)) / flights));
  });
});
