import { Popup, type Map as MapLibreMap } from 'maplibre-gl';
import type { LandingSet } from '../../../src/analysis/types.js';
import { el } from '../panels/dom.js';
import { inUnit } from '../units/format.js';
import type { Unit } from '../units/systems.js';

/**
 * Pointing at a landing shows its sample number, mode, apogee and flight time. The figures come
 * from the landing set (the feature only carries its index), and mode names go in as text.
 */
export function attachLandingHover(map: MapLibreMap, layer: string, lookup: () => { set: LandingSet; height: Unit } | null): void {
  const popup = new Popup({ closeButton: false, closeOnClick: false, className: 'landing-popup', offset: 8 });
  map.on('mousemove', layer, (event) => {
    const data = lookup();
    const feature = event.features?.[0];
    const index = feature?.properties?.i;
    if (!data || typeof index !== 'number' || index >= data.set.east.length) return;
    const { set, height } = data;
    map.getCanvas().style.cursor = 'crosshair';
    const mode = set.modeNames[set.mode[index]!] ?? `mode ${set.mode[index]}`;
    const content = el(
      'div',
      { data: { test: 'landing-popup' } },
      el('strong', { text: `Sample ${set.sample ? set.sample[index] : index}` }),
      el('div', { text: `Mode: ${mode}` }),
      set.apogee ? el('div', { text: `Apogee: ${inUnit(set.apogee[index]!, height)}` }) : null,
      set.flightTime ? el('div', { text: `Flight time: ${set.flightTime[index]!.toFixed(1)} s` }) : null,
    );
    popup.setLngLat(event.lngLat).setDOMContent(content).addTo(map);
  });
  map.on('mouseleave', layer, () => {
    map.getCanvas().style.cursor = '';
    popup.remove();
  });
}
