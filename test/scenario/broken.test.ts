import { describe, expect, it } from 'vitest';
import { ScenarioError } from '../../src/scenario/errors.js';
import { parseScenario, type ParseOptions } from '../../src/scenario/load.js';
import { fixture, fixtureReader, issuesOf } from './helpers.js';

type Scenario = Record<string, any>;

interface BrokenCase {
  name: string;
  /** Breaks a fresh copy of minimal-rocket.json (or returns a replacement). */
  breakIt: (s: Scenario) => Scenario | void;
  path: string;
  /** Part of the message: the value given or what was expected. */
  says: string;
  options?: ParseOptions;
}

const projectile = (s: Scenario): Scenario => {
  s.vehicle.kind = 'projectile';
  delete s.vehicle.motor;
  delete s.recovery;
  s.launch = { speed: 40, elevation: 45, azimuth: 0, height: 1 };
  return s;
};

const cases: BrokenCase[] = [
  // Missing required fields
  { name: 'missing format version', breakIt: (s) => void delete s.strewn, path: 'strewn', says: 'missing (required)' },
  { name: 'missing name', breakIt: (s) => void delete s.name, path: 'name', says: 'missing (required)' },
  { name: 'missing site', breakIt: (s) => void delete s.site, path: 'site', says: 'missing (required); expected an object' },
  { name: 'missing pad latitude', breakIt: (s) => void delete s.site.pad.lat, path: 'site.pad.lat', says: 'missing (required)' },
  { name: 'missing vehicle', breakIt: (s) => void delete s.vehicle, path: 'vehicle', says: 'missing (required); expected an object' },
  { name: 'missing vehicle mass', breakIt: (s) => void delete s.vehicle.mass, path: 'vehicle.mass', says: 'missing (required); expected a mass' },
  { name: 'missing launch rail', breakIt: (s) => void delete s.launch.rail, path: 'launch.rail', says: 'missing (required)' },
  { name: 'missing launch', breakIt: (s) => void delete s.launch, path: 'launch', says: 'missing (required); expected an object' },
  { name: 'missing weather', breakIt: (s) => void delete s.weather, path: 'weather', says: 'missing (required)' },
  { name: 'missing wind direction', breakIt: (s) => void delete s.weather.wind.from, path: 'weather.wind.from', says: 'expected an angle' },
  { name: 'rocket without motor', breakIt: (s) => void delete s.vehicle.motor, path: 'vehicle.motor', says: 'missing (required)' },
  { name: 'missing thrust curve', breakIt: (s) => void delete s.vehicle.motor.thrust, path: 'vehicle.motor.thrust', says: 'missing' },
  { name: 'missing drag', breakIt: (s) => void delete s.vehicle.drag, path: 'vehicle.drag', says: 'missing (required)' },
  { name: 'neither diameter nor reference area', breakIt: (s) => void delete s.vehicle.diameter, path: 'vehicle.diameter', says: 'either diameter or referenceArea' },

  // Wrong types and values
  { name: 'name is a number', breakIt: (s) => void (s.name = 5), path: 'name', says: '5 is not text; expected a short title in quotes' },
  { name: 'mass is a boolean', breakIt: (s) => void (s.vehicle.mass = true), path: 'vehicle.mass', says: 'true is not a number' },
  { name: 'recovery is not a list', breakIt: (s) => void (s.recovery = 'main'), path: 'recovery', says: "'main'; expected a list" },
  { name: 'format version 2', breakIt: (s) => void (s.strewn = 2), path: 'strewn', says: '2 is not a format version' },
  { name: 'misspelt vehicle kind', breakIt: (s) => void (s.vehicle.kind = 'rockt'), path: 'vehicle.kind', says: "did you mean 'rocket'?" },
  { name: 'unknown trigger', breakIt: (s) => void (s.recovery[0].trigger = 'burnout'), path: 'recovery[0].trigger', says: "'burnout' is not one of 'apogee', 'altitude', 'time'" },
  { name: 'turbulence is text', breakIt: (s) => void (s.weather.turbulence = 'yes'), path: 'weather.turbulence', says: "'yes' is not true or false" },
  { name: '"NaN" as a wind speed', breakIt: (s) => void (s.weather.wind.speed = 'NaN'), path: 'weather.wind.speed', says: "'NaN' is not a number" },
  { name: '"Infinity" as a mass', breakIt: (s) => void (s.vehicle.mass = 'Infinity kg'), path: 'vehicle.mass', says: "'Infinity kg' is not a number" },
  { name: 'negative mass', breakIt: (s) => void (s.vehicle.mass = -2), path: 'vehicle.mass', says: '-2 kg is out of range; expected more than 0 kg' },
  { name: 'negative mass in pounds', breakIt: (s) => void (s.vehicle.mass = '-2 lb'), path: 'vehicle.mass', says: '-2 lb (-0.907185 kg) is out of range' },
  { name: 'zero diameter', breakIt: (s) => void (s.vehicle.diameter = 0), path: 'vehicle.diameter', says: 'expected more than 0 m' },
  { name: 'negative rail', breakIt: (s) => void (s.launch.rail = '-1 m'), path: 'launch.rail', says: 'expected at least 0 m' },
  { name: 'tilt over 90', breakIt: (s) => void (s.launch.tilt = '95 deg'), path: 'launch.tilt', says: '95 deg is outside 0–90 deg' },
  { name: 'pad latitude over 90', breakIt: (s) => void (s.site.pad.lat = 91), path: 'site.pad.lat', says: '91 deg is outside -89.9–89.9 deg; Strewn does not work within 0.1° (11 km) of a pole' },
  { name: 'pad longitude over 180', breakIt: (s) => void (s.site.pad.lon = 190), path: 'site.pad.lon', says: 'outside -180–180 deg' },
  { name: 'drag coefficient 0', breakIt: (s) => void (s.vehicle.drag = 0), path: 'vehicle.drag', says: 'expected a drag coefficient more than 0' },
  { name: 'drag table with Mach going down', breakIt: (s) => void (s.vehicle.drag = [[0, 0.4], [0.9, 0.5], [0.8, 0.6]]), path: 'vehicle.drag[2]', says: 'Mach 0.8 is not above' },
  { name: 'drag table with Cd 0', breakIt: (s) => void (s.vehicle.drag = [[0, 0.4], [1, 0]]), path: 'vehicle.drag[1]', says: 'Cd 0 is out of range' },
  { name: 'temperature without unit', breakIt: (s) => void (s.weather.temperature = 18), path: 'weather.temperature', says: "did you mean '18 C'?" },
  { name: 'pressure without unit', breakIt: (s) => void (s.weather.pressure = 1013), path: 'weather.pressure', says: "did you mean '1013 hPa'?" },
  { name: 'shear above 1', breakIt: (s) => void (s.weather.wind.shear = 1.5), path: 'weather.wind.shear', says: '1.5 is outside 0–1' },
  { name: 'gust below the mean wind', breakIt: (s) => void (s.weather.wind.gust = '5 mph'), path: 'weather.wind.gust', says: 'below the mean speed' },
  { name: 'two profile rows at one altitude', breakIt: (s) => void (s.weather.wind.profile = [{ altitude: 100, speed: 5, from: 0 }, { altitude: '100 m', speed: 6, from: 10 }]), path: 'weather.wind.profile[1].altitude', says: 'same altitude as profile[0]' },
  { name: 'people not a whole number', breakIt: (s) => void (s.site.areas = [{ name: 'A', kind: 'other', geometry: square(), people: 2.5 }]), path: 'site.areas[0].people', says: '2.5 is not a head count' },

  // Units
  { name: 'unknown unit', breakIt: (s) => void (s.weather.wind.speed = '12 furlongs'), path: 'weather.wind.speed', says: "unknown unit 'furlongs'" },
  { name: 'unit of the wrong dimension', breakIt: (s) => void (s.weather.wind.speed = '12 kg'), path: 'weather.wind.speed', says: "'12 kg' has a unit of mass; expected a speed (m/s, km/h, mph, kn, ft/s)" },
  { name: 'percentage outside a spread', breakIt: (s) => void (s.vehicle.mass = '8 %'), path: 'vehicle.mass', says: 'allowed only in uncertainty spreads' },

  // Thrust curve
  { name: 'unsorted thrust curve', breakIt: (s) => void (s.vehicle.motor.thrust = [[0, 0], [0.3, 100], [0.2, 90], [1, 0]]), path: 'vehicle.motor.thrust[2]', says: "time 0.2 s is not after the previous row's 0.3 s" },
  { name: 'negative thrust', breakIt: (s) => void (s.vehicle.motor.thrust = [[0, 0], [0.1, -5], [1, 0]]), path: 'vehicle.motor.thrust[1]', says: 'thrust -5 N is negative' },
  { name: 'curve not starting at 0', breakIt: (s) => void (s.vehicle.motor.thrust = [[0.05, 10], [1, 0]]), path: 'vehicle.motor.thrust[0]', says: 'must start at t = 0' },
  { name: 'one-row curve', breakIt: (s) => void (s.vehicle.motor.thrust = [[0, 10]]), path: 'vehicle.motor.thrust', says: 'at least 2' },
  { name: 'curve row that is not a pair', breakIt: (s) => void (s.vehicle.motor.thrust = [[0, 0], [0.1], [1, 0]]), path: 'vehicle.motor.thrust[1]', says: 'not a [time, thrust] pair' },
  { name: 'curve with text in a row', breakIt: (s) => void (s.vehicle.motor.thrust = [[0, 0], [0.1, 'NaN'], [1, 0]]), path: 'vehicle.motor.thrust[1][1]', says: "'NaN' is not a number with a unit" },
  { name: 'curve with no impulse', breakIt: (s) => void (s.vehicle.motor.thrust = [[0, 0], [1, 0]]), path: 'vehicle.motor.thrust', says: 'no impulse' },
  {
    name: 'curve over 100,000 rows',
    breakIt: (s) => void (s.vehicle.motor.thrust = Array.from({ length: 100_001 }, (_, i) => [i * 1e-4, 10])),
    path: 'vehicle.motor.thrust',
    says: '100001 rows is more than the 100000 allowed',
  },
  {
    name: 'CSV curve with a non-numeric line',
    breakIt: (s) => void (s.vehicle.motor.thrust = 'curves/bad-line.csv'),
    path: 'vehicle.motor.thrust',
    says: "'curves/bad-line.csv' line 4: 'abc,12' is not two numbers",
    options: fixtureReader,
  },
  {
    name: 'CSV curve that does not exist',
    breakIt: (s) => void (s.vehicle.motor.thrust = 'curves/missing.csv'),
    path: 'vehicle.motor.thrust',
    says: "cannot read 'curves/missing.csv'",
    options: fixtureReader,
  },
  {
    name: 'CSV curve without a file reader',
    breakIt: (s) => void (s.vehicle.motor.thrust = 'curves/minimal-motor.csv'),
    path: 'vehicle.motor.thrust',
    says: 'no file reader',
  },

  // Failures and probabilities
  {
    name: 'failure probabilities summing over 1',
    breakIt: (s) => void (s.failures = [{ name: 'a', probability: 0.7, effect: 'skip', stage: 'main' }, { name: 'b', probability: '40 %', effect: 'skip', stage: 'all' }]),
    path: 'failures',
    says: 'the probabilities add up to 1.1; they must add up to at most 1',
  },
  { name: 'probability over 1', breakIt: (s) => void (s.failures = [{ name: 'a', probability: 1.5, stage: 'main' }]), path: 'failures[0].probability', says: '1.5 is outside 0–1' },
  { name: 'failure naming a stage that does not exist', breakIt: (s) => void (s.failures = [{ name: 'a', probability: 0.01, stage: 'mian' }]), path: 'failures[0].stage', says: "'mian' is not a recovery stage; expected one of 'drogue', 'main', 'all'" },
  { name: 'failure without recovery stages', breakIt: (s) => void (delete s.recovery, (s.failures = [{ name: 'a', probability: 0.01, stage: 'all' }])), path: 'failures[0].stage', says: 'no recovery stages' },
  { name: 'failure with an unknown effect', breakIt: (s) => void (s.failures = [{ name: 'a', probability: 0.01, effect: 'explode', stage: 'all' }]), path: 'failures[0].effect', says: "expected 'skip'" },
  { name: "failure named 'nominal'", breakIt: (s) => void (s.failures = [{ name: 'nominal', probability: 0.01, stage: 'all' }]), path: 'failures[0].name', says: "'nominal' is the name" },

  // Recovery stages
  { name: 'both dragArea and descentRate', breakIt: (s) => void (s.recovery[1].dragArea = 1.2), path: 'recovery[1].descentRate', says: 'give one of dragArea, descentRate, or diameter with drag, not dragArea and descentRate' },
  { name: 'canopy diameter without its drag coefficient', breakIt: (s) => void ((s.recovery[1].diameter = '36 in'), delete s.recovery[1].descentRate), path: 'recovery[1].drag', says: "missing (required) with diameter; expected the canopy's drag coefficient" },
  { name: 'canopy size and a descent rate', breakIt: (s) => void ((s.recovery[1].diameter = '36 in'), (s.recovery[1].drag = 0.8)), path: 'recovery[1].descentRate', says: 'not descentRate and diameter and drag' },
  { name: 'neither dragArea nor descentRate', breakIt: (s) => void delete s.recovery[0].descentRate, path: 'recovery[0].dragArea', says: 'give dragArea (Cd·A), descentRate, or the canopy diameter with its drag coefficient drag' },
  { name: 'altitude trigger without altitude', breakIt: (s) => void delete s.recovery[1].altitude, path: 'recovery[1].altitude', says: "missing (required) for trigger 'altitude'" },
  { name: 'time trigger without time', breakIt: (s) => void (s.recovery[0].trigger = 'time'), path: 'recovery[0].time', says: "missing (required) for trigger 'time'" },
  { name: 'altitude on an apogee stage', breakIt: (s) => void (s.recovery[0].altitude = 300), path: 'recovery[0].altitude', says: "this stage's trigger is 'apogee'" },
  { name: 'two stages with one name', breakIt: (s) => void (s.recovery[1].name = 'drogue'), path: 'recovery[1].name', says: 'must be unique' },
  { name: 'negative descent rate', breakIt: (s) => void (s.recovery[1].descentRate = '-18 ft/s'), path: 'recovery[1].descentRate', says: 'expected more than 0 m/s' },
  { name: 'recovery on a projectile', breakIt: (s) => void (projectile(s).recovery = [{ name: 'x', trigger: 'apogee', dragArea: 1 }]), path: 'recovery', says: 'a projectile has no recovery stages' },

  // Kind-specific fields
  { name: 'projectile with a motor', breakIt: (s) => void (projectile(s).vehicle.motor = { thrust: [[0, 0], [1, 1]], propellantMass: 1 }), path: 'vehicle.motor', says: 'a projectile has no motor' },
  { name: 'projectile elevation over 90', breakIt: (s) => void (projectile(s).launch.elevation = 100), path: 'launch.elevation', says: '100 deg is outside 0–90 deg' },
  { name: 'projectile launch fields on a rocket', breakIt: (s) => void (s.launch.speed = 40), path: 'launch.speed', says: "'speed' is not a field here" },
  { name: 'release without height', breakIt: (s) => void ((s.vehicle.kind = 'release'), delete s.vehicle.motor, (s.launch = { speed: 30, heading: 90 })), path: 'launch.height', says: 'missing (required)' },

  // Unknown and misspelt fields
  { name: 'misspelt top-level field', breakIt: (s) => void (s.wether = {}), path: 'wether', says: "'wether' is not a field here (did you mean 'weather'?)" },
  { name: 'misspelt nested field', breakIt: (s) => void ((s.site.pad.elevaton = 10)), path: 'site.pad.elevaton', says: "did you mean 'elevation'?" },
  { name: 'unknown field in a list item', breakIt: (s) => void (s.recovery[1].deployAltitude = 10), path: 'recovery[1].deployAltitude', says: 'is not a field here' },

  // Uncertainty
  { name: 'unknown uncertainty name', breakIt: (s) => void (s.uncertainty = { 'wind.sped': { sd: 1 } }), path: 'uncertainty.wind.sped', says: "did you mean 'wind.speed'?" },
  { name: 'spread with sd and range', breakIt: (s) => void (s.uncertainty = { 'wind.speed': { sd: 1, range: [-1, 1] } }), path: 'uncertainty.wind.speed', says: 'not both' },
  { name: 'spread with neither sd nor range', breakIt: (s) => void (s.uncertainty = { 'wind.speed': {} }), path: 'uncertainty.wind.speed', says: 'missing sd or range' },
  { name: 'spread in the wrong unit', breakIt: (s) => void (s.uncertainty = { 'wind.speed': { sd: '2 kg' } }), path: 'uncertainty.wind.speed.sd', says: 'has a unit of mass' },
  { name: 'range with lo above hi', breakIt: (s) => void (s.uncertainty = { 'launch.tilt': { range: ['2 deg', '-2 deg'] } }), path: 'uncertainty.launch.tilt.range', says: 'is above hi' },
  { name: 'relative wind direction', breakIt: (s) => void (s.uncertainty = { 'wind.from': { sd: '5 %' } }), path: 'uncertainty.wind.from.sd', says: 'a compass direction cannot vary by a percentage' },
  { name: 'absolute recovery.rate', breakIt: (s) => void (s.uncertainty = { 'recovery.rate': { sd: 0.1 } }), path: 'uncertainty.recovery.rate.sd', says: "write it as a percentage, e.g. '10 %'" },
  { name: 'spread on a parameter the rocket lacks', breakIt: (s) => void (s.uncertainty = { 'launch.elevation': { sd: 1 } }), path: 'uncertainty.launch.elevation', says: 'a rocket has no elevation' },
  { name: 'gust spread without a gust', breakIt: (s) => void (s.uncertainty = { 'wind.gust': { sd: 1 } }), path: 'uncertainty.wind.gust', says: 'weather.wind.gust is not given' },

  // Run settings
  { name: 'samples over the 10 million cap', breakIt: (s) => void (s.run = { samples: 10_000_001 }), path: 'run.samples', says: '10000001 is more than the cap of 10000000 samples' },
  { name: 'samples over a lowered cap', breakIt: (s) => void (s.run = { samples: 5000 }), path: 'run.samples', says: 'cap of 1000', options: { maxSamples: 1000 } },
  { name: 'fractional samples', breakIt: (s) => void (s.run = { samples: 2.5 }), path: 'run.samples', says: 'expected a whole number' },
  { name: 'seed that is an object', breakIt: (s) => void (s.run = { seed: {} }), path: 'run.seed', says: 'expected a number or non-empty text' },
  { name: 'levels not increasing', breakIt: (s) => void (s.run = { levels: [0.5, 0.99, 0.9] }), path: 'run.levels[2]', says: 'levels must increase' },
  { name: 'level of 1', breakIt: (s) => void (s.run = { levels: [0.5, 1] }), path: 'run.levels[1]', says: '1 is outside 0–1 (excluding 0 and 1)' },
  { name: 'keep-out level of 1', breakIt: (s) => void (s.run = { keepOut: { level: 1 } }), path: 'run.keepOut.level', says: 'outside 0–1' },

  // Geometry
  { name: 'unclosed ring', breakIt: (s) => void (s.site.boundary = { type: 'Polygon', coordinates: [[[8, 47], [8.1, 47], [8.1, 47.1], [8, 47.1]]] }), path: 'site.boundary.coordinates[0]', says: 'the ring is not closed' },
  { name: 'latitude out of range in a ring', breakIt: (s) => void (s.site.areas = [{ name: 'A', kind: 'other', geometry: square([8.5, 95]) }]), path: 'site.areas[0].geometry.coordinates[0][0]', says: 'latitude 95 is outside -90–90' },
  { name: 'ring with too few positions', breakIt: (s) => void (s.site.boundary = { type: 'Polygon', coordinates: [[[8, 47], [8.1, 47], [8, 47]]] }), path: 'site.boundary.coordinates[0]', says: 'at least 4' },
  { name: 'a Feature instead of a geometry', breakIt: (s) => void (s.site.boundary = { type: 'Feature', geometry: square() }), path: 'site.boundary.type', says: 'give the feature\'s "geometry"' },
  { name: 'unknown area kind', breakIt: (s) => void (s.site.areas = [{ name: 'A', kind: 'crowd', geometry: square() }]), path: 'site.areas[0].kind', says: "'crowd' is not one of" },
];

/** A small closed square ring starting at [lon, lat]. */
function square(start: [number, number] = [8.5, 47.25]) {
  const [x, y] = start;
  return { type: 'Polygon', coordinates: [[[x, y], [x + 0.001, y], [x + 0.001, y + 0.001], [x, y + 0.001], [x, y]]] };
}

describe('broken scenarios: each problem is reported at the field it concerns', () => {
  it('the unbroken fixture is accepted (so each failure below comes from its one change)', () => {
    expect(issuesOf(fixture('minimal-rocket.json'))).toEqual([]);
    expect(issuesOf(projectile(fixture('minimal-rocket.json')))).toEqual([]);
  });

  it.each(cases)('$name → $path', ({ breakIt, path, says, options }) => {
    const original = fixture('minimal-rocket.json');
    const broken = breakIt(original) ?? original;
    const issues = issuesOf(broken, options);
    const atPath = issues.filter((issue) => issue.path === path);
    expect(atPath, `issues were: ${JSON.stringify(issues, null, 2)}`).not.toEqual([]);
    expect(atPath.map((issue) => issue.message).join('\n')).toContain(says);
  });
});

describe('limits that options and defaults control', () => {
  it('allows more than 10 million samples when maxSamples lifts the cap', () => {
    const s = fixture('minimal-rocket.json');
    s.run = { samples: 20_000_000 };
    expect(issuesOf(s)).not.toEqual([]);
    const { scenario } = parseScenario(s, { maxSamples: 50_000_000 });
    expect(scenario.run.samples).toBe(20_000_000);
  });

  it('accepts exactly 10 million samples and exactly 100,000 curve rows', () => {
    const s = fixture('minimal-rocket.json');
    s.run = { samples: 10_000_000 };
    s.vehicle.motor.thrust = Array.from({ length: 100_000 }, (_, i) => [i * 1e-4, 10]);
    expect(issuesOf(s)).toEqual([]);
  });

  it('accepts failure probabilities summing to exactly 1 despite rounding (0.1 + 0.2 + 0.7)', () => {
    const s = fixture('minimal-rocket.json');
    s.failures = [
      { name: 'a', probability: 0.1, stage: 'main' },
      { name: 'b', probability: 0.2, stage: 'drogue' },
      { name: 'c', probability: 0.7, stage: 'all' },
    ];
    expect(issuesOf(s)).toEqual([]);
  });
});

describe('many problems in one file', () => {
  const broken = (): Scenario => {
    const s = fixture('minimal-rocket.json');
    s.vehicle.mass = -2;
    s.launch.tilt = 95;
    s.weather.wind.speed = '12 furlongs';
    s.vehicle.motor.thrust = [[0, 0], [0.3, 100], [0.2, 90]];
    s.failures = [{ name: 'a', probability: 0.01, stage: 'mian' }];
    s.recovery[1].dragArea = 1;
    s.colour = 'red';
    return s;
  };

  it('reports all of them together, in the order of the format', () => {
    expect(issuesOf(broken()).map((issue) => issue.path)).toEqual([
      'vehicle.mass',
      'vehicle.motor.thrust[2]',
      'launch.tilt',
      'recovery[1].descentRate',
      'weather.wind.speed',
      'failures[0].stage',
      'colour',
    ]);
  });

  it('throws one ScenarioError whose message lists every problem, without a stack trace in it', () => {
    let caught: unknown;
    try {
      parseScenario(broken());
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(ScenarioError);
    const message = (caught as ScenarioError).message;
    expect(message.split('\n')[0]).toBe('The scenario has problems (7 problems):');
    expect(message).toContain('  - launch.tilt: 95 deg is outside 0–90 deg');
    expect(message).toContain("  - weather.wind.speed: '12 furlongs' has an unknown unit 'furlongs'");
    expect(message).not.toMatch(/\bat .*\.ts:\d+/);
  });

  it('rejects a top level that is not an object', () => {
    expect(issuesOf([1, 2])).toEqual([{ path: '', message: '[1,2]; expected the scenario to be a JSON object {...}' }]);
  });
});
