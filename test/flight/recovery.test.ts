import { describe, expect, it } from 'vitest';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import { locateCrossing } from '../../src/flight/locate-crossing.js';
import { G0 } from '../../src/physics/constants.js';
import { uniformEarth } from '../../src/physics/earth.js';
import type { RecoveryStage } from '../../src/scenario/types.js';
import { body, constantAir, scenario } from '../helpers/build.js';

const RHO = 1.2;
const M = 1;
const CD = 0.5;
const AREA = 0.01;
const TIGHT = { rtol: 1e-10, atolPosition: 1e-9, atolVelocity: 1e-9, air: constantAir(RHO), earth: uniformEarth() };

/** Release from 400 m at rest; returns the landing time for the given stages and inputs. */
function drop(stages: RecoveryStage[], edit: (i: ReturnType<typeof emptyInputs>) => void = () => {}) {
  const sc = scenario({
    vehicle: body('release', M, CD, AREA),
    launch: { kind: 'release', height: 400, speed: 0, heading: 0, east: 0, north: 0 },
    recovery: stages,
  });
  const inputs = emptyInputs(stages.length);
  Object.assign(inputs, { height: 400, mass: M });
  edit(inputs);
  return { ...new FlightModel(sc, TIGHT).fly(inputs, () => 0, emptyResult()) };
}

// Free fall with quadratic drag from rest: depth (vt²/g) ln cosh(g t / vt), speed vt tanh(g t / vt)
// (J. R. Taylor, Classical Mechanics (2005), ch. 2); under a canopy the descent is steady at
// sqrt(2 m g / (ρ CdA)) once settled.
const vt = Math.sqrt((2 * M * G0) / (RHO * CD * AREA));
const fallTime = (depth: number) => (vt / G0) * Math.acosh(Math.exp((depth * G0) / (vt * vt)));

describe('recovery stages', () => {
  it('an altitude stage with a delay opens that long after its altitude is crossed', () => {
    const big = 4; // a large canopy: the speed after opening settles within a fraction of a second
    const vCanopy = Math.sqrt((2 * M * G0) / (RHO * big));
    const noDelay = drop([{ name: 'main', trigger: 'altitude', altitude: 300, delay: 0, dragArea: big }]);
    const delayed = drop([{ name: 'main', trigger: 'altitude', altitude: 300, delay: 2, dragArea: big }]);
    // Two more seconds of free fall from 100 m down, then the canopy: it lands sooner.
    expect(delayed.flightTime).toBeLessThan(noDelay.flightTime - 2 * (1 - vCanopy / 40));
    // The free-fall part before the altitude is the closed form.
    expect(noDelay.flightTime).toBeGreaterThan(fallTime(100) + 300 / vCanopy - 0.5);
    expect(noDelay.flightTime).toBeLessThan(fallTime(100) + 300 / vCanopy + 0.5);
  });

  it('the recovery.delay spread shifts a time-triggered stage too', () => {
    const stage: RecoveryStage = { name: 'chute', trigger: 'time', time: 3, delay: 0, dragArea: 2 };
    const early = drop([stage]);
    const late = drop([stage], (i) => (i.delayOffset = 1.5));
    expect(late.flightTime).toBeLessThan(early.flightTime);
  });

  it('a stage stopped by the failure mode never opens: the flight is a free fall', () => {
    const stopped = drop([{ name: 'chute', trigger: 'apogee', delay: 0, dragArea: 2 }], (i) => (i.skipStage[0] = 1));
    expect(stopped.flightTime).toBeCloseTo(fallTime(400), 6);
  });

  it('a later stage replaces an earlier one, never the other way round', () => {
    // The main opens at 350 m; the drogue's timer fires later and must not shrink the canopy.
    const both = drop([
      { name: 'drogue', trigger: 'time', time: 6, delay: 0, dragArea: 0.2 },
      { name: 'main', trigger: 'altitude', altitude: 350, delay: 0, dragArea: 3 },
    ]);
    const mainOnly = drop([{ name: 'main', trigger: 'altitude', altitude: 350, delay: 0, dragArea: 3 }]);
    expect(both.flightTime).toBeCloseTo(mainOnly.flightTime, 6);
  });
});

describe('event location', () => {
  it('finds a crossing to 1e-10 (regula falsi, Illinois variant)', () => {
    expect(locateCrossing((t) => t * t - 2, 1, 2, -1, 2)).toBeCloseTo(Math.SQRT2, 9);
    expect(locateCrossing((t) => Math.cos(t), 0, 3, 1, Math.cos(3))).toBeCloseTo(Math.PI / 2, 9);
  });
});
