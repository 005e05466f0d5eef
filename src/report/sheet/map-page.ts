/**
 * Page 1 of the sheet, also written alone as map.svg: the site, the probability contours, the
 * keep-out zone, the places that matter with their hit probabilities, landing points by mode,
 * range rings, scale bar, north arrow, wind, legend and the caution text.
 *
 * @example
 *   const page = buildMapPage(input, { paper: 'a4', units: 'metric', measure: createTextMeasure() });
 *   renderSvg(page, input.summary.name)
 */
import { createLocalFrame } from '../../analysis/geodesy.js';
import type { Page, Shape } from './display-list.js';
import { wrapText, CAP_HEIGHT } from './fonts.js';
import { aroundPoint, LabelPlacer, type Candidate, type LabelLine } from './labels.js';
import { layoutLegend, padSymbol, releaseSymbol, type LegendEntry } from './legend.js';
import { terrainContours } from '../../terrain/contours.js';
import { basemapShapes, linesPath, lineLabelCandidates, mainRing, pointsAlong, polygonsInMetres, polygonsPath, readBasemap, type Metres, type PagePoint } from './map-layers.js';
import { northArrow, scaleBar, windIndicator } from './map-furniture.js';
import { boundsOfPoints, chooseExtent, fitView, intersection, isEmpty, overlaps, union, type Bounds, type MapView } from './map-view.js';
import { lengthLabel, roundLengthAtMost } from './nice-length.js';
import { cautionBox, cautionHeight, dateText, MARGIN, PAPER_SIZES, titleBlock, warningsBox, type SheetOptions } from './page-parts.js';
import { AREA_STYLES, areaStyle, BASEMAP_LABEL, BASEMAP_LABEL_BACKING, BOUNDARY_STROKE, contourLabelColor, contourStyle, INK, INK_SOFT, KEEP_OUT_FILL, KEEP_OUT_STROKE, MINIMUM_DISTANCE_STROKE, modeMarker, RING_STROKE, STANDING_STROKE, STANDING_UNRESOLVED_STROKE } from './palette.js';
import { standingRing } from '../../risk/standing.js';
import type { SheetInput } from './sheet-input.js';
import { WORDS } from '../symbols.js';
import { grouped, levelText, percent, smallRate, unitFormatter, type UnitSystem } from '../format-number.js';
import { toWinAnsi } from './winansi.js';
import { releaseRoute, routeLegend, routePoints, routeShapes, type ReleaseRoute } from './release-route.js';

/** A short id for a level: 0.9 → '90', 0.995 → '99.5'. */
export function levelId(level: number): string {
  return String(Math.round(level * 1e6) / 1e4);
}

function pointsOf(polygons: Metres[][][]): Metres[] {
  return polygons.flatMap((rings) => rings.flat());
}

export function buildMapPage(input: SheetInput, options: SheetOptions, totalPages = 2): Page {
  const { summary, scenario } = input;
  const { measure } = options;
  const units = unitFormatter(options.units);
  const paper = PAPER_SIZES[options.paper];
  const frame = createLocalFrame(scenario.site.pad);
  const contentWidth = paper.width - 2 * MARGIN;

  // ---- geometry in metres from the pad
  const contours = [...(input.contours?.features ?? [])]
    .sort((a, b) => a.properties.level - b.properties.level)
    .map((f) => ({ level: f.properties.level, polygons: polygonsInMetres(frame, f.geometry) }));
  const keepOutFeature = input.keepOut?.features[0] ?? null;
  const keepOut = keepOutFeature ? polygonsInMetres(frame, keepOutFeature.geometry) : null;
  const areas = scenario.site.areas.map((area, index) => {
    const polygons = polygonsInMetres(frame, area.geometry);
    return { area, index, polygons, bounds: boundsOfPoints(pointsOf(polygons)) };
  });
  const boundary = scenario.site.boundary ? polygonsInMetres(frame, scenario.site.boundary) : null;
  const basemap = readBasemap(frame, scenario.site.basemap);
  const minimumDistance = scenario.site.minimumDistance;
  // A drone operation's route or area replaces the single release point.
  const route = releaseRoute(frame, scenario.launch);
  const release = route === null && scenario.launch.kind === 'release' && (scenario.launch.east !== 0 || scenario.launch.north !== 0) ? ([scenario.launch.east, scenario.launch.north] as Metres) : null;
  const landings = input.landings;
  const risk = summary.risk;
  const standing = risk ? standingRing(risk.standingDistance_m) : null;

  // ---- what the map must show
  let core: Bounds = boundsOfPoints([[0, 0]]);
  if (keepOut) core = union(core, boundsOfPoints(pointsOf(keepOut)));
  for (const c of contours) core = union(core, boundsOfPoints(pointsOf(c.polygons)));
  if (minimumDistance) core = union(core, { minX: -minimumDistance, minY: -minimumDistance, maxX: minimumDistance, maxY: minimumDistance });
  if (release) core = union(core, boundsOfPoints([release]));
  if (route) core = union(core, boundsOfPoints(routePoints(route)));
  if (standing) core = union(core, boundsOfPoints(standing.map((p) => [p[0], p[1]] as Metres)));
  if (!keepOut && landings) core = union(core, boundsOfPoints(landings.east.map((e, i) => [e, landings.north[i]] as Metres)));
  const reach = Math.max(Math.abs(core.minX), Math.abs(core.maxX), Math.abs(core.minY), Math.abs(core.maxY));
  const extent = chooseExtent({ core, areas: areas.map((a) => a.bounds), reach });

  // ---- page layout: title, map frame, legend, note, caution
  const particulars = [
    'Landing-zone map',
    `${grouped(summary.samples)} samples, seed ${summary.seed}`,
    `pad ${scenario.site.pad.lat.toFixed(5)}\u00b0, ${scenario.site.pad.lon.toFixed(5)}\u00b0`,
    `computed ${dateText(input.review.computedAt)}`,
    `strewn ${summary.version}`,
  ].join('  \u00b7  ');
  const title = titleBlock(summary.name, particulars, `Page 1 of ${totalPages}`, MARGIN, MARGIN, contentWidth, measure);
  const legendColumns = 3;
  const noteSize = 8;
  const caution = cautionHeight(contentWidth, measure);
  // Warnings first, where the eye lands: above the map, not only on page 2.
  const warnings = warningsBox([...summary.warnings, ...summary.scenarioWarnings], MARGIN, title.bottom + 4, contentWidth, measure);
  const frameTop = title.bottom + 6 + (warnings.height > 0 ? warnings.height + 4 : 0);
  const offMapAtMost = areas.filter((a) => !overlaps(a.bounds, extent));
  const noteReserve = areas.length > 0 || landings !== null ? wrapText(measure, toWinAnsi(offMapNote(offMapAtMost.map((a) => a.area.name), landings ? landings.east.length : 0, areas.length > 0, areas.length > 1)), noteSize, 'italic', contentWidth).length * noteSize * 1.25 + 2 : 0;
  /** The frame takes the height the legend and the caution leave. */
  const frameFor = (kinds: Set<string>) => {
    const entries = buildLegendEntries(input, contours.map((c) => c.level), basemap.map((b) => b.kind), units.system, release !== null, kinds, route);
    const legendHeight = layoutLegend(entries, 0, 0, contentWidth, legendColumns, measure).height;
    const available = paper.height - MARGIN - caution - 8 - noteReserve - legendHeight - 8 - frameTop;
    return { entries, view: fitView(extent, { x: MARGIN, y: frameTop, width: contentWidth, height: available }) };
  };
  // The legend names only the kinds of area in view; showing more land can bring one more kind in.
  const kindsIn = (shown: Bounds) => new Set(areas.filter((a) => overlaps(a.bounds, shown)).map((a) => a.area.kind as string));
  let layout = frameFor(kindsIn(extent));
  const inView = kindsIn(layout.view.shown);
  if ([...inView].some((k) => !kindsIn(extent).has(k))) layout = frameFor(new Set([...kindsIn(extent), ...inView]));
  const { view, entries: legendEntries } = layout;
  const fb: Bounds = { minX: view.frame.x, minY: view.frame.y, maxX: view.frame.x + view.frame.width, maxY: view.frame.y + view.frame.height };

  // ---- layers inside the frame
  const inside: Shape[] = [];
  inside.push(...basemapShapes(view, basemap));
  if (scenario.site.terrain) {
    // Terrain as thin contour lines under the results: every fifth line a little heavier.
    const terrain = terrainContours(scenario.site.terrain);
    const major = terrain.lines.filter((l) => Math.abs(l.level / terrain.interval) % 5 < 1e-6);
    const minor = terrain.lines.filter((l) => !major.includes(l));
    inside.push({
      kind: 'group',
      id: 'terrain',
      shapes: [
        { kind: 'path', className: 'terrain-contour', d: linesPath(view, minor.map((l) => l.points)), stroke: TERRAIN_STROKE },
        { kind: 'path', className: 'terrain-contour major', d: linesPath(view, major.map((l) => l.points)), stroke: { ...TERRAIN_STROKE, width: TERRAIN_STROKE.width * 2 } },
      ],
    });
  }
  if (boundary) inside.push({ kind: 'path', id: 'site-boundary', className: 'boundary', d: polygonsPath(view, boundary), stroke: BOUNDARY_STROKE, evenOdd: true });
  const rings = rangeRings(view, units.system);
  inside.push(...rings.shapes);
  for (const a of areas) {
    const style = areaStyle(a.area.kind);
    inside.push({ kind: 'path', id: `area-${a.index + 1}`, className: `area area-${a.area.kind}`, data: { name: a.area.name }, d: polygonsPath(view, a.polygons), fill: style.fill, stroke: style.stroke, evenOdd: true });
  }
  // Under the landings and the results: where the object may fail is context for where it lands.
  if (route) inside.push({ kind: 'group', id: route.kind === 'path' ? 'release-path' : 'release-area', shapes: routeShapes(view, route) });
  let landingsOffMap = 0;
  if (landings) {
    const groups = new Map<number, number[]>();
    for (let i = 0; i < landings.east.length; i++) {
      const e = landings.east[i];
      const n = landings.north[i];
      if (e < view.shown.minX || e > view.shown.maxX || n < view.shown.minY || n > view.shown.maxY) {
        landingsOffMap++;
        continue;
      }
      const list = groups.get(landings.mode[i]) ?? [];
      list.push(...view.toPage(e, n));
      groups.set(landings.mode[i], list);
    }
    // Nominal (most common) first, rare modes drawn on top where they can be seen.
    for (const m of [...groups.keys()].sort((a, b) => a - b)) {
      const marker = modeMarker(m);
      inside.push({ kind: 'markers', className: `landings landings-mode-${m}`, data: { mode: summary.modes[m]?.name ?? String(m) }, symbol: marker.symbol, size: marker.size, color: marker.color, opacity: marker.opacity, points: groups.get(m)! });
    }
  }
  contours.forEach((c, k) => {
    inside.push({ kind: 'path', id: `contour-${levelId(c.level)}`, className: 'contour', data: { level: String(c.level) }, d: polygonsPath(view, c.polygons), stroke: contourStyle(k), evenOdd: true });
  });
  if (keepOut && keepOutFeature) {
    inside.push({ kind: 'path', id: 'keep-out', className: 'keep-out', data: { level: String(keepOutFeature.properties.level), margin: String(keepOutFeature.properties.margin_m) }, d: polygonsPath(view, keepOut), fill: KEEP_OUT_FILL, stroke: KEEP_OUT_STROKE, evenOdd: true });
  }
  if (standing && risk) {
    inside.push({
      kind: 'path',
      id: 'standing-distance',
      className: 'risk standing-distance',
      data: { level: String(risk.standingLevel), resolved: String(risk.standingResolved) },
      d: polygonsPath(view, [[standing.map((p) => [p[0], p[1]] as Metres)]]),
      stroke: risk.standingResolved ? STANDING_STROKE : STANDING_UNRESOLVED_STROKE,
    });
  }
  if (minimumDistance) {
    const [cx, cy] = view.toPage(0, 0);
    inside.push({ kind: 'circle', id: 'minimum-distance', cx, cy, r: minimumDistance * view.scale, stroke: MINIMUM_DISTANCE_STROKE });
  }
  const [padX, padY] = view.toPage(0, 0);
  inside.push({ kind: 'group', id: 'pad', shapes: padSymbol(padX, padY) });
  let releaseAt: PagePoint | null = null;
  if (release) {
    releaseAt = view.toPage(release[0], release[1]);
    inside.push({ kind: 'group', id: 'release-point', shapes: releaseSymbol(releaseAt[0], releaseAt[1]) });
  }

  // ---- furniture and labels
  const north = northArrow(view.frame);
  const wind = windIndicator(view.frame, scenario.weather.wind, units, measure);
  const scale = scaleBar(view, units, measure);
  const placer = new LabelPlacer({ minX: fb.minX + 2, minY: fb.minY + 2, maxX: fb.maxX - 2, maxY: fb.maxY - 2 }, measure);
  for (const f of [north, wind, scale]) placer.reserve(f.box);
  placer.reserve({ minX: padX - 5, minY: padY - 5, maxX: padX + 5, maxY: padY + 5 });
  if (releaseAt) placer.reserve({ minX: releaseAt[0] - 5, minY: releaseAt[1] - 5, maxX: releaseAt[0] + 5, maxY: releaseAt[1] + 5 });

  if (keepOut && keepOutFeature) {
    const ring = mainRing(view, keepOut);
    const lines: LabelLine[] = [
      { text: WORDS.keepOut, size: 8.5, font: 'bold', color: KEEP_OUT_STROKE.color },
      { text: toWinAnsi(WORDS.keepOutRecipe(levelText(keepOutFeature.properties.level), units.length(keepOutFeature.properties.margin_m))), size: 8, font: 'regular', color: KEEP_OUT_STROKE.color },
    ];
    placer.place(lines, lineLabelCandidates(ring, 315), { required: true, className: 'label label-keep-out' });
  }
  contours.forEach((c, k) => {
    const ring = mainRing(view, c.polygons);
    const lines: LabelLine[] = [{ text: levelText(c.level), size: 8, font: 'bold', color: contourLabelColor(k) }];
    placer.place(lines, lineLabelCandidates(ring, 45 + 25 * k), { required: true, className: 'label label-contour' });
  });
  if (!keepOut && contours.length === 0) {
    // Say plainly why the map has no zones, where the eye looks first.
    const landed = summary.modes.reduce((sum, m) => sum + (m.landed ?? 0), 0);
    placer.place(
      [
        { text: 'No probability regions and no keep-out zone', size: 10, font: 'bold', color: KEEP_OUT_STROKE.color },
        { text: `Only ${grouped(landed)} of ${grouped(summary.samples)} samples landed: too few to draw them. Run more samples.`, size: 8.5, font: 'regular' },
      ],
      [{ x: (fb.minX + fb.maxX) / 2, y: fb.minY + 50, alignX: 0.5, alignY: 0 }, { x: (fb.minX + fb.maxX) / 2, y: fb.maxY - 40, alignX: 0.5, alignY: 1 }],
      { required: true, id: 'no-zones', backing: { color: '#ffffff', opacity: 0.95 } },
    );
  }
  placer.place([{ text: 'Pad', size: 8, font: 'bold' }], aroundPoint(padX, padY, 7), { required: true, className: 'label label-pad' });
  if (releaseAt) placer.place([{ text: 'Release point', size: 8, font: 'regular' }], aroundPoint(releaseAt[0], releaseAt[1], 7), { required: true, className: 'label' });

  const offMap: string[] = [];
  // Where people are comes first: crowded maps give the later areas a number tag instead.
  const resultOf = (a: (typeof areas)[number]) => summary.areas.find((r) => r.name === a.area.name);
  const labelOrder = [...areas].sort((p, q) => KIND_PRIORITY.indexOf(p.area.kind) - KIND_PRIORITY.indexOf(q.area.kind) || (resultOf(q)?.probability ?? 0) - (resultOf(p)?.probability ?? 0) || p.index - q.index);
  let tagged = 0;
  for (const a of areas) if (isEmpty(intersection(a.bounds, view.shown))) offMap.push(a.area.name);
  labelOrder.forEach((a) => {
    const visible = intersection(a.bounds, view.shown);
    if (isEmpty(visible)) return;
    const result = resultOf(a);
    const odds = result ? WORDS.areaChance(result.hits, percent(result.probability), percent(result.upper95)) : 'not assessed';
    const lines: LabelLine[] = [
      { text: toWinAnsi(a.area.name), size: 8, font: 'bold' },
      { text: toWinAnsi(odds), size: 8, font: 'regular' },
    ];
    const [x0, y0] = view.toPage(visible.minX, visible.maxY);
    const [x1, y1] = view.toPage(visible.maxX, visible.minY);
    const cx = (x0 + x1) / 2;
    const cy = (y0 + y1) / 2;
    const size = placer.size(lines);
    const roomy = x1 - x0 > size.width * 1.3 && y1 - y0 > size.height * 1.6;
    const outside: Candidate[] = [
      { x: cx, y: y0 - 2, alignX: 0.5, alignY: 1 },
      { x: cx, y: y1 + 2, alignX: 0.5, alignY: 0 },
      { x: x1 + 3, y: cy, alignX: 0, alignY: 0.5 },
      { x: x0 - 3, y: cy, alignX: 1, alignY: 0.5 },
      { x: x1 + 2, y: y0 - 2, alignX: 0, alignY: 1 },
      { x: x0 - 2, y: y0 - 2, alignX: 1, alignY: 1 },
      { x: x1 + 2, y: y1 + 2, alignX: 0, alignY: 0 },
      { x: x0 - 2, y: y1 + 2, alignX: 1, alignY: 0 },
      // Along a long, thin area (a road): a few points on it.
      ...[0.2, 0.35, 0.65, 0.8].map((f) => ({ x: x0 + f * (x1 - x0), y: y0 - 2, alignX: 0.5, alignY: 1 })),
      ...[0.2, 0.35, 0.65, 0.8].map((f) => ({ x: x0 + f * (x1 - x0), y: y1 + 2, alignX: 0.5, alignY: 0 })),
    ];
    const centre: Candidate = { x: cx, y: cy, alignX: 0.5, alignY: 0.5 };
    if (placer.place(lines, roomy ? [centre, ...outside] : [...outside, centre], { className: 'label label-area' })) return;
    // No clear spot for the full label: the area's number in the table on the record page.
    tagged++;
    const away: Candidate[] = [16, 28, 42, 58, 76].flatMap((d) =>
      [0, 45, 90, 135, 180, 225, 270, 315].map((deg) => {
        const ux = Math.sin((deg * Math.PI) / 180);
        const uy = -Math.cos((deg * Math.PI) / 180);
        return { x: cx + ux * d, y: cy + uy * d, alignX: 0.5 - ux / 2, alignY: 0.5 - uy / 2, leaderFrom: [cx, cy] as [number, number] };
      }),
    );
    placer.place([{ text: `#${a.index + 1}`, size: 8, font: 'bold' }], [centre, ...outside, ...away], { required: true, className: 'label label-area-tag' });
  });
  for (const r of rings.labels) {
    placer.place([{ text: r.text, size: 8, font: 'regular', color: INK_SOFT }], r.candidates, { className: 'label label-ring' });
  }
  // Basemap names are context: they keep off the zone and the contours, where results are read.
  const resultsBox = keepOut ? pageBounds(view, boundsOfPoints(pointsOf(keepOut))) : contours.length > 0 ? pageBounds(view, boundsOfPoints(pointsOf(contours[contours.length - 1].polygons))) : null;
  const basemapAvoid = [...(resultsBox ? [resultsBox] : []), ...areas.map((a) => pageBounds(view, a.bounds))];
  for (const item of basemap) {
    if (!item.name) continue;
    const label: LabelLine[] = [{ text: toWinAnsi(item.name), size: 8, font: 'italic', color: BASEMAP_LABEL }];
    let candidates: Candidate[];
    if (item.polygons.length > 0) {
      const b = intersection(boundsOfPoints(pointsOf(item.polygons)), view.shown);
      if (isEmpty(b)) continue;
      const { minX: x0, minY: y0, maxX: x1, maxY: y1 } = pageBounds(view, b);
      candidates = [0.5, 0.3, 0.7, 0.15, 0.85].flatMap((f) => [
        { x: x0 + f * (x1 - x0), y: y0 + f * (y1 - y0), alignX: 0.5, alignY: 0.5 },
        { x: x0 + f * (x1 - x0), y: y1 - f * (y1 - y0), alignX: 0.5, alignY: 0.5 },
      ]);
    } else {
      // Beside a line, not on it: the name must not hide what it names.
      const page = item.lines
        .flatMap((line) => pointsAlong(line.map(([e, n]) => view.toPage(e, n)), 40))
        .filter(([x, y]) => x > fb.minX + 4 && x < fb.maxX - 4 && y > fb.minY + 4 && y < fb.maxY - 4);
      if (page.length === 0) continue;
      const order = [0.5, 0.3, 0.7, 0.15, 0.85].map((f) => page[Math.min(page.length - 1, Math.floor(f * page.length))]);
      candidates = order.flatMap(([x, y]) => [
        { x: x + 4, y: y - 3, alignX: 0, alignY: 1 },
        { x: x - 4, y: y + 3, alignX: 1, alignY: 0 },
        { x: x + 4, y: y + 3, alignX: 0, alignY: 0 },
        { x: x - 4, y: y - 3, alignX: 1, alignY: 1 },
      ]);
    }
    placer.place(label, candidates, { backing: BASEMAP_LABEL_BACKING, className: 'label label-basemap', avoid: basemapAvoid });
  }

  // ---- below the map: legend, note, caution
  const shapes: Shape[] = [...title.shapes, ...warnings.shapes];
  shapes.push({ kind: 'clip', id: 'map', className: 'map', x: view.frame.x, y: view.frame.y, width: view.frame.width, height: view.frame.height, shapes: [...inside, ...placer.shapes()] });
  shapes.push(...north.shapes, ...wind.shapes, ...scale.shapes);
  shapes.push({ kind: 'rect', id: 'map-frame', x: view.frame.x, y: view.frame.y, width: view.frame.width, height: view.frame.height, stroke: { color: INK, width: 0.9 } });
  let y = fb.maxY + 8;
  const legend = layoutLegend(legendEntries, MARGIN, y, contentWidth, legendColumns, measure);
  shapes.push(...legend.shapes);
  y += legend.height;
  const note = offMapNote(offMap, landingsOffMap, areas.length > 0, tagged > 0);
  if (note) {
    let baseline = y + noteSize * CAP_HEIGHT;
    for (const line of wrapText(measure, toWinAnsi(note), noteSize, 'italic', contentWidth)) {
      shapes.push({ kind: 'text', className: 'map-note', x: MARGIN, y: baseline, text: line, size: noteSize, font: 'italic', anchor: 'start', color: INK_SOFT });
      baseline += noteSize * 1.25;
    }
  }
  shapes.push(...cautionBox(MARGIN, paper.height - MARGIN - caution, contentWidth, measure).shapes);
  return { width: paper.width, height: paper.height, shapes };
}

/** Area kinds in the order their labels are placed: where people are first. */
/** Terrain contour lines: thin warm brown, under every result layer. */
const TERRAIN_STROKE = { color: '#a57f5a', width: 0.35 };

const KIND_PRIORITY = ['spectators', 'building', 'parking', 'road', 'other', 'water'];

/** A box in metres as a box on the page. */
function pageBounds(view: MapView, b: Bounds): Bounds {
  const [x0, y0] = view.toPage(b.minX, b.maxY);
  const [x1, y1] = view.toPage(b.maxX, b.minY);
  return { minX: x0, minY: y0, maxX: x1, maxY: y1 };
}

/** Says which areas lie beyond the frame, and how many drawn landings do. */
function offMapNote(areaNames: string[], landingsOffMap: number, anyAreas: boolean, tags: boolean): string {
  const parts: string[] = [];
  if (anyAreas) parts.push(WORDS.areaChanceNote);
  if (tags) parts.push('Where labels would crowd, #n refers to row n of the areas table on page 2.');
  if (areaNames.length > 0) parts.push(`Beyond this map: ${areaNames.join(', ')} (figures on page 2).`);
  if (landingsOffMap > 0) parts.push(`${grouped(landingsOffMap)} of the landings drawn fall outside the frame.`);
  return parts.join(' ');
}

function rangeRings(view: MapView, system: UnitSystem): { shapes: Shape[]; labels: { text: string; candidates: Candidate[] }[] } {
  const s = view.shown;
  const farthest = Math.max(...[[s.minX, s.minY], [s.minX, s.maxY], [s.maxX, s.minY], [s.maxX, s.maxY]].map(([e, n]) => Math.hypot(e, n)));
  const halfSpan = Math.max(s.maxX - s.minX, s.maxY - s.minY) / 2;
  const step = roundLengthAtMost(halfSpan / 2.5, system);
  const [cx, cy] = view.toPage(0, 0);
  const shapes: Shape[] = [];
  const labels: { text: string; candidates: Candidate[] }[] = [];
  const inMiles = system === 'imperial' && step.label.endsWith('mi');
  for (let k = 1; k * step.metres <= farthest && k <= 40; k++) {
    const r = k * step.metres * view.scale;
    shapes.push({ kind: 'circle', className: 'range-ring', data: { metres: String(k * step.metres) }, cx, cy, r, stroke: RING_STROKE });
    const text = lengthLabel(k * step.metres, system, inMiles);
    const candidates = [135, 45, 225, 315, 180, 90, 0, 270, 160, 110, 200, 250].map((deg) => {
      const a = (deg * Math.PI) / 180;
      return { x: cx + r * Math.sin(a), y: cy - r * Math.cos(a), alignX: 0.5, alignY: 0.5 };
    });
    labels.push({ text, candidates });
  }
  return { shapes: [{ kind: 'group', id: 'range-rings', shapes }], labels };
}

function buildLegendEntries(input: SheetInput, levels: number[], basemapKinds: string[], system: UnitSystem, hasRelease: boolean, areaKinds: Set<string>, route: ReleaseRoute | null = null): LegendEntry[] {
  const units = unitFormatter(system);
  const entries: LegendEntry[] = [];
  const k = input.keepOut?.features[0]?.properties;
  if (k) entries.push({ swatch: { kind: 'area', fill: KEEP_OUT_FILL, stroke: { ...KEEP_OUT_STROKE, width: 2.6 } }, text: `${WORDS.keepOut}: ${WORDS.keepOutMadeOf(k.parts, levelText(k.level), k.margin_m > 0 ? units.length(k.margin_m) : null)}` });
  levels.forEach((level, i) => entries.push({ swatch: { kind: 'line', stroke: contourStyle(i) }, text: WORDS.contour(levelText(level)) }));
  const risk = input.summary.risk;
  if (risk && Object.values(risk.standingDistance_m).some((d) => d > 0)) {
    entries.push({ swatch: { kind: 'line', stroke: risk.standingResolved ? STANDING_STROKE : STANDING_UNRESOLVED_STROKE }, text: WORDS.standing(smallRate(risk.standingLevel), risk.standingResolved) });
  }
  if (input.scenario.site.minimumDistance) entries.push({ swatch: { kind: 'line', stroke: MINIMUM_DISTANCE_STROKE }, text: `Minimum distance ${units.length(input.scenario.site.minimumDistance)} (site setting)` });
  entries.push({ swatch: { kind: 'pad' }, text: WORDS.pad });
  if (hasRelease) entries.push({ swatch: { kind: 'release' }, text: 'Release point' });
  if (route) entries.push(routeLegend(route.kind));
  entries.push({ swatch: { kind: 'line', stroke: RING_STROKE }, text: WORDS.rings });
  if (input.scenario.site.boundary) entries.push({ swatch: { kind: 'line', stroke: BOUNDARY_STROKE }, text: WORDS.boundary });
  if (input.scenario.site.terrain) {
    const interval = terrainContours(input.scenario.site.terrain).interval;
    if (interval > 0) entries.push({ swatch: { kind: 'line', stroke: TERRAIN_STROKE }, text: `Terrain contours every ${units.length(interval)} (heavier every ${units.length(5 * interval)}), from ${input.scenario.site.terrain.file}` });
  }
  for (const kind of Object.keys(AREA_STYLES)) {
    if (!areaKinds.has(kind)) continue;
    const st = areaStyle(kind);
    entries.push({ swatch: { kind: 'area', fill: st.fill, stroke: st.stroke }, text: st.label });
  }
  const landings = input.landings;
  if (landings) {
    input.summary.modes.forEach((mode, i) => {
      const marker = modeMarker(i);
      const drawn = landings.mode.filter((x) => x === i).length;
      const landed = mode.landed ?? drawn;
      if (landed === 0) return;
      // With a breakup a flight lands as many pieces: say both, pieces drawn and flights.
      const count = input.summary.parts
        ? `${grouped(landed)} flights; ${grouped(drawn)} landings drawn`
        : drawn < landed ? `${grouped(drawn)} of ${grouped(landed)} drawn` : grouped(landed);
      entries.push({ swatch: { kind: 'marker', symbol: marker.symbol, color: marker.color, size: marker.size, opacity: Math.min(1, marker.opacity + 0.2) }, text: `${WORDS.landings(mode.name)} (${count})` });
    });
  }
  const seen = new Set<string>();
  const base: string[] = [];
  for (const kind of basemapKinds) if (!seen.has(kind)) { seen.add(kind); base.push(kind); }
  if (base.length > 0) {
    // One swatch per basemap class would crowd the legend; they are context, so one line names them.
    entries.push({ swatch: { kind: 'area', fill: { color: '#e6eedb' }, stroke: { color: '#9fbf8c', width: 0.6 } }, text: `Basemap: ${base.join(', ')}` });
  }
  return entries;
}


