import { describeValue } from './errors.js';
import { fail, leaf, ok, readFractionList, readQuantity, type LeafProblem, type LeafResult } from './fields.js';

/**
 * Readers for the fields of the `risk` block and the risk fields of a site area (see
 * scenario-format.md, section "risk"). Each returns SI values or names what is wrong.
 */

/** Individual-risk levels per flight: fractions strictly between 0 and 1, each given once. */
export const riskLevels = leaf((value): LeafResult<number[]> =>
  readFractionList(value, 'chances per flight like [1e-4, 1e-5, 1e-6]', (v, shown, earlier) =>
    earlier.includes(v) ? `${shown} is given twice; each level once` : undefined,
  ),
).optional();

/**
 * Casualty probability by impact energy: rows [energy, probability], energies strictly increasing,
 * probabilities 0–1 and never falling (more energy never hurts less).
 */
export const casualtyTable = leaf((value): LeafResult<{ energy: number[]; probability: number[] }> => {
  if (!Array.isArray(value) || value.length === 0) {
    return fail(`${describeValue(value)}; expected rows [energy, probability] like [["10 J", 0], ["100 J", 0.5], ["1 kJ", 1]]`);
  }
  const problems: LeafProblem[] = [];
  const energy: number[] = [];
  const probability: number[] = [];
  value.forEach((row: unknown, i) => {
    if (!Array.isArray(row) || row.length !== 2) {
      problems.push({ path: [i], message: `${describeValue(row)} is not a row [energy, probability]` });
      return;
    }
    const e = readQuantity(row[0], 'energy', { min: 0 });
    const p = readQuantity(row[1], 'fraction', { min: 0, max: 1 });
    if (!e.ok) problems.push(...e.problems.map((x) => ({ ...x, path: [i, 0] })));
    if (!p.ok) problems.push(...p.problems.map((x) => ({ ...x, path: [i, 1] })));
    if (!e.ok || !p.ok) return;
    const last = energy.length - 1;
    if (last >= 0 && !(e.value.value > energy[last])) {
      problems.push({ path: [i, 0], message: `${e.value.shown} is not above the previous row's energy; energies must increase` });
    }
    if (last >= 0 && p.value.value < probability[last]) {
      problems.push({ path: [i, 1], message: `${p.value.shown} is below the previous row's probability; a harder impact cannot be less harmful` });
    }
    energy.push(e.value.value);
    probability.push(p.value.value);
  });
  return problems.length > 0 ? { ok: false, problems } : ok({ energy, probability });
}).optional();

/** People per m² in an area. Above 10 per m² is not a crowd people can stand in. */
export const peopleDensity = leaf((value): LeafResult<number> => {
  const r = readQuantity(value, 'number', { min: 0, max: 10 });
  return r.ok ? ok(r.value.value) : r;
}).optional();

/** Share of an area's people under cover. */
export const shelteredShare = leaf((value): LeafResult<number> => {
  const r = readQuantity(value, 'fraction', { min: 0, max: 1 });
  return r.ok ? ok(r.value.value) : r;
}).optional();

/** A chance per flight, strictly between 0 and 1. */
export const perFlight = leaf((value): LeafResult<number> => {
  const r = readQuantity(value, 'fraction', { above: 0, below: 1 });
  return r.ok ? ok(r.value.value) : r;
}).optional();
