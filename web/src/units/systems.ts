import { convertQuantity, type Dimension } from '../../../src/scenario/units.js';

/**
 * Metric or imperial display. Conversion factors come from the scenario parser's own unit table
 * (src/scenario/units.ts), so a value typed in the page and the same value in a file agree to the
 * last bit.
 */
export type UnitSystem = 'metric' | 'imperial';

export const UNIT_SYSTEMS: readonly UnitSystem[] = ['metric', 'imperial'];

/** A unit the page shows and writes back into the scenario file. */
export interface Unit {
  /** As the scenario format spells it ("mph", "deg", "%"); '' for plain numbers. */
  text: string;
  /** As shown next to numbers ("mph", "°", "%"). */
  label: string;
  /** SI value of one of this unit (fractions: 0.01 for %). */
  si: number;
}

/** Dimensions the page shows, each with its metric and imperial unit (scenario-format spelling). */
const UNIT_TEXT: Partial<Record<Dimension, Record<UnitSystem, string>>> = {
  length: { metric: 'm', imperial: 'ft' },
  speed: { metric: 'm/s', imperial: 'mph' },
  mass: { metric: 'kg', imperial: 'lb' },
  impulse: { metric: 'N s', imperial: 'lbf s' },
  angle: { metric: 'deg', imperial: 'deg' },
  time: { metric: 's', imperial: 's' },
  fraction: { metric: '%', imperial: '%' },
  number: { metric: '', imperial: '' },
};

const LABELS: Record<string, string> = { deg: '°', m2: 'm²', ft2: 'ft²', 'kg m2': 'kg m²', 'lb in2': 'lb in²' };

/** A unit by its scenario-format spelling ("mm", "kg m2"), with its SI value from the parser's table. */
export function unitOf(text: string, dimension: Dimension): Unit {
  if (text === '') return { text, label: '', si: 1 };
  const one = convertQuantity(`1 ${text}`, dimension);
  if (!one.ok) throw new Error(`unit table: '${text}' is not ${dimension}: ${one.message}`);
  return { text, label: LABELS[text] ?? text, si: one.value };
}

/** The unit a field of this dimension is shown and typed in. */
export function fieldUnit(dimension: Dimension, system: UnitSystem): Unit {
  const text = UNIT_TEXT[dimension]?.[system];
  if (text === undefined) throw new Error(`no display unit for ${dimension}`);
  return unitOf(text, dimension);
}

/** Units for figures in the findings: distances and heights, speeds. Areas follow the one area
 * rule of src/report/sheet/units.ts (areaText), shared with the sheet and the terminal. */
export interface FigureUnits {
  length: Unit;
  speed: Unit;
}

export function figureUnits(system: UnitSystem): FigureUnits {
  return { length: fieldUnit('length', system), speed: fieldUnit('speed', system) };
}

/** The paper a unit system's users print on unless they choose: A4 (ISO 216) with metric, US Letter with imperial. */
export function paperFor(system: UnitSystem): 'a4' | 'letter' {
  return system === 'imperial' ? 'letter' : 'a4';
}
