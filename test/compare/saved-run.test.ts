import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { compareStudies, comparisonRows } from '../../src/compare/compare.js';
import { savedRunFromTexts } from '../../src/compare/saved-run.js';
import { CAUTION } from '../../src/report/caution.js';
import { readResultsFolder } from '../../src/report/sheet/read-results.js';
import { ResultsFolderError } from '../../src/report/sheet/results-texts.js';
import { unitFormatter } from '../../src/report/sheet/units.js';
import { runDemo } from '../report/sheet-helpers.js';

/**
 * A saved run as the page reads it (the texts of the files the user picked), against the same
 * folder read by `strewn compare`: the same checks and the same comparison; summary.json alone
 * gives the same figures, without a pad.
 */
const texts = (folder: string) => Object.fromEntries(readdirSync(folder).map((n) => [n, readFileSync(join(folder, n), 'utf8')]));

describe('a saved run from picked files', () => {
  const a = runDemo('club-rocket.json', 300, ['--seed', 'saved-a']);
  const b = runDemo('club-rocket.json', 300, ['--seed', 'saved-b']);

  it('compares as the folders do; summary.json alone gives the same figures without a pad', () => {
    const byFolder = compareStudies(readResultsFolder(a), readResultsFolder(b), CAUTION);
    const byTexts = compareStudies(savedRunFromTexts('a', texts(a)), readResultsFolder(b), CAUTION);
    expect(byTexts).toEqual(byFolder);
    const summaryOnly = compareStudies(savedRunFromTexts('a', { 'summary.json': texts(a)['summary.json'] }), readResultsFolder(b), CAUTION);
    expect(summaryOnly.samePad).toBeNull();
    expect(byFolder.samePad).toBe(true);
    expect({ ...summaryOnly, samePad: true }).toEqual(byFolder);
    // change = B − A, read from the two summaries written by the runs (the arithmetic is the check).
    const sa = JSON.parse(texts(a)['summary.json']!);
    const sb = JSON.parse(texts(b)['summary.json']!);
    expect(byFolder.zone.area_m2.change).toBe(sb.keepOut.area_m2 - sa.keepOut.area_m2);
    // The page's table and compare.pdf share these rows: first the zone, last the total.
    const rows = comparisonRows(byFolder, unitFormatter('metric'));
    expect(rows[0]!.cells[0]).toBe('Keep-out zone area');
    expect(rows.at(-1)!.total).toBe(true);
    expect(rows.length).toBe(2 + byFolder.contours.length + byFolder.areas.length + byFolder.areas.filter((x) => x.expectedCasualties.a !== null || x.expectedCasualties.b !== null).length + 1);
  }, 120_000);

  it('refuses a damaged or missing summary, naming the file and the field', () => {
    const t = texts(a);
    const broken = { ...JSON.parse(t['summary.json']!), samples: 'many' };
    expect(() => savedRunFromTexts('saved', { 'summary.json': JSON.stringify(broken) })).toThrow(/saved\/summary\.json: samples should be/);
    expect(() => savedRunFromTexts('saved', { 'scenario.json': t['scenario.json']! })).toThrow(ResultsFolderError);
    expect(() => savedRunFromTexts('saved', { 'scenario.json': t['scenario.json']! })).toThrow(/no summary\.json among the files \(scenario\.json\)/);
    // The summary's scenario hash must match scenario.json (the check of `strewn sheet`): runs a
    // and b fly one scenario file with other --seed flags, so they pass; an edited scenario does not.
    const other = texts(b);
    expect(() => savedRunFromTexts('saved', { ...t, 'summary.json': other['summary.json']! })).not.toThrow();
    const edited = JSON.parse(t['scenario.json']!);
    edited.name = 'someone else';
    expect(() => savedRunFromTexts('saved', { ...t, 'scenario.json': JSON.stringify(edited) })).toThrow(/scenario\.json/);
  }, 60_000);
});
