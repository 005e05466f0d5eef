import { describe, expect, it } from 'vitest';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { assembleChunks } from '../../src/dispersion/results.js';
import { studySensitivity } from '../../src/sensitivity/study.js';
import type { Scenario } from '../../src/scenario/types.js';
import { body, scenario } from '../helpers/build.js';

function fly(sc: Scenario, samples: number) {
  const runner = new DispersionRunner(sc, { samples, seed: 'sens' });
  return assembleChunks(samples, [runner.runChunk(0, samples)], runner.plan, 'sens');
}

describe('what drives the landing spread', () => {
  it('under a parachute in steady wind, drift ≈ wind × descent time: the wind speed spread drives the distance (common practice, no source)', () => {
    const sc: Scenario = {
      ...scenario({
        vehicle: body('release', 1.5, 0.8, 0.03),
        launch: { kind: 'release', height: 200, speed: 0, heading: 0, east: 0, north: 0 },
        recovery: [{ name: 'canopy', trigger: 'apogee', delay: 0, dragArea: 0.6 }],
        wind: { speed: 6, from: 270, shear: 0 },
      }),
      uncertainty: {
        'wind.speed': { kind: 'normal', sd: 1.5, relative: false },
        'vehicle.mass': { kind: 'normal', sd: 0.01, relative: true },
        'launch.height': { kind: 'uniform', lo: -1, hi: 1, relative: false },
      },
    };
    const s = studySensitivity(sc, fly(sc, 2000));
    const by = Object.fromEntries(s.inputs.map((x) => [x.input, x]));
    expect(by['wind.speed'].distance).toBeGreaterThan(0.9);
    expect(by['vehicle.mass'].distance).toBeLessThan(0.05);
    expect(by['launch.height'].distance).toBeLessThan(0.05);
    expect(s.inputs[0].input).toBe('wind.speed');
  });

  it('a failure mode that lands far away dominates the scatter', () => {
    const sc: Scenario = {
      ...scenario({
        vehicle: body('release', 1.5, 0.8, 0.03),
        launch: { kind: 'release', height: 300, speed: 0, heading: 0, east: 0, north: 0 },
        recovery: [{ name: 'canopy', trigger: 'apogee', delay: 0, dragArea: 0.6 }],
        wind: { speed: 6, from: 270, shear: 0 },
      }),
      uncertainty: { 'wind.from': { kind: 'normal', sd: 3, relative: false } },
      failures: [{ name: 'canopy fails', probability: 0.2, effect: 'skip', stage: 'canopy' }],
    };
    const s = studySensitivity(sc, fly(sc, 2000));
    expect(s.inputs[0].input).toBe('failure mode');
    expect(s.inputs[0].scatter).toBeGreaterThan(0.8);
  });
});
