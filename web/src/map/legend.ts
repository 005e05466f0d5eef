import type { IControl } from 'maplibre-gl';
import { el, replaceChildren } from '../panels/dom.js';
import { level } from '../units/format.js';
import { AREA_CLASSES, AREA_NO_HITS, BOUNDARY, KEEP_OUT, RINGS, STANDING, TRACK, contourStyle, modeStyle, riskStyle, type LineStyle } from './palette.js';
import { smallRate } from '../../../src/report/sheet/units.js';

const SVG = 'http://www.w3.org/2000/svg';

/** A short line drawn with the same colour, width and dashes as on the map. */
function lineSwatch(style: LineStyle): SVGSVGElement {
  const box = document.createElementNS(SVG, 'svg');
  box.setAttribute('width', '30');
  box.setAttribute('height', '12');
  box.setAttribute('aria-hidden', 'true');
  const line = document.createElementNS(SVG, 'line');
  for (const [k, v] of Object.entries({ x1: '1', y1: '6', x2: '29', y2: '6', stroke: style.color, 'stroke-width': String(style.width) })) line.setAttribute(k, v);
  // maplibre dashes are in line widths; SVG dashes in pixels.
  if (style.dash.length > 0) line.setAttribute('stroke-dasharray', style.dash.map((d) => d * style.width).join(' '));
  box.appendChild(line);
  return box;
}

function pointSwatch(mode: number): HTMLElement {
  const s = modeStyle(mode);
  const size = s.radius * 2 + s.strokeWidth * 2;
  const dot = el('span', { class: 'point-swatch', attrs: { 'aria-hidden': 'true' } });
  dot.style.width = dot.style.height = `${size}px`;
  dot.style.background = s.color;
  dot.style.border = s.strokeWidth > 0 ? `${s.strokeWidth}px solid ${s.stroke}` : 'none';
  if (s.stroke === '#FFFFFF') dot.style.boxShadow = '0 0 0 1px #999999';
  return el('span', { class: 'swatch-box' }, dot);
}

function fillSwatch(color: string, outline: string): HTMLElement {
  const box = el('span', { class: 'fill-swatch', attrs: { 'aria-hidden': 'true' } });
  box.style.background = color;
  box.style.borderColor = outline;
  return box;
}

function item(swatch: Element, text: string): HTMLElement {
  return el('li', {}, swatch, el('span', { text }));
}

export interface LegendContent {
  modes: string[];
  levels: number[];
  keepOut: { level: number } | null;
  hasAreas: boolean;
  /** The areas carry hit probabilities from a run (otherwise they are plain outlines). */
  areaFigures: boolean;
  hasTrack: boolean;
  /** Individual-risk lines (highest first) and the criterion of the standing ring. */
  risk?: { levels: { level: number; resolved: boolean }[]; standingLevel: number } | null;
}

/** What the symbols on the map mean; mode names are the scenario's text. */
export class LegendControl implements IControl {
  private readonly list = el('ul', {});
  // A disclosure, so the legend can be folded away when it covers part of the map.
  private readonly box = el('details', { class: 'maplibregl-ctrl legend', attrs: { open: '' }, data: { test: 'legend' } }, el('summary', { text: 'Legend' }), this.list);

  onAdd(): HTMLElement {
    return this.box;
  }

  onRemove(): void {
    this.box.remove();
  }

  /** Width it covers on the map (0 when folded away). */
  width(): number {
    return this.box.open ? this.box.offsetWidth : 0;
  }

  show(content: LegendContent): void {
    const items: HTMLElement[] = [];
    const heading = (text: string) => el('li', { class: 'legend-heading', text });
    if (content.modes.length > 0) {
      items.push(heading('Landings'));
      content.modes.forEach((name, m) => items.push(item(pointSwatch(m), name)));
    }
    if (content.levels.length > 0) {
      items.push(heading('Regions holding'));
      content.levels.forEach((p, i) => items.push(item(lineSwatch(contourStyle(i)), `${level(p)} of landings`)));
    }
    if (content.keepOut) items.push(item(lineSwatch(KEEP_OUT), `Keep-out zone (${level(content.keepOut.level)} + margin)`));
    if (content.risk) {
      items.push(heading('Individual risk per flight'));
      content.risk.levels.forEach((l, i) => items.push(item(lineSwatch(riskStyle(i)), `${smallRate(l.level)} or more${l.resolved ? '' : ' (faint: not resolved)'}`)));
      items.push(item(lineSwatch(STANDING), `Under ${smallRate(content.risk.standingLevel)} beyond (by octant)`));
    }
    if (content.hasAreas && content.areaFigures) {
      items.push(heading('Marked areas, chance of a landing'));
      items.push(item(fillSwatch(AREA_NO_HITS, '#333333'), 'no landing in the samples'));
      for (const c of AREA_CLASSES) items.push(item(fillSwatch(c.fill, '#333333'), c.label));
    }
    items.push(heading('Site'));
    items.push(item(el('span', { class: 'legend-pad' }, el('span', { class: 'pad-symbol' })), 'Launch point (drag to move)'));
    if (content.hasAreas && !content.areaFigures) items.push(item(fillSwatch(AREA_NO_HITS, '#333333'), 'Marked area (run to see its chance)'));
    if (content.hasTrack) items.push(item(lineSwatch(TRACK), 'Nominal ground track'));
    items.push(item(lineSwatch(RINGS), 'Distance from the pad'));
    items.push(item(lineSwatch(BOUNDARY), 'Site boundary'));
    replaceChildren(this.list, ...items);
  }
}
