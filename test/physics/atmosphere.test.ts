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
    // 1 km above the pad: standard temperature drop of 6.5 K (U.S. Standard Atmosphere, 1976).
    const std = standardAtmosphere(2000 * (6356766 / (6356766 + 2000)));
    const stdPad = standardAtmosphere(1000 * (6356766 / (6356766 + 1000)));
    const expected = ((90000 * std.pressure) / stdPad.pressure) / (287.05287 * (std.temperature + 300 - stdPad.temperature));
    expect(Math.abs(air.densityAt(1000) / expected - 1)).toBeLessThan(1e-6);
  });

  it('defaults to the standard atmosphere at the pad elevation', () => {
    const air = new AirModel(0);
    expect(air.densityAt(0)).toBeCloseTo(1.225, 4);
    expect(air.speedOfSoundAt(0)).toBeCloseTo(340.29, 2);
  });
});
