import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { unitSlipWarnings } from '../../src/scenario/unit-slips.js';
import { fixture } from './helpers.js';

/**
 * Ranges of common practice per vehicle kind (common practice, no source): rockets 10–400 mm
 * across, display shells 20–400 mm, rails 0.3–20 m, drones flown below about 150 m. The unit
 * factors (1 in = 25.4 mm, 1 lb = 0.45359237 kg, 1 ft = 0.3048 m) are the 1959 international
 * yard and pound definitions.
 */
function warnings(change: (s: Record<string, any>) => void) {
  const s = fixture('minimal-rocket.json');
  change(s);
  return parseScenario(s).warnings;
}

describe('likely unit slips', () => {
  it('says "did you mean 4 in?" for a rocket diameter of 4 (read as 4 m)', () => {
    const found = warnings((s) => {
      delete s.vehicle.referenceArea;
      s.vehicle.diameter = 4;
    });
    const slip = found.find((w) => w.path === 'vehicle.diameter');
    expect(slip?.message).toBe("4 m is outside the 10–400 mm common for a rocket's diameter; a plain number is in metres: did you mean '4 in'?");
  });

  it('offers every unit that fits, and says nothing for a value inside the range', () => {
    expect(warnings((s) => (s.vehicle.mass = 1200)).find((w) => w.path === 'vehicle.mass')?.message).toContain("did you mean '1200 g' or '1200 oz'?");
    expect(warnings((s) => (s.vehicle.mass = 60)).find((w) => w.path === 'vehicle.mass')?.message).toContain("did you mean '60 oz' or '60 g' or '60 lb'?");
    expect(warnings((s) => (s.vehicle.mass = 1.2)).filter((w) => w.path === 'vehicle.mass')).toEqual([]);
    expect(warnings((s) => (s.launch.rail = 72)).find((w) => w.path === 'launch.rail')?.message).toContain("did you mean '72 in'?");
  });

  it('warns without a guess when the value was written with a unit', () => {
    const w = warnings((s) => (s.vehicle.mass = '300 kg')).find((x) => x.path === 'vehicle.mass');
    expect(w?.message).toBe("300 kg is outside the 0.01–50 kg common for a rocket's mass without propellant; check the value and its unit");
  });

  it('judges by vehicle kind: 150 mm is a rocket diameter, 150 m a drone height, 400 a drone height in feet', () => {
    const raw = (kind: string, extra: Record<string, unknown>) => ({ vehicle: { kind, mass: 1, diameter: 0.15 }, launch: extra });
    expect(unitSlipWarnings(raw('rocket', { rail: 1.5 }), 'rocket')).toEqual([]);
    expect(unitSlipWarnings(raw('release', { height: 400, speed: 5 }), 'release')[0]!.message).toContain("did you mean '400 ft'?");
    expect(unitSlipWarnings(raw('projectile', { speed: 300, height: 0 }), 'projectile')[0]!.message).toContain("did you mean '300 km/h' or '300 ft/s' or '300 mph'?");
  });

  it('for a wind of 30, suggests mph only as a slip (the surface-wind warning covers the rest)', () => {
    const found = warnings((s) => (s.weather.wind.speed = 30));
    const wind = found.filter((w) => w.path === 'weather.wind.speed');
    expect(wind).toHaveLength(1);
    expect(wind[0]!.message).toMatch(/^30 m\/s is above the 9 m\/s .*; a plain number is in m\/s: did you mean '30 km\/h' or '30 mph' or '30 kn'\?$/);
    expect(warnings((s) => (s.weather.wind.speed = '30 m/s')).filter((w) => w.path === 'weather.wind.speed')).toHaveLength(1);
  });
});
