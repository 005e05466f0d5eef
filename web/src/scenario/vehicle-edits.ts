import { descentRateForDragArea, dragAreaForDescentRate } from '../../../src/scenario/normalize.js';
import { stabilityFigures } from '../../../src/physics/aero.js';
import type { RocketShape, Scenario } from '../../../src/scenario/types.js';
import type { Dimension } from '../../../src/scenario/units.js';
import { unitOf, type UnitSystem } from '../units/systems.js';
import { valueAt, withValue, type FieldPath, type ScenarioDocument } from './document.js';
import { dragWayOf, type DragWay } from './vehicle-fields.js';

/**
 * Edits of the document's structure that one box cannot make: adding, removing and moving list
 * entries (transitions, fin sets, recovery stages), a trigger or drag way that drops the fields it
 * no longer needs, a stage renamed together with the failures that name it, a starting shape.
 * Pure functions: a document in, a new document out; the validator then judges the result.
 * New values are written as quantities in the page's unit system ("54 mm", "2.1 in").
 */

const isRecord = (x: unknown): x is Record<string, unknown> => x !== null && typeof x === 'object' && !Array.isArray(x);

/** `si` as a quantity string in `unit`, five significant digits (a drag carried over stays within 0.01 %). */
export function quantityText(si: number, unitText: string, dimension: Dimension): string {
  const unit = unitOf(unitText, dimension);
  return `${Number((si / unit.si).toPrecision(5))} ${unitText}`;
}

const small = (system: UnitSystem) => (system === 'metric' ? 'mm' : 'in');
const len = (si: number, system: UnitSystem) => quantityText(si, small(system), 'length');

function listAt(doc: ScenarioDocument, path: FieldPath): unknown[] {
  const list = valueAt(doc.json, path);
  return Array.isArray(list) ? list : [];
}

/** Removes entry `index` of the list at `path`; an optional list left empty is removed. */
export function removeEntry(doc: ScenarioDocument, path: FieldPath, index: number, dropWhenEmpty: boolean): ScenarioDocument {
  const list = listAt(doc, path).filter((_x, i) => i !== index);
  return withValue(doc, path, list.length === 0 && dropWhenEmpty ? undefined : list);
}

/** Moves entry `index` by `delta` places (recovery stages deploy in list order). */
export function moveEntry(doc: ScenarioDocument, path: FieldPath, index: number, delta: number): ScenarioDocument {
  const list = [...listAt(doc, path)];
  const to = index + delta;
  if (to < 0 || to >= list.length) return doc;
  const [item] = list.splice(index, 1);
  list.splice(to, 0, item);
  return withValue(doc, path, list);
}

function appendEntry(doc: ScenarioDocument, path: FieldPath, entry: unknown): ScenarioDocument {
  return withValue(doc, path, [...listAt(doc, path), entry]);
}

/** The trigger changes; the altitude or time it no longer uses goes (the validator refuses them). */
export function setTrigger(doc: ScenarioDocument, index: number, trigger: unknown): ScenarioDocument {
  let next = withValue(doc, ['recovery', index, 'trigger'], trigger);
  if (trigger !== 'altitude') next = withValue(next, ['recovery', index, 'altitude'], undefined);
  if (trigger !== 'time') next = withValue(next, ['recovery', index, 'time'], undefined);
  return next;
}

/**
 * The stage's drag given another way, carrying over the same drag area: a descent rate v stands
 * for 2 m g0 / (1.225 v²) with m the mass without propellant (scenario-format.md, "recovery"), a
 * canopy of diameter d with coefficient Cd for Cd π d²/4. A canopy keeps the coefficient it had,
 * or takes 0.8 (a flat circular canopy, common practice, no source).
 */
export function setDragWay(doc: ScenarioDocument, index: number, way: DragWay, accepted: Scenario, system: UnitSystem): ScenarioDocument {
  const stage = valueAt(doc.json, ['recovery', index]);
  if (dragWayOf(stage) === way) return doc;
  const name = isRecord(stage) ? stage.name : undefined;
  const known = accepted.recovery.find((s) => s.name === name) ?? accepted.recovery[index];
  const mass = accepted.vehicle.mass;
  const cd = known?.canopy?.drag ?? 0.8;
  const area = known?.dragArea ?? dragAreaForDescentRate(mass, 6);
  const at = (field: string): FieldPath => ['recovery', index, field];
  let next = doc;
  for (const field of ['dragArea', 'descentRate', 'diameter', 'drag', 'canopy']) next = withValue(next, at(field), undefined);
  if (way === 'dragArea') return withValue(next, at('dragArea'), quantityText(area, system === 'metric' ? 'm2' : 'ft2', 'area'));
  if (way === 'descentRate') return withValue(next, at('descentRate'), quantityText(descentRateForDragArea(mass, area), system === 'metric' ? 'm/s' : 'ft/s', 'speed'));
  const diameter = Math.sqrt((4 * area) / (Math.PI * cd));
  next = withValue(next, at('diameter'), quantityText(diameter, system === 'metric' ? 'm' : 'in', 'length'));
  // The coefficient is a plain number in the file.
  return withValue(next, at('drag'), cd);
}

/** Renames a stage and every failure that names it, so a failure keeps meaning the same stage. */
export function renameStage(doc: ScenarioDocument, index: number, name: unknown): ScenarioDocument {
  const old = valueAt(doc.json, ['recovery', index, 'name']);
  let next = withValue(doc, ['recovery', index, 'name'], name);
  listAt(doc, ['failures']).forEach((failure, i) => {
    if (isRecord(failure) && typeof old === 'string' && failure.stage === old && typeof name === 'string') next = withValue(next, ['failures', i, 'stage'], name);
  });
  return next;
}

/** A new last stage: opens at apogee, 6 m/s (20 ft/s) at sea level, a name no other stage has. */
export function addStage(doc: ScenarioDocument, system: UnitSystem): ScenarioDocument {
  const names = new Set(listAt(doc, ['recovery']).map((s) => (isRecord(s) ? s.name : undefined)));
  let n = names.size + 1;
  while (names.has(`stage ${n}`)) n++;
  return appendEntry(doc, ['recovery'], { name: `stage ${n}`, trigger: 'apogee', descentRate: system === 'metric' ? '6 m/s' : '20 ft/s' });
}

/**
 * A boattail at the aft end: half a calibre long, narrowing to three quarters of the diameter
 * before it, behind the last transition. The user then moves it where their rocket has one.
 */
export function addTransition(doc: ScenarioDocument, shape: RocketShape, diameter: number, system: UnitSystem): ScenarioDocument {
  const last = [...shape.transitions].sort((a, b) => a.position - b.position).pop();
  const fore = last ? last.aftDiameter : diameter;
  const length = 0.5 * diameter;
  const position = Math.max(last ? last.position + last.length : shape.nose.length, shape.length - length);
  return appendEntry(doc, ['vehicle', 'shape', 'transitions'], { position: len(position, system), length: len(length, system), foreDiameter: len(fore, system), aftDiameter: len(0.75 * fore, system) });
}

/** Another fin set like the last one, a calibre behind the nose (canards, say), to edit. */
export function addFinSet(doc: ScenarioDocument, shape: RocketShape, diameter: number, system: UnitSystem): ScenarioDocument {
  const fin = shape.fins[shape.fins.length - 1]!;
  return appendEntry(doc, ['vehicle', 'shape', 'fins'], {
    count: fin.count,
    position: len(shape.nose.length + diameter, system),
    rootChord: len(fin.rootChord / 2, system),
    tipChord: len(fin.tipChord / 2, system),
    span: len(fin.span / 2, system),
    sweep: len(fin.sweep / 2, system),
  });
}

/**
 * A starting shape for a rocket that has none, so it can fly as a rigid body: a tangent ogive nose
 * of 5 calibres, a body of 20 calibres, three trapezoidal fins at the tail, a motor of 3.5
 * calibres if none is given, and a balance point put 1.5 calibres ahead of the CP those give
 * (a margin within the 1–2 calibres usually asked for: common practice, no source). EVERY number
 * is a placeholder for the user's own measurements; the page says so beside the shape.
 */
export function addStartingShape(doc: ScenarioDocument, scenario: Scenario, system: UnitSystem): ScenarioDocument {
  const v = scenario.vehicle;
  const d = v.diameter ?? Math.sqrt((4 * v.referenceArea) / Math.PI);
  const L = 20 * d;
  const shape: RocketShape = {
    nose: { form: 'ogive', length: 5 * d },
    transitions: [],
    fins: [{ count: 3, position: L - 2 * d, rootChord: 2 * d, tipChord: 0.8 * d, span: d, sweep: d }],
    length: L,
    cg: 0,
    inertia: 0,
    motorEnd: L,
  };
  const motorLength = v.motor?.length ?? 3.5 * d;
  const mp = v.motor?.propellantMass ?? 0;
  // The CP does not depend on the balance point; the margin is (CP - CG) / d.
  const cp = stabilityFigures({ ...shape, cg: L / 2 }, d, v.mass, mp, motorLength).cp_m;
  let next = doc;
  if (valueAt(doc.json, ['vehicle', 'diameter']) === undefined) {
    next = withValue(withValue(next, ['vehicle', 'referenceArea'], undefined), ['vehicle', 'diameter'], len(d, system));
  }
  if (valueAt(doc.json, ['vehicle', 'motor', 'length']) === undefined) next = withValue(next, ['vehicle', 'motor', 'length'], len(motorLength, system));
  const fin = shape.fins[0]!;
  return withValue(next, ['vehicle', 'shape'], {
    nose: { form: 'ogive', length: len(shape.nose.length, system) },
    fins: [{ count: 3, position: len(fin.position, system), rootChord: len(fin.rootChord, system), tipChord: len(fin.tipChord, system), span: len(fin.span, system), sweep: len(fin.sweep, system) }],
    length: len(L, system),
    cg: len(cp - 1.5 * d, system),
  });
}

/** Takes the shape away: the rocket flies as a point mass again. */
export function removeShape(doc: ScenarioDocument): ScenarioDocument {
  return withValue(doc, ['vehicle', 'shape'], undefined);
}

/** A thrust curve file opened on the page becomes the motor's curve, kept beside the scenario. */
export function setThrustFile(doc: ScenarioDocument, fileName: string, text: string): ScenarioDocument {
  const next = withValue(doc, ['vehicle', 'motor', 'thrust'], fileName);
  return { ...next, files: { ...next.files, [fileName]: text } };
}
