import { AttributionControl, Map as MapLibreMap, NavigationControl, ScaleControl, setWorkerUrl } from 'maplibre-gl';
import 'maplibre-gl/dist/maplibre-gl.css';
import workerUrl from 'maplibre-gl/dist/maplibre-gl-worker.mjs?url';
import { offlineStyle } from './style.js';

// After bundling, maplibre cannot find its worker by itself.
setWorkerUrl(workerUrl);

/** Whether this browser can draw the map at all (maplibre needs WebGL 2). */
export function webglAvailable(): boolean {
  try {
    return document.createElement('canvas').getContext('webgl2') !== null;
  } catch {
    return false;
  }
}

export interface CreatedMap {
  map: MapLibreMap;
  scale: ScaleControl;
}

/** The map with the offline style, centred on the pad; throws where WebGL is missing. */
export function createMap(container: HTMLElement, centre: [number, number]): CreatedMap {
  const map = new MapLibreMap({
    container,
    style: offlineStyle(),
    center: centre,
    zoom: 14.5,
    attributionControl: false,
    maxPitch: 0,
    dragRotate: false,
    // Keyboard panning and zooming once the map has focus.
    keyboard: true,
    // Labels appear at once rather than fading in over 0.3 s: without a graphics card every frame
    // of 20,000 landing markers takes a large part of a second to draw, and a fade costs one or
    // two more such frames before the results stand (measured by test/bench/page.ts).
    fadeDuration: 0,
  });
  map.touchZoomRotate.disableRotation();
  map.addControl(new NavigationControl({ showCompass: false }), 'top-left');
  const scale = new ScaleControl({ maxWidth: 160, unit: 'metric' });
  map.addControl(scale, 'bottom-left');
  map.addControl(new AttributionControl({ compact: true }), 'bottom-right');
  return { map, scale };
}
