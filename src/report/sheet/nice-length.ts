/**
 * Round distances for the scale bar and the range rings: 1, 2 or 5 times a power of ten in the
 * unit the reader uses (metres, or feet below a mile and miles above), so every label is a number
 * one can read off without arithmetic.
 *
 * @example
 *   roundLengthAtMost(730, 'metric')    // { metres: 500, label: '500 m' }
 *   roundLengthAtMost(2000, 'imperial') // { metres: 1609.344, label: '1 mi' }
 */
import { FOOT_M, MILE_M, grouped, type UnitSystem } from '../format-number.js';

export interface RoundLength {
  metres: number;
  label: string;
}

/** Largest 1-2-5 × 10^k not above x (x > 0). */
export function roundDown125(x: number): number {
  const power = 10 ** Math.floor(Math.log10(x));
  const mantissa = x / power;
  // A whisker of tolerance so 500 is not read as 499.9999 through rounding.
  const step = mantissa >= 5 - 1e-9 ? 5 : mantissa >= 2 - 1e-9 ? 2 : 1;
  return step * power;
}

/** A multiple of a round length written in the reader's unit ('1.5 km', '2,000 ft', '0.5 mi'). */
export function lengthLabel(metres: number, system: UnitSystem, inMiles = metres >= MILE_M): string {
  const tidy = (x: number) => String(Number(x.toPrecision(6)));
  if (system === 'metric') return metres >= 1000 ? `${tidy(metres / 1000)} km` : `${tidy(metres)} m`;
  if (inMiles) return `${tidy(metres / MILE_M)} mi`;
  return `${grouped(Math.round(metres / FOOT_M))} ft`;
}

/** The largest round length not above `maxMetres`. */
export function roundLengthAtMost(maxMetres: number, system: UnitSystem): RoundLength {
  if (!(maxMetres > 0)) throw new Error(`a round length needs a positive bound, got ${maxMetres}`);
  if (system === 'metric') {
    const metres = roundDown125(maxMetres);
    return { metres, label: lengthLabel(metres, system) };
  }
  if (maxMetres >= MILE_M) {
    const metres = roundDown125(maxMetres / MILE_M) * MILE_M;
    return { metres, label: lengthLabel(metres, system, true) };
  }
  const metres = roundDown125(maxMetres / FOOT_M) * FOOT_M;
  return { metres, label: lengthLabel(metres, system, false) };
}
