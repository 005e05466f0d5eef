import type { IControl, Map as MapLibreMap } from 'maplibre-gl';
import type { Wind } from '../../../src/scenario/types.js';
import { el } from '../panels/dom.js';
import { readable } from '../../../src/report/format-number.js';
import type { Unit } from '../units/systems.js';

const SVG = 'http://www.w3.org/2000/svg';

function svg<K extends keyof SVGElementTagNameMap>(tag: K, attrs: Record<string, string>): SVGElementTagNameMap[K] {
  const node = document.createElementNS(SVG, tag);
  for (const [k, v] of Object.entries(attrs)) node.setAttribute(k, v);
  return node;
}

/**
 * A compass card with an arrow pointing where the wind blows to (the scenario gives where it
 * blows from), turned with the map, and the speed and gusts as text.
 */
export class WindArrowControl implements IControl {
  private map: MapLibreMap | null = null;
  private readonly box = el('div', { class: 'maplibregl-ctrl wind-card', attrs: { role: 'img' }, data: { test: 'wind-arrow' } });
  private readonly arrow = svg('g', {});
  private readonly caption = el('div', { class: 'wind-caption' });
  private from = 0;
  private readonly onRotate = () => this.turn();

  constructor() {
    const face = svg('svg', { viewBox: '-30 -30 60 60', width: '64', height: '64', 'aria-hidden': 'true' });
    face.appendChild(svg('circle', { r: '27', fill: '#FFFFFF', stroke: '#777777', 'stroke-width': '1' }));
    const north = svg('text', { x: '0', y: '-17', 'text-anchor': 'middle', 'font-size': '9', fill: '#555555' });
    north.textContent = 'N';
    face.appendChild(north);
    // Drawn pointing up (north); rotated to the downwind direction.
    this.arrow.appendChild(svg('path', { d: 'M0,20 L0,-12', stroke: '#111111', 'stroke-width': '3', 'stroke-linecap': 'round' }));
    this.arrow.appendChild(svg('path', { d: 'M-7,-8 L0,-21 L7,-8 Z', fill: '#111111' }));
    this.arrow.appendChild(svg('path', { d: 'M-5,22 L0,14 L5,22', fill: 'none', stroke: '#111111', 'stroke-width': '2' }));
    face.appendChild(this.arrow);
    this.box.append(face, this.caption);
  }

  onAdd(map: MapLibreMap): HTMLElement {
    this.map = map;
    map.on('rotate', this.onRotate);
    return this.box;
  }

  onRemove(): void {
    this.map?.off('rotate', this.onRotate);
    this.box.remove();
    this.map = null;
  }

  show(wind: Wind, speed: Unit): void {
    this.from = wind.from;
    // Rounded for reading, as everywhere (4.9 m/s, 11 mph): src/report/format-number.ts.
    const says = (si: number) => `${readable(si / speed.si)} ${speed.label}`;
    const gust = wind.gust === undefined ? '' : `, gusts ${says(wind.gust)}`;
    this.caption.textContent = `Wind from ${Math.round(wind.from)}° · ${says(wind.speed)}${gust}`;
    this.box.setAttribute('aria-label', `Wind blowing from ${Math.round(wind.from)} degrees at ${says(wind.speed)}${gust}`);
    this.turn();
  }

  private turn(): void {
    const bearing = this.map?.getBearing() ?? 0;
    this.arrow.setAttribute('transform', `rotate(${(this.from + 180 - bearing) % 360})`);
  }
}
