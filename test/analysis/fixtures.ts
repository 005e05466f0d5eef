/** Shared inputs for the analysis tests: a site, run settings and landing sets built from seeded draws. */
import type { RunSettings, Site } from '../../src/scenario/types.js';
import type { LandingSet } from '../../src/analysis/types.js';
import { drawNormal2, makeRandom, type Normal2 } from './sampling.js';

export const PAD = { lat: 40.1, lon: -105.2, elevation: 1600 };

export function makeSite(extra: Partial<Site> = {}): Site {
  return { pad: PAD, areas: [], ...extra };
}

export function makeRun(extra: Partial<RunSettings> = {}): RunSettings {
  return { samples: 0, seed: '1', levels: [0.5, 0.9, 0.99], keepOut: { level: 0.99, margin: 25 }, ...extra };
}

export interface ModeSpec {
  name: string;
  probability: number;
  samples: number;
  shape: Normal2;
  parachute?: boolean;
}

/** Landing set with each mode drawn `samples` times and weighted back to its probability. */
export function mixtureSet(seed: string, modes: ModeSpec[]): LandingSet {
  const total = modes.reduce((s, m) => s + m.samples, 0);
  const east = new Float64Array(total);
  const north = new Float64Array(total);
  const weight = new Float64Array(total);
  const mode = new Uint8Array(total);
  const random = makeRandom(seed);
  let from = 0;
  modes.forEach((m, k) => {
    drawNormal2(random, m.shape, east, north, from, m.samples);
    weight.fill(m.probability / m.samples, from, from + m.samples);
    mode.fill(k, from, from + m.samples);
    from += m.samples;
  });
  return {
    east,
    north,
    weight,
    mode,
    modeNames: modes.map((m) => m.name),
    modeProbability: modes.map((m) => m.probability),
    modeCarriesParachute: modes.map((m) => m.parachute ?? false),
  };
}
