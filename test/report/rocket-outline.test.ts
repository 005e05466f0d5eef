import { describe, expect, it } from 'vitest';
import { bodyRadius, noseRadius, rocketOutline } from '../../src/report/rocket-outline.js';
import type { RocketShape } from '../../src/scenario/types.js';

// Invented 54 mm rocket with a boattail; every expected value is worked from plane geometry here.
const shape: RocketShape = {
  nose: { form: 'ogive', length: 0.25 },
  transitions: [{ position: 1.0, length: 0.05, foreDiameter: 0.054, aftDiameter: 0.044 }],
  fins: [{ count: 3, position: 0.85, rootChord: 0.12, tipChord: 0.05, span: 0.07, sweep: 0.06 }],
  length: 1.05,
  cg: 0.6,
  inertia: 0.08,
  motorEnd: 1.05,
};

describe('rocket side view geometry', () => {
  it('nose profiles meet the body at its radius; the ogive and parabola tangentially (plane geometry)', () => {
    const R = 0.027;
    const L = 0.25;
    for (const form of ['cone', 'ogive', 'parabola'] as const) {
      expect(noseRadius(form, 0, R, L)).toBeCloseTo(0, 12);
      expect(noseRadius(form, L, R, L)).toBeCloseTo(R, 12);
    }
    // Cone: straight line; at mid-length half the radius.
    expect(noseRadius('cone', L / 2, R, L)).toBeCloseTo(R / 2, 12);
    // Parabola 2t - t²: at mid-length 3/4 of R.
    expect(noseRadius('parabola', L / 2, R, L)).toBeCloseTo(0.75 * R, 12);
    // Tangent ogive: zero slope at the base (tangent to the tube), fuller than a cone at mid-length.
    const h = 1e-6;
    expect((noseRadius('ogive', L, R, L) - noseRadius('ogive', L - h, R, L)) / h).toBeLessThan(1e-3);
    // Arc radius rho = (R² + L²)/(2R); at mid-length r = sqrt(rho² - (L/2)²) + R - rho.
    const rho = (R * R + L * L) / (2 * R);
    expect(noseRadius('ogive', L / 2, R, L)).toBeCloseTo(Math.sqrt(rho * rho - (L / 2) ** 2) + R - rho, 12);
    expect(noseRadius('ogive', L / 2, R, L)).toBeGreaterThan(R / 2);
  });

  it('the body follows tube and boattail; the outline is closed and symmetric about the axis', () => {
    expect(bodyRadius(shape, 0.054, 0.6)).toBeCloseTo(0.027, 12);
    expect(bodyRadius(shape, 0.054, 1.025)).toBeCloseTo((0.027 + 0.022) / 2, 12);
    expect(bodyRadius(shape, 0.054, 1.05)).toBeCloseTo(0.022, 12);
    const o = rocketOutline(shape, 0.054);
    expect(o.length).toBe(1.05);
    expect(o.body[0]).toEqual([0, 0]);
    const xs = o.body.map((p) => p[0]);
    expect(Math.max(...xs)).toBeCloseTo(1.05, 12);
    // For every upper point there is its mirror image below.
    const upper = o.body.filter((p) => p[1] > 0);
    for (const [x, y] of upper) expect(o.body.some((q) => q[0] === x && q[1] === -y)).toBe(true);
  });

  it('a 3-fin set shows one fin at full span above and the others at half span below (cos 60°)', () => {
    const o = rocketOutline(shape, 0.054);
    expect(o.fins).toHaveLength(2);
    const [up, down] = o.fins as [Array<[number, number]>, Array<[number, number]>];
    expect(up[0]).toEqual([0.85, 0.027]);
    expect(up[1]![0]).toBeCloseTo(0.91, 12);
    expect(up[1]![1]).toBeCloseTo(0.097, 12);
    expect(up[2]![0]).toBeCloseTo(0.96, 12);
    expect(up[3]![0]).toBeCloseTo(0.97, 12);
    expect(down[1]![1]).toBeCloseTo(-(0.027 + 0.035), 12);
    expect(o.halfHeight).toBeCloseTo(0.097, 12);
    const four = rocketOutline({ ...shape, fins: [{ ...shape.fins[0]!, count: 4 }] }, 0.054);
    expect(four.fins[1]![1]![1]).toBeCloseTo(-0.097, 12);
  });
});
