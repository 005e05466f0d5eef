import { studyIsCurrent, type AppState, type Store } from '../app/store.js';
import type { Study } from '../study/compose.js';
import { grouped, inUnit, level, percent } from '../units/format.js';
import { figureUnits, type FigureUnits, type UnitSystem } from '../units/systems.js';
import { areaText } from '../../../src/report/sheet/units.js';
import { el, replaceChildren } from './dom.js';
import { inputWords } from '../../../src/report/sheet/input-names.js';
import type { InputSensitivity } from '../../../src/sensitivity/study.js';
import { svgFigure } from './svg-figure.js';
import type { RiskSummary } from '../../../src/risk/index.js';
import { smallRate } from '../../../src/report/sheet/units.js';
import { readable, significant } from '../../../src/report/format-number.js';

/**
 * The "Findings" tab: what the last run found, in the chosen units. Every figure comes from the
 * run summary the command line writes (summary.json), so the two always agree.
 */
export function findingsPanel(store: Store): HTMLElement {
  const body = el('div', { class: 'findings', data: { test: 'findings' } });
  const render = (state: AppState) => {
    if (state.study === null) {
      replaceChildren(body, el('p', { class: 'muted', text: 'No results yet. Press Run to fly the samples.' }));
      return;
    }
    replaceChildren(body, ...findings(state.study, figureUnits(state.units), state.units, studyIsCurrent(state)));
  };
  store.subscribe((state, previous) => {
    if (state.study !== previous.study || state.units !== previous.units || state.accepted !== previous.accepted) render(state);
  });
  render(store.get());
  return el('section', { class: 'panel-section', attrs: { 'aria-label': 'Findings' } }, body);
}

function figure(name: string, label: string, value: string, detail?: string): HTMLElement {
  return el('div', { class: 'figure', data: { finding: name } }, el('dt', { text: label }), el('dd', {}, el('span', { class: 'figure-value', text: value }), detail ? el('span', { class: 'figure-detail', text: ` ${detail}` }) : null));
}

function table(caption: string, name: string, head: string[], rows: (string | Node)[][]): HTMLElement {
  return el(
    'table',
    { data: { finding: name } },
    el('caption', { text: caption }),
    el('thead', {}, el('tr', {}, ...head.map((h) => el('th', { text: h, attrs: { scope: 'col' } })))),
    el('tbody', {}, ...rows.map((r) => el('tr', {}, ...r.map((c, i) => (i === 0 ? el('th', { attrs: { scope: 'row' } }, c) : el('td', {}, c)))))),
  );
}

const OCTANTS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;

/**
 * A distance for each of the eight directions in two rows of four, numbers only (the unit is in
 * the caption): fits a phone's width in feet as in metres, with no unit wrapped under its number.
 */
function octantTable(caption: string, name: string, metres: Record<(typeof OCTANTS)[number], number | null>, u: FigureUnits): HTMLElement {
  const cell = (n: (typeof OCTANTS)[number]) => el('td', {}, el('span', { class: 'octant-name', text: n }), metres[n] === null ? '–' : grouped(metres[n]! / u.length.si));
  return el(
    'table',
    { class: 'octants', data: { finding: name } },
    el('caption', { text: caption }),
    el('tbody', {}, el('tr', {}, ...OCTANTS.slice(0, 4).map(cell)), el('tr', {}, ...OCTANTS.slice(4).map(cell))),
  );
}

function findings(study: Study, u: FigureUnits, system: UnitSystem, current: boolean): HTMLElement[] {
  // One rule for areas on the sheet, the page and the terminal (src/report/sheet/units.ts).
  const area = (m2: number) => areaText(m2, system);
  const s = study.summary;
  const out: HTMLElement[] = [];
  if (!current) out.push(el('p', { class: 'stale', attrs: { role: 'status' }, data: { test: 'stale' }, text: 'These results are from the scenario as it was before your last change. Run again to update them.' }));

  // Warnings first: above every figure, where they are read before the figures they qualify.
  const warnings = [...s.warnings, ...s.scenarioWarnings];
  if (warnings.length > 0) {
    out.push(el('div', { class: 'warnings', attrs: { role: 'note' }, data: { finding: 'warnings' } }, el('p', { class: 'warnings-title', text: `Warnings (${warnings.length})` }), el('ul', {}, ...warnings.map((w) => el('li', { text: w })))));
  }

  const rate = s.samples / Math.max(1e-3, study.flightTime_ms / 1000);
  out.push(
    el('p', { class: 'findings-head' }, el('strong', { text: s.name })),
    el('p', { class: 'muted', text: `${grouped(s.samples)} samples (seed ${s.seed}) in ${(study.flightTime_ms / 1000).toFixed(1)} s, ${grouped(rate)} flights/s · scenario ${s.scenarioHash.slice(0, 12)}` }),
  );

  const figures = el('dl', { class: 'figures' });
  const f = s.farthestLanding;
  figures.appendChild(figure('farthest', 'Farthest landing', f ? inUnit(f.distance_m, u.length) : 'none landed', f ? `bearing ${f.bearing_deg.toFixed(0)}°, sample ${f.sample} (${f.mode})` : undefined));
  if (Number.isFinite(s.keepOut.area_m2)) {
    const k = s.keepOut;
    figures.appendChild(figure('keepout-reach', 'Keep-out zone reaches', inUnit(k.maxDistance_m, u.length), `from the pad (${level(k.level)} region + ${inUnit(k.margin_m, u.length)} margin)`));
    figures.appendChild(figure('keepout-area', 'Keep-out zone area', area(k.area_m2)));
    figures.appendChild(figure('keepout-outside', 'Landings outside the zone', percent(k.outsideShare), `(95 % upper bound ${percent(k.outsideUpper95)})`));
  }
  figures.appendChild(figure('apogee', 'Apogee (median)', inUnit(s.apogee_m.p50, u.length), `5–95 %: ${inUnit(s.apogee_m.p05, u.length)} – ${inUnit(s.apogee_m.p95, u.length)}; highest ${inUnit(s.apogee_m.max, u.length)}`));
  figures.appendChild(figure('flight-time', 'Flight time (median)', `${s.flightTime_s.p50.toFixed(1)} s`, `5–95 %: ${s.flightTime_s.p05.toFixed(1)} – ${s.flightTime_s.p95.toFixed(1)} s`));
  figures.appendChild(figure('failed', 'Failed flights', grouped(s.failedSamples), s.failures.map((x) => `${grouped(x.samples)} ${x.reason}`).join('; ') || undefined));
  out.push(figures);

  if (study.analysis) {
    out.push(octantTable(`Keep-out zone: farthest point by direction from the pad (${u.length.label})`, 'octants', study.analysis.keepOut.properties.octants_m, u));
  }
  if (s.contours.length > 0) {
    out.push(table('Probability regions', 'contours', ['Holds', 'Area', 'Reaches', 'In band'], s.contours.map((c) => [level(c.level), area(c.area_m2), inUnit(c.maxDistance_m, u.length), grouped(c.samplesInBand)])));
  }
  if (s.modes.length > 1) {
    out.push(table('Modes', 'modes', ['Mode', 'Probability', 'Samples', 'Landed'], s.modes.map((m) => [m.name, percent(m.probability), grouped(m.samples), grouped(m.landed)])));
  }
  if (s.areas.length > 0) {
    const overlaps = new Map((study.analysis?.areas ?? []).map((a) => [a.name, a.intersectsKeepOut]));
    out.push(
      table(
        'Marked areas: chance per flight of a landing inside',
        'areas',
        ['Area', 'Hits', 'Chance', '95 % bound', 'Overlaps zone'],
        s.areas.map((a) => [el('span', {}, a.name, el('span', { class: 'area-kind', text: a.kind })), grouped(a.hits), percent(a.probability), percent(a.upper95), overlaps.get(a.name) ? 'yes' : 'no']),
      ),
    );
  }
  if (s.risk) out.push(...riskFindings(s.risk, u, area));
  if (s.sensitivity && s.sensitivity.inputs.length > 0) {
    const sensitivity = s.sensitivity;
    const data = table(
      'Shares as numbers',
      'sensitivity',
      ['Input', 'Landing scatter', 'Distance from pad'],
      sensitivity.inputs.map((x) => [inputWords(x.input), percent(Math.max(0, x.scatter)), percent(Math.max(0, x.distance))]),
    );
    const chart = el('div', { class: 'figure-chart' });
    void drawSensitivity(chart, sensitivity.inputs);
    out.push(
      el(
        'figure',
        { class: 'sensitivity', data: { finding: 'sensitivity-chart' } },
        el('figcaption', { text: 'What drives the landing spread: the share each input explains alone' }),
        chart,
        el('p', { class: 'note', text: `The rest is turbulence and interactions. Method: ${sensitivity.method}.` }),
        el('details', {}, el('summary', { text: 'As a table' }), data),
      ),
    );
  }
  return out;
}

/** Risk to people: per flight, each figure against the user's criterion where one is set. */
function riskFindings(r: RiskSummary, u: FigureUnits, area: (m2: number) => string): HTMLElement[] {
  const out: HTMLElement[] = [];
  const st = r.settings;
  const harm = st.casualtyEnergy_J !== null ? `casualty at ${significant(st.casualtyEnergy_J, 3)} J or more` : 'casualty chance by energy, your table';
  out.push(el('h3', { class: 'findings-subhead', text: 'Risk to people (per flight)' }));
  const figures = el('dl', { class: 'figures', data: { finding: 'risk' } });
  const crit = r.total.collectiveCriterion ? `; ${r.total.collectiveCriterion} (${smallRate(st.criteria.collective)}), bound ${r.total.collectiveCriterionUpper95}` : '';
  figures.appendChild(figure('risk-total', 'Expected casualties, all marked areas', smallRate(r.total.expectedCasualties), `(95 % upper bound ${smallRate(r.total.upper95)})${crit}`));
  figures.appendChild(figure('risk-model', 'Harm model', harm, `object radius ${inUnit(st.objectRadius_m, u.length, 3)} (${st.objectRadiusFrom}); person ${inUnit(st.personRadius_m, u.length, 2)} radius, ${inUnit(st.personHeight_m, u.length, 2)} tall`));
  out.push(figures);
  out.push(octantTable(`Individual risk stays under ${smallRate(r.standingLevel)} beyond this distance from the pad (${u.length.label})${r.standingResolved ? '' : '; line not resolved by the samples'}`, 'standing', r.standingDistance_m, u));
  out.push(
    table('Individual-risk lines', 'risk-lines', ['Risk per flight', 'Area inside', 'Reaches', 'Resolved by the samples?'], r.lines.map((l) => [
      smallRate(l.level),
      area(l.area_m2),
      inUnit(l.maxDistance_m, u.length),
      l.resolved ? 'yes' : el('span', {}, 'no', el('span', { class: 'cell-note', text: `about ${l.samplesNeeded === null ? 'many more' : grouped(l.samplesNeeded)} samples needed` })),
    ])),
  );
  if (r.areas.length > 0) {
    out.push(
      table('Marked areas: expected casualties and largest individual risk', 'risk-areas', ['Area', 'Expected casualties', '95 % upper bound', 'Largest individual risk'], r.areas.map((a) => [
        a.name,
        a.expectedCasualties === null ? 'no people given' : smallRate(a.expectedCasualties),
        a.upper95 === null ? '–' : smallRate(a.upper95),
        `${smallRate(a.maxIndividualRisk)}${a.individualCriterion ? ` (${a.individualCriterion})` : ''}`,
      ])),
    );
  }
  out.push(
    // Units in the heads, so each cell is two short numbers that stay on one line in a phone's width.
    table('Impacts by mode: median (95 %)', 'risk-modes', ['Mode', `Speed (${u.speed.label})`, 'Energy (J)', 'Expected casualties'], r.modes.map((m) => [
      m.name,
      `${readable(m.impactSpeed_m_s.p50 / u.speed.si)} (${readable(m.impactSpeed_m_s.p95 / u.speed.si)})`,
      `${significant(m.impactEnergy_J.p50, 3)} (${significant(m.impactEnergy_J.p95, 3)})`,
      smallRate(m.expectedCasualties),
    ])),
  );
  out.push(el('p', { class: 'note', text: 'Not a compliance figure: people spread evenly over each area, all modes counted; "under / over your criterion" compares with the criteria you set, it is not a verdict on the event.' }));
  return out;
}

/**
 * The bars of the review sheet's record page, drawn from the same shapes. The drawing modules
 * measure text with pdfkit; a finished run has loaded them already (compose.ts), so this is quick.
 */
async function drawSensitivity(holder: HTMLElement, inputs: InputSensitivity[]): Promise<void> {
  try {
    await import('../exports/pdf-fonts.js');
    const [{ sensitivityFigure }, { renderSvg }, { defaultMeasure }] = await Promise.all([
      import('../../../src/report/sheet/sensitivity-bars.js'),
      import('../../../src/report/sheet/render-svg.js'),
      import('../../../src/report/sheet/fonts.js'),
    ]);
    const page = sensitivityFigure(inputs, 270, defaultMeasure());
    holder.replaceChildren(svgFigure(renderSvg(page, 'What drives the landing spread'), `Bar chart: ${inputs.map((x) => `${inputWords(x.input)} ${percent(Math.max(0, x.scatter))} of the scatter`).join(', ')}`));
  } catch (error) {
    holder.replaceChildren(el('p', { class: 'muted', text: `The chart could not be drawn (${error instanceof Error ? error.message : String(error)}); the table below has the numbers.` }));
  }
}
