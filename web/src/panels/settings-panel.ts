import type { LayerGroup } from '../map/style.js';
import type { Actions } from './actions.js';
import { el, uniqueId } from './dom.js';

/**
 * The "Map" tab: which layers to draw, and an optional real basemap beneath the scenario (a tile
 * URL for users with a network, or a PMTiles archive from disk for offline use).
 */

const LAYERS: [LayerGroup, string][] = [
  ['landings', 'Landing points'],
  ['contours', 'Probability regions'],
  ['keepOut', 'Keep-out zone'],
  ['areas', 'Marked areas'],
  ['track', 'Nominal ground track'],
  ['rings', 'Distance rings'],
  ['risk', 'Individual risk'],
];

export function settingsPanel(actions: Actions, mapAvailable: boolean, basemapErrors: (listener: (message: string) => void) => void): HTMLElement {
  const layers = el('fieldset', { class: 'field-group' }, el('legend', { text: 'Layers' }));
  for (const [group, label] of LAYERS) {
    const id = uniqueId('layer');
    const box = el('input', { attrs: { type: 'checkbox', id, checked: '' } });
    box.addEventListener('change', () => actions.setLayerVisible(group, box.checked));
    layers.appendChild(el('div', { class: 'check' }, box, el('label', { text: label, attrs: { for: id } })));
  }

  const status = el('p', { class: 'note', attrs: { role: 'status' }, data: { test: 'background-status' }, text: 'The scenario\u2019s own basemap only; nothing is fetched.' });
  basemapErrors((message) => (status.textContent = `Warning: ${message}.`));
  const say = (promise: Promise<string>) =>
    promise.then(
      (text) => (status.textContent = text),
      (error: unknown) => (status.textContent = `Not changed: ${error instanceof Error ? error.message : String(error)}`),
    );

  const none = radio('background', 'Scenario basemap only (offline)', true);
  const url = radio('background', 'Raster tiles from a URL (needs a network)');
  const urlInput = el('input', { attrs: { type: 'url', id: uniqueId('tile-url'), placeholder: 'https://…/{z}/{x}/{y}.png', 'aria-label': 'Tile URL template' } });
  const urlApply = el('button', { text: 'Use these tiles', attrs: { type: 'button' } });
  const pmtiles = radio('background', 'A PMTiles file from this computer (offline)');
  const fileInput = el('input', { attrs: { type: 'file', accept: '.pmtiles', id: uniqueId('pmtiles'), 'aria-label': 'PMTiles file' } });

  none.input.addEventListener('change', () => none.input.checked && say(actions.setBackground({ kind: 'none' })));
  urlApply.addEventListener('click', () => {
    url.input.checked = true;
    void say(actions.setBackground({ kind: 'url', url: urlInput.value }));
  });
  fileInput.addEventListener('change', () => {
    const file = fileInput.files?.[0];
    if (!file) return;
    pmtiles.input.checked = true;
    void say(actions.setBackground({ kind: 'pmtiles', file }));
  });

  const background = el(
    'fieldset',
    { class: 'field-group' },
    el('legend', { text: 'Basemap' }),
    none.element,
    url.element,
    el('div', { class: 'row indent' }, urlInput, urlApply),
    pmtiles.element,
    el('div', { class: 'row indent' }, fileInput),
    status,
  );
  if (!mapAvailable) for (const input of [...layers.querySelectorAll('input'), ...background.querySelectorAll('input, button')]) (input as HTMLInputElement).disabled = true;
  return el('section', { class: 'panel-section', attrs: { 'aria-label': 'Map settings' } }, layers, background);
}

function radio(name: string, label: string, checked = false): { element: HTMLElement; input: HTMLInputElement } {
  const id = uniqueId(name);
  const input = el('input', { attrs: { type: 'radio', name, id } });
  input.checked = checked;
  return { element: el('div', { class: 'check' }, input, el('label', { text: label, attrs: { for: id } })), input };
}
