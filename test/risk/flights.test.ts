import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { assembleChunks } from '../../src/dispersion/results.js';
import { landingSetFromRun } from '../../src/analysis/from-run.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { parseScenario } from '../../src/scenario/load.js';
import { assessRisk } from '../../src/risk/index.js';
import { riskSettings } from '../../src/risk/settings.js';
import type { Area, Scenario } from '../../src/scenario/types.js';
import { body, constantAir, scenario } from '../helpers/build.js';

function fly(sc: Scenario, samples: number, flight = {}) {
  const runner = new DispersionRunner(sc, { samples, flight });
  const run = assembleChunks(samples, [runner.runChunk(0, samples)], runner.plan, runner.seed);
  return { run, set: landingSetFromRun(run, sc) };
}

describe('parachute impact energy against ½ m v_t² with the closed-form terminal speed', () => {
  // Steady descent: m g = ½ ρ v_t² CdA, so v_t = √(2 m g / (ρ CdA)) (J. R. Taylor, Classical
  // Mechanics (2005), ch. 2). g is G0 within 0.1 % at 45° latitude and sea level (WGS 84 normal gravity).
  const m = 2;
  const rho = 1.2;
  const cdA = 1.0;
  const g = 9.80665;
  const vt = Math.sqrt((2 * m * g) / (rho * cdA));
  const sc = scenario({
    vehicle: body('release', m, 0, 0.01),
    launch: { kind: 'release', height: 300, speed: 0, heading: 0, east: 0, north: 0 },
    recovery: [{ name: 'canopy', trigger: 'apogee', delay: 0, dragArea: cdA }],
  });
  const { set } = fly(sc, 1, { air: constantAir(rho) });

  it(`lands at v_t = ${vt.toFixed(3)} m/s with ½ m v_t² = ${(0.5 * m * vt * vt).toFixed(2)} J, vertically`, () => {
    expect(set.impactSpeed![0] / vt).toBeCloseTo(1, 2);
    expect(set.impactEnergy![0] / (0.5 * m * vt * vt)).toBeCloseTo(1, 2);
    expect(set.impactAngle![0]).toBeCloseTo(90, 1);
  });
});

describe('demo club rocket (invented demo; behaviour checks, not check values)', () => {
  const path = join(dirname(fileURLToPath(import.meta.url)), '../../scenarios/club-rocket.json');
  const { scenario: sc } = parseScenario(JSON.parse(readFileSync(path, 'utf8')), {
    baseDir: dirname(path),
    readText: (p) => readFileSync(p, 'utf8'),
  });
  const { set } = fly(sc, 2000);
  const frame = createLocalFrame(sc.site.pad);
  const modeIndex = (name: string) => set.modeNames.indexOf(name);
  const failed = modeIndex('main does not open');
  const nominal = modeIndex('nominal');

  it('the landed mass is the mass without propellant: energy / (½ v²) averages the dry 1.2 kg, not 1.275 kg', () => {
    let sum = 0;
    for (let i = 0; i < set.east.length; i++) sum += set.impactEnergy![i] / (0.5 * set.impactSpeed![i] ** 2);
    expect(Math.abs(sum / set.east.length - 1.2)).toBeLessThan(0.005);
  });

  it('the 1e-6 line from 2,000 samples is flagged as not resolved, with a sample count that would', () => {
    const risk = assessRisk(set, sc.site, riskSettings(sc), { samples: 2000 });
    const line = risk.lines.find((l) => l.level === 1e-6)!;
    expect(line.resolved).toBe(false);
    expect(line.samplesNeeded!).toBeGreaterThan(2000);
    expect(risk.warnings.some((w) => w.includes('1e-6 individual-risk line is not resolved'))).toBe(true);
  });

  // The demo's own spectator line lies upwind, 3–4 sd of this mode's landings away, so a box of
  // spectators is put where the mode comes down (its landings' mean ± 1 sd).
  const failedEast: number[] = [];
  const failedNorth: number[] = [];
  for (let i = 0; i < set.east.length; i++) if (set.mode[i] === failed) { failedEast.push(set.east[i]); failedNorth.push(set.north[i]); }
  const mean = (a: number[]) => a.reduce((s, x) => s + x, 0) / a.length;
  const sd = (a: number[]) => Math.sqrt(mean(a.map((x) => (x - mean(a)) ** 2)));
  const [e0, e1] = [mean(failedEast) - sd(failedEast), mean(failedEast) + sd(failedEast)];
  const [n0, n1] = [mean(failedNorth) - sd(failedNorth), mean(failedNorth) + sd(failedNorth)];
  const ring = [[e0, n0], [e1, n0], [e1, n1], [e0, n1], [e0, n0]].map(([e, n]) => frame.toLonLat(e, n));
  const spectators: Area = { name: 'Spectators', kind: 'spectators', people: 120, geometry: { type: 'Polygon', coordinates: [ring] } };
  const site = { ...sc.site, areas: [spectators] };

  it('"main does not open" gives non-zero expected casualties for the spectator area', () => {
    const risk = assessRisk(set, site, riskSettings(sc));
    expect(risk.areas[0].byMode[failed]).toBeGreaterThan(0);
    expect(risk.modes[failed].expectedCasualties).toBeGreaterThan(0);
    expect(risk.areas[0].upper95!).toBeGreaterThan(risk.areas[0].expectedCasualties!);
  });

  it('a mode under the energy threshold contributes none', () => {
    let nominalMax = 0;
    let nominalInside = 0;
    const withDefault = assessRisk(set, site, riskSettings(sc));
    for (let i = 0; i < set.east.length; i++) if (set.mode[i] === nominal) nominalMax = Math.max(nominalMax, set.impactEnergy![i]);
    nominalInside = withDefault.areas[0].byMode[nominal];
    expect(nominalInside).toBeGreaterThan(0); // at 15 J the canopy landings count ...
    expect(nominalMax).toBeLessThan(100);
    const strict = assessRisk(set, site, riskSettings({ ...sc, risk: { casualtyEnergy: 100 } }));
    expect(strict.areas[0].byMode[nominal]).toBe(0); // ... at 100 J they do not
    expect(strict.modes[nominal].expectedCasualties).toBe(0);
    expect(strict.areas[0].byMode[failed]).toBeCloseTo(withDefault.areas[0].byMode[failed], 15);
  });
});
