import { rangeValues } from '../../../src/envelope/grid.js';
import type { EnvelopeResult } from '../../../src/envelope/envelope.js';
import { DEFAULT_MAX_SAMPLES } from '../../../src/scenario/schema.js';
import type { AppState, Store } from '../app/store.js';
import { envelopeDrawing } from '../study/envelope-files.js';
import { limitsKey, plannedPoints, type EnvelopeGrid, type EnvelopeState } from '../study/envelope.js';
import { grouped, inUnit } from '../units/format.js';
import { fieldUnit, type UnitSystem } from '../units/systems.js';
import type { Actions } from './actions.js';
import { el, replaceChildren, uniqueId } from './dom.js';
import { svgFigure } from './svg-figure.js';

/**
 * The "Wind limits" tab: the wind envelope of the scenario in Setup (the same computation as
 * `strewn envelope`), on a small grid by default so it finishes in a minute or two in a browser.
 * The polar chart is the command line's own drawing; clicking it (or a row of the table) puts
 * that direction and speed into the wind fields, ready to run.
 */

const DEFAULTS: Record<UnitSystem, { speeds: string }> = { metric: { speeds: '0:12:1' }, imperial: { speeds: '0:26:2' } };
const DEFAULT_DIRECTIONS = '0:330:30';
const DEFAULT_SAMPLES = '500';

interface GridField {
  input: HTMLInputElement;
  message: HTMLElement;
  row: HTMLElement;
  unit: HTMLElement;
}

function gridField(label: string, value: string, test: string, hint: string): GridField {
  const id = uniqueId('envelope');
  const input = el('input', { attrs: { id, type: 'text', autocomplete: 'off', spellcheck: 'false', value, 'aria-describedby': `${id}-message ${id}-hint` }, data: { test } });
  const unit = el('span', { class: 'unit', attrs: { 'aria-hidden': 'true' } });
  const message = el('p', { class: 'field-message', attrs: { id: `${id}-message` } });
  const row = el(
    'div',
    { class: 'field' },
    el('label', { text: label, attrs: { for: id } }),
    el('div', { class: 'input-with-unit' }, input, unit),
    el('p', { class: 'field-hint', text: hint, attrs: { id: `${id}-hint` } }),
    message,
  );
  return { input, message, row, unit };
}

/** The grid typed in, or the first problem with it (naming the field, the value and what is expected). */
function readGrid(directions: string, speeds: string, samples: string, units: UnitSystem): { grid: EnvelopeGrid } | { field: 'directions' | 'speeds' | 'samples'; message: string } {
  const d = rangeValues(directions.trim());
  if (typeof d === 'string') return { field: 'directions', message: `Directions: ${d}` };
  if (d.some((x) => x < 0 || x >= 360)) return { field: 'directions', message: `Directions: '${directions}' leaves 0° to 359°; expected directions from 0 up to (not including) 360` };
  const s = rangeValues(speeds.trim());
  const unit = fieldUnit('speed', units);
  if (typeof s === 'string') return { field: 'speeds', message: `Speeds: ${s}` };
  if (s[0] < 0) return { field: 'speeds', message: `Speeds: '${speeds}' starts below zero; expected speeds of 0 ${unit.label} or more` };
  const n = Number(samples.trim().replace(/_/g, ''));
  if (!Number.isInteger(n) || n < 10 || n > DEFAULT_MAX_SAMPLES) return { field: 'samples', message: `Samples per grid point: '${samples}' is not a whole number from 10 to ${grouped(DEFAULT_MAX_SAMPLES)}` };
  return { grid: { directions: d, speeds: s.map((v) => Math.round(v * unit.si * 1e9) / 1e9), samples: n } };
}

export function envelopePanel(store: Store, actions: Actions): HTMLElement {
  const directions = gridField('Wind directions (from)', DEFAULT_DIRECTIONS, 'envelope-directions', 'first:last:step in degrees');
  directions.unit.textContent = '°';
  const speeds = gridField('Mean wind speeds', DEFAULTS[store.get().units].speeds, 'envelope-speeds', 'first:last:step at the reference height');
  const samples = gridField('Samples per grid point', DEFAULT_SAMPLES, 'envelope-samples', 'fewer is faster but coarser');
  const fields = { directions, speeds, samples };
  const plan = el('p', { class: 'note', attrs: { 'aria-live': 'polite' }, data: { test: 'envelope-plan' } });

  const computeButton = el('button', { class: 'primary', text: 'Compute wind limits', attrs: { type: 'button' }, data: { test: 'envelope-compute' } });
  const cancelButton = el('button', { text: 'Cancel', attrs: { type: 'button' }, data: { test: 'envelope-cancel' } });
  const progress = el('progress', { attrs: { max: '1', value: '0', 'aria-label': 'Wind limits progress' }, data: { test: 'envelope-progress' } });
  const status = el('p', { class: 'run-status', attrs: { role: 'status', 'aria-live': 'polite' }, data: { test: 'envelope-status' } });
  const stale = el('p', { class: 'stale', attrs: { role: 'status' }, data: { test: 'envelope-stale' }, text: 'These limits are for the scenario as it was before your last change (other than the wind). Compute them again to update.' });
  const chart = el('div', { class: 'envelope-chart', data: { test: 'envelope-chart' } });
  const picked = el('p', { class: 'note', attrs: { role: 'status', 'aria-live': 'polite' }, data: { test: 'envelope-picked' } });
  const table = el('div', { data: { test: 'envelope-limits' } });

  const current = () => readGrid(directions.input.value, speeds.input.value, samples.input.value, store.get().units);

  const showGrid = () => {
    const read = current();
    for (const [name, f] of Object.entries(fields)) {
      const problem = 'field' in read && read.field === name ? read.message : '';
      f.message.textContent = problem;
      f.input.setAttribute('aria-invalid', problem ? 'true' : 'false');
    }
    if ('grid' in read) {
      const g = read.grid;
      plan.textContent = `${g.directions.length} directions × ${g.speeds.length} speeds: at most ${grouped(plannedPoints(g))} grid points by bisection, ${grouped(plannedPoints(g) * g.samples)} flights.`;
    } else plan.textContent = '';
    computeButton.disabled = 'field' in read || busy(store.get()) || store.get().draftIssues.length > 0;
  };
  for (const f of Object.values(fields)) f.input.addEventListener('input', showGrid);

  computeButton.addEventListener('click', () => {
    const read = current();
    if ('grid' in read) void actions.computeEnvelope(read.grid);
  });
  cancelButton.addEventListener('click', () => actions.cancelEnvelope());

  // The chart is redrawn only when what it shows changes (result, units, or the wind it marks).
  let drawn = '';
  const render = (state: AppState) => {
    const e = state.envelope;
    const units = state.units;
    speeds.unit.textContent = fieldUnit('speed', units).label;
    progress.value = e.phase === 'running' ? e.progress : e.phase === 'finished' ? 1 : 0;
    cancelButton.disabled = e.phase !== 'running';
    status.dataset.phase = e.phase;
    status.textContent = statusText(e);
    showGrid();
    const outcome = e.outcome;
    if (!outcome) {
      replaceChildren(chart, el('p', { class: 'muted', text: 'No wind limits yet. Choose a grid and press Compute.' }));
      replaceChildren(table);
      stale.hidden = true;
      picked.textContent = '';
      drawn = '';
      return;
    }
    const fresh = outcome.key === limitsKey(state.accepted.scenario);
    stale.hidden = fresh;
    // While the limits apply, the marker shows the wind now in the scenario (a loaded grid point too).
    const wind = state.accepted.scenario.weather.wind;
    const shown: EnvelopeResult = fresh ? { ...outcome.envelope, forecast: { from: wind.from, speed: wind.speed } } : outcome.envelope;
    const signature = `${outcome.computedAt}|${outcome.hash}|${units}|${shown.forecast.from}|${shown.forecast.speed}`;
    if (signature !== drawn) {
      drawn = signature;
      void drawChart(shown, units, fresh);
      replaceChildren(table, limitsTable(shown, units, fresh, (from, speed) => pick(from, speed)), ...(shown.window && shown.window.length > 0 ? [windowTable(shown.window, units)] : []));
    }
  };

  const pick = (from: number, speed: number) => {
    actions.loadWindCase(from, speed);
    const unit = fieldUnit('speed', store.get().units);
    picked.textContent = `Wind set to ${inUnit(speed, unit, unit.label === 'mph' ? 0 : 1)} from ${from}° in Setup (and on the map). Press Run to fly it.`;
  };

  const drawChart = async (e: EnvelopeResult, units: UnitSystem, clickable: boolean) => {
    const signature = drawn;
    const { envelopeFigure } = await envelopeDrawing();
    const { renderSvg } = await import('../../../src/report/sheet/render-svg.js');
    if (signature !== drawn) return;
    const figure = envelopeFigure(e, { units, width: 270 });
    const svg = svgFigure(renderSvg(figure.page, `Wind limits: ${e.name}`), `Polar chart of the wind limits by direction. ${clickable ? 'Click a direction and speed to load it into the wind fields.' : ''}`);
    if (clickable) {
      svg.classList.add('clickable');
      svg.addEventListener('click', (event) => {
        const matrix = svg.getScreenCTM();
        if (!matrix) return;
        const point = new DOMPoint(event.clientX, event.clientY).matrixTransform(matrix.inverse());
        const hit = figure.frame.pick(point.x, point.y, e.directions, e.speeds);
        if (hit) pick(hit.from, hit.speed);
      });
    }
    replaceChildren(chart, svg);
  };

  store.subscribe((state, previous) => {
    if (state.envelope !== previous.envelope || state.units !== previous.units || state.accepted !== previous.accepted || state.draftIssues !== previous.draftIssues || state.run !== previous.run) {
      // The speeds' default follows the units, unless the user typed their own grid.
      if (state.units !== previous.units && speeds.input.value === DEFAULTS[previous.units].speeds) speeds.input.value = DEFAULTS[state.units].speeds;
      render(state);
    }
  });
  render(store.get());

  return el(
    'section',
    { class: 'panel-section envelope-panel', attrs: { 'aria-label': 'Wind limits' } },
    el('p', { class: 'note', text: 'For each wind direction, the highest mean wind at which the keep-out zone of the scenario in Setup stays inside the site boundary and clear of spectators, parking, roads and buildings. Every grid point flies the scenario with its spreads, failure modes and seed.' }),
    el('fieldset', { class: 'field-group' }, el('legend', { text: 'Grid' }), directions.row, speeds.row, samples.row, plan),
    el('div', { class: 'row' }, computeButton, cancelButton),
    progress,
    status,
    stale,
    chart,
    picked,
    table,
  );
}

function busy(state: AppState): boolean {
  return state.envelope.phase === 'running';
}

function statusText(e: EnvelopeState): string {
  switch (e.phase) {
    case 'idle':
      return 'Ready.';
    case 'running':
      return e.planned > 0 ? `${grouped(e.done)} of at most ${grouped(e.planned)} grid points flown` : 'Starting…';
    case 'finished':
      return `Finished: ${grouped(e.outcome?.envelope.casesFlown ?? e.done)} grid points flown in ${(e.outcome?.envelope.elapsed_s ?? 0).toFixed(1)} s.`;
    case 'cancelled':
      return `Cancelled after ${grouped(e.done)} grid points.${e.outcome ? ' The limits shown are from the previous computation.' : ''}`;
    case 'failed':
      return `The computation failed: ${e.message}`;
  }
}

/** The limits as a table, each row with a button that loads its limit wind (the keyboard's way to pick). */
function limitsTable(e: EnvelopeResult, units: UnitSystem, loadable: boolean, load: (from: number, speed: number) => void): HTMLElement {
  const unit = fieldUnit('speed', units);
  const speed = (v: number) => inUnit(v, unit, unit.label === 'mph' ? 0 : 1);
  // The unit sits in the column head, so a narrow panel never wraps it under the number.
  const bare = (v: number) => grouped(v / unit.si, unit.label === 'mph' ? 0 : 1);
  const rows = e.limits.map((d) => {
    const limit = d.limit === null ? `none (fails at ${bare(e.speeds[0])})` : d.aboveGrid ? `≥ ${bare(d.limit)}` : bare(d.limit);
    const cells: (string | Node)[] = [`${d.from}°`, limit, d.firstFailure.join('; ') || (d.aboveGrid ? 'none within the grid' : '–')];
    if (loadable) {
      const button = el('button', { class: 'link-button', text: 'Load', attrs: { type: 'button', 'aria-label': `Load wind ${d.limit === null ? speed(e.speeds[0]) : speed(d.limit)} from ${d.from}°` }, data: { loadFrom: String(d.from) } });
      button.addEventListener('click', () => load(d.from, d.limit ?? e.speeds[0]));
      cells.push(button);
    }
    return el('tr', {}, ...cells.map((c, i) => (i === 0 ? el('th', { attrs: { scope: 'row' } }, c) : el('td', {}, c))));
  });
  const head = ['From', `Limit (${unit.label})`, 'First test to fail above it', ...(loadable ? [''] : [])];
  return el(
    'table',
    { class: 'envelope-table' },
    el('caption', { text: 'Limits by direction' }),
    el('thead', {}, el('tr', {}, ...head.map((h) => el('th', { text: h, attrs: { scope: 'col' } })))),
    el('tbody', {}, ...rows),
  );
}

/** The launch window: each forecast hour of the day against the limits, as `strewn envelope` prints it. */
function windowTable(hours: NonNullable<EnvelopeResult['window']>, units: UnitSystem): HTMLElement {
  const unit = fieldUnit('speed', units);
  const bare = (v: number) => grouped(v / unit.si, unit.label === 'mph' ? 0 : 1);
  const rows = hours.map((h) =>
    el(
      'tr',
      { data: { inside: String(h.inside) } },
      el('th', { attrs: { scope: 'row' }, text: h.time.slice(11, 16) }),
      el('td', { text: `${bare(h.speed)} from ${Math.round(h.from)}°` }),
      el('td', { text: h.limit === null ? '–' : bare(h.limit) }),
      el('td', { text: h.inside ? 'inside' : 'OUTSIDE' }),
    ),
  );
  return el(
    'table',
    { class: 'envelope-table', attrs: { 'data-test': 'launch-window' } },
    el('caption', { text: `Launch window ${hours[0]!.time.slice(0, 10)} (UTC): the forecast wind at the reference height against the limits` }),
    el('thead', {}, el('tr', {}, ...['Hour', `Forecast (${unit.label})`, `Limit (${unit.label})`, 'Judged'].map((h) => el('th', { text: h, attrs: { scope: 'col' } })))),
    el('tbody', {}, ...rows),
  );
}
