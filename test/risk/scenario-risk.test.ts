import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { fixture, fixtureReader, issuesOf } from '../scenario/helpers.js';

// The `risk` block and the area fields as scenario-format.md ("risk") fixes them.
describe('risk block in the scenario', () => {
  it('reads energies with units (1 ft·lbf = 1.3558 J, exact definitions of foot and pound-force)', () => {
    const json = fixture('minimal-rocket.json');
    json.risk = { casualtyEnergy: '11 ft lbf', personRadius: '30 cm', levels: [1e-6, 1e-4], criteria: { individual: 1e-6, collective: 1e-4 } };
    const { scenario } = parseScenario(json, fixtureReader);
    expect(scenario.risk!.casualtyEnergy).toBeCloseTo(11 * 0.3048 * 4.4482216152605, 10);
    expect(scenario.risk!.personRadius).toBeCloseTo(0.3, 12);
    expect(scenario.risk!.levels).toEqual([1e-4, 1e-6]);
    expect(scenario.risk!.criteria).toEqual({ individual: 1e-6, collective: 1e-4 });
  });

  it('a scenario without the block keeps no risk field (its hash stays)', () => {
    const { scenario } = parseScenario(fixture('minimal-rocket.json'), fixtureReader);
    expect(scenario.risk).toBeUndefined();
  });

  it('refuses an energy without its dimension, a table that falls, both threshold and table, people and density together', () => {
    const json = fixture('minimal-rocket.json');
    json.risk = { casualtyEnergy: '15 kg', casualtyProbability: [['10 J', 0.5], ['100 J', 0.2]] };
    json.site.areas = [{ name: 'a', kind: 'other', people: 3, density: 0.1, sheltered: 1.5, geometry: { type: 'Polygon', coordinates: [[[0, 0], [0.001, 0], [0.001, 0.001], [0, 0]]] } }];
    const paths = issuesOf(json, fixtureReader).map((i) => `${i.path}: ${i.message}`);
    expect(paths.some((p) => p.startsWith('risk.casualtyEnergy') && /energy/.test(p))).toBe(true);
    expect(paths.some((p) => p.startsWith('risk.casualtyProbability[1][1]'))).toBe(true);
    expect(paths.some((p) => p.startsWith('risk.casualtyProbability:') && /not both/.test(p))).toBe(true);
    expect(paths.some((p) => p.startsWith('site.areas[0].density') && /not both/.test(p))).toBe(true);
    expect(paths.some((p) => p.startsWith('site.areas[0].sheltered'))).toBe(true);
  });
});
