import type { VehicleKind } from './types.js';

/**
 * Starting scenarios for `strewn new`: one per vehicle kind, in metric or imperial units. Every
 * value is written with its unit, so the file itself shows how to write quantities; the notes say
 * what to replace. The site is the invented demo field of scenarios/ (no real place is meant).
 * Both unit systems describe the same vehicle, rounded to the figures people write in each.
 */

export type StarterUnits = 'metric' | 'imperial';

const PAD = { lat: 47.31204, lon: 8.02117 };

/** A square of ±dLat, ±dLon degrees around a point, as a closed GeoJSON ring ([lon, lat]). */
function square(lat: number, lon: number, dLat: number, dLon: number): { type: 'Polygon'; coordinates: number[][][] } {
  const r = (x: number) => Math.round(x * 1e6) / 1e6;
  const ring = [
    [r(lon - dLon), r(lat - dLat)],
    [r(lon + dLon), r(lat - dLat)],
    [r(lon + dLon), r(lat + dLat)],
    [r(lon - dLon), r(lat + dLat)],
    [r(lon - dLon), r(lat - dLat)],
  ];
  return { type: 'Polygon', coordinates: [ring] };
}

function site(units: StarterUnits) {
  return {
    pad: { lat: PAD.lat, lon: PAD.lon, elevation: units === 'metric' ? '420 m' : '1380 ft' },
    minimumDistance: units === 'metric' ? '30 m' : '100 ft',
    // About 1.3 km by 1.3 km around the pad.
    boundary: square(PAD.lat, PAD.lon, 0.006, 0.009),
    areas: [
      {
        name: 'Spectators',
        kind: 'spectators',
        people: 50,
        geometry: square(PAD.lat - 0.0012, PAD.lon - 0.0015, 0.0002, 0.0008),
      },
    ],
  };
}

const NOTE =
  'Starting point written by strewn new: replace every value with your own (site, vehicle, weather, spreads). Plain numbers are SI units; text values carry their unit. Field by field: scenarios/README.md. Check it with: strewn check <this file>.';

function rocket(units: StarterUnits): Record<string, unknown> {
  const m = units === 'metric';
  // An invented 130 N s motor: [s, N] 0 0, 0.05 140, 0.2 130, 1.0 110, 1.2 0.
  const thrust = m
    ? [['0 s', '0 N'], ['0.05 s', '140 N'], ['0.2 s', '130 N'], ['1.0 s', '110 N'], ['1.2 s', '0 N']]
    : [['0 s', '0 lbf'], ['0.05 s', '31.5 lbf'], ['0.2 s', '29.2 lbf'], ['1.0 s', '24.7 lbf'], ['1.2 s', '0 lbf']];
  return {
    vehicle: {
      kind: 'rocket',
      mass: m ? '1.2 kg' : '2.6 lb',
      diameter: m ? '54 mm' : '2.1 in',
      drag: 0.45,
      motor: { thrust, propellantMass: m ? '75 g' : '2.6 oz' },
    },
    launch: { rail: m ? '2 m' : '6 ft', tilt: '5 deg', azimuth: '0 deg' },
    recovery: [
      { name: 'drogue', trigger: 'apogee', delay: '1 s', descentRate: m ? '22 m/s' : '72 ft/s' },
      { name: 'main', trigger: 'altitude', altitude: m ? '150 m' : '500 ft', diameter: m ? '90 cm' : '36 in', drag: 0.8, canopy: 'flat circular' },
    ],
    weather: { wind: { speed: m ? '4 m/s' : '9 mph', from: '270 deg' } },
    uncertainty: {
      'wind.speed': { sd: m ? '1 m/s' : '2 mph' },
      'wind.from': { sd: '10 deg' },
      'launch.tilt': { sd: '1 deg', limit: 3 },
      'motor.impulse': { sd: '3 %' },
      'recovery.delay': { range: ['0 s', '1 s'] },
    },
    failures: [{ name: 'main does not open', probability: 0.02, effect: 'skip', stage: 'main' }],
  };
}

function projectile(units: StarterUnits): Record<string, unknown> {
  const m = units === 'metric';
  return {
    vehicle: { kind: 'projectile', mass: m ? '250 g' : '0.55 lb', diameter: m ? '75 mm' : '3 in', drag: 0.47 },
    launch: { speed: m ? '58 m/s' : '190 ft/s', elevation: '85 deg', azimuth: '0 deg', height: m ? '0.5 m' : '1.5 ft' },
    weather: { wind: { speed: m ? '4 m/s' : '9 mph', from: '215 deg' } },
    uncertainty: {
      'wind.speed': { sd: m ? '1 m/s' : '2 mph' },
      'launch.speed': { sd: '6 %' },
      'launch.elevation': { sd: '2 deg', limit: 3 },
      'vehicle.drag': { sd: '10 %' },
    },
  };
}

function release(units: StarterUnits): Record<string, unknown> {
  const m = units === 'metric';
  return {
    vehicle: { kind: 'release', mass: m ? '1.4 kg' : '3.1 lb', diameter: m ? '35 cm' : '14 in', drag: 1.05 },
    launch: { height: m ? '60 m' : '200 ft', speed: m ? '5 m/s' : '11 mph', heading: '90 deg' },
    weather: { wind: { speed: m ? '5 m/s' : '11 mph', from: '280 deg' } },
    uncertainty: {
      'wind.speed': { sd: m ? '1 m/s' : '2 mph' },
      'wind.from': { sd: '15 deg' },
      'launch.height': { range: m ? ['-20 m', '20 m'] : ['-65 ft', '65 ft'] },
      'launch.azimuth': { range: ['0 deg', '360 deg'] },
    },
  };
}

const TITLES: Record<VehicleKind, string> = {
  rocket: 'New scenario: a 54 mm rocket on a parachute',
  projectile: 'New scenario: a 75 mm display shell that fails to burst',
  release: 'New scenario: a camera drone that loses power',
};

/** The starting scenario for a kind, as a JSON object in the format's field order. */
export function starterScenario(kind: VehicleKind, units: StarterUnits): Record<string, unknown> {
  const body = kind === 'rocket' ? rocket(units) : kind === 'projectile' ? projectile(units) : release(units);
  const { vehicle, launch, recovery, weather, uncertainty, failures } = body as Record<string, unknown>;
  const out: Record<string, unknown> = { strewn: 1, name: TITLES[kind], notes: NOTE, site: site(units), vehicle, launch };
  if (recovery !== undefined) out.recovery = recovery;
  out.weather = weather;
  out.uncertainty = uncertainty;
  if (failures !== undefined) out.failures = failures;
  out.run = { samples: 2000, seed: '1', units, ...(units === 'imperial' ? { paper: 'letter' } : {}) };
  return out;
}
