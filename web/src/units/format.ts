import { grouped as groupedText, levelText, percent as percentText } from '../../../src/report/format-number.js';
import type { Unit } from './systems.js';

/**
 * Numbers as the page shows them. Grouping, percentages and levels come from the one formatting
 * module the terminal and the sheet use (src/report/format-number.ts), so the page, the sheet and
 * the command line print the same figure the same way.
 */

export function grouped(x: number, decimals = 0): string {
  if (!Number.isFinite(x)) return 'n/a';
  return groupedText(x, decimals);
}

/** An SI value in `unit`, e.g. "3,089 ft". */
export function inUnit(si: number, unit: Unit, decimals = 0): string {
  if (!Number.isFinite(si)) return 'n/a';
  const text = grouped(si / unit.si, decimals);
  return unit.label === '' ? text : unit.label === '°' ? `${text}°` : `${text} ${unit.label}`;
}

/** A probability as a percentage with two significant figures, as on the sheet. */
export function percent(p: number): string {
  return percentText(p);
}

/** A probability level such as 0.99 as "99 %" (decimals only where needed: "99.9 %"). */
export function level(p: number): string {
  return levelText(p);
}

/** A field value for an input box: up to `significant` digits, no grouping (it must parse back). */
export function fieldNumber(x: number, significant = 6): string {
  if (!Number.isFinite(x)) return '';
  return String(Number(x.toPrecision(significant)));
}
