import { describe, expect, it } from 'vitest';
import {
  aeroTable,
  balanceAndInertia,
  bodyRadiusAt,
  finMachFactor,
  finTerm,
  massLayout,
  noseTerm,
  slopeAndCp,
  transitionTerm,
} from '../../src/physics/aero.js';
import type { FinSet, RocketShape } from '../../src/scenario/types.js';

// J. S. Barrowman, "The Practical Calculation of the Aerodynamic Characteristics of Slender
// Finned Vehicles" (1967), subsonic normal-force slopes and centres of pressure, as the scenario
// format restates them. Each expected value is worked by hand below from those formulas.

const d = 0.1; // body diameter, m

describe('Barrowman normal-force slopes and centres of pressure (Barrowman 1967)', () => {
  it.each([
    ['cone', 0.3, 0.2], // 2/3 · 0.3
    ['ogive', 0.3, 0.1398], // 0.466 · 0.3
    ['parabola', 0.3, 0.15], // 1/2 · 0.3
  ] as const)('%s nose: CNα = 2 at its CP', (form, length, cp) => {
    const n = noseTerm(form, length);
    expect(n.cnAlpha).toBe(2);
    expect(n.cp).toBeCloseTo(cp, 12);
  });

  it('boattail 100 → 80 mm over 50 mm at 1.0 m: CNα = 2[(0.8)² − 1] = −0.72, CP 1.0240741 m', () => {
    // CP = 1.0 + (0.05/3)[1 + 1/(1 + 0.1/0.08)] = 1.0 + 0.0166667 · 1.4444444 = 1.0240741
    const t = transitionTerm({ position: 1, length: 0.05, foreDiameter: 0.1, aftDiameter: 0.08 }, d);
    expect(t.cnAlpha).toBeCloseTo(-0.72, 12);
    expect(t.cp).toBeCloseTo(1.0240741, 6);
  });

  it('shoulder 50 → 100 mm over 60 mm at 0.4 m: CNα = 2(1 − 0.25) = 1.5, CP 0.4333333 m', () => {
    // CP = 0.4 + (0.06/3)[1 + 1/(1 + 0.5)] = 0.4 + 0.02 · 1.6666667 = 0.4333333
    const t = transitionTerm({ position: 0.4, length: 0.06, foreDiameter: 0.05, aftDiameter: 0.1 }, d);
    expect(t.cnAlpha).toBeCloseTo(1.5, 12);
    expect(t.cp).toBeCloseTo(0.4333333, 6);
  });

  const fin = (count: 3 | 4): FinSet => ({ count, position: 1.0, rootChord: 0.2, tipChord: 0.1, span: 0.1, sweep: 0.1 });
  // l_m = sqrt(0.1² + (0.1 + 0.05 − 0.1)²) = 0.1118034; 2 l_m/(Cr + Ct) = 0.7453560;
  // 1 + sqrt(1 + 0.5555556) = 2.2472191; interference 1 + 0.05/(0.1 + 0.05) = 1.3333333.
  // CP = 1.0 + 0.1(0.2 + 0.2)/(3 · 0.3) + [0.3 − 0.02/0.3]/6 = 1.0 + 0.0444444 + 0.0388889 = 1.0833333
  it('four fins: CNα = 1.3333333 · 16 / 2.2472191 = 9.4932 at 1.0833333 m', () => {
    const f = finTerm(fin(4), d, 0.05);
    expect(f.cnAlpha).toBeCloseTo((1.3333333 * 16) / 2.2472191, 5);
    expect(f.cnAlpha).toBeCloseTo(9.4932, 3);
    expect(f.cp).toBeCloseTo(1.0833333, 6);
  });

  it('three fins: CNα = 1.3333333 · 12 / 2.2472191 = 7.1199, same CP', () => {
    const f = finTerm(fin(3), d, 0.05);
    expect(f.cnAlpha).toBeCloseTo(7.1199, 3);
    expect(f.cp).toBeCloseTo(1.0833333, 6);
  });

  it('Prandtl–Glauert factor on the fins, 1/sqrt(1 − M²), capped at Mach 0.8', () => {
    expect(finMachFactor(0)).toBe(1);
    expect(finMachFactor(0.5)).toBeCloseTo(1 / Math.sqrt(0.75), 12); // 1.1547005
    expect(finMachFactor(0.8)).toBeCloseTo(1 / 0.6, 12);
    expect(finMachFactor(0.95)).toBeCloseTo(1 / 0.6, 12);
    expect(finMachFactor(2)).toBeCloseTo(1 / 0.6, 12);
  });

  const shape: RocketShape = {
    nose: { form: 'cone', length: 0.3 },
    transitions: [{ position: 1.15, length: 0.05, foreDiameter: 0.1, aftDiameter: 0.08 }],
    fins: [fin(4)],
    length: 1.2,
    cg: 0.7,
    inertia: 0.5,
    motorEnd: 1.2,
  };

  it('the whole rocket: slopes add, the CP is the slope-weighted mean; only the fins feel the Mach factor', () => {
    const table = aeroTable(shape, d);
    const nose = 2, ncp = 0.2;
    const bt = -0.72, btcp = 1.15 + (0.05 / 3) * (1 + 1 / (1 + 1.25));
    const fn = 9.4932, fcp = 1.0833333;
    const m0 = slopeAndCp(table, 0);
    expect(m0.cnAlpha).toBeCloseTo(nose + bt + fn, 3);
    expect(m0.cp).toBeCloseTo((nose * ncp + bt * btcp + fn * fcp) / (nose + bt + fn), 4);
    const m5 = slopeAndCp(table, 0.5);
    const k = 1 / Math.sqrt(0.75);
    expect(m5.cnAlpha).toBeCloseTo(nose + bt + k * fn, 3);
    expect(m5.cp).toBeCloseTo((nose * ncp + bt * btcp + k * fn * fcp) / (nose + bt + k * fn), 4);
  });

  it('the interference term uses the body radius at the fin root: behind a boattail it is smaller', () => {
    const onBoattail: RocketShape = { ...shape, fins: [{ ...fin(4), position: 1.175, rootChord: 0.02, tipChord: 0.01, sweep: 0.01 }] };
    // halfway along the boattail, diameter 0.09 m → radius 0.045 m
    expect(bodyRadiusAt(onBoattail, d, 1.175)).toBeCloseTo(0.045, 12);
    const table = aeroTable(onBoattail, d);
    const expected = finTerm(onBoattail.fins[0], d, 0.045).cnAlpha;
    expect(table.f0).toBeCloseTo(expected, 12);
    expect(table.f0).not.toBeCloseTo(finTerm(onBoattail.fins[0], d, 0.05).cnAlpha, 6);
  });

  it('nose profiles: a tangent ogive meets the body with its full radius; cone and parabola as their formulas', () => {
    for (const form of ['cone', 'ogive', 'parabola'] as const) {
      const s = { ...shape, nose: { form, length: 0.3 } };
      expect(bodyRadiusAt(s, d, 0.3 - 1e-12)).toBeCloseTo(0.05, 8);
    }
    expect(bodyRadiusAt({ ...shape, nose: { form: 'cone', length: 0.3 } }, d, 0.15)).toBeCloseTo(0.025, 12);
    expect(bodyRadiusAt({ ...shape, nose: { form: 'parabola', length: 0.3 } }, d, 0.15)).toBeCloseTo(0.05 * 0.75, 12);
    // tangent ogive: ρ = (R² + L²)/(2R) = (0.0025 + 0.09)/0.1 = 0.925; r(0.15) = sqrt(ρ² − 0.15²) + R − ρ
    expect(bodyRadiusAt({ ...shape, nose: { form: 'ogive', length: 0.3 } }, d, 0.15)).toBeCloseTo(Math.sqrt(0.925 ** 2 - 0.0225) + 0.05 - 0.925, 12);
  });
});

describe('mass and inertia by the format rules (parallel-axis theorem)', () => {
  it('dry balance point and own inertia from the ready-to-fly figures; at full propellant they come back', () => {
    // 1.2 kg dry + 0.3 kg propellant at 1.0 m, ready-to-fly cg 0.8 m:
    // dry cg = (1.5 · 0.8 − 0.3 · 1.0)/1.2 = 0.75; own inertia = 0.2 − 1.2 · 0.05² − 0.3 · 0.2² = 0.185
    const m = massLayout(1.2, 0.3, 0.8, 0.2, 1.0);
    expect(m.dryCg).toBeCloseTo(0.75, 12);
    expect(m.dryInertia).toBeCloseTo(0.185, 12);
    const full = balanceAndInertia(m, 0.3);
    expect(full.cg).toBeCloseTo(0.8, 12);
    expect(full.inertia).toBeCloseTo(0.2, 12);
    const empty = balanceAndInertia(m, 0);
    expect(empty.cg).toBeCloseTo(0.75, 12);
    expect(empty.inertia).toBeCloseTo(0.185, 12);
  });
});
