import { describe, expect, it } from 'vitest';
import { deserialize } from 'flatgeobuf/lib/mjs/geojson.js';
import { landingsFlatGeobufChunks } from '../../src/analysis/flatgeobuf.js';
import { landingsGeoJSONChunks } from '../../src/analysis/geojsonWriters.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { landingSubset } from '../../src/analysis/thinning.js';
import type { LandingSet } from '../../src/analysis/types.js';
import { mixtureSet, PAD } from './fixtures.js';

const frame = createLocalFrame(PAD);

function bytesOf(pieces: Iterable<Uint8Array>): Uint8Array {
  const list = [...pieces];
  const out = new Uint8Array(list.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of list) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

describe('landings.fgb', () => {
  // Read back with the flatgeobuf package's own reader (FlatGeobuf 3 specification): a wrong
  // size prefix, column index or byte order would fail to parse or give other values.
  it('holds every landing as a WGS 84 point with its sample, mode and figures', async () => {
    const set = mixtureSet('fgb', [
      { name: 'nominal', probability: 0.9, samples: 3000, shape: { sigmaMajor: 80, sigmaMinor: 50, azimuthDeg: 30 } },
      { name: 'drogue only, main fails', probability: 0.1, samples: 400, shape: { sigmaMajor: 40, sigmaMinor: 40, azimuthDeg: 0, meanEast: 250 } },
    ]);
    set.apogee = Float64Array.from({ length: 3400 }, (_, i) => 400 + i / 7);
    set.sample = Uint32Array.from({ length: 3400 }, (_, i) => 3 * i + 2);
    (set as LandingSet & { impactEnergy?: Float64Array }).impactEnergy = Float64Array.from({ length: 3400 }, (_, i) => i / 3);
    const bytes = bytesOf(landingsFlatGeobufChunks(set, PAD));
    const features: { geometry: { coordinates: number[] }; properties: Record<string, unknown> }[] = [];
    for await (const f of deserialize(bytes)) features.push(f as never);
    expect(features).toHaveLength(3400);
    for (const i of [0, 1234, 3399]) {
      const [lon, lat] = frame.toLonLat(set.east[i], set.north[i]);
      expect(features[i].geometry.coordinates).toEqual([lon, lat]);
      expect(features[i].properties).toMatchObject({
        sample: 3 * i + 2,
        mode: set.modeNames[set.mode[i]],
        east_m: set.east[i],
        north_m: set.north[i],
        apogee_m: set.apogee[i],
        impactEnergy: i / 3,
        weight: set.weight[i],
      });
    }
    expect(features[3399].properties.mode).toBe('drogue only, main fails');
  });
});

describe('landings.geojson above 100,000 landings', () => {
  const set = mixtureSet('thin', [
    { name: 'nominal', probability: 0.995, samples: 249_000, shape: { sigmaMajor: 80, sigmaMinor: 50, azimuthDeg: 30 } },
    { name: 'no deployment', probability: 0.005, samples: 1_000, shape: { sigmaMajor: 30, sigmaMinor: 30, azimuthDeg: 0, meanNorth: 400 } },
  ]);

  it('keeps a stratified subset: each mode in proportion, a rare mode whole, weights summing to its probability', () => {
    const subset = landingSubset(set)!;
    expect(landingSubset(set, 250_000)).toBeNull();
    const kept = [0, 0];
    const weight = [0, 0];
    subset.index.forEach((i, k) => {
      kept[set.mode[i]]++;
      weight[set.mode[i]] += subset.weight[k];
    });
    // 249,000 · 100,000 / 250,000 = 99,600 nominal; the rare mode keeps all 1,000 (under 2,000).
    expect(kept).toEqual([99_600, 1_000]);
    expect(subset.description).toMatchObject({ points: 100_600, of: 250_000 });
    expect(weight[0]).toBeCloseTo(0.995, 9);
    expect(weight[1]).toBeCloseTo(0.005, 9);
    expect([...subset.index]).toEqual([...subset.index].sort((a, b) => a - b));
    // Evenly spread through the run, not its first 100,000 samples: the mean east of the subset
    // matches that of all nominal landings (systematic sampling of independent draws).
    let all = 0, part = 0, n = 0;
    for (let i = 0; i < set.east.length; i++) if (set.mode[i] === 0) all += set.east[i];
    subset.index.forEach((i) => { if (set.mode[i] === 0) { part += set.east[i]; n++; } });
    expect(Math.abs(part / n - all / 249_000)).toBeLessThan(1);
    expect(subset.index[subset.index.length - 1]).toBeGreaterThan(240_000);
  });

  it('says so in the file', () => {
    const text = [...landingsGeoJSONChunks(set, PAD, landingSubset(set))].join('');
    const parsed = JSON.parse(text);
    expect(parsed.features).toHaveLength(100_600);
    expect(parsed.subset).toMatchObject({ points: 100_600, of: 250_000 });
    expect(parsed.subset.note).toContain('landings.fgb');
  });
});
