import type { Map as MapLibreMap } from 'maplibre-gl';
import { el } from '../panels/dom.js';

/**
 * The browser's print of the page shows the map. A WebGL canvas keeps no picture between frames
 * (maplibre does not preserve the drawing buffer, for speed), so a print would show it blank.
 * Before printing, the map is drawn once more synchronously (`redraw`) and read out in the same
 * task, while the picture is still there; the print stylesheet shows that image in the canvas'
 * place, under the legend and wind card, with a line pointing to the review sheet as the record.
 */
export function installPrintSnapshot(map: MapLibreMap, container: HTMLElement): HTMLImageElement {
  const image = el('img', { class: 'print-map', attrs: { alt: 'The map as shown on the screen', 'aria-hidden': 'true' }, data: { test: 'print-map' } }) as HTMLImageElement;
  container.prepend(image);
  const snap = () => {
    try {
      map.redraw();
      image.src = map.getCanvas().toDataURL('image/png');
    } catch (error) {
      // A map that cannot be read out prints blank; the note beside it still offers the sheet.
      console.warn('the map could not be captured for printing', error);
    }
  };
  window.addEventListener('beforeprint', snap);
  window.addEventListener('afterprint', () => image.removeAttribute('src'));
  return image;
}
