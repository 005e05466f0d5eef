import { describe, expect, it } from 'vitest';
import { standardAtmosphere } from '../../src/physics/atmosphere.js';
import { AirModel } from '../../src/physics/air.js';

// U.S. Standard Atmosphere, 1976 (NOAA/NASA/USAF), by geopotential altitude.
const TABLE: [number, number, number, number][] = [
  // h (m), T (K), p (Pa), rho (kg/m³)
  [0, 288.15, 101325, 1.225],
  [1000, 281.65, 89874.6, 1.1116],
  [5000, 255.65, 54019.9, 0.73612],
  [11000, 216.65, 22632.0, 0.36392],
  [20000, 216.65, 5474.9, 0.088035],
  [32000, 228.65, 868.02, 0.013225],
];

describe('standard atmosphere (U.S. Standard Atmosphere, 1976)', () => {
  it.each(TABLE)('at %d m', (h, t, p, rho) => {
    const s = standardAtmosphere(h);
    expect(s.temperature).toBeCloseTo(t, 2);
    expect(Math.abs(s.pressure / p - 1)).toBeLessThan(2e-5);
    expect(Math.abs(s.density / rho - 1)).toBeLessThan(1e-4);
  });

  it('speed of sound at sea level is 340.29 m/s (U.S. Standard Atmosphere, 1976)', () => {
    expect(standardAtmosphere(0).speedOfSound).toBeCloseTo(340.29, 2);
  });

  it('reaches 47 km: 270.65 K at the stratopause (U.S. Standard Atmosphere, 1976, layer table)', () => {
    expect(standardAtmosphere(47000).temperature).toBeCloseTo(270.65, 2);
  });
});

describe('air shifted to the pad', () => {
  it('matches the given pad temperature and pressure and keeps the standard lapse rate', () => {
    const air = new AirModel(1000, 300, 90000);
    expect(air.densityAt(0)).toBeCloseTo(90000 / (287.05287 * 300), 6);
    // 1 km above the pad the temperature is the standard one plus the pad's offset (U.S. Standard
    // Atmosphere, 1976, lapse 6.5 K/km), and the pressure follows from the hydrostatic equation
    // dp/dH = −g0 p / (R T) in geopotential height, integrated here by Simpson's rule.
    const geo = (z: number) => (6356766 * z) / (6356766 + z);
    const offset = 300 - standardAtmosphere(geo(1000)).temperature;
    const tAt = (h: number) => standardAtmosphere(h).temperature + offset;
    const h0 = geo(1000), h1 = geo(2000), n = 2000;
    let integral = 0;
    for (let i = 0; i <= n; i++) {
      const h = h0 + ((h1 - h0) * i) / n;
      integral += (i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2) / tAt(h);
    }
    integral *= (h1 - h0) / (3 * n);
    const p = 90000 * Math.exp((-9.80665 / 287.05287) * integral);
    const expected = p / (287.05287 * tAt(h1));
    expect(Math.abs(air.densityAt(1000) / expected - 1)).toBeLessThan(1e-6);
    // The old shortcut (standard pressure ratio scaled to the pad) is about 1 % off on a hot, high
    // pad at 1 km: the check above must be able to tell the two apart.
    const stdRatio = standardAtmosphere(h1).pressure / standardAtmosphere(h0).pressure;
    expect(Math.abs((90000 * stdRatio) / (287.05287 * tAt(h1)) / expected - 1)).toBeGreaterThan(1e-3);
  });

  it('on a standard-temperature day reproduces the standard pressure ratio (U.S. Standard Atmosphere, 1976)', () => {
    // 0 m pad, standard temperature, pressure 101325 Pa: the reference table's values above the pad.
    // The table is by geopotential altitude H; the model takes geometric height z = r H / (r − H).
    const air = new AirModel(0);
    const z = (h: number) => (6356766 * h) / (6356766 - h);
    expect(air.densityAt(z(1000)) / 1.1116).toBeCloseTo(1, 4);
    expect(air.densityAt(z(5000)) / 0.73612).toBeCloseTo(1, 4);
    expect(air.densityAt(z(11000)) / 0.36392).toBeCloseTo(1, 4);
    expect(air.densityAt(z(20000)) / 0.088035).toBeCloseTo(1, 4);
  });

  it('reaches below the pad for ground lower than the pad (valleys)', () => {
    const air = new AirModel(500);
    // 400 m below a 500 m pad is 100 m above sea level: standard density there, 1.2133 kg/m³
    // (U.S. Standard Atmosphere, 1976, from its formulas).
    expect(air.densityAt(-400)).toBeCloseTo(standardAtmosphere((6356766 * 100) / (6356766 + 100)).density, 5);
    expect(air.densityAt(-400)).toBeGreaterThan(air.densityAt(0));
  });

  it('defaults to the standard atmosphere at the pad elevation', () => {
    const air = new AirModel(0);
    expect(air.densityAt(0)).toBeCloseTo(1.225, 4);
    expect(air.speedOfSoundAt(0)).toBeCloseTo(340.29, 2);
  });
});
