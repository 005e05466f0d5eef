/**
 * The event sheet: page 1 the map (site, every item's keep-out zone, their union, the event's
 * individual-risk lines), page 2 the record (items, areas, totals for the whole event, sign-off).
 * Drawn as display lists in the review sheet's type, palette and rules, so event-map.svg and the
 * PDF are one drawing.
 */
import { createLocalFrame } from '../analysis/geodesy.js';
import type { Page, Shape, Stroke } from '../report/sheet/display-list.js';
import { CAP_HEIGHT, defaultMeasure, wrapText, type TextMeasure } from '../report/sheet/fonts.js';
import { layoutLegend, padSymbol, type LegendEntry } from '../report/sheet/legend.js';
import { polygonsInMetres, polygonsPath, basemapShapes, readBasemap, type Metres } from '../report/sheet/map-layers.js';
import { northArrow, scaleBar } from '../report/sheet/map-furniture.js';
import { boundsOfPoints, chooseExtent, fitView, union, type Bounds } from '../report/sheet/map-view.js';
import { cautionBox, cautionHeight, dateText, MARGIN, PAPER_SIZES, titleBlock, type Paper } from '../report/sheet/page-parts.js';
import { areaStyle, BOUNDARY_STROKE, INK, INK_SOFT, KEEP_OUT_FILL, KEEP_OUT_STROKE } from '../report/sheet/palette.js';
import { renderPdf } from '../report/sheet/render-pdf.js';
import { renderSvg } from '../report/sheet/render-svg.js';
import { grouped, percent, smallRate, unitFormatter, type UnitSystem } from '../report/sheet/units.js';
import { toWinAnsi } from '../report/sheet/winansi.js';
import type { Launch, Site } from '../scenario/types.js';
import { eventItemZoneSymbol, riskLineSymbol, WORDS } from '../report/symbols.js';
import { releaseRoute, routeLegend, routePoints, routeShapes } from '../report/sheet/release-route.js';
import type { EventTotals } from './combine.js';

export interface EventSheetInput {
  totals: EventTotals;
  site: Site;
  /** Every item's pad (items may fly from different pads on the site). */
  pads: { lat: number; lon: number }[];
  /** Every item's launch, in item order: a drone operation's route or area is drawn. */
  launches?: Launch[];
  computedAt: string;
  version: string;
}

export interface EventSheetChoices {
  paper?: Paper;
  units?: UnitSystem;
}

/** Item zones and risk lines in the shared symbol set (src/report/symbols.ts), as on the page's map. */
const itemStroke = (i: number): Stroke => eventItemZoneSymbol(i);
const riskStroke = (k: number): Stroke => riskLineSymbol(k);

const riskText = (level: number): string => `1 in ${grouped(Math.round(1 / level))}`;

function particulars(input: EventSheetInput): string {
  const t = input.totals;
  return ['Event plan', `${t.items.length} items, ${grouped(t.flights)} flights`, `computed ${dateText(input.computedAt)}`, `strewn ${input.version}`].join('  \u00b7  ');
}

function mapPage(input: EventSheetInput, paper: Paper, units: UnitSystem, measure: TextMeasure): Page {
  const size = PAPER_SIZES[paper];
  const width = size.width - 2 * MARGIN;
  const frame = createLocalFrame(input.site.pad);
  const t = input.totals;
  const title = titleBlock(t.name, particulars(input), 'Page 1 of 2', MARGIN, MARGIN, width, measure);
  const zones = t.zones.map((z) => polygonsInMetres(frame, z.zone.geometry));
  const unionZone = t.union ? polygonsInMetres(frame, t.union.geometry) : null;
  const areas = input.site.areas.map((a) => ({ area: a, polygons: polygonsInMetres(frame, a.geometry) }));
  let core: Bounds = boundsOfPoints([[0, 0]]);
  for (const z of zones) core = union(core, boundsOfPoints(z.flat(2) as Metres[]));
  const routes = (input.launches ?? []).flatMap((launch, i) => {
    const route = releaseRoute(frame, launch);
    return route ? [{ route, item: t.items[i]?.name ?? String(i + 1) }] : [];
  });
  for (const r of routes) core = union(core, boundsOfPoints(routePoints(r.route)));
  const reach = Math.max(Math.abs(core.minX), Math.abs(core.maxX), Math.abs(core.minY), Math.abs(core.maxY));
  const extent = chooseExtent({ core, areas: areas.map((a) => boundsOfPoints(a.polygons.flat(2) as Metres[])), reach });

  const legend: LegendEntry[] = [
    { swatch: { kind: 'area', fill: KEEP_OUT_FILL, stroke: KEEP_OUT_STROKE }, text: 'Keep-out zone of the event (union of the items)' },
    ...t.zones.map((z, i) => ({ swatch: { kind: 'line' as const, stroke: itemStroke(i) }, text: WORDS.eventItemZone(z.name) })),
    ...t.individualRisk.lines.map((l, k) => ({ swatch: { kind: 'line' as const, stroke: riskStroke(k) }, text: `Individual risk ${riskText(l.level)} per event` })),
    { swatch: { kind: 'pad' }, text: 'Pad' },
    ...[...new Set(routes.map((r) => r.route.kind))].map((kind) => routeLegend(kind)),
  ];
  const kinds = [...new Set(input.site.areas.map((a) => a.kind))];
  for (const kind of kinds) legend.push({ swatch: { kind: 'area', fill: areaStyle(kind).fill, stroke: areaStyle(kind).stroke }, text: areaStyle(kind).label });
  const legendLaid = layoutLegend(legend, MARGIN, 0, width, 2, measure);
  const caution = cautionHeight(width, measure);
  const frameTop = title.bottom + 6;
  const frameHeight = size.height - MARGIN - caution - 8 - legendLaid.height - 10 - frameTop;
  const rect = { x: MARGIN, y: frameTop, width, height: frameHeight };
  const view = fitView(extent, rect);

  const inside: Shape[] = [];
  inside.push(...basemapShapes(view, readBasemap(frame, input.site.basemap)));
  if (input.site.boundary) inside.push({ kind: 'path', d: polygonsPath(view, polygonsInMetres(frame, input.site.boundary)), stroke: BOUNDARY_STROKE });
  for (const a of areas) {
    const style = areaStyle(a.area.kind);
    inside.push({ kind: 'path', className: 'area', d: polygonsPath(view, a.polygons), fill: style.fill, stroke: style.stroke, evenOdd: true });
  }
  for (const r of routes) inside.push(...routeShapes(view, r.route, { item: r.item }));
  if (unionZone) inside.push({ kind: 'path', id: 'event-zone', d: polygonsPath(view, unionZone), fill: KEEP_OUT_FILL, stroke: KEEP_OUT_STROKE, evenOdd: true });
  zones.forEach((z, i) => inside.push({ kind: 'path', className: 'item-zone', data: { item: t.zones[i].name }, d: polygonsPath(view, z), stroke: itemStroke(i) }));
  t.individualRisk.lines.forEach((l, k) => inside.push({ kind: 'path', className: 'risk-line', data: { level: String(l.level) }, d: polygonsPath(view, polygonsInMetres(frame, l.geometry)), stroke: riskStroke(k) }));
  // Every pad used by an item.
  const pads = new Map<string, [number, number]>([['0,0', view.toPage(0, 0)]]);
  for (const pad of input.pads) {
    const [e, n] = frame.toEastNorth(pad.lon, pad.lat);
    pads.set(`${e.toFixed(1)},${n.toFixed(1)}`, view.toPage(e, n));
  }
  [...pads.values()].forEach(([x, y], i) => inside.push({ kind: 'group', ...(i === 0 ? { id: 'pad' } : {}), className: 'pad', shapes: padSymbol(x, y) }));
  for (const a of areas) {
    const ring = a.polygons[0]?.[0];
    if (!ring || ring.length === 0) continue;
    const cx = ring.reduce((s, p) => s + p[0], 0) / ring.length;
    const cy = ring.reduce((s, p) => s + p[1], 0) / ring.length;
    const [x, y] = view.toPage(cx, cy);
    inside.push({ kind: 'text', x, y: y + 3, text: toWinAnsi(a.area.name), size: 7.5, font: 'bold', anchor: 'middle', color: INK });
  }
  const u = unitFormatter(units);
  inside.push(...northArrow(rect).shapes, ...scaleBar(view, u, measure).shapes);

  const shapes: Shape[] = [
    ...title.shapes,
    { kind: 'clip', ...rect, shapes: inside },
    { kind: 'rect', ...rect, stroke: { color: INK, width: 0.8 } },
  ];
  const legendTop = frameTop + frameHeight + 8;
  shapes.push(...layoutLegend(legend, MARGIN, legendTop, width, 2, measure).shapes);
  shapes.push(...cautionBox(MARGIN, size.height - MARGIN - caution, width, measure).shapes);
  return { width: size.width, height: size.height, shapes };
}

interface Column {
  title: string;
  weight: number;
  align: 'start' | 'end';
}

function table(columns: Column[], rows: string[][], x: number, y: number, width: number, measure: TextMeasure): { shapes: Shape[]; bottom: number } {
  const sizeText = 8;
  const row = sizeText * 1.45;
  const total = columns.reduce((s, c) => s + c.weight, 0);
  const widths = columns.map((c) => (c.weight / total) * width);
  const shapes: Shape[] = [];
  let baseline = y + sizeText * CAP_HEIGHT;
  const cells = (texts: string[], font: 'bold' | 'regular') => {
    let cx = x;
    texts.forEach((text, i) => {
      const col = columns[i];
      let shown = toWinAnsi(text);
      while (shown.length > 1 && measure(shown, sizeText, font) > widths[i] - (i > 0 && col.align === 'start' ? 12 : 4)) shown = `${shown.slice(0, -2)}\u2026`;
      shapes.push({ kind: 'text', x: col.align === 'end' ? cx + widths[i] - 2 : cx + (i > 0 ? 8 : 0), y: baseline, text: shown, size: sizeText, font, anchor: col.align, color: INK });
      cx += widths[i];
    });
  };
  cells(columns.map((c) => c.title), 'bold');
  shapes.push({ kind: 'path', d: [['M', x, baseline + 3], ['L', x + width, baseline + 3]], stroke: { color: INK, width: 0.6 } });
  baseline += row;
  for (const r of rows) {
    cells(r, 'regular');
    baseline += row;
  }
  return { shapes, bottom: baseline - row + 6 };
}

function heading(text: string, x: number, y: number): { shapes: Shape[]; bottom: number } {
  return { shapes: [{ kind: 'text', x, y: y + 10.5 * CAP_HEIGHT, text, size: 10.5, font: 'bold', anchor: 'start', color: INK }], bottom: y + 16 };
}

function recordPage(input: EventSheetInput, paper: Paper, units: UnitSystem, measure: TextMeasure): Page {
  const size = PAPER_SIZES[paper];
  const width = size.width - 2 * MARGIN;
  const t = input.totals;
  const u = unitFormatter(units);
  const shapes: Shape[] = [];
  const title = titleBlock(t.name, particulars(input), 'Page 2 of 2', MARGIN, MARGIN, width, measure);
  shapes.push(...title.shapes);
  let y = title.bottom + 10;
  const push = (part: { shapes: Shape[]; bottom: number }) => {
    shapes.push(...part.shapes);
    y = part.bottom + 6;
  };
  push(heading('Items', MARGIN, y));
  push(
    table(
      [
        { title: 'Item', weight: 3.6, align: 'start' },
        { title: 'Flights', weight: 0.9, align: 'end' },
        { title: 'Samples', weight: 1, align: 'end' },
        { title: 'Zone area', weight: 1.4, align: 'end' },
        { title: 'Reach', weight: 1, align: 'end' },
        { title: 'Exp. casualties', weight: 1.5, align: 'end' },
        { title: 'When', weight: 2.2, align: 'start' },
      ],
      t.items.map((r) => [
        r.chancePerFlight < 1 ? `${r.name} (down in ${percent(r.chancePerFlight)})` : r.name,
        grouped(r.flights),
        `${grouped(r.samples)}${r.failedSamples > 0 ? ` (${r.failedSamples} failed)` : ''}`,
        u.area(r.keepOut_m2 ?? NaN),
        u.length(r.reach_m ?? NaN),
        smallRate(r.expectedCasualties),
        r.window ? `${r.window.start.slice(0, 16).replace('T', ' ')} to ${r.window.end.slice(11, 16)}` : 'any time',
      ]),
      MARGIN,
      y,
      width,
      measure,
    ),
  );
  push(heading('Places that matter, for the whole event', MARGIN, y));
  push(
    table(
      [
        { title: 'Area', weight: 3, align: 'start' },
        { title: 'Kind', weight: 1.3, align: 'start' },
        { title: 'People', weight: 0.9, align: 'end' },
        { title: 'Expected landings', weight: 1.6, align: 'end' },
        { title: 'Chance of any landing', weight: 1.9, align: 'end' },
        { title: 'Exp. casualties', weight: 1.5, align: 'end' },
      ],
      t.areas.map((a) => [a.name, a.kind, a.people === undefined ? '' : grouped(a.people), smallRate(a.expectedLandings), percent(a.chanceOfAnyLanding), a.expectedCasualties === undefined ? 'no head count' : smallRate(a.expectedCasualties)]),
      MARGIN,
      y,
      width,
      measure,
    ),
  );
  push(heading('Totals for the event', MARGIN, y));
  const ir = t.individualRisk;
  const lines = [
    `${grouped(t.flights)} flights of ${t.items.length} items. Expected casualties for the whole event: ${smallRate(t.total.expectedCasualties)} (sum over flights).`,
    `Keep-out zone of the event (union of the items' zones): ${u.area(t.unionArea_m2 ?? NaN)}, reaching ${u.length(t.unionReach_m ?? NaN)} from the event pad.`,
    `Highest individual risk over the event: ${smallRate(ir.max)} (chance that one person standing at that place all event long is harmed); lines drawn at ${ir.lines.length > 0 ? ir.lines.map((l) => riskText(l.level)).join(', ') : 'none (all levels above the highest value)'}.`,
    `Casualty figures: ${t.harmModel ?? 'none (no area has a head count)'}. Indicative only, never a compliance figure.`,
  ];
  for (const line of lines) {
    for (const w of wrapText(measure, toWinAnsi(line), 8.5, 'regular', width)) {
      shapes.push({ kind: 'text', x: MARGIN, y: y + 8.5 * CAP_HEIGHT, text: w, size: 8.5, font: 'regular', anchor: 'start', color: INK });
      y += 8.5 * 1.3;
    }
    y += 3;
  }
  y += 8;
  push(heading('Sign-off', MARGIN, y));
  const signWidth = (width - 20) / 2;
  for (const [k, label] of ['Safety officer (name, signature)', 'Event organiser (name, signature)'].entries()) {
    const x = MARGIN + k * (signWidth + 20);
    shapes.push({ kind: 'path', d: [['M', x, y + 28], ['L', x + signWidth, y + 28]], stroke: { color: INK, width: 0.7 } });
    shapes.push({ kind: 'text', x, y: y + 38, text: label, size: 8, font: 'regular', anchor: 'start', color: INK_SOFT });
    shapes.push({ kind: 'path', d: [['M', x, y + 64], ['L', x + signWidth, y + 64]], stroke: { color: INK, width: 0.7 } });
    shapes.push({ kind: 'text', x, y: y + 74, text: 'Date and time', size: 8, font: 'regular', anchor: 'start', color: INK_SOFT });
  }
  y += 90;
  const note = 'Each item\u2019s own review sheet (map and record) is in its folder under items/. The event\u2019s figures add the items\u2019 per-flight figures times their flights; the local range-safety code and the safety officer decide.';
  for (const w of wrapText(measure, toWinAnsi(note), 8, 'italic', width)) {
    shapes.push({ kind: 'text', x: MARGIN, y: y + 8 * CAP_HEIGHT, text: w, size: 8, font: 'italic', anchor: 'start', color: INK_SOFT });
    y += 8 * 1.3;
  }
  const caution = cautionHeight(width, measure);
  shapes.push(...cautionBox(MARGIN, size.height - MARGIN - caution, width, measure).shapes);
  return { width: size.width, height: size.height, shapes };
}

export function buildEventSheet(input: EventSheetInput, choices: EventSheetChoices = {}): { svg: string; pdf: Uint8Array } {
  const paper = choices.paper ?? 'a4';
  const units = choices.units ?? 'metric';
  const measure = defaultMeasure();
  const pages = [mapPage(input, paper, units, measure), recordPage(input, paper, units, measure)];
  const date = new Date(input.computedAt);
  return {
    svg: renderSvg(pages[0], input.totals.name),
    pdf: renderPdf(pages, { title: toWinAnsi(input.totals.name), subject: 'Event plan', creator: `strewn ${input.version}`, date: Number.isNaN(date.getTime()) ? new Date(0) : date }),
  };
}
