import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import geodesic from 'geographiclib-geodesic';
import { editedScenario, strewn } from '../cli/helpers.js';

const WGS84 = geodesic.Geodesic.WGS84;

/**
 * Near the poles. The local frame maps east/north metres to WGS 84 through Gauss's conformal
 * sphere (src/analysis/geodesy.ts); the flight itself does not depend on longitude, so the same
 * scenario and seed flown at 45° and at 89.9° differ only through gravity and Coriolis (WGS 84
 * normal gravity, NIMA TR8350.2 eq. 4-1: under 0.6 % between those latitudes) and must draw zones
 * of nearly the same size. Before the fix every longitude collapsed at the pole and the zone came
 * out smaller than the landings.
 */

function zoneAt(lat: number) {
  const path = editedScenario('drone-power-loss.json', (s) => {
    s.site.pad.lat = lat;
    // Areas and the boundary belong to the original site; only the zone is compared.
    delete s.site.areas;
    delete s.site.boundary;
    delete s.site.basemap;
  });
  const out = join(path, '..', 'out');
  const r = strewn(['run', path, '--samples', '400', '--workers', '1', '--out', out, '--quiet']);
  expect(r.status, r.stderr).toBe(0);
  return { ...JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')), out };
}

describe('pads near the poles', () => {
  it('zones at 89.9° and at 45° of the same scenario agree in area within 1 %', () => {
    const a = zoneAt(45);
    const b = zoneAt(89.9);
    expect(Math.abs(b.keepOut.area_m2 / a.keepOut.area_m2 - 1)).toBeLessThan(0.01);
    for (let i = 0; i < a.contours.length; i++) expect(Math.abs(b.contours[i].area_m2 / a.contours[i].area_m2 - 1)).toBeLessThan(0.01);
    // The zone is drawn in lon/lat too: its ring must reach as far from the pad as the figures say
    // (geodesic distance by GeographicLib, C. F. F. Karney, J. Geodesy 87, 2013).
    const ring: number[][] = JSON.parse(readFileSync(join(b.out, 'keepout.geojson'), 'utf8')).features[0].geometry.coordinates[0];
    const farthest = Math.max(...ring.map(([lon, lat]) => WGS84.Inverse(89.9, 8.02117, lat, lon).s12 as number));
    expect(Math.abs(farthest / b.keepOut.maxDistance_m - 1)).toBeLessThan(0.01);
  });

  it('a pad nearer the pole than 89.9° is refused with a message (exit 2)', () => {
    for (const lat of [90, -89.95]) {
      const path = editedScenario('drone-power-loss.json', (s) => (s.site.pad.lat = lat));
      const r = strewn(['check', path]);
      expect(r.status).toBe(2);
      expect(r.stderr).toContain('site.pad.lat');
      expect(r.stderr).toContain('within 0.1° (11 km) of a pole');
    }
  });

  it('analyze --pad refuses a pad nearer the pole than 89.9°', () => {
    const r = strewn(['analyze', 'x.csv', '--pad', '89.95,10']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('of a pole');
  });
});
