import { el } from './dom.js';

/** Files dropped anywhere on the page are opened as a scenario (plus the files it refers to). */
export function installDropTarget(target: HTMLElement, open: (files: File[]) => void | Promise<void>): void {
  const overlay = el('div', { class: 'drop-overlay', attrs: { 'aria-hidden': 'true' } }, el('p', { text: 'Drop a scenario file (and its motor CSV) to open it, or a forecast (GRIB2) or terrain (GeoTIFF) file for the scenario open' }));
  overlay.hidden = true;
  target.appendChild(overlay);
  let depth = 0;
  const hasFiles = (event: DragEvent) => Array.from(event.dataTransfer?.types ?? []).includes('Files');
  target.addEventListener('dragenter', (event) => {
    if (!hasFiles(event)) return;
    depth += 1;
    overlay.hidden = false;
  });
  target.addEventListener('dragleave', () => {
    depth = Math.max(0, depth - 1);
    if (depth === 0) overlay.hidden = true;
  });
  target.addEventListener('dragover', (event) => {
    if (!hasFiles(event)) return;
    event.preventDefault();
    if (event.dataTransfer) event.dataTransfer.dropEffect = 'copy';
  });
  target.addEventListener('drop', (event) => {
    if (!hasFiles(event)) return;
    event.preventDefault();
    depth = 0;
    overlay.hidden = true;
    const files = Array.from(event.dataTransfer?.files ?? []);
    if (files.length > 0) void open(files);
  });
}
