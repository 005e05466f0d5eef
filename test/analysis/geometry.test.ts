import { describe, expect, it } from 'vitest';
import { area as turfArea, booleanPointInPolygon, convex, featureCollection, point, polygon } from '@turf/turf';
import { createPolygonIndex } from '../../src/analysis/pointInPolygon.js';
import { convexHull } from '../../src/analysis/convexHull.js';
import { octantReach } from '../../src/analysis/octants.js';
import { padCircle } from '../../src/analysis/padCircle.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { polygonsArea, polygonsToEastNorth } from '../../src/analysis/projectGeometry.js';
import { makeRandom } from './sampling.js';

describe('point in polygon (banded index) against turf booleanPointInPolygon', () => {
  it('agrees on 20,000 random points for a star with a hole and a second part', () => {
    const star: number[][] = [];
    for (let k = 0; k < 40; k++) {
      const r = k % 2 === 0 ? 100 : 45;
      const a = (2 * Math.PI * k) / 40;
      star.push([r * Math.cos(a), r * Math.sin(a)]);
    }
    star.push([...star[0]]);
    const hole = [[-10, -10], [-10, 10], [10, 10], [10, -10], [-10, -10]];
    const island = [[150, 150], [200, 150], [200, 210], [150, 150]];
    const index = createPolygonIndex([[star, hole], [island]]);
    const a = polygon([star, hole]);
    const b = polygon([island]);
    const random = makeRandom('pip');
    let inside = 0;
    for (let k = 0; k < 20_000; k++) {
      const x = -120 + 340 * random();
      const y = -120 + 340 * random();
      const reference = booleanPointInPolygon([x, y], a) || booleanPointInPolygon([x, y], b);
      expect(index.contains(x, y)).toBe(reference);
      if (reference) inside++;
    }
    expect(inside).toBeGreaterThan(1000); // the test covers both answers
  });
});

describe('convex hull against turf convex', () => {
  it('same hull area and the hull holds every point', () => {
    const random = makeRandom('hull');
    const n = 5000;
    const xs = new Float64Array(n);
    const ys = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      xs[i] = (random() - 0.5) * 200 + (random() < 0.01 ? 400 : 0);
      ys[i] = (random() - 0.5) * 80;
    }
    const hull = convexHull(xs, ys);
    // turf convex works on any x/y; compare planar shoelace areas of both hulls.
    const reference = convex(featureCollection(Array.from(xs, (x, i) => point([x, ys[i]]))))!;
    expect(polygonsArea([[hull]])).toBeCloseTo(polygonsArea([reference.geometry.coordinates]), 6);
    const index = createPolygonIndex([[hull]]);
    let outside = 0;
    for (let i = 0; i < n; i++) {
      // Hull vertices themselves sit on the boundary; nudge toward the centroid to test strictly.
      if (!index.contains(xs[i] * 0.999999, ys[i] * 0.999999)) outside++;
    }
    expect(outside).toBe(0);
  });

  it('a subset filter and degenerate inputs', () => {
    const xs = new Float64Array([0, 1, 2, 5, 5]);
    const ys = new Float64Array([0, 1, 2, 5, 5]);
    expect(convexHull(xs, ys, (i) => i < 3)).toEqual([[0, 0], [2, 2]]); // collinear: the two ends
    expect(convexHull(xs, ys, (i) => i >= 3)).toEqual([[5, 5]]);
    expect(convexHull(xs, ys, () => false)).toEqual([]);
  });
});

describe('octant reach (plane geometry, worked by hand)', () => {
  it('square of half-side 10 centred on the pad: corners in NE/SE/SW/NW, 10·√(1 + tan²22.5°) on the axes', () => {
    const square = [[-10, -10], [10, -10], [10, 10], [-10, 10], [-10, -10]];
    const reach = octantReach([[square]]);
    const corner = Math.hypot(10, 10);
    // On the north edge (y = 10) the N octant reaches to the border ray at 22.5°: x = 10 tan 22.5°.
    const axis = 10 / Math.cos(Math.PI / 8);
    expect(reach.NE).toBeCloseTo(corner, 12);
    expect(reach.SW).toBeCloseTo(corner, 12);
    expect(reach.N).toBeCloseTo(axis, 12);
    expect(reach.E).toBeCloseTo(axis, 12);
    expect(reach.W).toBeCloseTo(axis, 12);
  });

  it('a shape only to the north-east leaves the other octants empty', () => {
    const box = [[100, 100], [120, 100], [120, 120], [100, 120], [100, 100]];
    const reach = octantReach([[box]]);
    expect(reach.NE).toBeCloseTo(Math.hypot(120, 120), 12);
    expect(reach.S).toBeNull();
    expect(reach.W).toBeNull();
  });
});

describe('pad circle polygon', () => {
  it('contains the true circle: every point at the radius lies inside', () => {
    const ring = padCircle(150, 64);
    const index = createPolygonIndex([[ring]]);
    for (let k = 0; k < 3600; k++) {
      const a = (2 * Math.PI * k) / 3600;
      expect(index.contains(150 * Math.cos(a) * 0.99999999, 150 * Math.sin(a) * 0.99999999)).toBe(true);
    }
  });
});

describe('areas from lon/lat polygons', () => {
  it('east/north shoelace area of a 0.01° box matches turf area within 0.5 % (turf uses a sphere)', () => {
    const pad = { lat: 52, lon: 4 };
    const frame = createLocalFrame(pad);
    const box = polygon([[[4, 52], [4.01, 52], [4.01, 52.01], [4, 52.01], [4, 52]]]);
    const metres = polygonsArea(polygonsToEastNorth(frame, box.geometry));
    expect(Math.abs(metres / turfArea(box) - 1)).toBeLessThan(0.005);
  });
});
