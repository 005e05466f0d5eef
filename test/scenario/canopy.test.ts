import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { descentRateAtDensity, dragAreaForDescentRate } from '../../src/scenario/normalize.js';
import { fixture } from './helpers.js';

/**
 * A canopy of nominal diameter D and drag coefficient Cd (referred to π D²/4) has the drag area
 * Cd π D²/4, and under mass m falls steadily at v = sqrt(2 m g / (ρ Cd A)), from m g = ½ ρ v² Cd A
 * (the steady-descent balance in any parachute text, e.g. Knacke, Parachute Recovery Systems Design
 * Manual, 1992, from memory). 36 in = 0.9144 m (1959 international inch).
 */
describe('parachutes by diameter and drag coefficient', () => {
  it('gives the drag area Cd π D²/4 and keeps the canopy as written', () => {
    const s = fixture('minimal-rocket.json');
    delete s.recovery[1].descentRate;
    Object.assign(s.recovery[1], { diameter: '36 in', drag: 0.8, canopy: 'flat circular, 8 gores' });
    const stage = parseScenario(s).scenario.recovery[1]!;
    expect(stage.dragArea).toBeCloseTo((0.8 * Math.PI * 0.9144 ** 2) / 4, 12);
    expect(stage.canopy).toEqual({ diameter: 0.9144, drag: 0.8, note: 'flat circular, 8 gores' });
  });

  it('a descent rate and a drag area still work as before', () => {
    const s = fixture('minimal-rocket.json');
    const sc = parseScenario(s).scenario;
    const given = sc.recovery.find((r) => r.descentRate !== undefined)!;
    expect(given.dragArea).toBeCloseTo(dragAreaForDescentRate(sc.vehicle.mass, given.descentRate!), 12);
  });

  it('descent rate at density: 1 kg under 0.5 m² at 1.225 kg/m³ falls at sqrt(2·9.80665/(1.225·0.5)) = 5.659 m/s', () => {
    expect(descentRateAtDensity(1, 0.5, 1.225)).toBeCloseTo(5.6589, 3);
    // Thinner air at a high pad: faster, by sqrt(1.225 / 1.0).
    expect(descentRateAtDensity(1, 0.5, 1.0) / descentRateAtDensity(1, 0.5, 1.225)).toBeCloseTo(Math.sqrt(1.225), 12);
  });
});
