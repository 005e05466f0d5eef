import { formatPath } from '../../../src/scenario/errors.js';
import type { Dimension } from '../../../src/scenario/units.js';
import type { UnitSystem } from '../units/systems.js';
import { valueAt, type FieldPath } from './document.js';

/**
 * The fields people change on the day, read from the document itself: the pad, the wind, the
 * spreads the file has, the failure probabilities, samples and seed. Everything else is edited in
 * the file.
 */

export type FieldKind = 'quantity' | 'integer' | 'text' | 'choice';

export interface DayField {
  path: FieldPath;
  /** The path as validation issues name it ("uncertainty.wind.speed.sd"). */
  issuePath: string;
  label: string;
  kind: FieldKind;
  dimension?: Dimension;
  /** Spreads may be relative ("8 %"). */
  allowRelative?: boolean;
  /** Leaving it empty removes it from the file. */
  optional?: boolean;
  /** Significant digits shown (latitude and longitude need more). */
  digits?: number;
  /** The unit shown per system, where the dimension's usual one reads badly (a fin in mm, not m). */
  units?: Record<UnitSystem, string>;
  /** Shown in an empty optional box: what the format takes when it is left out. */
  placeholder?: string;
  /** For kind 'choice': the values the format allows, as written into the file, and their names. */
  choices?: readonly { value: string | number; label: string }[];
}

export interface FieldGroup {
  id: 'pad' | 'wind' | 'spreads' | 'failures' | 'run';
  title: string;
  fields: DayField[];
  /** Said under the group's title. */
  note?: string;
}

function field(path: FieldPath, label: string, kind: FieldKind, extra: Partial<DayField> = {}): DayField {
  return { path, issuePath: formatPath(path), label, kind, ...extra };
}

/** How each spread is shown, and the unit its absolute values are in. */
const SPREADS: Record<string, { label: string; dimension: Dimension }> = {
  'wind.speed': { label: 'Wind speed', dimension: 'speed' },
  'wind.from': { label: 'Wind direction', dimension: 'angle' },
  'wind.gust': { label: 'Gust speed', dimension: 'speed' },
  'launch.tilt': { label: 'Rail tilt', dimension: 'angle' },
  'launch.azimuth': { label: 'Launch direction', dimension: 'angle' },
  'launch.speed': { label: 'Launch speed', dimension: 'speed' },
  'launch.elevation': { label: 'Launch elevation', dimension: 'angle' },
  'launch.height': { label: 'Launch height', dimension: 'length' },
  'motor.impulse': { label: 'Motor impulse', dimension: 'impulse' },
  'vehicle.mass': { label: 'Mass', dimension: 'mass' },
  'vehicle.drag': { label: 'Drag coefficient', dimension: 'number' },
  'recovery.delay': { label: 'Deployment delay', dimension: 'time' },
  'recovery.rate': { label: 'Descent rate', dimension: 'fraction' },
};

function spreadFields(json: unknown): DayField[] {
  const uncertainty = valueAt(json, ['uncertainty']);
  if (uncertainty === null || typeof uncertainty !== 'object') return [];
  const fields: DayField[] = [];
  for (const [name, spec] of Object.entries(uncertainty as Record<string, unknown>)) {
    const info = SPREADS[name] ?? { label: name, dimension: 'number' as Dimension };
    const base = ['uncertainty', name];
    if (spec !== null && typeof spec === 'object' && 'range' in spec && Array.isArray((spec as { range: unknown }).range)) {
      fields.push(field([...base, 'range', 0], `${info.label}: from`, 'quantity', { dimension: info.dimension, allowRelative: true }));
      fields.push(field([...base, 'range', 1], `${info.label}: to`, 'quantity', { dimension: info.dimension, allowRelative: true }));
    } else {
      fields.push(field([...base, 'sd'], `${info.label}: standard deviation`, 'quantity', { dimension: info.dimension, allowRelative: true }));
    }
  }
  return fields;
}

function failureFields(json: unknown): DayField[] {
  const failures = valueAt(json, ['failures']);
  if (!Array.isArray(failures)) return [];
  return failures.map((f: unknown, i) => {
    const name = f !== null && typeof f === 'object' && typeof (f as { name?: unknown }).name === 'string' ? (f as { name: string }).name : `failure ${i + 1}`;
    return field(['failures', i, 'probability'], name, 'quantity', { dimension: 'fraction' });
  });
}

export function dayFieldGroups(json: unknown): FieldGroup[] {
  const groups: FieldGroup[] = [
    {
      id: 'pad',
      title: 'Launch point',
      note: 'Drag the pad marker on the map, or type its position.',
      fields: [
        field(['site', 'pad', 'lat'], 'Latitude', 'quantity', { dimension: 'angle', digits: 9 }),
        field(['site', 'pad', 'lon'], 'Longitude', 'quantity', { dimension: 'angle', digits: 9 }),
      ],
    },
    {
      id: 'wind',
      title: 'Wind',
      fields: [
        field(['weather', 'wind', 'speed'], 'Mean speed', 'quantity', { dimension: 'speed' }),
        field(['weather', 'wind', 'from'], 'Blowing from', 'quantity', { dimension: 'angle' }),
        field(['weather', 'wind', 'gust'], 'Gusts up to', 'quantity', { dimension: 'speed', optional: true }),
      ],
    },
  ];
  const spreads = spreadFields(json);
  if (spreads.length > 0) groups.push({ id: 'spreads', title: 'Spreads', note: 'A plain number is in the unit shown; write "8 %" for a relative spread.', fields: spreads });
  const failures = failureFields(json);
  if (failures.length > 0) groups.push({ id: 'failures', title: 'Failure probabilities', note: 'Chance per flight.', fields: failures });
  groups.push({
    id: 'run',
    title: 'Samples and seed',
    fields: [field(['run', 'samples'], 'Samples', 'integer', { optional: true }), field(['run', 'seed'], 'Seed', 'text', { optional: true })],
  });
  return groups;
}
