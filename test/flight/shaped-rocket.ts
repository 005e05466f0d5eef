import type { Scenario } from '../../src/scenario/types.js';
import { scenario } from '../helpers/build.js';

/** An invented 54 mm rocket with a shape (margin about 1.5 calibres). */
export function shapedRocket(windFrom: number, windSpeed: number, tilt: number, recovery = true): Scenario {
  return scenario({
    vehicle: {
      kind: 'rocket',
      mass: 1.2,
      diameter: 0.054,
      referenceArea: (Math.PI * 0.054 ** 2) / 4,
      drag: { mach: [0, 0.3, 0.6, 0.85], cd: [0.48, 0.45, 0.46, 0.52] },
      motor: {
        source: 'inline',
        propellantMass: 0.075,
        length: 0.194,
        thrust: { time: [0, 0.02, 0.1, 0.4, 0.9, 1.1], thrust: [0, 180, 160, 140, 90, 0] },
      },
      shape: {
        nose: { form: 'ogive', length: 0.24 },
        transitions: [],
        fins: [{ count: 3, position: 1.1, rootChord: 0.1, tipChord: 0.035, span: 0.045, sweep: 0.05 }],
        length: 1.2,
        cg: 0.77,
        inertia: 0.153,
        motorEnd: 1.2,
      },
    },
    launch: { kind: 'rocket', rail: 2, tilt, azimuth: 45 },
    recovery: recovery
      ? [
          { name: 'drogue', trigger: 'apogee', delay: 1, dragArea: 0.05 },
          { name: 'main', trigger: 'altitude', delay: 0, altitude: 150, dragArea: 0.6 },
        ]
      : [],
    wind: { speed: windSpeed, from: windFrom, height: 10, shear: 0.16 },
    elevation: 418,
  });
}

