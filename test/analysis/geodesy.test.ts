import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import { createLocalFrame, toLonLatArrays } from '../../src/analysis/geodesy.js';

// Reference: GeographicLib (C. F. F. Karney, "Algorithms for geodesics", J. Geodesy 87, 2013),
// npm geographiclib-geodesic, on the WGS 84 ellipsoid (NIMA TR8350.2).
const wgs84 = geodesic.Geodesic.WGS84;

const pads = [
  { lat: 0, lon: 0 },
  { lat: 35.35, lon: -117.81 },
  { lat: -33.9, lon: 151.2 },
  { lat: 52.2, lon: -0.12 },
  { lat: 70.3, lon: 31.1 },
  { lat: 80.5, lon: 179.9 }, // high latitude, next to the antimeridian
  { lat: -78.0, lon: -166.7 },
];
const azimuths = [0, 45, 90, 135, 180, 225, 270, 315, 17.3, 301.9];

describe('local frame vs GeographicLib direct/inverse problem (Karney 2013)', () => {
  for (const pad of pads) {
    it(`agrees within 0.05 m out to 10 km at lat ${pad.lat}`, () => {
      const frame = createLocalFrame(pad);
      let worst = 0;
      for (const azimuth of azimuths) {
        for (const distance of [10, 1000, 5000, 10000]) {
          const reference = wgs84.Direct(pad.lat, pad.lon, azimuth, distance);
          const east = distance * Math.sin((azimuth * Math.PI) / 180);
          const north = distance * Math.cos((azimuth * Math.PI) / 180);
          const [lon, lat] = frame.toLonLat(east, north);
          const miss = wgs84.Inverse(lat, lon, reference.lat2!, reference.lon2!).s12!;
          worst = Math.max(worst, miss);
          // Inverse direction: lon/lat of the reference point back to east/north.
          const [e2, n2] = frame.toEastNorth(reference.lon2!, reference.lat2!);
          worst = Math.max(worst, Math.hypot(e2 - east, n2 - north));
          expect(lon).toBeGreaterThanOrEqual(-180);
          expect(lon).toBeLessThan(180);
        }
      }
      expect(worst).toBeLessThan(0.05);
    });
  }

  it('inverse of the inverse problem: GeographicLib azimuth and distance give east/north', () => {
    const pad = { lat: 47.4, lon: 8.5 };
    const frame = createLocalFrame(pad);
    const target = { lat: 47.45, lon: 8.58 };
    const inv = wgs84.Inverse(pad.lat, pad.lon, target.lat, target.lon);
    const [east, north] = frame.toEastNorth(target.lon, target.lat);
    const az = (inv.azi1! * Math.PI) / 180;
    expect(Math.abs(east - inv.s12! * Math.sin(az))).toBeLessThan(0.05);
    expect(Math.abs(north - inv.s12! * Math.cos(az))).toBeLessThan(0.05);
  });

  it('converts a million points in well under two seconds', () => {
    const frame = createLocalFrame({ lat: 40, lon: -105 });
    const n = 1_000_000;
    const east = new Float64Array(n);
    const north = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      east[i] = ((i * 7919) % 20000) - 10000;
      north[i] = ((i * 104729) % 20000) - 10000;
    }
    const start = performance.now();
    const { lon, lat } = toLonLatArrays(frame, east, north);
    const elapsed = performance.now() - start;
    expect(lon.length).toBe(n);
    expect(Number.isFinite(lat[n - 1])).toBe(true);
    expect(elapsed).toBeLessThan(2000);
  });
});
