/**
 * Two studies side by side (two results folders, or a saved run and the current one in the
 * page): how the keep-out zone's area and reach changed, how each area's chance per flight and
 * expected casualties changed, and the two zones on one map. Pure: reads the sheet inputs the
 * folders give and returns plain numbers and a drawing.
 *
 * @example
 * const c = compareStudies(readResultsFolder('results/a'), readResultsFolder('results/b'));
 * c.zone.area_m2.change   // B − A
 */
import { createLocalFrame } from '../analysis/geodesy.js';
import type { Page, Shape, Stroke } from '../report/sheet/display-list.js';
import { CAP_HEIGHT, defaultMeasure, type TextMeasure } from '../report/sheet/fonts.js';
import { layoutLegend, padSymbol, type LegendEntry } from '../report/sheet/legend.js';
import { polygonsInMetres, polygonsPath, type Metres } from '../report/sheet/map-layers.js';
import { northArrow, scaleBar } from '../report/sheet/map-furniture.js';
import { boundsOfPoints, chooseExtent, fitView, union, type Bounds } from '../report/sheet/map-view.js';
import { cautionBox, cautionHeight, MARGIN, PAPER_SIZES, titleBlock } from '../report/sheet/page-parts.js';
import { areaStyle, BOUNDARY_STROKE, INK } from '../report/sheet/palette.js';
import { renderPdf } from '../report/sheet/render-pdf.js';
import { renderSvg } from '../report/sheet/render-svg.js';
import type { SheetInput } from '../report/sheet/sheet-input.js';
import { percent, smallRate, unitFormatter, type UnitFormatter } from '../report/sheet/units.js';
import { toWinAnsi } from '../report/sheet/winansi.js';
import { SYMBOLS } from '../report/symbols.js';

/**
 * One side of a comparison: a results folder read back, or (in the page) a saved summary.json
 * alone, which has no site, inputs or zone outline; the figures it has are still compared.
 */
export interface CompareSide {
  summary: SheetInput['summary'];
  scenario: SheetInput['scenario'] | null;
  review: SheetInput['review'] | null;
  keepOut: SheetInput['keepOut'];
}

export interface Change {
  a: number | null;
  b: number | null;
  /** b − a, null when either is missing. */
  change: number | null;
}

export interface Comparison {
  a: { name: string; scenarioHash: string; samples: number; seed: string };
  b: { name: string; scenarioHash: string; samples: number; seed: string };
  /** Both fly from the same pad; null when a side is a summary alone (it does not say). */
  samePad: boolean | null;
  zone: { area_m2: Change; maxDistance_m: Change };
  contours: { level: number; area_m2: Change; maxDistance_m: Change }[];
  areas: { name: string; kind: string; probability: Change; upper95: Change; expectedCasualties: Change }[];
  total: { expectedCasualties: Change };
  caution: string;
}

function change(a: number | null | undefined, b: number | null | undefined): Change {
  const x = typeof a === 'number' && Number.isFinite(a) ? a : null;
  const y = typeof b === 'number' && Number.isFinite(b) ? b : null;
  return { a: x, b: y, change: x !== null && y !== null ? y - x : null };
}

interface AreaFigures { name: string; kind: string; probability: number; upper95: number; expectedCasualties?: number }

/**
 * Each area's figures with its expected casualties per flight: the risk block of summary.json
 * when the run has one, else the indicative figure review.json keeps.
 */
function withCasualties(input: CompareSide): AreaFigures[] {
  const risk = (input.summary as unknown as { risk?: { areas?: { name: string; expectedCasualties: number }[] } }).risk?.areas;
  const review = (input.review as unknown as { areas?: { name: string; expectedCasualties?: number }[] } | null)?.areas ?? [];
  return (input.summary.areas as unknown as AreaFigures[]).map((a) => {
    const e = risk?.find((r) => r.name === a.name)?.expectedCasualties ?? review.find((r) => r.name === a.name)?.expectedCasualties;
    return e === undefined ? { ...a } : { ...a, expectedCasualties: e };
  });
}

export function compareStudies(A: CompareSide, B: CompareSide, caution: string): Comparison {
  const sa = A.summary, sb = B.summary;
  const areasA = withCasualties(A);
  const areasB = withCasualties(B);
  const names = [...new Set([...areasA.map((x) => x.name), ...areasB.map((x) => x.name)])];
  const casualties = (list: AreaFigures[]) => (list.some((x) => x.expectedCasualties !== undefined) ? list.reduce((s, x) => s + (x.expectedCasualties ?? 0), 0) : null);
  const levels = [...new Set([...sa.contours.map((c) => c.level), ...sb.contours.map((c) => c.level)])].sort((x, y) => x - y);
  return {
    a: { name: sa.name, scenarioHash: sa.scenarioHash, samples: sa.samples, seed: sa.seed },
    b: { name: sb.name, scenarioHash: sb.scenarioHash, samples: sb.samples, seed: sb.seed },
    samePad: A.scenario === null || B.scenario === null ? null : A.scenario.site.pad.lat === B.scenario.site.pad.lat && A.scenario.site.pad.lon === B.scenario.site.pad.lon,
    zone: { area_m2: change(sa.keepOut.area_m2, sb.keepOut.area_m2), maxDistance_m: change(sa.keepOut.maxDistance_m, sb.keepOut.maxDistance_m) },
    contours: levels.map((level) => {
      const ca = sa.contours.find((c) => c.level === level);
      const cb = sb.contours.find((c) => c.level === level);
      return { level, area_m2: change(ca?.area_m2, cb?.area_m2), maxDistance_m: change(ca?.maxDistance_m, cb?.maxDistance_m) };
    }),
    areas: names.map((name) => {
      const x = areasA.find((r) => r.name === name);
      const y = areasB.find((r) => r.name === name);
      return { name, kind: (x ?? y)!.kind, probability: change(x?.probability, y?.probability), upper95: change(x?.upper95, y?.upper95), expectedCasualties: change(x?.expectedCasualties, y?.expectedCasualties) };
    }),
    total: { expectedCasualties: change(casualties(areasA), casualties(areasB)) },
    caution,
  };
}

/** The shared symbols (src/report/symbols.ts): the page draws a saved run beside the current one with the same. */
const A_STROKE: Stroke = SYMBOLS.compareA;
const B_STROKE: Stroke = SYMBOLS.compareB;

const signed = (x: number | null, text: (v: number) => string): string => (x === null ? 'n/a' : x === 0 ? 'no change' : `${x > 0 ? '+' : '\u2212'}${text(Math.abs(x))}`);

export interface ComparisonRow {
  /** What, A, B, change (B − A). */
  cells: [string, string, string, string];
  /** The closing total (printed bold). */
  total: boolean;
}

/**
 * The table of changes in words and numbers, the same on the comparison page and in the page's
 * Compare tab: zone area and reach, each region's area, each area's chance per flight and
 * expected casualties, and the total.
 */
export function comparisonRows(c: Comparison, u: UnitFormatter): ComparisonRow[] {
  const rows: ComparisonRow[] = [];
  const row = (cells: [string, string, string, string], total = false) => rows.push({ cells, total });
  row(['Keep-out zone area', u.area(c.zone.area_m2.a ?? NaN), u.area(c.zone.area_m2.b ?? NaN), signed(c.zone.area_m2.change, u.area)]);
  row(['Keep-out zone reach', u.length(c.zone.maxDistance_m.a ?? NaN), u.length(c.zone.maxDistance_m.b ?? NaN), signed(c.zone.maxDistance_m.change, u.length)]);
  for (const k of c.contours) row([`${Math.round(k.level * 1000) / 10} % region area`, u.area(k.area_m2.a ?? NaN), u.area(k.area_m2.b ?? NaN), signed(k.area_m2.change, u.area)]);
  for (const a of c.areas) {
    row([`${a.name}: chance per flight`, percent(a.probability.a), percent(a.probability.b), signed(a.probability.change, (v) => percent(v).replace(' %', ' points'))]);
    if (a.expectedCasualties.a !== null || a.expectedCasualties.b !== null) row([`${a.name}: expected casualties`, smallRate(a.expectedCasualties.a), smallRate(a.expectedCasualties.b), signed(a.expectedCasualties.change, (v) => smallRate(v))]);
  }
  row(['Expected casualties, all areas', smallRate(c.total.expectedCasualties.a), smallRate(c.total.expectedCasualties.b), signed(c.total.expectedCasualties.change, (v) => smallRate(v))], true);
  return rows;
}

/**
 * One page: both zones on one map (A solid, B dashed) over A's site (B's when A is a summary
 * alone), and the table of changes.
 */
export function comparisonPage(c: Comparison, A: CompareSide, B: CompareSide, measure: TextMeasure = defaultMeasure()): Page {
  const size = PAPER_SIZES.a4;
  const width = size.width - 2 * MARGIN;
  const u = unitFormatter('metric');
  const site = (A.scenario ?? B.scenario)?.site;
  if (!site) throw new Error('comparisonPage: neither side has a scenario to draw the map from');
  const frame = createLocalFrame(site.pad);
  const title = titleBlock(`Comparison: ${c.a.name} / ${c.b.name}`, `A ${c.a.scenarioHash.slice(0, 12)} (${c.a.samples} samples)  \u00b7  B ${c.b.scenarioHash.slice(0, 12)} (${c.b.samples} samples)`, 'Page 1 of 1', MARGIN, MARGIN, width, measure);
  const zoneA = A.keepOut?.features[0] ? polygonsInMetres(frame, A.keepOut.features[0].geometry) : null;
  const zoneB = B.keepOut?.features[0] ? polygonsInMetres(frame, B.keepOut.features[0].geometry) : null;
  const areas = site.areas.map((a) => ({ a, polygons: polygonsInMetres(frame, a.geometry) }));
  let core: Bounds = boundsOfPoints([[0, 0]]);
  for (const z of [zoneA, zoneB]) if (z) core = union(core, boundsOfPoints(z.flat(2) as Metres[]));
  const reach = Math.max(Math.abs(core.minX), Math.abs(core.maxX), Math.abs(core.minY), Math.abs(core.maxY));
  const extent = chooseExtent({ core, areas: areas.map((x) => boundsOfPoints(x.polygons.flat(2) as Metres[])), reach });
  const rect = { x: MARGIN, y: title.bottom + 6, width, height: 0.5 * size.height };
  const view = fitView(extent, rect);
  const inside: Shape[] = [];
  if (site.boundary) inside.push({ kind: 'path', d: polygonsPath(view, polygonsInMetres(frame, site.boundary)), stroke: BOUNDARY_STROKE });
  for (const x of areas) {
    const st = areaStyle(x.a.kind);
    inside.push({ kind: 'path', d: polygonsPath(view, x.polygons), fill: st.fill, stroke: st.stroke, evenOdd: true });
  }
  if (zoneA) inside.push({ kind: 'path', id: 'zone-a', d: polygonsPath(view, zoneA), stroke: A_STROKE });
  if (zoneB) inside.push({ kind: 'path', id: 'zone-b', d: polygonsPath(view, zoneB), stroke: B_STROKE });
  const [px, py] = view.toPage(0, 0);
  inside.push(...padSymbol(px, py), ...northArrow(rect).shapes, ...scaleBar(view, u, measure).shapes);
  const shapes: Shape[] = [...title.shapes, { kind: 'clip', ...rect, shapes: inside }, { kind: 'rect', ...rect, stroke: { color: INK, width: 0.8 } }];
  const legend: LegendEntry[] = [
    { swatch: { kind: 'line', stroke: A_STROKE }, text: `A: ${c.a.name}` },
    { swatch: { kind: 'line', stroke: B_STROKE }, text: `B: ${c.b.name}` },
  ];
  const laid = layoutLegend(legend, MARGIN, rect.y + rect.height + 8, width, 2, measure);
  shapes.push(...laid.shapes);
  let y = rect.y + rect.height + 8 + laid.height + 10;
  const row = (cells: string[], bold = false) => {
    const xs = [0, 0.36, 0.55, 0.74];
    cells.forEach((text, i) => shapes.push({ kind: 'text', x: MARGIN + xs[i] * width, y: y + 8 * CAP_HEIGHT, text: toWinAnsi(text), size: 8, font: bold ? 'bold' : 'regular', anchor: 'start', color: INK }));
    y += 8 * 1.45;
  };
  row(['', 'A', 'B', 'Change (B \u2212 A)'], true);
  for (const r of comparisonRows(c, u)) row(r.cells, r.total);
  if (c.samePad === false) row(['The two studies fly from different pads; the map is drawn around A\u2019s pad.']);
  if (c.samePad === null) row([`${A.scenario === null ? 'A' : 'B'} is a summary alone: its zone is ${(A.scenario === null ? A : B).keepOut ? 'drawn' : 'not drawn'}, and its pad is not known.`]);
  const ch = cautionHeight(width, measure);
  shapes.push(...cautionBox(MARGIN, size.height - MARGIN - ch, width, measure).shapes);
  return { width: size.width, height: size.height, shapes };
}

export function comparisonFiles(c: Comparison, A: CompareSide, B: CompareSide, version: string, date: Date): [string, string | Uint8Array][] {
  const page = comparisonPage(c, A, B);
  return [
    ['compare.json', JSON.stringify(c, null, 2) + '\n'],
    ['compare.svg', renderSvg(page, `Comparison: ${c.a.name} / ${c.b.name}`)],
    ['compare.pdf', renderPdf([page], { title: toWinAnsi(`Comparison: ${c.a.name} / ${c.b.name}`), creator: `strewn ${version}`, date })],
  ];
}
