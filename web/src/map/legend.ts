import type { IControl } from 'maplibre-gl';
import { markerOutline, type PathCommand } from '../../../src/report/sheet/display-list.js';
import { SYMBOLS, WORDS } from '../../../src/report/symbols.js';
import { el, replaceChildren } from '../panels/dom.js';
import { level } from '../units/format.js';
import { AREA_KINDS, BOUNDARY, KEEP_OUT, KEEP_OUT_FILL, RINGS, STANDING, TRACK, areaStyle, contourStyle, modeStyle, riskStyle, type LineStyle } from './palette.js';
import { smallRate } from '../../../src/report/sheet/units.js';

const SVG = 'http://www.w3.org/2000/svg';

function svgBox(): SVGSVGElement {
  const box = document.createElementNS(SVG, 'svg');
  box.setAttribute('width', '30');
  box.setAttribute('height', '14');
  box.setAttribute('aria-hidden', 'true');
  return box;
}

function svgNode(tag: string, attrs: Record<string, string>): SVGElement {
  const node = document.createElementNS(SVG, tag);
  for (const [k, v] of Object.entries(attrs)) node.setAttribute(k, v);
  return node;
}

/** A short line drawn with the same colour, width and dashes as on the map. */
function lineSwatch(style: LineStyle): SVGSVGElement {
  const box = svgBox();
  const line = svgNode('line', { x1: '2', y1: '7', x2: '28', y2: '7', stroke: style.color, 'stroke-width': String(style.width), 'stroke-linecap': style.cap });
  // maplibre dashes are in line widths; SVG dashes in pixels.
  if (style.dash.length > 0) line.setAttribute('stroke-dasharray', style.dash.map((d) => d * style.width).join(' '));
  box.appendChild(line);
  return box;
}

/** A box with a fill and an outline, as an area or the zone is drawn. */
function areaSwatch(fill: string, opacity: number, line: LineStyle): SVGSVGElement {
  const box = svgBox();
  const w = line.width;
  const rect = svgNode('rect', { x: String(1 + w / 2), y: String(2 + w / 2), width: String(28 - w), height: String(10 - w), fill, 'fill-opacity': String(opacity), stroke: line.color, 'stroke-width': String(w) });
  if (line.dash.length > 0) rect.setAttribute('stroke-dasharray', line.dash.map((d) => d * line.width).join(' '));
  box.appendChild(rect);
  return box;
}

function pathData(d: PathCommand[]): string {
  return d.map((c) => (c[0] === 'Z' ? 'Z' : `${c[0]}${c[1].toFixed(2)} ${c[2].toFixed(2)}`)).join('');
}

/** Three markers of a mode, as the map (and the sheet) draws them. */
function markerSwatch(mode: number): SVGSVGElement {
  const m = modeStyle(mode);
  const box = svgBox();
  // Nominal dots are tiny on the map; the legend shows them a little larger so they can be seen.
  const s = Math.max(m.px, 2.4);
  for (const [x, y] of [[6, 8], [15, 5.5], [24, 8.5]] as const) {
    const attrs: Record<string, string> = m.shape === 'cross' ? { fill: 'none', stroke: m.color, 'stroke-width': String(Math.max(1.4, s * 0.45)) } : { fill: m.color, 'fill-opacity': String(Math.min(1, m.opacity + 0.2)) };
    box.appendChild(m.shape === 'dot' ? svgNode('circle', { cx: String(x), cy: String(y), r: String(s), ...attrs }) : svgNode('path', { d: pathData(markerOutline(m.shape, x, y, s)), ...attrs }));
  }
  return box;
}

function padSwatch(): SVGSVGElement {
  const box = svgBox();
  const p = SYMBOLS.pad;
  box.append(
    svgNode('circle', { cx: '15', cy: '7', r: String(p.radius * 1.2), fill: '#FFFFFF', stroke: p.ring, 'stroke-width': String(p.ringWidth * 1.2) }),
    svgNode('circle', { cx: '15', cy: '7', r: String(p.centre * 1.2), fill: p.ring }),
  );
  return box;
}

function item(swatch: Element, text: string, name?: string): HTMLElement {
  return el('li', name ? { data: { legend: name } } : {}, swatch, el('span', { text }));
}

export interface LegendContent {
  modes: string[];
  levels: number[];
  keepOut: { level: number; parts: string[]; margin: string | null } | null;
  /** Kinds of the marked areas on the map. */
  areaKinds: string[];
  hasTrack: boolean;
  hasBoundary: boolean;
  /** Individual-risk lines (highest first) and the criterion of the standing ring. */
  risk?: { levels: { level: number; resolved: boolean }[]; standingLevel: number; standingResolved: boolean } | null;
}

/** What the symbols on the map mean, in the sheet's words; mode names are the scenario's text. */
export class LegendControl implements IControl {
  private readonly list = el('ul', {});
  // A disclosure, so the legend can be folded away when it covers part of the map.
  private readonly box = el('details', { class: 'maplibregl-ctrl legend', attrs: { open: '' }, data: { test: 'legend' } }, el('summary', { text: 'Legend' }), this.list);

  /** Whether the reader had it open before printing (a print shows it open, then it is put back). */
  private openBeforePrint: boolean | null = null;
  private readonly printOpen = () => {
    // Kept from the first of nested print events (a print may follow a print preview).
    this.openBeforePrint ??= this.element.open;
    this.element.open = true;
  };
  private readonly printDone = () => {
    if (this.openBeforePrint !== null) this.element.open = this.openBeforePrint;
    this.openBeforePrint = null;
  };

  onAdd(): HTMLElement {
    window.addEventListener('beforeprint', this.printOpen);
    window.addEventListener('afterprint', this.printDone);
    return this.box;
  }

  onRemove(): void {
    window.removeEventListener('beforeprint', this.printOpen);
    window.removeEventListener('afterprint', this.printDone);
    this.box.remove();
  }

  get element(): HTMLDetailsElement {
    return this.box as HTMLDetailsElement;
  }

  /** Width it covers on the map (0 when folded away). */
  width(): number {
    return this.box.open ? this.box.offsetWidth : 0;
  }

  show(content: LegendContent): void {
    const items: HTMLElement[] = [];
    if (content.keepOut) {
      const k = content.keepOut;
      items.push(item(areaSwatch(KEEP_OUT_FILL.color, KEEP_OUT_FILL.opacity ?? 1, KEEP_OUT), `${WORDS.keepOut}: ${WORDS.keepOutMadeOf(k.parts, level(k.level), k.margin)}`, 'keep-out'));
    }
    content.levels.forEach((p, i) => items.push(item(lineSwatch(contourStyle(i)), WORDS.contour(level(p)), 'contour')));
    // The results first (the list may scroll on a small map): landings, then risk, then the site.
    content.modes.forEach((name, m) => items.push(item(markerSwatch(m), WORDS.landings(name), 'landings')));
    if (content.risk) {
      content.risk.levels.forEach((l, i) => items.push(item(lineSwatch(riskStyle(i)), WORDS.riskLine(smallRate(l.level), l.resolved), 'risk-line')));
      items.push(item(lineSwatch(STANDING), WORDS.standing(smallRate(content.risk.standingLevel), content.risk.standingResolved), 'standing'));
    }
    items.push(item(padSwatch(), `${WORDS.pad} (drag to move)`, 'pad'));
    items.push(item(lineSwatch(RINGS), WORDS.rings, 'rings'));
    if (content.hasBoundary) items.push(item(lineSwatch(BOUNDARY), WORDS.boundary, 'boundary'));
    if (content.hasTrack) items.push(item(lineSwatch(TRACK), WORDS.track, 'track'));
    for (const kind of AREA_KINDS) {
      if (!content.areaKinds.includes(kind)) continue;
      const a = areaStyle(kind);
      items.push(item(areaSwatch(a.fill, a.opacity, a.line), a.label, `area-${kind}`));
    }
    replaceChildren(this.list, ...items);
  }
}
