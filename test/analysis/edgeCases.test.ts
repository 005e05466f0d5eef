import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/analysis/index.js';
import { polygonsOf } from '../../src/analysis/projectGeometry.js';
import { hasRfc7946Winding } from '../../src/analysis/rings.js';
import { makeRun, makeSite, mixtureSet } from './fixtures.js';
import { strictlyValid } from './strictValidity.js';

describe('edge cases', () => {
  it('every sample on one point (no spreads): regions come from the smoothed density, with a warning', () => {
    const n = 500;
    const set = {
      east: new Float64Array(n).fill(120),
      north: new Float64Array(n).fill(-35),
      weight: new Float64Array(n).fill(1 / n),
      mode: new Uint8Array(n),
      modeNames: ['nominal'],
      modeProbability: [1],
    };
    const result = analyze(set, makeSite(), makeRun());
    expect(result.bandwidth.floored).toBe(true);
    expect(result.warnings.some((w) => w.includes('coincide'))).toBe(true);
    for (const f of result.contours.features) {
      expect(f.geometry.coordinates.length).toBeGreaterThan(0);
      expect(strictlyValid(f.geometry)).toBeNull();
    }
    // Areas grow with the level (nested regions, by definition of highest-density regions).
    const areas = result.contours.features.map((f) => f.properties.area_m2);
    expect(areas[0]).toBeLessThan(areas[1]);
    expect(areas[1]).toBeLessThan(areas[2]);
    // Every landing is 125.0 m from the pad; the zone adds the 25 m margin beyond that.
    expect(result.keepOut.properties.maxDistance_m).toBeGreaterThan(Math.hypot(120, 35) + 25);
    expect(result.keepOutOutside.samples).toBe(0);
  });

  it('pad next to the antimeridian: polygons stay whole (continuous longitudes) and valid', () => {
    const set = mixtureSet('antimeridian', [
      { name: 'nominal', probability: 1, samples: 4000, shape: { sigmaMajor: 200, sigmaMinor: 100, azimuthDeg: 90 } },
    ]);
    const result = analyze(set, makeSite({ pad: { lat: -16.5, lon: 179.999, elevation: 0 } }), makeRun());
    for (const f of result.contours.features) {
      expect(strictlyValid(f.geometry)).toBeNull();
      expect(hasRfc7946Winding(f.geometry.coordinates)).toBe(true);
      const lons = f.geometry.coordinates.flat(2).map((p) => p[0]);
      expect(Math.max(...lons)).toBeGreaterThan(180); // east of the pad, continuous past 180°
    }
    expect(strictlyValid(result.keepOut.geometry)).toBeNull();
    expect(hasRfc7946Winding(polygonsOf(result.keepOut.geometry))).toBe(true);
    expect(result.keepOutOutside.samples).toBe(0);
  });

  it('rejects bad input with a readable message', () => {
    const set = mixtureSet('bad', [
      { name: 'nominal', probability: 1, samples: 10, shape: { sigmaMajor: 1, sigmaMinor: 1, azimuthDeg: 0 } },
    ]);
    expect(() => analyze(set, makeSite(), makeRun({ levels: [0.5, 1.2] }))).toThrow(/between 0 and 1/);
    expect(() => analyze({ ...set, north: new Float64Array(3) }, makeSite(), makeRun())).toThrow(/north has 3/);
    expect(() => analyze({ ...set, east: new Float64Array(0), north: new Float64Array(0) }, makeSite(), makeRun())).toThrow(
      /no landed samples/,
    );
  });
});
