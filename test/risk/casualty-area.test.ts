import { describe, expect, it } from 'vitest';
import { casualtyArea, MIN_IMPACT_ANGLE_DEG } from '../../src/risk/casualty-area.js';
import { casualtyChance, impactEnergy } from '../../src/risk/harm.js';

// Basic casualty area A_c = π(R_p + R_o)² + 2(R_p + R_o) h_p / tan γ (from memory, as range-safety
// debris analyses use it), worked by hand for R_p = 0.3 m, R_o = 0.05 m, h_p = 1.8 m.
describe('casualty area against the formula worked by hand', () => {
  it('vertical impact: π · 0.35² = 0.384845 m² (no strip)', () => {
    expect(casualtyArea(0.3, 0.05, 1.8, 90)).toBeCloseTo(0.384845, 5);
  });
  it('45° impact: 0.384845 + 2 · 0.35 · 1.8 / 1 = 1.644845 m²', () => {
    expect(casualtyArea(0.3, 0.05, 1.8, 45)).toBeCloseTo(1.644845, 5);
  });
  it('30° impact: 0.384845 + 1.26 / tan 30° = 0.384845 + 2.182384 = 2.567229 m²', () => {
    expect(casualtyArea(0.3, 0.05, 1.8, 30)).toBeCloseTo(2.567229, 5);
  });
  it(`grazing paths are held at ${MIN_IMPACT_ANGLE_DEG}° instead of growing without bound`, () => {
    expect(casualtyArea(0.3, 0.05, 1.8, 1)).toBeCloseTo(casualtyArea(0.3, 0.05, 1.8, MIN_IMPACT_ANGLE_DEG), 12);
    expect(Number.isFinite(casualtyArea(0.3, 0.05, 1.8, 0))).toBe(true);
  });
});

describe('casualty chance by energy', () => {
  it('threshold: 1 at or above the casualty energy, 0 below (½ m v² by hand: 1.2 kg at 5 m/s is 15 J)', () => {
    expect(impactEnergy(1.2, 5)).toBeCloseTo(15, 12);
    const threshold = { casualtyEnergy: 15, casualtyProbability: null };
    expect(casualtyChance(15, threshold)).toBe(1);
    expect(casualtyChance(14.99, threshold)).toBe(0);
  });
  it('table: linear between rows, held outside (common practice, no source)', () => {
    const table = { casualtyEnergy: 15, casualtyProbability: { energy: [10, 100, 1000], probability: [0, 0.5, 1] } };
    expect(casualtyChance(5, table)).toBe(0);
    expect(casualtyChance(55, table)).toBeCloseTo(0.25, 12);
    expect(casualtyChance(550, table)).toBeCloseTo(0.75, 12);
    expect(casualtyChance(5000, table)).toBe(1);
  });
});
