import { comparisonRows, type Comparison } from '../../../src/compare/compare.js';
import { SYMBOLS } from '../../../src/report/symbols.js';
import { unitFormatter } from '../../../src/report/sheet/units.js';
import type { Store } from '../app/store.js';
import type { CompareController } from '../compare/compare-controller.js';
import type { CompareCell, CompareState } from '../compare/saved-run.js';
import { keyEntry } from '../map/overlay.js';
import type { UnitSystem } from '../units/systems.js';
import { el, replaceChildren, uniqueId } from './dom.js';
import '../event/event.css';

/**
 * The "Compare" tab: a saved run (a results folder, its files, or its summary.json alone) beside
 * the current run, as `strewn compare SAVED CURRENT` compares two folders: zone area and reach,
 * each region, each area's chance per flight and expected casualties, the change; both zones on
 * the map. The rows are comparisonRows (src/compare/compare.ts), the same as compare.pdf's.
 */
export function comparePanel(store: Store, cell: CompareCell, actions: CompareController): HTMLElement {
  const files = el('input', { attrs: { type: 'file', multiple: '', accept: '.json,.geojson,application/json', 'aria-label': 'Files of a saved results folder' }, data: { test: 'compare-files' } });
  const folder = el('input', { attrs: { type: 'file', webkitdirectory: '', 'aria-label': 'A saved results folder' }, data: { test: 'compare-folder' } });
  for (const input of [files, folder]) {
    input.addEventListener('change', () => {
      const picked = Array.from(input.files ?? []);
      if (picked.length > 0) void actions.openFiles(picked);
      input.value = '';
    });
  }
  const problem = el('div', { class: 'alert', attrs: { role: 'alert' }, data: { test: 'compare-problem' } });
  const body = el('div', { data: { test: 'compare-body' } });

  const render = (s: CompareState, units: UnitSystem) => {
    problem.hidden = s.problem === null;
    problem.textContent = s.problem ?? '';
    if (!s.saved) {
      replaceChildren(body, el('p', { class: 'muted', text: 'No saved run loaded. Pick the files of a results folder that strewn run (or this page\u2019s Files tab) wrote, the folder itself, or just its summary.json.' }));
      return;
    }
    const head = el('p', { class: 'scenario-title', data: { test: 'compare-saved' }, text: `Saved run: ${s.saved.summary.name}` });
    const detail = el('p', { class: 'note', text: `From ${s.savedLabel}; ${s.saved.summary.samples.toLocaleString('en')} samples, seed ${s.saved.summary.seed}${s.saved.scenario === null ? '; a summary alone (no site, no inputs)' : ''}.` });
    const clear = el('button', { text: 'Forget the saved run', attrs: { type: 'button' } });
    clear.addEventListener('click', () => actions.clear());
    if (!s.comparison) {
      replaceChildren(body, head, detail, el('p', { class: 'muted', data: { test: 'compare-waiting' }, text: 'Run the scenario to compare the saved run with the current one.' }), clear);
      return;
    }
    const mapId = uniqueId('compare-map');
    const onMap = el('input', { attrs: { type: 'checkbox', id: mapId }, data: { test: 'compare-on-map' } });
    onMap.checked = s.onMap;
    onMap.addEventListener('change', () => actions.showOnMap(onMap.checked));
    const pdf = el('button', { text: 'Comparison (PDF)', attrs: { type: 'button' }, data: { test: 'compare-pdf' } });
    pdf.addEventListener('click', () => void actions.downloadPdf());
    replaceChildren(
      body,
      head,
      detail,
      ...notes(s.comparison),
      el('ul', { class: 'compare-key' }, keyEntry(SYMBOLS.compareA, `A, saved: ${s.comparison.a.name}`), keyEntry(SYMBOLS.compareB, `B, current: ${s.comparison.b.name}`)),
      comparisonTable(s.comparison, units),
      el('div', { class: 'check' }, onMap, el('label', { text: 'Draw both keep-out zones on the map', attrs: { for: mapId } })),
      el('div', { class: 'row' }, pdf, clear),
    );
  };
  const draw = () => render(cell.get(), store.get().units);
  cell.subscribe(draw);
  store.subscribe((state, previous) => state.units !== previous.units && draw());
  draw();

  return el(
    'section',
    { class: 'panel-section compare-panel', attrs: { 'aria-label': 'Compare' } },
    el('p', { class: 'note', text: 'Compare a saved run (A) with the current run (B): zone size and reach, each area\u2019s chance per flight and expected casualties, and the change B \u2212 A.' }),
    el('div', { class: 'row' }, el('label', { class: 'file-pick' }, 'Files of a results folder ', files)),
    el('div', { class: 'row' }, el('label', { class: 'file-pick' }, 'or the folder ', folder)),
    problem,
    body,
  );
}

function notes(c: Comparison): HTMLElement[] {
  const out: HTMLElement[] = [];
  if (c.a.scenarioHash === c.b.scenarioHash && c.a.seed === c.b.seed && c.a.samples === c.b.samples) out.push(el('p', { class: 'note', text: 'The same scenario, seed and sample count: the two runs should agree exactly.' }));
  else if (c.a.scenarioHash !== c.b.scenarioHash) out.push(el('p', { class: 'note', text: `The two runs differ in their inputs: another scenario, an edit, or another seed or sample count (seed ${c.a.seed} with ${c.a.samples.toLocaleString('en')} samples, and seed ${c.b.seed} with ${c.b.samples.toLocaleString('en')}).` }));
  if (c.samePad === false) out.push(el('p', { class: 'note', data: { test: 'compare-pads' }, text: 'The two runs fly from different pads.' }));
  return out;
}

function comparisonTable(c: Comparison, units: UnitSystem): HTMLElement {
  const rows = comparisonRows(c, unitFormatter(units));
  return el(
    'div',
    { class: 'table-scroll' },
    el(
      'table',
      { class: 'event-table', data: { test: 'compare-table' } },
      el('caption', { text: 'Saved (A) and current (B)' }),
      el('thead', {}, el('tr', {}, ...['', 'A, saved', 'B, current', 'Change (B \u2212 A)'].map((h) => el('th', { text: h, attrs: { scope: 'col' } })))),
      el('tbody', {}, ...rows.map((r) => el('tr', { class: r.total ? 'total' : '' }, ...r.cells.map((text, i) => (i === 0 ? el('th', { text, attrs: { scope: 'row' } }) : el('td', { text })))))),
    ),
  );
}
