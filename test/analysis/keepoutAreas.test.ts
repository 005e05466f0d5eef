import { describe, expect, it } from 'vitest';
import { booleanPointInPolygon } from '@turf/turf';
import { analyze } from '../../src/analysis/index.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { polygonsOf, polygonsToEastNorth, polygonsArea } from '../../src/analysis/projectGeometry.js';
import { contourBands, topLevelWarning, MIN_BAND_SAMPLES } from '../../src/analysis/confidence.js';
import type { Area, PolygonGeometry } from '../../src/scenario/types.js';
import { makeRun, makeSite, mixtureSet, PAD } from './fixtures.js';

const frame = createLocalFrame(PAD);

/** A lon/lat box from east/north corners in metres. */
function box(e0: number, n0: number, e1: number, n1: number): PolygonGeometry {
  const ring = [[e0, n0], [e1, n0], [e1, n1], [e0, n1], [e0, n0]].map(([e, n]) => frame.toLonLat(e, n));
  return { type: 'Polygon', coordinates: [ring] };
}

function perimeter(polygons: number[][][][]): number {
  let total = 0;
  for (const rings of polygons) for (const ring of rings) {
    for (let k = 0; k + 1 < ring.length; k++) total += Math.hypot(ring[k + 1][0] - ring[k][0], ring[k + 1][1] - ring[k][1]);
  }
  return total;
}

describe('keep-out zone', () => {
  const set = mixtureSet('keep-out', [
    { name: 'nominal', probability: 0.995, samples: 8000, shape: { sigmaMajor: 80, sigmaMinor: 50, azimuthDeg: 120 } },
    {
      name: 'rare',
      probability: 0.005,
      samples: 2000,
      shape: { sigmaMajor: 40, sigmaMinor: 40, azimuthDeg: 0, meanEast: -900, meanNorth: 0 },
    },
  ]);

  it('holds every sample of modes at least as likely as 1 − level (their convex hulls are in the union)', () => {
    const result = analyze(set, makeSite(), makeRun({ keepOut: { level: 0.99, margin: 0 } }));
    // Only the rare mode (0.5 % < 1 %) may land outside, and only its tail beyond the density region.
    let nominalOutside = 0;
    for (let i = 0; i < 8000; i++) {
      const ll = frame.toLonLat(set.east[i], set.north[i]);
      if (!booleanPointInPolygon(ll, result.keepOut)) nominalOutside++;
    }
    expect(nominalOutside).toBe(0);
    expect(result.keepOut.properties.parts.some((p) => p.includes('"nominal"'))).toBe(true);
    expect(result.keepOut.properties.parts.some((p) => p.includes('"rare"'))).toBe(false);
    // The outside share is a weighted share and its bound is above it (Clopper & Pearson 1934).
    expect(result.keepOutOutside.share).toBeLessThan(0.01);
    expect(result.keepOutOutside.upper95).toBeGreaterThan(result.keepOutOutside.share);
  });

  it("the margin grows a convex zone by Steiner's formula A + P r + π r² (Steiner 1840, closed form)", () => {
    // One compact mode: the zone is its convex hull, a convex polygon.
    const single = mixtureSet('steiner', [
      { name: 'nominal', probability: 1, samples: 3000, shape: { sigmaMajor: 60, sigmaMinor: 30, azimuthDeg: 45 } },
    ]);
    const bare = analyze(single, makeSite(), makeRun({ keepOut: { level: 0.99, margin: 0 } }));
    const grown = analyze(single, makeSite(), makeRun({ keepOut: { level: 0.99, margin: 40 } }));
    const metres = polygonsToEastNorth(frame, bare.keepOut.geometry);
    const expected = bare.keepOut.properties.area_m2 + perimeter(metres) * 40 + Math.PI * 40 * 40;
    expect(Math.abs(grown.keepOut.properties.area_m2 / expected - 1)).toBeLessThan(0.005);
    expect(grown.keepOut.properties.margin_m).toBe(40);
  });

  it('minimum distance: landings near the pad give a circle of radius distance + margin, every octant at that reach', () => {
    const tight = mixtureSet('tight', [
      { name: 'nominal', probability: 1, samples: 2000, shape: { sigmaMajor: 8, sigmaMinor: 6, azimuthDeg: 0 } },
    ]);
    const site = makeSite({ minimumDistance: 300, boundary: box(0, -5000, 5000, 5000) });
    const result = analyze(tight, site, makeRun({ keepOut: { level: 0.99, margin: 25 } }));
    const r = 325;
    // Area of a circle (closed form); the buffered polygon is a fine polygon outside the true circle.
    expect(Math.abs(result.keepOut.properties.area_m2 / (Math.PI * r * r) - 1)).toBeLessThan(0.005);
    for (const reach of Object.values(result.keepOut.properties.octants_m)) {
      expect(Math.abs((reach as number) - r)).toBeLessThan(1.5);
    }
    // The boundary is the half-plane east of the pad: half the circle lies outside it (symmetry).
    expect(result.keepOutOutsideBoundary!.share).toBeCloseTo(0.5, 2);
    expect(result.warnings.some((w) => w.includes('outside the site boundary'))).toBe(true);
  });
});

describe('site areas', () => {
  const set = mixtureSet('areas', [
    { name: 'nominal', probability: 0.9, samples: 9000, shape: { sigmaMajor: 100, sigmaMinor: 100, azimuthDeg: 0 }, parachute: true },
    { name: 'ballistic', probability: 0.1, samples: 1000, shape: { sigmaMajor: 100, sigmaMinor: 100, azimuthDeg: 0 } },
  ]);
  const areas: Area[] = [
    { name: 'east half', kind: 'parking', geometry: box(0, -2000, 2000, 2000) },
    { name: 'far road', kind: 'road', geometry: box(5000, 5000, 5100, 5100) },
    { name: 'crowd', kind: 'spectators', people: 200, geometry: box(50, -50, 250, 150) },
  ];
  const result = analyze(set, makeSite({ areas }), makeRun());
  const [half, far, crowd] = result.areas;

  it('probability of the east half-plane of a centred circular normal is 1/2 (symmetry) within 3 sd', () => {
    expect(Math.abs(half.probability - 0.5)).toBeLessThan(3 * Math.sqrt(0.25 / result.effectiveSamples));
    expect(half.upper95).toBeGreaterThan(half.probability);
  });

  it('0 hits still gives the rule-of-three bound 1 − 0.05^(1/n_eff) (Hanley & Lippman-Hand 1983)', () => {
    expect(far.hits).toBe(0);
    expect(far.probability).toBe(0);
    expect(far.upper95).toBeCloseTo(1 - Math.pow(0.05, 1 / result.effectiveSamples), 12);
    expect(far.intersectsKeepOut).toBe(false);
    expect(half.intersectsKeepOut).toBe(true);
  });
});

describe('contour confidence bands', () => {
  it('warns when the top level rests on fewer than 100 samples (common practice, no source) and suggests a count that fixes it', () => {
    const set = mixtureSet('bands', [
      { name: 'nominal', probability: 1, samples: 2000, shape: { sigmaMajor: 50, sigmaMinor: 50, azimuthDeg: 0 } },
    ]);
    const result = analyze(set, makeSite(), makeRun({ levels: [0.99, 0.999], keepOut: { level: 0.99, margin: 0 } }));
    const top = result.bands[result.bands.length - 1];
    expect(top.samples).toBeLessThan(MIN_BAND_SAMPLES);
    const warning = result.warnings.find((w) => w.includes('0.999 contour'));
    expect(warning).toBeDefined();
    const suggested = Number(/About (\d+) samples/.exec(warning!)![1]);
    expect(suggested * (top.samples / 2000)).toBeGreaterThanOrEqual(MIN_BAND_SAMPLES);
    // Equal weights: each band holds p_i − p_(i−1) of the samples, to one sample (Hyndman 1996 definition).
    expect(Math.abs(result.bands[0].share - 0.99)).toBeLessThanOrEqual(1 / 2000);
  });

  it('no warning when the band is well filled; empty band suggests 100 / band probability', () => {
    const density = Float64Array.from({ length: 1000 }, (_, i) => 1000 - i);
    const weights = new Float64Array(1000).fill(1);
    const bands = contourBands(density, weights, [0.5, 0.9], [500, 100]);
    expect(bands.map((b) => b.samples)).toEqual([501, 400]);
    expect(topLevelWarning(bands, 1000)).toBeNull();
    const empty = topLevelWarning([{ ...bands[1], samples: 0 }], 1000)!;
    expect(empty.suggestedSamples).toBe(250); // 100 / (0.9 − 0.5)
  });
});

it('polygonsOf treats Polygon and MultiPolygon alike', () => {
  const p = box(0, 0, 10, 10);
  expect(polygonsOf(p)).toHaveLength(1);
  expect(polygonsOf({ type: 'MultiPolygon', coordinates: [p.coordinates, p.coordinates] })).toHaveLength(2);
});
