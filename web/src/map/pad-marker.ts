import { Marker, type Map as MapLibreMap } from 'maplibre-gl';
import { el } from '../panels/dom.js';

/**
 * The launch point: a marker that can be dragged to move the pad. While it moves, `onDrag` lets
 * the rings follow; when it is let go, `onMoved` writes the new position into the scenario.
 */
export class PadMarker {
  private readonly marker: Marker;

  constructor(map: MapLibreMap, handlers: { onDrag(lon: number, lat: number): void; onMoved(lon: number, lat: number): void }) {
    const element = el('div', { class: 'pad-marker', attrs: { title: 'Launch point: drag to move', 'aria-label': 'Launch point (drag to move; the Setup tab has its coordinates)' }, data: { test: 'pad-marker' } });
    element.appendChild(el('span', { class: 'pad-symbol', attrs: { 'aria-hidden': 'true' } }));
    this.marker = new Marker({ element, draggable: true, anchor: 'center' }).setLngLat([0, 0]).addTo(map);
    this.marker.on('drag', () => {
      const p = this.marker.getLngLat();
      handlers.onDrag(p.lng, p.lat);
    });
    this.marker.on('dragend', () => {
      const p = this.marker.getLngLat();
      handlers.onMoved(p.lng, p.lat);
    });
  }

  place(lon: number, lat: number): void {
    this.marker.setLngLat([lon, lat]);
  }
}
