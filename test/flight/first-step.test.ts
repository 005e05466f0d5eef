import { describe, expect, it } from 'vitest';
import { firstStepSize } from '../../src/flight/first-step.js';

// The starting step size of Hairer, Nørsett & Wanner, Solving ODEs I, §II.4 (from memory):
// d0 = ‖y'‖, d1 = ‖(f(y + h0 y') − y')‖ / h0, h1 = (0.01 / max(d0, d1))^(1/(q+1)), h = min(100 h0, h1).
describe('firstStepSize', () => {
  const decay = (lambda: number) => ({
    derivative(_t: Float64Array, y: Float64Array, dy: Float64Array) {
      dy[0] = lambda * y[0];
    },
  });

  it('gives the closed form for y′ = λy', () => {
    const y = Float64Array.of(1);
    const f0 = Float64Array.of(-2);
    const h = firstStepSize(decay(-2), new Float64Array(1), 0, 0.01, 10, y, f0, new Float64Array(1), new Float64Array(1), Float64Array.of(0), 1e-6, 1, 1, 0.2);
    // d0 = 2 / 1e-6, d1 = |λ² h0 y| / (h0 · 1e-6) = 4 / 1e-6: h1 = (0.01 / 4e6)^(1/5).
    expect(h).toBeCloseTo(Math.pow(0.01 / 4e6, 0.2), 12);
  });

  it('never exceeds 100 h0 nor hMax, and counts only the first normCount components', () => {
    const calm = { derivative: (_t: Float64Array, _y: Float64Array, dy: Float64Array) => dy.fill(0) };
    const y = Float64Array.of(1, 1e9);
    const zero = new Float64Array(2);
    expect(firstStepSize(calm, new Float64Array(1), 0, 0.01, 10, y, zero, new Float64Array(2), new Float64Array(2), Float64Array.of(1, 1), 1e-6, 2, 2, 0.2)).toBeCloseTo(1e-5, 15);
    // A fast second component left out of the norm does not shorten the step.
    const fast = { derivative: (_t: Float64Array, yy: Float64Array, dy: Float64Array) => { dy[0] = 0; dy[1] = -1e6 * yy[1]; } };
    const f0 = Float64Array.of(0, -1e15);
    expect(firstStepSize(fast, new Float64Array(1), 0, 0.01, 0.5, y, f0, new Float64Array(2), new Float64Array(2), Float64Array.of(1, 1), 1e-6, 2, 1, 0.2)).toBeCloseTo(1e-5, 15);
  });
});
