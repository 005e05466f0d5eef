import { CAUTION } from '../report/caution.js';
import { readResultsFolder, ResultsFolderError } from '../report/sheet/read-results.js';
import { runDate } from '../report/sheet/review-facts.js';
import { VERSION } from '../version.js';
import { compareStudies, comparisonFiles, type Change } from '../compare/compare.js';
import { parseCommandArgs } from './args.js';
import { UsageError } from './errors.js';
import { OutputFolder } from './output-folder.js';

export const COMPARE_HELP = `Usage: strewn compare <results A> <results B> [options]

Compares two results folders of strewn run: keep-out zone area and reach, each probability
region, each area's chance per flight and expected casualties (B minus A), and draws both zones on
one map. Prints the table; with --out writes compare.json, compare.svg and compare.pdf.

Options:
  --out DIR     write the comparison files into DIR
  --force       replace DIR if it is not empty
  --json        print compare.json on stdout
  -h, --help    this help

Exit status: 0 done, 2 bad input (a folder that is not a results folder), 1 anything else.
`;

function read(folder: string) {
  try {
    return readResultsFolder(folder);
  } catch (error) {
    if (error instanceof ResultsFolderError) throw new UsageError(error.message);
    throw error;
  }
}

export async function compareCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('compare', args, { out: { type: 'string' }, force: { type: 'boolean' }, json: { type: 'boolean' } });
  if (values.help) {
    process.stdout.write(COMPARE_HELP);
    return 0;
  }
  if (positionals.length !== 2) throw new UsageError(`compare: expected two results folders, got ${positionals.length}; see strewn compare --help`);
  const A = read(positionals[0]);
  const B = read(positionals[1]);
  const c = compareStudies(A, B, CAUTION);
  if (values.out !== undefined) {
    const out = OutputFolder.prepare(values.out as string, values.force === true);
    try {
      for (const [name, content] of comparisonFiles(c, A, B, VERSION, runDate())) out.write(name, content);
      out.commit();
    } finally {
      out.discard();
    }
  }
  if (values.json === true) {
    process.stdout.write(JSON.stringify(c, null, 2) + '\n');
    return 0;
  }
  const f = (x: number | null, digits = 0) => (x === null ? 'n/a' : x.toLocaleString('en', { maximumFractionDigits: digits }));
  const d = (ch: Change, text: (v: number) => string) => (ch.change === null ? 'n/a' : `${ch.change >= 0 ? '+' : '−'}${text(Math.abs(ch.change))}`);
  const pct = (x: number | null) => (x === null ? 'n/a' : `${(x * 100).toPrecision(2)} %`);
  const lines = [`A: ${c.a.name}`, `B: ${c.b.name}`];
  lines.push(`  zone area      ${f(c.zone.area_m2.a)} m² → ${f(c.zone.area_m2.b)} m²  (${d(c.zone.area_m2, (v) => `${f(v)} m²`)})`);
  lines.push(`  zone reach     ${f(c.zone.maxDistance_m.a)} m → ${f(c.zone.maxDistance_m.b)} m  (${d(c.zone.maxDistance_m, (v) => `${f(v)} m`)})`);
  for (const a of c.areas) {
    const cas = a.expectedCasualties.a !== null || a.expectedCasualties.b !== null ? `; expected casualties ${f(a.expectedCasualties.a, 6)} → ${f(a.expectedCasualties.b, 6)}` : '';
    lines.push(`  area           ${a.name}: chance per flight ${pct(a.probability.a)} → ${pct(a.probability.b)}${cas}`);
  }
  lines.push(`  total          expected casualties ${f(c.total.expectedCasualties.a, 6)} → ${f(c.total.expectedCasualties.b, 6)}`);
  if (c.samePad === false) lines.push('  note           the two studies fly from different pads');
  if (values.out !== undefined) lines.push(`  results        ${values.out as string}`);
  lines.push('', `CAUTION: ${CAUTION}`, '');
  process.stdout.write(lines.join('\n'));
  return 0;
}
