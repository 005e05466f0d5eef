import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { fixtureReader } from './helpers.js';

// GeoJSON positions are [longitude, latitude] (RFC 7946, section 3.1.1).
const SCENARIOS = join(import.meta.dirname, '../../scenarios');

function club(change: (s: Record<string, any>) => void) {
  const s = JSON.parse(readFileSync(join(SCENARIOS, 'club-rocket.json'), 'utf8'));
  change(s);
  return parseScenario(s, { baseDir: SCENARIOS, readText: fixtureReader.readText }).warnings;
}

const swap = (g: { coordinates: number[][][] }) => void (g.coordinates = g.coordinates.map((r) => r.map(([a, b]) => [b!, a!])));

describe('swapped coordinates and a pad outside its boundary', () => {
  it('the demo site as written has no geometry warning', () => {
    expect(club(() => {}).filter((w) => w.path.startsWith('site'))).toEqual([]);
  });

  it('names a boundary written as [lat, lon] and the likely swap', () => {
    const w = club((s) => swap(s.site.boundary)).filter((x) => x.path === 'site.boundary');
    expect(w).toHaveLength(1);
    expect(w[0]!.message).toContain('look like [lat, lon] (first [47.307337,8.011895])');
    expect(w[0]!.message).toContain('write [8.011895, 47.307337]');
  });

  it('names a swapped area by its name', () => {
    const w = club((s) => swap(s.site.areas[1].geometry)).filter((x) => x.path.startsWith('site.areas'));
    expect(w.map((x) => x.path)).toEqual(['site.areas[1].geometry']);
    expect(w[0]!.message).toMatch(/^area 'Car park' lies [\d,]+ km from the pad as written/);
  });

  it('warns when the pad lies outside its own boundary', () => {
    // North of the field's north-west corner (8.012558, 47.318371) by 0.0166° of latitude (1.85 km)
    // and 0.0086° of longitude (0.65 km at this latitude): about 1.96 km, by hand.
    const w = club((s) => (s.site.pad.lat = 47.335)).filter((x) => x.path === 'site.boundary');
    expect(w).toHaveLength(1);
    expect(w[0]!.message).toMatch(/^the pad \(lat 47\.335, lon 8\.02117\) lies outside the boundary, about 2\.0 km from its nearest corner/);
  });
});
