import type { EventTotals } from '../../../src/event/combine.js';
import type { EventPlan } from '../../../src/event/event-file.js';
import { areaText, smallRate } from '../../../src/report/sheet/units.js';
import type { Store } from '../app/store.js';
import type { EventController } from '../event/event-controller.js';
import { EVENT_DEMOS } from '../event/event-demos.js';
import type { EventState, EventCell } from '../event/event-state.js';
import type { EventRun } from '../event/event-run.js';
import { grouped, inUnit, percent } from '../units/format.js';
import { figureUnits, paperFor, type UnitSystem } from '../units/systems.js';
import { el, replaceChildren, uniqueId } from './dom.js';
import { issueList } from './issues.js';
import '../event/event.css';

/**
 * The "Event" tab: opens an event plan (*.event.json, with the scenarios and curves it names),
 * flies every item on the page's workers with one progress bar, and shows what `strewn event`
 * shows: warnings, the event's keep-out zone, a table of items, expected landings, chance of any
 * landing and expected casualties per area and in total, the individual-risk lines; the event
 * sheet and event.json download. Every figure is combineEvent's (src/event/combine.ts).
 */
export function eventPanel(store: Store, cell: EventCell, actions: EventController): HTMLElement {
  const picker = el('input', { attrs: { type: 'file', multiple: '', accept: '.json,.csv,application/json,text/csv', 'aria-label': 'Event plan and its scenario files' }, data: { test: 'event-file' } });
  picker.addEventListener('change', () => {
    const files = Array.from(picker.files ?? []);
    if (files.length > 0) void actions.openFiles(files);
    picker.value = '';
  });
  const demoId = uniqueId('event-demo');
  const demo = el('select', { attrs: { id: demoId }, data: { test: 'event-demo' } }, ...EVENT_DEMOS.map((d) => el('option', { text: d.label, attrs: { value: d.id } })));
  const openDemo = el('button', { text: 'Open demo event', attrs: { type: 'button' }, data: { test: 'event-open-demo' } });
  openDemo.addEventListener('click', () => actions.openDemo(demo.value));

  const refused = el('div', { class: 'alert', attrs: { role: 'alert' }, data: { test: 'event-refused' } });
  const plan = el('div', { data: { test: 'event-plan' } });
  const runButton = el('button', { class: 'primary', text: 'Run the event', attrs: { type: 'button' }, data: { test: 'event-run' } });
  const cancelButton = el('button', { text: 'Cancel', attrs: { type: 'button' }, data: { test: 'event-cancel' } });
  runButton.addEventListener('click', () => void actions.run());
  cancelButton.addEventListener('click', () => actions.cancel());
  const progress = el('progress', { attrs: { max: '1', value: '0', 'aria-label': 'Event progress' }, data: { test: 'event-progress' } });
  const status = el('p', { class: 'run-status', attrs: { role: 'status', 'aria-live': 'polite' }, data: { test: 'event-status' } });
  const mapId = uniqueId('event-on-map');
  const onMap = el('input', { attrs: { type: 'checkbox', id: mapId }, data: { test: 'event-on-map' } });
  onMap.addEventListener('change', () => actions.showOnMap(onMap.checked));
  const controls = el(
    'div',
    { class: 'event-controls' },
    el('div', { class: 'row' }, runButton, cancelButton),
    progress,
    status,
    el('div', { class: 'check' }, onMap, el('label', { text: 'Show the event on the map (instead of the scenario)', attrs: { for: mapId } })),
  );
  const results = el('div', { class: 'event-results', data: { test: 'event-results' } });

  const render = (s: EventState, units: UnitSystem) => {
    refused.hidden = s.refused === null;
    if (s.refused) replaceChildren(refused, el('p', { class: 'alert-title', text: `${s.refused.fileName} was not opened (${s.refused.issues.length} ${s.refused.issues.length === 1 ? 'problem' : 'problems'}):` }), issueList(s.refused.issues));
    controls.hidden = s.plan === null;
    if (s.plan === null) {
      replaceChildren(plan, el('p', { class: 'muted', text: 'No event open. Pick an event plan (*.event.json) together with the scenario files and motor curves it names, or open a demo event.' }));
      replaceChildren(results);
      return;
    }
    replaceChildren(plan, ...planView(s.plan));
    const busy = s.phase === 'running' || s.phase === 'analysing';
    runButton.disabled = busy;
    cancelButton.disabled = !busy;
    onMap.checked = s.onMap;
    progress.max = Math.max(1, s.total);
    progress.value = s.phase === 'idle' ? 0 : s.done;
    status.dataset.phase = s.phase;
    status.textContent = statusText(s);
    if (s.run && s.phase !== 'running' && s.phase !== 'analysing') replaceChildren(results, ...resultsView(s.plan, s.run, units, actions));
    else if (!s.run) replaceChildren(results);
  };
  const draw = () => render(cell.get(), store.get().units);
  cell.subscribe(draw);
  store.subscribe((state, previous) => state.units !== previous.units && draw());
  draw();

  return el(
    'section',
    { class: 'panel-section event-panel', attrs: { 'aria-label': 'Event' } },
    el('p', { class: 'note', text: 'An event plan is the site once and the items that fly during the event, each a scenario with how many times it flies. The figures add up every flight of the event.' }),
    el('div', { class: 'row' }, el('label', { class: 'file-pick' }, 'Open plan and files ', picker)),
    el('div', { class: 'row' }, el('label', { text: 'Demo', attrs: { for: demoId } }), demo, openDemo),
    refused,
    plan,
    controls,
    results,
  );
}

function statusText(s: EventState): string {
  switch (s.phase) {
    case 'idle':
      return `Ready: ${grouped(s.total)} samples over ${s.plan?.items.length ?? 0} items.`;
    case 'running':
      return `${grouped(s.done)} of ${grouped(s.total)} samples · ${grouped(s.rate)} flights/s`;
    case 'analysing':
      return `${grouped(s.total)} samples flown · combining the items…`;
    case 'finished':
      return `Finished: ${grouped(s.total)} samples in ${((s.run!.flightTime_ms + s.run!.analysisTime_ms) / 1000).toFixed(1)} s (flown and analysed item by item ${(s.run!.flightTime_ms / 1000).toFixed(1)} s, combined ${(s.run!.analysisTime_ms / 1000).toFixed(1)} s).`;
    case 'cancelled':
      return `Cancelled after ${grouped(s.done)} of ${grouped(s.total)} samples.${s.run ? ' The results shown are from the previous run.' : ''}`;
    case 'failed':
      return `The event run failed: ${s.message}`;
  }
}

function planView(plan: EventPlan): HTMLElement[] {
  const flights = plan.items.reduce((s, it) => s + it.flights, 0);
  return [
    el('p', { class: 'scenario-title', text: plan.name, data: { test: 'event-name' } }),
    plan.notes ? el('p', { class: 'note', text: plan.notes }) : null,
    el('p', { class: 'note', text: `${plan.items.length} items, ${grouped(flights)} flights.` }),
  ].filter((x): x is HTMLParagraphElement => x !== null);
}

function scrollTable(caption: string, name: string, head: string[], rows: string[][]): HTMLElement {
  return el(
    'div',
    { class: 'table-scroll' },
    el(
      'table',
      { class: 'event-table', data: { event: name } },
      el('caption', { text: caption }),
      el('thead', {}, el('tr', {}, ...head.map((h) => el('th', { text: h, attrs: { scope: 'col' } })))),
      el('tbody', {}, ...rows.map((r) => el('tr', {}, ...r.map((c, i) => (i === 0 ? el('th', { text: c, attrs: { scope: 'row' } }) : el('td', { text: c })))))),
    ),
  );
}

function figure(name: string, label: string, value: string, detail?: string): HTMLElement {
  return el('div', { class: 'figure', data: { event: name } }, el('dt', { text: label }), el('dd', {}, el('span', { class: 'figure-value', text: value }), detail ? el('span', { class: 'figure-detail', text: ` ${detail}` }) : null));
}

/** Warnings of every item: the scenario's and its run's, named by item. */
export function eventWarnings(plan: EventPlan, run: EventRun): string[] {
  const out: string[] = [];
  run.outcomes.forEach((o, i) => {
    const name = plan.items[i]!.name;
    for (const w of o.item.warnings) out.push(`${name}: ${w.path ? `${w.path}: ` : ''}${w.message}`);
    for (const w of o.summary.warnings) out.push(`${name}: ${w}`);
  });
  return [...new Set(out)];
}

function resultsView(plan: EventPlan, run: EventRun, units: UnitSystem, actions: EventController): HTMLElement[] {
  const t: EventTotals = run.totals;
  const u = figureUnits(units);
  const area = (m2: number | null) => (m2 === null ? 'n/a' : areaText(m2, units));
  const length = (m: number | null) => (m === null ? 'n/a' : inUnit(m, u.length));
  const out: HTMLElement[] = [];
  const warnings = eventWarnings(plan, run);
  if (warnings.length > 0) {
    out.push(el('div', { class: 'warnings', attrs: { role: 'note' }, data: { event: 'warnings' } }, el('p', { class: 'warnings-title', text: `Warnings (${warnings.length})` }), el('ul', {}, ...warnings.map((w) => el('li', { text: w })))));
  }
  out.push(
    el(
      'dl',
      { class: 'figures' },
      figure('flights', 'Flights', grouped(t.flights), `${t.items.length} items`),
      figure('zone', 'Event keep-out zone', area(t.unionArea_m2), t.unionReach_m === null ? undefined : `reaches ${length(t.unionReach_m)} from the event pad; union of the items' zones`),
      figure('casualties', 'Expected casualties, whole event', smallRate(t.total.expectedCasualties), '(indicative)'),
      figure('landings', 'Expected landings in marked areas', smallRate(t.total.expectedLandingsInAreas)),
      figure('risk-max', 'Highest individual risk', smallRate(t.individualRisk.max), 'chance per event of harm to one person standing there'),
    ),
  );
  out.push(
    scrollTable(
      'Items',
      'items',
      ['Item', 'Flights', 'Chance it comes down per flight', 'Keep-out zone', 'Reach', 'Expected casualties per flight', 'Over the event'],
      t.items.map((r) => [r.name, grouped(r.flights), percent(r.chancePerFlight), area(r.keepOut_m2), length(r.reach_m), smallRate(r.expectedCasualtiesPerFlight), smallRate(r.expectedCasualties)]),
    ),
  );
  out.push(
    scrollTable(
      'Marked areas over the whole event',
      'areas',
      ['Area', 'Kind', 'People', 'Expected landings', 'Chance of any landing', 'Expected casualties'],
      t.areas.map((a) => [a.name, a.kind, a.people === undefined ? '–' : grouped(a.people), smallRate(a.expectedLandings), percent(a.chanceOfAnyLanding), a.expectedCasualties === undefined ? '–' : smallRate(a.expectedCasualties)]),
    ),
  );
  out.push(
    scrollTable(
      'Individual-risk lines over the event',
      'risk-lines',
      ['Chance per event', 'Area inside'],
      t.individualRisk.lines.length > 0 ? t.individualRisk.lines.map((l) => [`${smallRate(l.level)} or more`, area(l.area_m2)]) : [['none reached', '–']],
    ),
  );
  if (t.harmModel) out.push(el('p', { class: 'note', text: `Harm to people: ${t.harmModel}.` }));
  const paperId = uniqueId('event-paper');
  const paper = el('select', { attrs: { id: paperId }, data: { test: 'event-paper' } }, el('option', { text: 'A4', attrs: { value: 'a4' } }), el('option', { text: 'Letter', attrs: { value: 'letter' } }));
  paper.value = paperFor(units);
  const sheet = el('button', { text: 'Event sheet (PDF)', attrs: { type: 'button' }, data: { test: 'event-sheet' } });
  const summary = el('button', { text: 'event.json', attrs: { type: 'button' }, data: { test: 'event-json' } });
  const note = el('p', { class: 'note', attrs: { role: 'status' } });
  sheet.addEventListener('click', () => {
    note.textContent = 'Drawing the event sheet…';
    actions.downloadSheet(paper.value as 'a4' | 'letter', units).then(
      () => (note.textContent = ''),
      (error: unknown) => (note.textContent = `The sheet could not be drawn: ${error instanceof Error ? error.message : String(error)}`),
    );
  });
  summary.addEventListener('click', () => void actions.downloadSummary());
  out.push(el('div', { class: 'row event-downloads' }, el('label', { text: 'Paper', attrs: { for: paperId } }), paper, sheet, summary), note);
  out.push(el('p', { class: 'note', text: 'The sheet is the record to sign: map, items, totals and the sign-off. The figures are estimates from a model; they do not replace the review the local rules and a licensed practitioner require.' }));
  return out;
}
