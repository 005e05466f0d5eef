import { describe, expect, it } from 'vitest';
import { MeanWind } from '../../src/physics/wind.js';

const out = new Float64Array(2);
function vector(w: MeanWind, z: number) {
  w.at(z, out);
  return { east: out[0], north: out[1], speed: Math.hypot(out[0], out[1]) };
}

describe('mean wind by height', () => {
  it('power law U(z) = U_ref (z/z_ref)^α (Hellmann; common practice)', () => {
    const w = new MeanWind({ speed: 5, from: 270, height: 10, shear: 1 / 7 });
    for (const z of [1, 2, 10, 37, 100, 850, 3000]) {
      expect(Math.abs(vector(w, z).speed / (5 * (z / 10) ** (1 / 7)) - 1)).toBeLessThan(1e-4);
    }
    expect(vector(w, 0).speed).toBe(0);
  });

  it('"from" is where the wind blows from: from 270° moves air toward the east', () => {
    const w = new MeanWind({ speed: 5, from: 270, height: 10, shear: 0 });
    const v = vector(w, 50);
    expect(v.east).toBeCloseTo(5, 9);
    expect(v.north).toBeCloseTo(0, 9);
    const south = vector(new MeanWind({ speed: 4, from: 180, height: 10, shear: 0 }), 50);
    expect(south.north).toBeCloseTo(4, 9);
  });

  it('a sample can change the speed and turn the whole wind', () => {
    const w = new MeanWind({ speed: 5, from: 270, height: 10, shear: 0 });
    w.setSample(8, 90); // from 360°: air moves south
    const v = vector(w, 50);
    expect(v.north).toBeCloseTo(-8, 9);
    expect(v.east).toBeCloseTo(0, 9);
  });

  it('a profile interpolates speed and direction (shorter arc) between rows and holds the top row', () => {
    const w = new MeanWind({
      speed: 4, from: 350, height: 10, shear: 0.14,
      profile: [
        { altitude: 100, speed: 6, from: 350 },
        { altitude: 500, speed: 10, from: 30 },
      ],
    });
    // Half-way: 8 m/s from 10° (350° → 30° turns through north).
    const mid = vector(w, 300);
    expect(mid.speed).toBeCloseTo(8, 2);
    const from = (Math.atan2(-mid.east, -mid.north) * 180) / Math.PI;
    expect(from).toBeCloseTo(10, 1);
    expect(vector(w, 2000).speed).toBeCloseTo(10, 6);
    // Below the lowest row: the power law anchored on it.
    expect(vector(w, 25).speed).toBeCloseTo(6 * (25 / 100) ** 0.14, 3);
  });
});
