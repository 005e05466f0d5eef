import type { AppState, Store } from '../app/store.js';
import type { Actions } from './actions.js';
import { el, replaceChildren } from './dom.js';
import { ENVELOPE_FILES, type EnvelopeFileName } from '../study/envelope-files.js';
import type { Paper } from '../../../src/report/sheet/index.js';
import { paperFor } from '../units/systems.js';

/**
 * The "Files" tab: every file of the command line's results folder for the last run, with the
 * same names and bytes (built by the same writers in src/report), and the scenario that made them.
 */

const DESCRIPTIONS: Record<string, string> = {
  'sheet.pdf': 'Review sheet for the safety officer: map and record to sign (PDF)',
  'map.svg': 'The review sheet\u2019s map alone, in the page\u2019s units and paper (SVG)',
  'landings.csv': 'Landing points, one row per sample (CSV)',
  'summary.json': 'Run summary (JSON)',
  'landings.geojson': 'Landing points (GeoJSON; a stated subset above 100,000 landings)',
  'landings.fgb': 'Every landing point, for map programs (FlatGeobuf)',
  'contours.geojson': 'Probability regions (GeoJSON)',
  'keepout.geojson': 'Keep-out zone (GeoJSON)',
  'risk.geojson': 'Individual-risk lines and where people may stand (GeoJSON)',
  'areas.csv': 'Marked areas: chances, expected casualties, largest individual risk (CSV)',
  'result.kml': 'Regions, zone and areas for map viewers (KML)',
  'scenario.json': 'The scenario as the engine read it, in SI units (JSON)',
  'review.json': 'Figures the review sheet needs beyond the summary (JSON)',
};

const ENVELOPE_DESCRIPTIONS: Record<EnvelopeFileName, string> = {
  'envelope.pdf': 'Wind limits as a page of the review sheet, in the page\u2019s units (PDF)',
  'envelope.svg': 'The polar chart of the wind limits, in the page\u2019s units (SVG)',
  'envelope.json': 'Limits, grid and every grid point flown (JSON)',
  'envelope.csv': 'Limit and first failing test per direction (CSV)',
};

/** The review sheet first: it is what most people came for. */
const FIRST = ['map.svg'];

export function exportPanel(store: Store, actions: Actions): HTMLElement {
  const list = el('ul', { class: 'export-list', data: { test: 'exports' } });
  const render = (state: AppState) => {
    const study = state.study;
    if (study === null) {
      replaceChildren(list, el('li', { class: 'muted', text: 'Run the scenario to get its result files.' }));
      sheetRow.hidden = true;
      return;
    }
    const names = study.files.map((f) => f.name).filter((name) => name !== 'sheet.pdf').sort((a, b) => rank(a) - rank(b));
    const items: HTMLElement[] = names.map((name) => {
      const button = el('button', { text: name, attrs: { type: 'button' }, data: { export: name } });
      // The map is redrawn like the sheet, in the page's units and paper; the rest are the run's bytes.
      if (name === 'map.svg') button.addEventListener('click', () => void actions.exportMapSvg(chosenPaper()).catch((error: unknown) => (sheetStatus.textContent = ` map.svg failed: ${error instanceof Error ? error.message : String(error)}`)));
      else button.addEventListener('click', () => actions.exportFile(name));
      return el('li', {}, button, el('span', { class: 'muted', text: ` ${DESCRIPTIONS[name] ?? ''}` }));
    });
    if (study.filesError !== null) items.unshift(el('li', { class: 'alert', attrs: { role: 'alert' }, text: `The result files could not be made: ${study.filesError}` }));
    const own = el('button', { text: study.accepted.document.fileName, attrs: { type: 'button' }, data: { export: 'scenario' } });
    own.addEventListener('click', () => actions.exportFile('scenario'));
    items.push(el('li', {}, own, el('span', { class: 'muted', text: ' The scenario file these results came from, in your units (JSON)' })));
    replaceChildren(list, ...items);
    sheetRow.hidden = study.filesError !== null;
  };

  // ONE review-sheet button: in the units chosen at the top of the page, on the paper chosen here,
  // else the scenario's run.paper, else A4 for metric and US Letter for imperial. The command
  // line's sheet.pdf is not listed beside it, so nobody prints a metric A4 sheet by mistake.
  const automatic = el('option', { attrs: { value: 'auto' } });
  const paper = el(
    'select',
    { attrs: { id: 'sheet-paper', 'aria-label': 'Paper size of the review sheet' } },
    automatic,
    el('option', { text: 'A4', attrs: { value: 'a4' } }),
    el('option', { text: 'US Letter', attrs: { value: 'letter' } }),
  );
  const scenarioPaper = (): Paper | undefined => store.get().accepted.scenario.run.paper;
  const chosenPaper = (): Paper => (paper.value === 'a4' || paper.value === 'letter' ? paper.value : scenarioPaper() ?? paperFor(store.get().units));
  const redraw = el('button', { class: 'primary', attrs: { type: 'button' }, data: { export: 'sheet' } });
  const sheetStatus = el('span', { class: 'muted', attrs: { role: 'status' } });
  const label = () => {
    const units = store.get().units;
    redraw.textContent = `Review sheet (PDF): ${units}, ${paperName(chosenPaper())}`;
    const named = scenarioPaper();
    automatic.textContent = named ? `Paper: the scenario\u2019s (${paperName(named)})` : 'Paper: follows the units';
  };
  paper.addEventListener('change', label);
  redraw.addEventListener('click', () => {
    sheetStatus.textContent = ' drawing…';
    actions.exportReviewSheet(chosenPaper()).then(
      () => (sheetStatus.textContent = ''),
      (error: unknown) => (sheetStatus.textContent = ` failed: ${error instanceof Error ? error.message : String(error)}`),
    );
  });
  const sheetRow = el(
    'div',
    { class: 'sheet-export', data: { test: 'sheet-export' } },
    el('div', { class: 'row' }, redraw, paper, sheetStatus),
    el('p', { class: 'note', text: 'For the safety officer: map and record to sign, in the page\u2019s units; with the wind-limits page when the limits were computed for this very scenario. Printing the page itself gives a picture of the screen, not the record.' }),
  );
  sheetRow.hidden = true;
  label();
  // The wind limits' files, once the "Wind limits" tab has computed them.
  const envelopeHeading = el('p', { class: 'scenario-title', text: 'Wind limits' });
  const envelopeList = el('ul', { class: 'export-list', data: { test: 'envelope-exports' } });
  const envelopeStatus = el('p', { class: 'muted', attrs: { role: 'status' } });
  const renderEnvelope = (state: AppState) => {
    const outcome = state.envelope.outcome;
    envelopeHeading.hidden = envelopeList.hidden = outcome === null;
    if (outcome === null) return;
    replaceChildren(
      envelopeList,
      ...ENVELOPE_FILES.map((name) => {
        const button = el('button', { text: name, attrs: { type: 'button' }, data: { export: name } });
        button.addEventListener('click', () => {
          envelopeStatus.textContent = '';
          actions.exportEnvelopeFile(name).catch((error: unknown) => (envelopeStatus.textContent = `${name} could not be made: ${error instanceof Error ? error.message : String(error)}`));
        });
        return el('li', {}, button, el('span', { class: 'muted', text: ` ${ENVELOPE_DESCRIPTIONS[name]}` }));
      }),
    );
  };

  store.subscribe((state, previous) => {
    if (state.study !== previous.study) render(state);
    if (state.units !== previous.units || state.accepted !== previous.accepted) label();
    if (state.envelope.outcome !== previous.envelope.outcome) renderEnvelope(state);
  });
  render(store.get());
  renderEnvelope(store.get());
  return el(
    'section',
    { class: 'panel-section', attrs: { 'aria-label': 'Files' } },
    el('p', { class: 'note', text: 'The same files as the command line\u2019s results folder, made here in the page; nothing is sent anywhere.' }),
    sheetRow,
    list,
    envelopeHeading,
    envelopeList,
    envelopeStatus,
  );
}

function paperName(paper: Paper): string {
  return paper === 'a4' ? 'A4' : 'US Letter';
}

function rank(name: string): number {
  const i = FIRST.indexOf(name);
  return i === -1 ? FIRST.length : i;
}
