import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { ScenarioError } from '../../src/scenario/errors.js';
import { POINT_MASS_ROCKET_WARNING } from '../../src/scenario/warnings.js';
import { stabilityFigures } from '../../src/physics/aero.js';
import { MotorModel } from '../../src/physics/motor.js';
import { attachedFileReader, valueAt, withValue, type ScenarioDocument } from '../../web/src/scenario/document.js';
import { shownValue, writtenValue } from '../../web/src/scenario/field-values.js';
import { vehicleFieldGroups, type VehicleField } from '../../web/src/scenario/vehicle-fields.js';
import { addStage, addStartingShape, addTransition, moveEntry, removeEntry, removeShape, renameStage, setDragWay, setThrustFile, setTrigger } from '../../web/src/scenario/vehicle-edits.js';

/**
 * The Setup tab's boxes for the shape, the motor and the recovery stages, against the scenario
 * validator: what is typed or added reaches the engine as the value meant, written where the
 * scenario format puts it, and what cannot exist is refused with the validator's message.
 */

const SCENARIOS = resolve(fileURLToPath(new URL('../../scenarios', import.meta.url)));
const MOTORS = Object.fromEntries(readdirSync(join(SCENARIOS, 'motors')).map((name) => [`motors/${name}`, readFileSync(join(SCENARIOS, 'motors', name), 'utf8')]));
const demo = (name: string): ScenarioDocument => ({ json: JSON.parse(readFileSync(join(SCENARIOS, name), 'utf8')), files: MOTORS, fileName: name });
const parse = (doc: ScenarioDocument) => parseScenario(doc.json, { readText: attachedFileReader(doc.files) });

function fieldAt(doc: ScenarioDocument, issuePath: string): VehicleField {
  const field = vehicleFieldGroups(doc.json).flatMap((g) => g.fields).find((f) => f.issuePath === issuePath);
  if (!field) throw new Error(`no box for ${issuePath}`);
  return field;
}

/** Types `text` into the box for `issuePath` as the page shows it in `system`. */
function type(doc: ScenarioDocument, issuePath: string, text: string, system: 'metric' | 'imperial'): ScenarioDocument {
  const field = fieldAt(doc, issuePath);
  const shown = shownValue(field, valueAt(doc.json, field.path), system);
  return withValue(doc, field.path, writtenValue(field, text, shown.unit));
}

function issuesOf(doc: ScenarioDocument): { path: string; message: string }[] {
  try {
    parse(doc);
    return [];
  } catch (error) {
    if (error instanceof ScenarioError) return error.issues;
    throw error;
  }
}

describe('shape, motor and recovery boxes', () => {
  it('shows rocket lengths in mm or inches and writes them back exactly', () => {
    const doc = demo('club-rocket.json');
    const span = fieldAt(doc, 'vehicle.shape.fins[0].span');
    expect(shownValue(span, '45 mm', 'metric')).toMatchObject({ text: '45', unit: { label: 'mm' } });
    // 45 mm = 1.7717 in (1 in = 25.4 mm exactly; NIST SP 811, appendix B).
    expect(shownValue(span, '45 mm', 'imperial')).toMatchObject({ text: '1.7717', unit: { label: 'in' } });
    const imperial = type(doc, 'vehicle.shape.fins[0].span', '2', 'imperial');
    expect(valueAt(imperial.json, ['vehicle', 'shape', 'fins', 0, 'span'])).toBe('2 in');
    expect(parse(imperial).scenario.vehicle.shape!.fins[0]!.span).toBeCloseTo(0.0508, 15);
    const cg = type(doc, 'vehicle.shape.cg', '780', 'metric');
    expect(parse(cg).scenario.vehicle.shape!.cg).toBeCloseTo(0.78, 15);
    // Inertia in lb in² reads back in kg m²: 1 lb in² = 0.45359237 × 0.0254² kg m².
    const inertia = type(doc, 'vehicle.shape.inertia', '500', 'imperial');
    expect(parse(inertia).scenario.vehicle.shape!.inertia).toBeCloseTo(500 * 0.45359237 * 0.0254 ** 2, 12);
    // The propellant in grams; the nose form from the format's list.
    expect(parse(type(doc, 'vehicle.motor.propellantMass', '80', 'metric')).scenario.vehicle.motor!.propellantMass).toBeCloseTo(0.08, 15);
    expect(parse(type(doc, 'vehicle.shape.nose.form', 'cone', 'metric')).scenario.vehicle.shape!.nose.form).toBe('cone');
  });

  it('refuses a fin that cannot exist with the validator\u2019s message at the fin\u2019s box', () => {
    const doc = type(demo('club-rocket.json'), 'vehicle.shape.fins[0].position', '100', 'metric');
    const issues = issuesOf(doc);
    expect(issues.map((i) => i.path)).toContain('vehicle.shape.fins[0].position');
    expect(issues.find((i) => i.path === 'vehicle.shape.fins[0].position')!.message).toMatch(/is on the nose, which ends at 0\.24 m/);
    // Each issue the validator names has a box that shows it.
    const paths = vehicleFieldGroups(doc.json).flatMap((g) => g.fields.map((f) => f.issuePath));
    for (const issue of issues) expect(paths).toContain(issue.path);
  });

  it('shows the boxes a stage\u2019s trigger and drag way need, and drops those they no longer use', () => {
    const doc = demo('club-rocket.json');
    const paths = (d: ScenarioDocument) => vehicleFieldGroups(d.json).flatMap((g) => g.fields.map((f) => f.issuePath));
    expect(paths(doc)).toContain('recovery[1].altitude');
    expect(paths(doc)).not.toContain('recovery[0].altitude');
    const timed = setTrigger(doc, 1, 'time');
    expect(valueAt(timed.json, ['recovery', 1])).not.toHaveProperty('altitude');
    expect(paths(timed)).toContain('recovery[1].time');
    // The format requires a time for that trigger, and says so at the box.
    expect(issuesOf(timed).map((i) => i.path)).toEqual(['recovery[1].time']);
    expect(parse(type(timed, 'recovery[1].time', '20', 'metric')).scenario.recovery[1]!.time).toBe(20);
  });

  it('keeps the same drag when a stage is given another way', () => {
    const doc = demo('club-rocket.json');
    const accepted = parse(doc).scenario;
    const before = accepted.recovery[1]!.dragArea;
    for (const system of ['metric', 'imperial'] as const) {
      const asArea = setDragWay(doc, 1, 'dragArea', accepted, system);
      expect(valueAt(asArea.json, ['recovery', 1])).not.toHaveProperty('descentRate');
      // Written to five significant digits: the drag area comes back within 0.05 %.
      expect(parse(asArea).scenario.recovery[1]!.dragArea / before).toBeCloseTo(1, 3);
      // A canopy of diameter d and coefficient Cd has the drag area Cd π d²/4 (geometry).
      const asCanopy = setDragWay(doc, 1, 'canopy', accepted, system);
      const canopy = parse(asCanopy).scenario.recovery[1]!;
      expect(canopy.canopy!.drag).toBe(0.8);
      const noted = parse(type(asCanopy, 'recovery[1].canopy', 'cross', system)).scenario.recovery[1]!;
      expect(noted.canopy).toEqual({ ...canopy.canopy, note: 'cross' });
      expect(canopy.dragArea / before).toBeCloseTo(1, 3);
      // And back to a descent rate: 2 m g0 / (1.225 v²) = drag area (scenario format, "recovery").
      const back = setDragWay(asCanopy, 1, 'descentRate', parse(asCanopy).scenario, system);
      const rate = parse(back).scenario.recovery[1]!;
      expect(rate.dragArea / before).toBeCloseTo(1, 3);
      expect(rate.descentRate! / 5.5).toBeCloseTo(1, 3);
    }
  });

  it('adds, moves and removes stages; a renamed stage keeps its failures', () => {
    const doc = demo('club-rocket.json');
    const added = addStage(doc, 'imperial');
    const stages = parse(added).scenario.recovery;
    expect(stages.map((s) => s.name)).toEqual(['drogue', 'main', 'stage 3']);
    // 20 ft/s = 6.096 m/s (1 ft = 0.3048 m exactly).
    expect(stages[2]!.descentRate).toBeCloseTo(6.096, 12);
    const moved = moveEntry(added, ['recovery'], 2, -1);
    expect(parse(moved).scenario.recovery.map((s) => s.name)).toEqual(['drogue', 'stage 3', 'main']);
    expect(parse(removeEntry(moved, ['recovery'], 1, true)).scenario.recovery.map((s) => s.name)).toEqual(['drogue', 'main']);
    const renamed = renameStage(doc, 1, 'main chute');
    expect(parse(renamed).scenario.failures.map((f) => f.stage)).toEqual(['main chute', 'all']);
    // Removing the stage a failure names is refused with the validator's message there.
    expect(issuesOf(removeEntry(doc, ['recovery'], 1, true)).map((i) => i.path)).toContain('failures[0].stage');
  });

  it('gives a rocket without a shape a starting shape within the usual margin', () => {
    const pointMass = removeShape(demo('club-rocket.json'));
    const { scenario, warnings } = parse(pointMass);
    expect(scenario.vehicle.shape).toBeUndefined();
    expect(warnings.map((w) => w.message)).toContain(POINT_MASS_ROCKET_WARNING);
    const shaped = addStartingShape(pointMass, scenario, 'metric');
    const after = parse(shaped);
    expect(after.warnings.map((w) => w.message)).not.toContain(POINT_MASS_ROCKET_WARNING);
    const v = after.scenario.vehicle;
    const f = stabilityFigures(v.shape!, v.diameter!, v.mass, v.motor!.propellantMass, v.motor!.length!);
    // A margin of 1–2 calibres is what is usually asked for (common practice, no source).
    expect(f.margin_cal).toBeGreaterThan(1.4);
    expect(f.margin_cal).toBeLessThan(1.6);
    // A transition added at the aft end is a boattail the validator accepts.
    const boattail = addTransition(shaped, v.shape!, v.diameter!, 'metric');
    const t = parse(boattail).scenario.vehicle.shape!.transitions[0]!;
    expect(t.position + t.length).toBeCloseTo(v.shape!.length, 6);
    expect(t.aftDiameter).toBeLessThan(t.foreDiameter);
  });

  it('flies a thrust curve opened on the page, kept beside the scenario', () => {
    const doc = setThrustFile(demo('club-rocket.json'), 'flat-100.csv', 'time_s,thrust_N\n0,0\n0.1,100\n1.0,100\n1.1,0\n');
    expect(valueAt(doc.json, ['vehicle', 'motor', 'thrust'])).toBe('flat-100.csv');
    expect(doc.files['motors/harrow-g150.csv']).toBeDefined();
    // Trapezoid rule over the points: 5 + 90 + 5 = 100 N s (closed form).
    expect(new MotorModel(parse(doc).scenario.vehicle.motor!).totalImpulse).toBeCloseTo(100, 12);
  });
});
