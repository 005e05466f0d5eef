import type { Unit } from './systems.js';

/**
 * Numbers as the page shows them: English digit grouping everywhere (the scenario files and the
 * command line use it too), a fixed number of decimals per kind of figure.
 */

export function grouped(x: number, decimals = 0): string {
  if (!Number.isFinite(x)) return 'n/a';
  return x.toLocaleString('en', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
}

/** An SI value in `unit`, e.g. "3,089 ft". */
export function inUnit(si: number, unit: Unit, decimals = 0): string {
  if (!Number.isFinite(si)) return 'n/a';
  const text = grouped(si / unit.si, decimals);
  return unit.label === '' ? text : unit.label === '°' ? `${text}°` : `${text} ${unit.label}`;
}

/** A probability as a percentage with enough digits to tell small values apart. */
export function percent(p: number): string {
  if (!Number.isFinite(p)) return 'n/a';
  if (p === 0) return '0 %';
  const pct = p * 100;
  if (pct >= 10) return `${pct.toFixed(1)} %`;
  if (pct >= 0.1) return `${pct.toFixed(2)} %`;
  return `${pct.toPrecision(2)} %`;
}

/** A probability level such as 0.99 as "99 %" (one decimal only where needed: "99.9 %"). */
export function level(p: number): string {
  const pct = p * 100;
  return `${Number.isInteger(Math.round(pct * 1e6) / 1e6) ? pct.toFixed(0) : String(Number(pct.toFixed(2)))} %`;
}

/** A field value for an input box: up to `significant` digits, no grouping (it must parse back). */
export function fieldNumber(x: number, significant = 6): string {
  if (!Number.isFinite(x)) return '';
  return String(Number(x.toPrecision(significant)));
}
