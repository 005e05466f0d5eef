import { formatNumber } from './units.js';
import type { Issue } from './types.js';
import type { ParsedRocketVehicle } from './schema.js';

/**
 * Geometry a rocket shape cannot have, found once the shape's numbers are read (every field in
 * SI): parts that overlap or leave the body, a balance point outside the body, a motor longer than
 * the rocket. Every problem is reported, each naming its field, the value and what was expected.
 * Limits that are only unusual (a margin under 1 calibre) are warnings, in warnings.ts.
 */
export function shapeIssues(v: ParsedRocketVehicle): Issue[] {
  const shape = v.shape;
  const issues: Issue[] = [];
  if (shape === undefined) return issues;
  const m = (x: number) => `${formatNumber(x)} m`;
  const add = (path: string, message: string) => issues.push({ path: `vehicle.${path}`, message });
  const diameter = v.diameter;
  if (diameter === undefined) {
    add('diameter', 'missing (required with a shape): the nose base and the calibre are the body diameter; give diameter rather than referenceArea');
  }
  if (v.motor.length === undefined) {
    add('motor.length', 'missing (required with a shape): the propellant sits halfway along the motor, from motorEnd forward');
  }
  const length = shapeLength(v);
  const noseEnd = shape.nose.length;
  if (shape.length !== undefined && noseEnd >= shape.length) {
    add('shape.nose.length', `${m(noseEnd)} reaches the aft end at ${m(shape.length)}; expected a nose shorter than the rocket`);
  }

  // Transitions: behind the nose, in order, not overlapping, joining the diameter before them.
  let bodyDiameter = diameter;
  let previousEnd = noseEnd;
  (shape.transitions ?? []).forEach((tr, i) => {
    const at = `shape.transitions[${i}]`;
    if (tr.position < previousEnd - 1e-9) {
      const what = i === 0 ? `the nose's end at ${m(noseEnd)}` : `the end of transitions[${i - 1}] at ${m(previousEnd)}`;
      add(`${at}.position`, `${m(tr.position)} is ahead of ${what}; expected transitions behind the nose, in order, not overlapping`);
    }
    if (tr.position + tr.length > length + 1e-9) {
      add(`${at}.length`, `ends at ${m(tr.position + tr.length)}, behind the aft end at ${m(length)}; expected it to lie on the body`);
    }
    if (tr.foreDiameter === 0 && tr.aftDiameter === 0) {
      add(`${at}.aftDiameter`, 'both diameters are 0 m; expected a transition between two body diameters');
    }
    if (bodyDiameter !== undefined && Math.abs(tr.foreDiameter - bodyDiameter) > 0.01 * bodyDiameter) {
      add(
        `${at}.foreDiameter`,
        `${m(tr.foreDiameter)} does not meet the body ahead of it, ${m(bodyDiameter)} across; expected the diameter there (a step in the body is not a shape this model can describe)`,
      );
    }
    bodyDiameter = tr.aftDiameter;
    previousEnd = tr.position + tr.length;
  });

  shape.fins.forEach((fin, i) => {
    const at = `shape.fins[${i}]`;
    if (fin.position < noseEnd - 1e-9) {
      add(`${at}.position`, `${m(fin.position)} is on the nose, which ends at ${m(noseEnd)}; expected the fins' root leading edge behind the nose`);
    }
    if (shape.length !== undefined && fin.position + fin.rootChord > shape.length + 1e-9) {
      add(`${at}.rootChord`, `the root runs to ${m(fin.position + fin.rootChord)}, behind the aft end at ${m(shape.length)}; expected the fin root on the body`);
    }
    if (fin.tipChord > 0 && fin.sweep + fin.tipChord <= 0) {
      add(`${at}.sweep`, `${m(fin.sweep)} puts the whole tip chord ahead of the root leading edge; expected a fin that is joined to the body`);
    }
    if (diameter !== undefined && fin.span > 20 * diameter) {
      add(`${at}.span`, `${m(fin.span)} is more than 20 body diameters; expected one fin's span from body to tip (not the tip-to-tip width) in a length unit`);
    }
  });

  if (!(shape.cg < length)) {
    add('shape.cg', `${m(shape.cg)} is behind the aft end at ${m(length)}; expected a balance point on the body, measured from the nose tip`);
  }
  const motorEnd = shape.motorEnd ?? length;
  if (shape.motorEnd !== undefined && shape.motorEnd > length + 1e-9) {
    add('shape.motorEnd', `${m(shape.motorEnd)} is behind the aft end at ${m(length)}; expected the nozzle exit on the body`);
  }
  const motorLength = v.motor.length;
  if (motorLength !== undefined) {
    if (motorLength > length) {
      add('motor.length', `${m(motorLength)} is longer than the rocket (${m(length)}); expected the motor's own length`);
    } else if (motorLength > motorEnd + 1e-9) {
      add('motor.length', `${m(motorLength)} reaches ahead of the nose tip from the nozzle at ${m(motorEnd)}; expected a motor that fits inside the body`);
    }
  }
  if (shape.inertia !== undefined && motorLength !== undefined && issues.length === 0) {
    // The dry rocket's own inertia must stay positive after the parallel-axis terms come off.
    const xp = motorEnd - motorLength / 2;
    const mp = v.motor.propellantMass;
    const xd = ((v.mass + mp) * shape.cg - mp * xp) / v.mass;
    const own = shape.inertia - v.mass * (xd - shape.cg) ** 2 - mp * (xp - shape.cg) ** 2;
    if (!(own > 0)) {
      add(
        'shape.inertia',
        `${formatNumber(shape.inertia)} kg m2 is less than the propellant and dry mass placed where they are already give about the balance point; expected the whole rocket's transverse inertia about cg, in kg m2`,
      );
    }
  }
  return issues;
}

/** The shape's length: as given, or the farthest aft point of any part, fin tips included. */
export function shapeLength(v: ParsedRocketVehicle): number {
  const shape = v.shape!;
  if (shape.length !== undefined) return shape.length;
  let aft = shape.nose.length;
  for (const tr of shape.transitions ?? []) aft = Math.max(aft, tr.position + tr.length);
  for (const fin of shape.fins) aft = Math.max(aft, fin.position + fin.rootChord, fin.position + fin.sweep + fin.tipChord);
  return aft;
}
