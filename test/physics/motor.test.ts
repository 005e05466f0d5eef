import { describe, expect, it } from 'vitest';
import { MotorModel } from '../../src/physics/motor.js';

const curve = { time: [0, 0.1, 1, 2], thrust: [0, 200, 100, 0] };
const motor = () => new MotorModel({ thrust: curve, source: 'inline', propellantMass: 0.2 });

describe('motor from a thrust curve', () => {
  it('total impulse is the area under the linear curve (trapezoids, exact for linear segments)', () => {
    // 0.5·0.1·200 + 0.9·150 + 0.5·1·100 = 10 + 135 + 50
    expect(motor().nominalImpulse).toBeCloseTo(195, 12);
  });

  it('propellant falls in proportion to the impulse delivered (common practice, no source)', () => {
    const m = motor();
    expect(m.propellantAt(0)).toBeCloseTo(0.2, 12);
    // At t = 1 the delivered impulse is 10 + 135 = 145 of 195.
    expect(m.propellantAt(1)).toBeCloseTo(0.2 * (1 - 145 / 195), 12);
    expect(m.propellantAt(2)).toBe(0);
    m.evaluate(0.55);
    expect(m.thrustNow).toBeCloseTo(150, 9);
  });

  it('an impulse scale scales thrust and keeps the burn time and the propellant schedule', () => {
    const m = motor();
    m.setImpulseScale(1.1);
    expect(m.thrustAt(1)).toBeCloseTo(110, 9);
    expect(m.burnTime).toBe(2);
    expect(m.propellantAt(1)).toBeCloseTo(0.2 * (1 - 145 / 195), 12);
    expect(m.thrustAt(2.5)).toBe(0);
  });
});
