import type { Scenario, Launch, RecoveryStage, Vehicle, Wind } from '../../src/scenario/types.js';
import type { Air } from '../../src/physics/air.js';

/**
 * Builds normalised scenarios directly (bypassing the file parser) so physics tests state exactly
 * the inputs a closed form assumes. Values are invented test inputs, not check values.
 */
export function scenario(parts: {
  vehicle: Vehicle;
  launch: Launch;
  recovery?: RecoveryStage[];
  wind?: Partial<Wind>;
  turbulence?: boolean;
  elevation?: number;
}): Scenario {
  return {
    strewn: 1,
    name: 'test',
    site: { pad: { lat: 45, lon: 7, elevation: parts.elevation ?? 0 }, areas: [] },
    vehicle: parts.vehicle,
    launch: parts.launch,
    recovery: parts.recovery ?? [],
    weather: {
      wind: { speed: 0, from: 0, height: 10, shear: 0.14, ...parts.wind },
      turbulence: parts.turbulence ?? false,
    },
    uncertainty: {},
    failures: [],
    run: { samples: 1, seed: '1', levels: [0.5, 0.9, 0.99], keepOut: { level: 0.99, margin: 25 } },
  };
}

/** A body with a constant drag coefficient (Cd 0 gives a vacuum flight). */
export function body(kind: Vehicle['kind'], mass: number, cd: number, referenceArea: number): Vehicle {
  return { kind, mass, referenceArea, drag: { mach: [0], cd: [cd] } };
}

/** Air of constant density, for the constant-density closed forms. */
export function constantAir(density: number, speedOfSound = 340.29): Air {
  return { densityAt: () => density, speedOfSoundAt: () => speedOfSound, densitySlopeAt: () => 0 };
}
