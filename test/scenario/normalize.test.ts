import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { dragAreaForDescentRate, descentRateForDragArea, normalizeDirection } from '../../src/scenario/normalize.js';
import { UNCERTAINTY_NAMES, type Scenario } from '../../src/scenario/types.js';
import { fixture, fixtureReader } from './helpers.js';

/**
 * Expected SI values are worked out by hand from the unit definitions (foot = 0.3048 m,
 * pound = 0.45359237 kg: International Yard and Pound Agreement, 1959; knot = 1852/3600 m/s:
 * SI Brochure 8th ed., Table 8; K = °C + 273.15: SI Brochure 9th ed.) and from the format's own
 * rules (reference area π d²/4; descent rate v stands for Cd·A = 2 m g0 / (1.225 v²)).
 */
const close = (value: number) => expect.closeTo(value, 9);

const MASS = 1.587573295; // 3.5 lb
const DROGUE_RATE = 18.288; // 60 ft/s
const MAIN_RATE = 5.4864; // 18 ft/s

const minimalExpected: Scenario = {
  strewn: 1,
  name: 'Minimal test rocket',
  site: { pad: { lat: 47.25, lon: 8.5, elevation: 0 }, areas: [] },
  vehicle: {
    kind: 'rocket',
    mass: close(MASS),
    referenceArea: close(0.002290221044466959), // π (0.054 m)² / 4
    drag: { mach: [0], cd: [0.45] },
    motor: { thrust: { time: [0, 0.1, 1.2], thrust: [0, 120, 0] }, source: 'inline', propellantMass: close(0.06) },
  },
  launch: { kind: 'rocket', rail: close(1.8288), tilt: 5, azimuth: 250 },
  recovery: [
    // 2 × 1.587573295 × 9.80665 / (1.225 × 18.288²)
    { name: 'drogue', trigger: 'apogee', delay: 0, dragArea: close(0.07600041107989816), descentRate: close(DROGUE_RATE) },
    // 2 × 1.587573295 × 9.80665 / (1.225 × 5.4864²)
    { name: 'main', trigger: 'altitude', altitude: close(152.4), delay: 0, dragArea: close(0.8444490119988682), descentRate: close(MAIN_RATE) },
  ],
  weather: { wind: { speed: close(5.36448), from: 270, height: 10, shear: 0.14 }, turbulence: false },
  uncertainty: {},
  failures: [],
  run: { samples: 2000, seed: '1', levels: [0.5, 0.9, 0.99], keepOut: { level: 0.99, margin: 25 } },
};

describe('normalising the minimal rocket', () => {
  const { scenario, warnings } = parseScenario(fixture('minimal-rocket.json'));

  it('gives SI values and every default', () => {
    expect(scenario).toEqual(minimalExpected);
    // Only the point-mass warning of a rocket without a shape (see shape.test.ts).
    expect(warnings.map((w) => w.path)).toEqual(['vehicle.shape']);
  });

  it('leaves temperature and pressure out when the file does not give them', () => {
    expect('temperature' in scenario.weather).toBe(false);
    expect('pressure' in scenario.weather).toBe(false);
  });

  it('reads the same curve from the CSV variant', () => {
    const fromCsv = parseScenario(fixture('minimal-rocket-csv.json'), fixtureReader).scenario;
    expect(fromCsv.vehicle.motor).toEqual({
      thrust: { time: [0, 0.1, 1.2], thrust: [0, 120, 0] },
      source: 'curves/minimal-motor.csv',
      propellantMass: close(0.06),
    });
    expect({ ...fromCsv, name: scenario.name, vehicle: { ...fromCsv.vehicle, motor: scenario.vehicle.motor } }).toEqual(scenario);
  });

  it('turns each descent rate into the drag area that falls at that rate at sea level', () => {
    // Steady descent closed form v = sqrt(2 m g / (ρ Cd·A)): J. R. Taylor, Classical Mechanics (2005), ch. 2;
    // g0 = 9.80665 m/s² and ρ0 = 1.225 kg/m³: U.S. Standard Atmosphere, 1976.
    for (const stage of scenario.recovery) {
      const v = Math.sqrt((2 * MASS * 9.80665) / (1.225 * stage.dragArea));
      expect(v).toBeCloseTo(stage.descentRate!, 10);
    }
  });
});

describe('normalising the full rocket', () => {
  const { scenario, warnings } = parseScenario(fixture('full-rocket.json'));

  it('converts the site', () => {
    expect(scenario.site.pad).toEqual({ lat: 47.25, lon: 8.5, elevation: close(457.2) });
    expect(scenario.site.minimumDistance).toBeCloseTo(30.48, 9);
    expect(scenario.site.boundary?.coordinates[0]).toHaveLength(5);
    expect(scenario.site.areas.map((a) => [a.name, a.kind, a.people])).toEqual([
      ['Spectator line', 'spectators', 40],
      ['Farm track', 'road', undefined],
    ]);
    expect('people' in scenario.site.areas[1]!).toBe(false);
    expect(scenario.site.basemap).toEqual({ type: 'FeatureCollection', features: [] });
  });

  it('converts the vehicle, launch and recovery', () => {
    expect(scenario.vehicle.drag).toEqual({ mach: [0, 0.8, 1.2], cd: [0.45, 0.5, 0.62] });
    expect(scenario.vehicle.motor?.propellantMass).toBeCloseTo(0.05669904625, 12); // 2 oz
    expect(scenario.launch).toEqual({ kind: 'rocket', rail: close(1.8288), tilt: 5, azimuth: 350 }); // -10 deg → 350
    expect(scenario.recovery).toEqual([
      { name: 'drogue', trigger: 'apogee', delay: 0.5, dragArea: 0.1 },
      { name: 'main', trigger: 'altitude', altitude: close(152.4), delay: 0, dragArea: close(0.8444490119988682), descentRate: close(MAIN_RATE) },
      { name: 'backup', trigger: 'time', time: 30, delay: 0, dragArea: close(0.2) }, // 2000 cm²
    ]);
  });

  it('converts the weather and sorts the profile by altitude', () => {
    expect(scenario.weather).toEqual({
      wind: {
        speed: close(5.36448), // 12 mph
        from: close(28.64788975654116), // 0.5 rad
        gust: close(10.28888888888889), // 20 kn
        height: close(10.0584), // 33 ft
        shear: 0.2,
        profile: [
          { altitude: 100, speed: close(5.555555555555555), from: 10 }, // 20 km/h, 370 deg → 10
          { altitude: 1000, speed: 12, from: 280 },
        ],
      },
      temperature: close(291.15), // 18 C
      pressure: close(101300), // 1013 hPa
      turbulence: false, // given, although a gust would otherwise turn it on
    });
  });

  it('converts spreads, keeping relative ones as fractions', () => {
    expect(scenario.uncertainty).toEqual({
      'wind.speed': { kind: 'normal', sd: 0.08, relative: true },
      'wind.from': { kind: 'normal', sd: 10, relative: false, limit: 3 },
      'launch.tilt': { kind: 'uniform', lo: -1, hi: 1, relative: false },
      'motor.impulse': { kind: 'normal', sd: 5, relative: false },
      'vehicle.mass': { kind: 'normal', sd: close(0.028349523125), relative: false }, // 1 oz
      'vehicle.drag': { kind: 'uniform', lo: -0.1, hi: 0.1, relative: true },
      'recovery.rate': { kind: 'normal', sd: 0.1, relative: true },
    });
    const order = Object.keys(scenario.uncertainty);
    expect(order).toEqual(UNCERTAINTY_NAMES.filter((n) => order.includes(n)));
  });

  it('converts failures and run settings (a number seed becomes text)', () => {
    expect(scenario.failures).toEqual([
      { name: 'main fails', probability: 0.02, effect: 'skip', stage: 'main' },
      { name: 'no deployment', probability: 0.005, effect: 'skip', stage: 'all' },
    ]);
    expect(scenario.run).toEqual({ samples: 5000, seed: '42', levels: [0.5, 0.9], keepOut: { level: 0.95, margin: close(30.48) } });
    expect(scenario.notes).toBe('Invented values that use every field of the format.');
    // Only the point-mass warning of a rocket without a shape (see shape.test.ts).
    expect(warnings.map((w) => w.path)).toEqual(['vehicle.shape']);
  });
});

describe('defaults that depend on other fields', () => {
  it('turns turbulence on when a gust is given and the file does not say', () => {
    const s = fixture('minimal-rocket.json');
    s.weather.wind.gust = '20 mph';
    expect(parseScenario(s).scenario.weather.turbulence).toBe(true);
    s.weather.turbulence = false;
    expect(parseScenario(s).scenario.weather.turbulence).toBe(false);
  });

  it('fills projectile height and release offsets with 0', () => {
    const projectile = fixture('minimal-rocket.json');
    projectile.vehicle = { kind: 'projectile', mass: '20 g', diameter: '12 mm', drag: 0.3 };
    delete projectile.recovery;
    projectile.launch = { speed: '100 ft/s', elevation: 45, azimuth: 90 };
    expect(parseScenario(projectile).scenario.launch).toEqual({ kind: 'projectile', speed: close(30.48), elevation: 45, azimuth: 90, height: 0 });

    const release = fixture('minimal-rocket.json');
    release.vehicle = { kind: 'release', mass: 2, referenceArea: '0.05 m2', drag: 1 };
    release.launch = { height: '3000 ft', speed: '80 kn', heading: 180 };
    const { launch, vehicle } = parseScenario(release).scenario;
    expect(launch).toEqual({ kind: 'release', height: close(914.4), speed: close(41.15555555555556), heading: 180, east: 0, north: 0 });
    expect(vehicle.motor).toBeUndefined();
  });

  it('accepts referenceArea in place of diameter', () => {
    const s = fixture('minimal-rocket.json');
    delete s.vehicle.diameter;
    s.vehicle.referenceArea = '20 cm2';
    expect(parseScenario(s).scenario.vehicle.referenceArea).toBeCloseTo(0.002, 12);
  });
});

describe('helpers', () => {
  it('descent rate and drag area are inverses', () => {
    expect(descentRateForDragArea(2, dragAreaForDescentRate(2, 5.5))).toBeCloseTo(5.5, 12);
  });

  it('directions wrap into [0, 360)', () => {
    expect([-10, 0, 360, 725, -360, 359.5].map(normalizeDirection)).toEqual([350, 0, 0, 5, 0, 359.5]);
  });
});
