import { formatPath } from '../../../src/scenario/errors.js';
import type { Dimension } from '../../../src/scenario/units.js';
import type { UnitSystem } from '../units/systems.js';
import type { DayField } from './day-fields.js';
import { valueAt, type FieldPath } from './document.js';

/**
 * The fields of what flies, read from the document itself: the rocket's mass and diameter, its
 * motor, its shape (nose, transitions, fin sets, length, balance point, inertia, nozzle position)
 * and the recovery stages. Which fields appear follows the file: a stage triggered at an altitude
 * shows its altitude, a stage given by a canopy shows the canopy's diameter and drag. Every field
 * writes into the place the scenario format defines (scenario-format.md, "vehicle", "vehicle.shape
 * (rockets)", "recovery").
 */

/** Rocket dimensions read in millimetres or inches, not in metres or feet. */
const SMALL_LENGTH: Record<UnitSystem, string> = { metric: 'mm', imperial: 'in' };
const MASS: Record<UnitSystem, string> = { metric: 'kg', imperial: 'lb' };
const PROPELLANT: Record<UnitSystem, string> = { metric: 'g', imperial: 'oz' };
const INERTIA: Record<UnitSystem, string> = { metric: 'kg m2', imperial: 'lb in2' };
const DRAG_AREA: Record<UnitSystem, string> = { metric: 'm2', imperial: 'ft2' };
/** Descent rates in ft/s, as the trade gives them (format-number.ts says the same). */
const DESCENT: Record<UnitSystem, string> = { metric: 'm/s', imperial: 'ft/s' };
const CANOPY: Record<UnitSystem, string> = { metric: 'm', imperial: 'in' };

export const NOSE_FORMS = [
  { value: 'ogive', label: 'ogive' },
  { value: 'cone', label: 'cone' },
  { value: 'parabola', label: 'parabola' },
] as const;
export const FIN_COUNTS = [
  { value: 3, label: '3' },
  { value: 4, label: '4' },
] as const;
export const TRIGGERS = [
  { value: 'apogee', label: 'at apogee' },
  { value: 'altitude', label: 'at an altitude' },
  { value: 'time', label: 'at a time' },
] as const;

/** The three ways the format lets a stage give its drag. */
export type DragWay = 'descentRate' | 'dragArea' | 'canopy';
export const DRAG_WAYS: readonly { value: DragWay; label: string }[] = [
  { value: 'descentRate', label: 'descent rate' },
  { value: 'dragArea', label: 'drag area' },
  { value: 'canopy', label: 'canopy size' },
];

/** A box of the vehicle editor: a day field, or a choice that changes the file's structure. */
export interface VehicleField extends DayField {
  /** Reads the value shown when it is not simply the value at `path` (the drag way). */
  read?: (json: unknown) => unknown;
  /** A choice that rewrites more than its own value (a trigger drops the fields it no longer needs). */
  structural?: 'trigger' | 'dragWay';
}

export type VehicleGroupKind = 'rocket' | 'motor' | 'shape' | 'transition' | 'fins' | 'stage';

export interface VehicleGroup {
  id: string;
  kind: VehicleGroupKind;
  title: string;
  note?: string;
  /** Index in its list (transitions, fins, recovery). */
  index?: number;
  fields: VehicleField[];
}

function f(path: FieldPath, label: string, dimension: Dimension, units: Record<UnitSystem, string> | undefined, extra: Partial<VehicleField> = {}): VehicleField {
  return { path, issuePath: formatPath(path), label, kind: 'quantity', dimension, units, digits: 5, ...extra };
}

const isRecord = (x: unknown): x is Record<string, unknown> => x !== null && typeof x === 'object' && !Array.isArray(x);

/** How a stage in the file gives its drag (descent rate when it gives none yet). */
export function dragWayOf(stage: unknown): DragWay {
  if (!isRecord(stage)) return 'descentRate';
  if (stage.dragArea !== undefined) return 'dragArea';
  if (stage.diameter !== undefined || stage.drag !== undefined) return 'canopy';
  return 'descentRate';
}

function rocketGroups(json: unknown): VehicleGroup[] {
  const vehicle = valueAt(json, ['vehicle']);
  const groups: VehicleGroup[] = [];
  const v = ['vehicle'];
  const body: VehicleField[] = [f([...v, 'mass'], 'Mass without propellant', 'mass', MASS)];
  // A shape needs the body diameter; a point-mass rocket may give a reference area instead.
  if (valueAt(json, [...v, 'referenceArea']) === undefined || valueAt(json, [...v, 'shape']) !== undefined) body.push(f([...v, 'diameter'], 'Body diameter', 'length', SMALL_LENGTH));
  groups.push({ id: 'rocket', kind: 'rocket', title: 'Rocket', fields: body });

  const m = [...v, 'motor'];
  groups.push({
    id: 'motor',
    kind: 'motor',
    title: 'Motor',
    fields: [f([...m, 'propellantMass'], 'Propellant mass', 'mass', PROPELLANT), f([...m, 'length'], 'Motor length', 'length', SMALL_LENGTH, { optional: true, placeholder: 'needed with a shape' })],
  });

  const shape = isRecord(vehicle) ? vehicle.shape : undefined;
  if (!isRecord(shape)) return groups;
  const s = [...v, 'shape'];
  groups.push({
    id: 'shape',
    kind: 'shape',
    title: 'Shape and balance',
    note: 'Positions from the nose tip toward the tail. Leave length, inertia or nozzle position empty for the format\u2019s default.',
    fields: [
      { ...f([...s, 'nose', 'form'], 'Nose form', 'number', undefined), kind: 'choice', choices: NOSE_FORMS, dimension: undefined, units: undefined },
      f([...s, 'nose', 'length'], 'Nose length', 'length', SMALL_LENGTH),
      f([...s, 'length'], 'Length, nose tip to aft end', 'length', SMALL_LENGTH, { optional: true, placeholder: 'aft-most part' }),
      f([...s, 'cg'], 'Balance point (CG), ready to fly', 'length', SMALL_LENGTH),
      f([...s, 'inertia'], 'Transverse inertia about the CG', 'inertia', INERTIA, { optional: true, placeholder: 'm L\u00b2/12' }),
      f([...s, 'motorEnd'], 'Nozzle exit from the nose tip', 'length', SMALL_LENGTH, { optional: true, placeholder: 'the aft end' }),
    ],
  });
  const transitions = Array.isArray(shape.transitions) ? shape.transitions : [];
  transitions.forEach((_t, i) => {
    const t = [...s, 'transitions', i];
    groups.push({
      id: `transition-${i}`,
      kind: 'transition',
      index: i,
      title: `Transition ${i + 1}`,
      fields: [
        f([...t, 'position'], 'Starts at', 'length', SMALL_LENGTH),
        f([...t, 'length'], 'Length', 'length', SMALL_LENGTH),
        f([...t, 'foreDiameter'], 'Diameter at its front', 'length', SMALL_LENGTH),
        f([...t, 'aftDiameter'], 'Diameter at its back', 'length', SMALL_LENGTH),
      ],
    });
  });
  const fins = Array.isArray(shape.fins) ? shape.fins : [];
  fins.forEach((_fin, i) => {
    const p = [...s, 'fins', i];
    groups.push({
      id: `fins-${i}`,
      kind: 'fins',
      index: i,
      title: fins.length === 1 ? 'Fins' : `Fin set ${i + 1}`,
      fields: [
        { ...f([...p, 'count'], 'Number of fins', 'number', undefined), kind: 'choice', choices: FIN_COUNTS, dimension: undefined, units: undefined },
        f([...p, 'position'], 'Root leading edge from the nose tip', 'length', SMALL_LENGTH),
        f([...p, 'rootChord'], 'Root chord', 'length', SMALL_LENGTH),
        f([...p, 'tipChord'], 'Tip chord', 'length', SMALL_LENGTH),
        f([...p, 'span'], 'Span (one fin, body to tip)', 'length', SMALL_LENGTH),
        f([...p, 'sweep'], 'Sweep (root to tip leading edge)', 'length', SMALL_LENGTH),
      ],
    });
  });
  return groups;
}

function stageGroups(json: unknown): VehicleGroup[] {
  const recovery = valueAt(json, ['recovery']);
  if (!Array.isArray(recovery)) return [];
  return recovery.map((stage: unknown, i) => {
    const r = ['recovery', i];
    const trigger = isRecord(stage) ? stage.trigger : undefined;
    const way = dragWayOf(stage);
    const fields: VehicleField[] = [
      { ...f([...r, 'name'], 'Name', 'number', undefined), kind: 'text', dimension: undefined, units: undefined },
      { ...f([...r, 'trigger'], 'Opens', 'number', undefined), kind: 'choice', choices: TRIGGERS, dimension: undefined, units: undefined, structural: 'trigger' },
    ];
    if (trigger === 'altitude') fields.push(f([...r, 'altitude'], 'Altitude above the pad', 'length', undefined));
    if (trigger === 'time') fields.push(f([...r, 'time'], 'Time after launch', 'time', undefined));
    fields.push(f([...r, 'delay'], 'Delay after the trigger', 'time', undefined, { optional: true, placeholder: 'none' }));
    fields.push({
      ...f([...r, 'dragWay'], 'Drag given as', 'number', undefined),
      kind: 'choice',
      choices: DRAG_WAYS,
      dimension: undefined,
      units: undefined,
      structural: 'dragWay',
      read: (doc) => dragWayOf(valueAt(doc, r)),
    });
    if (way === 'descentRate') fields.push(f([...r, 'descentRate'], 'Descent rate at sea level', 'speed', DESCENT));
    if (way === 'dragArea') fields.push(f([...r, 'dragArea'], 'Drag area Cd·A', 'area', DRAG_AREA));
    if (way === 'canopy') {
      fields.push(f([...r, 'diameter'], 'Canopy diameter', 'length', CANOPY));
      fields.push(f([...r, 'drag'], 'Drag coefficient for that diameter', 'number', undefined));
      fields.push({ ...f([...r, 'canopy'], 'Canopy note (its kind, for reports)', 'number', undefined), kind: 'text', dimension: undefined, units: undefined, optional: true, placeholder: 'e.g. flat circular' });
    }
    const name = isRecord(stage) && typeof stage.name === 'string' ? stage.name : '';
    return { id: `stage-${i}`, kind: 'stage' as const, index: i, title: `Recovery stage ${i + 1}${name ? `: ${name}` : ''}`, fields };
  });
}

/** The editor's groups for the document's vehicle kind (projectiles have no recovery). */
export function vehicleFieldGroups(json: unknown): VehicleGroup[] {
  const kind = valueAt(json, ['vehicle', 'kind']);
  if (kind === 'rocket') return [...rocketGroups(json), ...stageGroups(json)];
  if (kind === 'release') return stageGroups(json);
  return [];
}
