import { convertQuantity } from '../../../src/scenario/units.js';
import { fieldNumber } from '../units/format.js';
import { fieldUnit, unitOf, type Unit, type UnitSystem } from '../units/systems.js';
import type { DayField } from './day-fields.js';

/**
 * Between a field's value in the file and the text in its input box. The box shows the value in
 * the chosen unit system; a plain number typed into it is in the unit shown beside it, and a
 * number with a unit ("12 mph") is written to the file as typed, for the validator to read.
 */

export interface ShownValue {
  text: string;
  /** The unit beside the box ('' for none). */
  unit: Unit | null;
}

const PERCENT: Unit = { text: '%', label: '%', si: 0.01 };

export function shownValue(field: DayField, raw: unknown, system: UnitSystem): ShownValue {
  if (field.kind !== 'quantity' || field.dimension === undefined) return { text: raw === undefined ? '' : String(raw), unit: null };
  const unit = field.dimension === 'fraction' ? PERCENT : field.units ? unitOf(field.units[system], field.dimension) : fieldUnit(field.dimension, system);
  if (raw === undefined) return { text: '', unit: unit.label === '' ? null : unit };
  const q = convertQuantity(raw, field.dimension, { allowRelative: field.allowRelative });
  // A value the validator cannot read is shown as it stands, so its message makes sense beside it.
  if (!q.ok) return { text: typeof raw === 'string' ? raw : JSON.stringify(raw), unit: unit.label === '' ? null : unit };
  if (q.relative) return { text: fieldNumber(q.value * 100, field.digits ?? 4), unit: PERCENT };
  return { text: fieldNumber(q.value / unit.si, field.digits ?? 4), unit: unit.label === '' ? null : unit };
}

const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/** What to write into the file for the text typed; undefined removes an optional field. */
export function writtenValue(field: DayField, typed: string, shownUnit: Unit | null): unknown {
  const text = typed.trim();
  if (text === '') return field.optional ? undefined : '';
  if (field.kind === 'integer') return PLAIN_NUMBER.test(text) ? Number(text) : text;
  if (field.kind === 'text') return typed;
  if (field.kind === 'choice') return field.choices?.find((c) => String(c.value) === text)?.value ?? text;
  if (!PLAIN_NUMBER.test(text)) return text;
  // A plain number in the file is SI (degrees for angles, a fraction for probabilities); write it
  // as a number only when the unit shown is that one, otherwise with the unit shown.
  if (shownUnit === null || shownUnit.si === 1) return Number(text);
  return `${text} ${shownUnit.text}`;
}
