/**
 * What page 2 of the sheet says, as a list of blocks (headings, label/value rows, tables, bullet
 * lists, sign-off lines); record-page.ts decides where they go. Every figure comes from the results
 * folder; nothing here is computed anew except descriptions of the inputs (motor impulse and burn
 * time from the thrust curve, air at the pad from the standard atmosphere).
 *
 * @example
 *   const blocks = recordBlocks(input, unitFormatter('metric'));
 */
import { MotorModel } from '../../physics/motor.js';
import { AirModel } from '../../physics/air.js';
import { descentRateForDragArea } from '../../scenario/normalize.js';
import type { Scenario, UncertaintyName } from '../../scenario/types.js';
import { UNCERTAINTY_NAMES } from '../../scenario/types.js';
import { MIN_BAND_SAMPLES } from '../../analysis/confidence.js';
import { bearingText } from './compass.js';
import { SPREAD_WORDS } from './input-names.js';
import { spreadAsFlown } from '../spread-text.js';
import type { FontName, Shape } from './display-list.js';
import type { TextMeasure } from './fonts.js';
import { sensitivityBars, sensitivityKey, sensitivityKeyWidth, sensitivityNote } from './sensitivity-bars.js';
import { dateText } from './page-parts.js';
import type { SheetInput } from './sheet-input.js';
import type { RiskSummary } from '../../risk/index.js';
import { grouped, levelText, percent, significant, smallRate, type UnitFormatter } from '../format-number.js';
import { unprintableCount } from './winansi.js';
import { sideView } from './side-view.js';
import { WORDS } from '../symbols.js';
import type { UnitSystem } from '../format-number.js';

export interface Column {
  title: string;
  /** Share of the table's width. */
  weight: number;
  align?: 'left' | 'right';
}

export type Block =
  /** `aside` draws something small at the right end of the heading's line (a key). */
  | { kind: 'heading'; text: string; aside?: { width: (size: number, measure: TextMeasure) => number; draw: (x: number, baseline: number, size: number, measure: TextMeasure) => Shape[] } }
  | { kind: 'rows'; rows: { label: string; value: string; font?: FontName }[] }
  | { kind: 'table'; id: string; columns: Column[]; rows: string[][] }
  | { kind: 'text'; text: string; font?: FontName }
  | { kind: 'bullets'; items: string[] }
  /** A drawing laid at (x, y) across `width` in type of `size`; it reports the height it took. */
  | { kind: 'figure'; draw: (x: number, y: number, width: number, size: number, measure: TextMeasure) => { shapes: Shape[]; height: number } }
  /** Blocks set side by side, each column across its share (`weight`) of the width. */
  | { kind: 'columns'; columns: { weight: number; blocks: Block[] }[] }
  | { kind: 'signoff' };

export interface RecordLimits {
  /** Most lines of scenario notes shown (the rest is in scenario.json). */
  noteLines: number;
  /** Most warnings listed (the rest is in summary.json). */
  warnings: number;
  /** Most inputs drawn in "What drives the landing spread" (the rest is in summary.json). */
  sensitivityInputs: number;
}

const OCTANTS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;

/** A judgement against the user's criterion in two words for a table cell ('under', 'over'). */
function judged(j: string | null | undefined): string {
  return j ? (j.startsWith('under') ? ' (under)' : ' (over)') : '';
}

/** The standing-distance row of the octant table: where individual risk stays under the level. */
function standingRow(risk: RiskSummary, u: UnitFormatter): string[] {
  return [
    `risk under ${smallRate(risk.standingLevel)} beyond${risk.standingResolved ? '' : ' (not resolved)'}`,
    ...OCTANTS.map((o) => u.length(risk.standingDistance_m[o])),
  ];
}

/**
 * The risk-to-people part of the record: the individual-risk lines and each mode's impacts side by
 * side, then the harm model, the standing distances (when the keep-out octant table does not carry
 * them), the total and the criteria. Wording as `strewn run` prints it (src/report/risk-text.ts).
 */
function riskLinesTable(risk: RiskSummary, u: UnitFormatter): Block {
  return {
    kind: 'table',
    id: 'risk-lines',
    columns: [
      { title: 'Risk line', weight: 1.2 },
      { title: 'Area inside', weight: 1.05, align: 'right' },
      { title: 'Reaches', weight: 0.9, align: 'right' },
      { title: 'Resolved by samples?', weight: 2, align: 'right' },
    ],
    rows: risk.lines.map((l) => [
      smallRate(l.level),
      u.area(l.area_m2),
      u.length(l.maxDistance_m),
      l.resolved ? 'yes' : `no: about ${l.samplesNeeded === null ? 'many more' : grouped(l.samplesNeeded)} needed`,
    ]),
  };
}

/** The harm model in words: what makes an impact a casualty, and over what area. */
function harmText(risk: RiskSummary, u: UnitFormatter): string {
  const st = risk.settings;
  const harm = st.casualtyEnergy_J !== null
    ? `a casualty within the casualty area (by impact angle) at ${energy(st.casualtyEnergy_J, u)} or more`
    : `casualty chance within the casualty area (by impact angle) by impact energy, from the scenario's table (${st.casualtyProbability?.energy_J.length ?? 0} rows)`;
  return `${harm}; person ${u.shortLength(st.personRadius_m)} radius, ${u.shortLength(st.personHeight_m)} tall; object radius ${u.diameter(st.objectRadius_m)} (${st.objectRadiusFrom})`;
}

/** The total against the user's collective criterion, or that none was given. */
function criteriaText(risk: RiskSummary): string {
  const t = risk.total;
  const c = risk.settings.criteria;
  const out: string[] = [];
  if (c.collective !== undefined) out.push(`collective criterion ${smallRate(c.collective)}: total ${t.collectiveCriterion ?? 'n/a'} (bound ${t.collectiveCriterionUpper95 ?? 'n/a'})`);
  if (c.individual !== undefined) out.push(`individual criterion ${smallRate(c.individual)}: judged per area`);
  if (out.length === 0) out.push('no criteria given (risk.criteria)');
  return out.join('; ');
}

/**
 * The rest of the risk part: each mode's chance and impacts, and (when the areas table does not
 * already carry them) the harm model, the standing distances and the total with the criteria.
 */
function riskBlocks(risk: RiskSummary, summary: SheetInput['summary'], u: UnitFormatter, shown: { standing: boolean; lines: boolean; harm: boolean }): Block[] {
  const blocks: Block[] = [];
  const st = risk.settings;
  if (!shown.harm || !shown.lines) blocks.push({ kind: 'heading', text: 'Risk to people (per flight)' });
  if (!shown.lines) blocks.push(riskLinesTable(risk, u));
  const byName = new Map(summary.modes.map((m) => [m.name, m]));
  const modes: Block = {
    kind: 'table',
    id: 'risk-modes',
    columns: [
      { title: 'Impacts by mode', weight: 1.7 },
      { title: 'Chance per flight', weight: 1.1, align: 'right' },
      { title: 'Samples', weight: 0.8, align: 'right' },
      { title: 'Speed: median (95 %)', weight: 1.5, align: 'right' },
      { title: 'Energy: median (95 %)', weight: 1.5, align: 'right' },
      { title: st.casualtyEnergy_J !== null ? `Share at ${energy(st.casualtyEnergy_J, u)} or more` : 'Casualty chance', weight: 1.4, align: 'right' },
    ],
    rows: risk.modes.map((m) => [
      m.name,
      percent(byName.get(m.name)?.probability),
      byName.has(m.name) ? grouped(byName.get(m.name)!.samples) : '-',
      `${u.speed(m.impactSpeed_m_s.p50)} (${u.speed(m.impactSpeed_m_s.p95)})`,
      `${energy(m.impactEnergy_J.p50, u)} (${energy(m.impactEnergy_J.p95, u)})`,
      percent(m.harmfulShare),
    ]),
  };
  blocks.push(modes);
  const rows: { label: string; value: string }[] = [];
  if (!shown.harm) rows.push({ label: 'Harm model', value: harmText(risk, u) });
  if (!shown.standing) {
    const d = risk.standingDistance_m;
    rows.push({ label: 'Stand beyond', value: `risk under ${smallRate(risk.standingLevel)}: ${OCTANTS.map((o) => `${o} ${u.length(d[o])}`).join(', ')}${risk.standingResolved ? '' : ' (line not resolved)'}` });
  }
  const t = risk.total;
  if (!shown.harm) rows.push({ label: 'All areas', value: `expected casualties ${smallRate(t.expectedCasualties)} per flight (95 % bound ${smallRate(t.upper95)}); ${criteriaText(risk)}` });
  void st;
  if (rows.length > 0) blocks.push({ kind: 'rows', rows });
  return blocks;
}

/** Impact energy in J in both unit systems, as the page, the terminal and the scenario's `risk` block give it. */
function energy(j: number, _u: UnitFormatter): string {
  return `${significant(j, 2)} J`;
}

/** Lengths along the rocket from the nose tip: mm or in, as a rocket's parts are measured. */
function station(m: number, u: UnitFormatter): string {
  return u.diameter(m);
}

/**
 * The stability figures (summary.json `stability`) beside the side view drawn to scale, for a
 * rocket with a shape; they close the inputs, as figures of the rocket described there. Wording as `strewn check` prints it (src/report/stability.ts).
 */
function stabilityBlocks(input: SheetInput, u: UnitFormatter, units: UnitSystem): Block[] {
  const st = input.summary.stability;
  const v = input.scenario.vehicle;
  if (!st || v.kind !== 'rocket' || !v.shape || v.diameter === undefined) return [];
  const shape = v.shape;
  const diameter = v.diameter;
  const rows: Block = {
    kind: 'rows',
    rows: [
      { label: 'Centre of pressure', value: `${station(st.cp_m, u)} from the nose tip (Barrowman, subsonic)` },
      { label: 'Balance point', value: `${station(st.cg_m, u)} at lift-off, ${station(st.cgBurnout_m, u)} at burnout` },
      { label: 'Normal-force slope', value: `${significant(st.normalForceSlope_per_rad, 3)} per radian` },
      { label: 'Static margin', value: `${significant(st.margin_cal, 3)} calibres at lift-off, ${significant(st.marginBurnout_cal, 3)} at burnout` },
      { label: 'Rail exit', value: `${u.speed(st.railExitSpeed_m_s)}, angle of attack ${significant(st.railExitAngleOfAttack_deg, 3)}\u00b0 in the mean wind` },
    ],
  };
  const a = input.summary.nominalApogee;
  if (a) rows.rows.push(nominalApogeeRow(a, u));
  const figure: Block = {
    kind: 'figure',
    draw: (x, y, width, size, measure) =>
      sideView({ shape, diameter, cg: st.cg_m, cgBurnout: st.cgBurnout_m, cp: st.cp_m, marginCal: st.margin_cal }, x, y, width, { maxHeight: SIDE_VIEW_HEIGHT, size, units }, measure),
  };
  return [{ kind: 'columns', columns: [{ weight: 1.15, blocks: [rows] }, { weight: 1, blocks: [figure] }] }];
}

/** Where the nominal flight's apogee is (summary.json `nominalApogee`), as `strewn check` gives it. */
function nominalApogeeRow(a: NonNullable<SheetInput['summary']['nominalApogee']>, u: UnitFormatter): { label: string; value: string } {
  return { label: 'Nominal apogee', value: `${u.length(a.height_m)} above the pad, ${u.length(a.distance_m)} from it toward ${bearingText(a.bearing_deg)}` };
}

/** Tallest the side view may be, points: about as tall as the six figures beside it. */
const SIDE_VIEW_HEIGHT = 56;

function vehicleText(sc: Scenario, u: UnitFormatter): string {
  const v = sc.vehicle;
  const diameter = Math.sqrt((4 * v.referenceArea) / Math.PI);
  const cd = v.drag.cd;
  const drag = cd.length === 1 ? `Cd ${significant(cd[0], 3)}` : `Cd ${significant(Math.min(...cd), 3)} to ${significant(Math.max(...cd), 3)} over Mach ${significant(v.drag.mach[0], 2)} to ${significant(v.drag.mach[v.drag.mach.length - 1], 2)} (${cd.length} points)`;
  const massWord = v.kind === 'rocket' ? ' without propellant' : '';
  return `${v.kind}; ${u.mass(v.mass)}${massWord}; reference area ${u.smallArea(v.referenceArea)} (a circle ${u.diameter(diameter)} across); ${drag}`;
}

function motorText(sc: Scenario, u: UnitFormatter): string | null {
  const m = sc.vehicle.motor;
  if (!m) return null;
  const model = new MotorModel(m);
  return `total impulse ${u.impulse(model.nominalImpulse)}, burn time ${significant(model.burnTime, 3)} s, propellant ${u.mass(m.propellantMass)}; thrust curve ${m.source}`;
}

function launchText(sc: Scenario, u: UnitFormatter): string {
  const l = sc.launch;
  switch (l.kind) {
    case 'rocket':
      return `rail ${u.shortLength(l.rail)}, tilted ${significant(l.tilt, 3)}\u00b0 from vertical toward ${bearingText(l.azimuth)}`;
    case 'projectile':
      return `${u.speed(l.speed)} at ${significant(l.elevation, 3)}\u00b0 above the horizontal toward ${bearingText(l.azimuth)}, from ${u.shortLength(l.height)} above the pad`;
    case 'release': {
      const time = l.duration === undefined ? '' : `, operation ${significant(l.duration / 60, 3)} min`;
      const rate = l.rate === undefined ? '' : `, comes down ${significant(l.rate * 3600, 3)} times per flight hour`;
      if (l.path !== undefined) return `released ${u.length(l.height)} up anywhere along the route (uniform in time), moving ${u.speed(l.speed)} along it${time}${rate}`;
      if (l.area !== undefined) {
        const heading = !l.headingFree ? `toward ${bearingText(l.heading)}` : 'in any direction';
        return `released ${u.length(l.height)} up anywhere over the operating area, moving ${u.speed(l.speed)} ${heading}${time}${rate}`;
      }
      const offset = l.east === 0 && l.north === 0 ? 'above the pad' : `${u.length(Math.abs(l.east))} ${l.east >= 0 ? 'east' : 'west'} and ${u.length(Math.abs(l.north))} ${l.north >= 0 ? 'north' : 'south'} of the pad`;
      return `released ${u.length(l.height)} up, ${offset}, moving ${u.speed(l.speed)} toward ${bearingText(l.heading)}`;
    }
  }
}

function recoveryText(sc: Scenario, u: UnitFormatter): string {
  if (sc.recovery.length === 0) return 'none: falls with its own drag';
  return sc.recovery
    .map((s, i) => {
      const when = s.trigger === 'apogee' ? 'at apogee' : s.trigger === 'altitude' ? `at ${u.length(s.altitude)} on the way down` : `${significant(s.time, 3)} s after launch`;
      const delay = s.delay > 0 ? ` + ${significant(s.delay, 3)} s` : '';
      const seaLevel = descentRateForDragArea(sc.vehicle.mass, s.dragArea);
      const rate =
        s.descentRate !== undefined
          ? `descent ${u.descentRate(s.descentRate)} at sea level`
          : s.canopy
            ? `canopy ${u.diameter(s.canopy.diameter)} across, Cd ${significant(s.canopy.drag, 3)}${s.canopy.note ? ` (${s.canopy.note})` : ''}, descent ${u.descentRate(seaLevel)} at sea level`
            : `drag area ${u.smallArea(s.dragArea)}, descent ${u.descentRate(seaLevel)} at sea level`;
      return `${i + 1}. ${s.name}: ${when}${delay}, ${rate}`;
    })
    .join('\n');
}

function windText(sc: Scenario, u: UnitFormatter): string {
  const w = sc.weather.wind;
  let text = w.speed > 0 ? `${u.speed(w.speed)} from ${bearingText(w.from)} at ${u.length(w.height)}` : 'calm';
  if (w.gust !== undefined) text += `, gusts ${u.speed(w.gust)}`;
  if (w.profile && w.profile.length > 0) {
    text += `; profile: ${w.profile.map((r) => `${u.length(r.altitude)}: ${u.speed(r.speed)} from ${Math.round(r.from)}\u00b0`).join(', ')}`;
  } else {
    text += `; power-law shear exponent ${significant(w.shear, 2)}`;
  }
  text += `; turbulence ${sc.weather.turbulence ? 'on' : 'off'}`;
  return text;
}

function airText(sc: Scenario, u: UnitFormatter): string {
  const air = new AirModel(sc.site.pad.elevation, sc.weather.temperature, sc.weather.pressure);
  const given = sc.weather.temperature !== undefined || sc.weather.pressure !== undefined;
  return `${u.temperature(air.padTemperature)}, ${u.pressure(air.padPressure)} at the pad (${u.length(sc.site.pad.elevation)} above sea level)${given ? '' : ', standard atmosphere'}`;
}

function spreadsText(sc: Scenario, u: UnitFormatter): string {
  const parts = UNCERTAINTY_NAMES.filter((n) => sc.uncertainty[n]).map((n) => `${SPREAD_WORDS[n]}: ${spreadAsFlown(sc, n, sc.uncertainty[n]!, u, { compact: true })}`);
  if (parts.length === 0) return 'none: every sample flies the nominal flight';
  const normal = UNCERTAINTY_NAMES.some((n) => sc.uncertainty[n]?.kind === 'normal');
  return `${parts.join('; ')}${normal ? ' (after \u2192: values flown; ±2 sd for normal spreads)' : ''}`;
}

function failuresText(sc: Scenario): string {
  if (sc.failures.length === 0) return 'none';
  return sc.failures.map((f) => `${f.name}: ${percent(f.probability)} of flights, ${f.stage === 'all' ? 'no recovery stage deploys' : `stage "${f.stage}" does not deploy`}`).join('; ');
}

function siteText(sc: Scenario, u: UnitFormatter): string {
  const s = sc.site;
  const parts = [`pad ${s.pad.lat.toFixed(5)}\u00b0, ${s.pad.lon.toFixed(5)}\u00b0`];
  if (s.minimumDistance) parts.push(`minimum distance ${u.length(s.minimumDistance)}`);
  parts.push(s.boundary ? 'boundary given' : 'no boundary given');
  parts.push(`${s.areas.length} marked area${s.areas.length === 1 ? '' : 's'}`);
  return parts.join('; ');
}

/**
 * One ingredient of the keep-out zone as the analysis names it ('0.99 density region', 'grown by
 * 25 m'), with its quantity in the sheet's units.
 */
export function keepOutPart(part: string, u: UnitFormatter): string {
  const level = /^([\d.]+) density region$/.exec(part);
  if (level) return `${levelText(Number(level[1]))} density region`;
  const metres = /^(grown by|minimum distance) ([\d.]+) m$/.exec(part);
  if (metres) return `${metres[1]} ${u.length(Number(metres[2]))}`;
  return part;
}

function trimLines(text: string, max: number): string {
  const lines = text.split('\n');
  return lines.length <= max ? text : `${lines.slice(0, max).join('\n')} \u2026`;
}

/**
 * The sheet's standard fonts carry only the Windows-1252 set; embedding fonts for every script
 * (emoji, right-to-left text with its shaping) is left out, so the sheet says what it replaced.
 */
function replacedCharacterNote(input: SheetInput): string[] {
  const sc = input.scenario;
  const texts = [
    sc.name,
    sc.notes ?? '',
    ...sc.site.areas.map((a) => a.name),
    ...sc.recovery.map((r) => r.name),
    ...sc.failures.map((f) => f.name),
    ...input.summary.modes.map((m) => m.name),
  ];
  const count = texts.reduce((n, t) => n + unprintableCount(t), 0);
  if (count === 0) return [];
  return [
    `${count} character${count === 1 ? '' : 's'} of the names and notes (such as emoji or right-to-left scripts) cannot be shown in this sheet's font and ${count === 1 ? 'is' : 'are'} printed as '?'; scenario.json and summary.json keep the names exactly`,
  ];
}

export function recordBlocks(input: SheetInput, u: UnitFormatter, limits: RecordLimits): Block[] {
  const { summary: s, scenario: sc, review } = input;
  const blocks: Block[] = [];
  if (sc.notes) {
    const notes = sc.notes.length > limits.noteLines * 110 ? `${sc.notes.slice(0, limits.noteLines * 110)}\u2026 (full notes in scenario.json)` : sc.notes;
    blocks.push({ kind: 'text', text: trimLines(notes, limits.noteLines) });
  }

  blocks.push({ kind: 'heading', text: 'Inputs' });
  const inputs: { label: string; value: string }[] = [
    { label: 'Site', value: siteText(sc, u) },
    { label: 'Vehicle', value: vehicleText(sc, u) },
  ];
  const motor = motorText(sc, u);
  if (motor) inputs.push({ label: 'Motor', value: motor });
  inputs.push({ label: 'Launch', value: launchText(sc, u) });
  if (sc.vehicle.kind !== 'projectile' || sc.recovery.length > 0) inputs.push({ label: 'Recovery', value: recoveryText(sc, u) });
  inputs.push(
    { label: 'Wind', value: windText(sc, u) },
    { label: 'Air', value: airText(sc, u) },
    { label: 'Spreads', value: spreadsText(sc, u) },
    { label: 'Failure modes', value: failuresText(sc) },
  );
  blocks.push({ kind: 'rows', rows: inputs });
  const stability = stabilityBlocks(input, u, u.system);
  const stabilityShown = stability.length > 0;
  blocks.push(...stability);

  blocks.push({ kind: 'heading', text: 'Results' });
  const landed = s.modes.reduce((sum, m) => sum + (m.landed ?? 0), 0);
  const modesInTable = s.risk !== undefined && s.risk.modes.length === s.modes.length;
  const modes = modesInTable && s.modes.length > 1 ? `; ${s.modes.length} modes (table below), rare modes sampled more often and weighted back` : s.modes.length > 1 ? `; modes: ${s.modes.map((m) => `${m.name} ${percent(m.probability)} (${grouped(m.samples)} samples)`).join(', ')}, rare modes sampled more often and weighted back` : '';
  const failed = s.failures.length > 0 ? ` (${s.failures.map((f) => `${grouped(f.samples)} ${f.reason}`).join(', ')})` : '';
  const spread5 = (x: { p05: number; p50: number; p95: number; max: number }, f: (v: number) => string) => `5 %: ${f(x.p05)}  \u00b7  median ${f(x.p50)}  \u00b7  95 %: ${f(x.p95)}  \u00b7  highest ${f(x.max)}`;
  const results: { label: string; value: string }[] = [
    { label: 'Samples', value: `${grouped(s.samples)} flown, ${grouped(landed)} landed, ${grouped(s.failedSamples)} failed${failed}${modes}` },
    { label: 'Apogee', value: `${spread5(s.apogee_m, (v) => u.length(v))} (above the pad)` },
    { label: 'Flight time', value: spread5(s.flightTime_s, (v) => (Number.isFinite(v) && v !== null ? `${significant(v, 3)} s` : 'n/a')) },
  ];
  const a = s.nominalApogee;
  if (a && !stabilityShown) results.push(nominalApogeeRow(a, u));
  if (s.farthestLanding) {
    const f = s.farthestLanding;
    results.push({ label: 'Farthest landing', value: `${u.length(f.distance_m)} from the pad toward ${bearingText(f.bearing_deg)} (sample ${f.sample}, ${f.mode})` });
  }
  blocks.push({ kind: 'rows', rows: results });

  if (s.contours.length === 0) {
    blocks.push({ kind: 'text', font: 'bold', text: 'No probability regions and no keep-out zone: too few samples landed to draw them. Run more samples before relying on this sheet.' });
  } else {
    const levels: Block = {
      kind: 'table',
      id: 'levels',
      columns: [
        { title: 'Region holding', weight: 1.25 },
        { title: 'Area', weight: 1, align: 'right' },
        { title: 'Reaches', weight: 1.1, align: 'right' },
        { title: 'Samples in its band', weight: 1.75, align: 'right' },
      ],
      rows: s.contours.map((c) => [
        `${levelText(c.level)} of landings`,
        u.area(c.area_m2),
        u.length(c.maxDistance_m),
        `${grouped(c.samplesInBand)}${c.samplesInBand < MIN_BAND_SAMPLES ? ' (few: line is uncertain)' : ''}`,
      ]),
    };
    // The landing regions and the individual-risk lines side by side: both are lines around the pad.
    blocks.push(s.risk ? { kind: 'columns', columns: [{ weight: 1, blocks: [levels] }, { weight: 1, blocks: [riskLinesTable(s.risk, u)] }] } : levels);
  }

  const k = input.keepOut?.features[0]?.properties;
  if (k) {
    const outside = review.keepOutOutsideBoundary;
    const boundaryShare = !sc.site.boundary ? 'no site boundary given' : outside ? `${percent(outside.share)} of the zone (${u.area(outside.area_m2)})` : 'not computed';
    blocks.push({
      kind: 'rows',
      rows: [
        {
          label: 'Keep-out zone',
          value:
            `${u.area(k.area_m2)}, reaching ${u.length(k.maxDistance_m)} from the pad; landings outside it: ${percent(s.keepOut.outsideShare)} of flights (95 % bound ${percent(s.keepOut.outsideUpper95)}); ` +
            `zone outside the site: ${boundaryShare}; made of the ${WORDS.keepOutMadeOf(k.parts, levelText(k.level), k.margin_m > 0 ? u.length(k.margin_m) : null)} (parts in keepout.geojson)`,
        },
      ],
    });
    const rows = [['keep-out zone reaches', ...OCTANTS.map((o) => (k.octants_m[o] === null || k.octants_m[o] === undefined ? '-' : u.length(k.octants_m[o])))]];
    if (s.risk) rows.push(standingRow(s.risk, u));
    blocks.push({
      kind: 'table',
      id: 'octants',
      columns: [{ title: 'By octant, from the pad', weight: 3.4 }, ...OCTANTS.map((o) => ({ title: o, weight: 1, align: 'right' as const }))],
      rows,
    });
  }

  let harmShown = false;
  if (sc.site.areas.length > 0 && s.areas.length === 0) {
    blocks.push({ kind: 'text', text: `Marked areas (${sc.site.areas.map((a) => a.name).join(', ')}) were not assessed: there is no analysis to assess them with.` });
  }
  if (s.areas.length > 0) {
    const byName = new Map(review.areas.map((a) => [a.name, a]));
    const risk = s.risk;
    const anyPeople = review.areas.some((a) => a.expectedCasualties !== null && a.expectedCasualties !== undefined);
    const riskOf = new Map((risk?.areas ?? []).map((a) => [a.name, a]));
    const columns: Column[] = [
      { title: '#', weight: 0.35 },
      { title: 'Area', weight: 2.2 },
      { title: 'Kind', weight: 1.1 },
      { title: 'Hits', weight: 0.7, align: 'right' },
      { title: 'Chance per flight', weight: 1.2, align: 'right' },
      { title: '95 % upper bound', weight: 1.2, align: 'right' },
      { title: 'Touches zone', weight: 0.9, align: 'right' },
    ];
    if (anyPeople) columns.push({ title: 'People', weight: 0.8, align: 'right' }, { title: 'Expected casualties per flight (95 % bound)*', weight: 2.2, align: 'right' });
    const showRisk = risk !== undefined && risk.areas.length > 0;
    if (showRisk) columns.push({ title: 'Largest individual risk', weight: 1.3, align: 'right' });
    const rows = s.areas.map((a, i) => {
      const r = byName.get(a.name);
      const row = [String(i + 1), a.name, a.kind, grouped(a.hits), percent(a.probability), percent(a.upper95), r ? (r.intersectsKeepOut ? 'yes' : 'no') : 'n/a'];
      if (anyPeople) {
        const people = r?.people !== null && r?.people !== undefined ? grouped(r.people) : r?.peoplePerM2 !== null && r?.peoplePerM2 !== undefined ? `${significant(r.peoplePerM2, 2)}/m²` : '-';
        const e = r?.expectedCasualties;
        row.push(people, e !== null && e !== undefined ? `${smallRate(e)} (${smallRate(r?.casualtiesUpper95 ?? null)})` : '-');
      }
      if (showRisk && risk) {
        const ra = riskOf.get(a.name);
        row.push(ra ? `${smallRate(ra.maxIndividualRisk)}${judged(ra.individualCriterion)}` : '-');
      }
      return row;
    });
    // The risk model's total per flight closes the table, as a sum row.
    if (anyPeople && risk) {
      const total = new Array<string>(columns.length).fill('');
      total[1] = 'All areas';
      total[8] = `${smallRate(risk.total.expectedCasualties)} (${smallRate(risk.total.upper95)})`;
      rows.push(total);
    }
    blocks.push({ kind: 'table', id: 'areas', columns, rows });
    if (anyPeople) {
      const model = risk ? `${harmText(risk, u)}; ${criteriaText(risk)}` : 'an impact harms those within its casualty area (from the impact angle) when its energy reaches the casualty energy';
      blocks.push({
        kind: 'text',
        font: 'italic',
        text: `* Not a compliance figure: people spread evenly; all modes; one-sided 95 % bound. Harm: ${model}.`,
      });
    }
    harmShown = anyPeople && risk !== undefined;
  }
  if (s.risk) blocks.push(...riskBlocks(s.risk, s, u, { standing: k !== undefined, lines: s.contours.length > 0, harm: harmShown }));

  const sensitivity = s.sensitivity;
  if (sensitivity && sensitivity.inputs.length > 0) {
    const shown = Math.min(sensitivity.inputs.length, limits.sensitivityInputs);
    blocks.push({ kind: 'heading', text: 'What drives the landing spread', aside: { width: (size, measure) => sensitivityKeyWidth(size, measure), draw: (x, baseline, size, measure) => sensitivityKey(x, baseline, size, measure) } });
    blocks.push({ kind: 'figure', draw: (x, y, width, size, measure) => sensitivityBars(sensitivity.inputs, x, y, width, { columns: 2, size, maxRows: shown }, measure) });
    blocks.push({ kind: 'text', font: 'italic', text: sensitivityNote(sensitivity.method, sensitivity.inputs.length - shown) });
  }

  // The warnings beside the signatures, and under them what reproduces the run (full width: the
  // hash must not break): the signed record names what was assessed and what was known against it.
  const warnings = [...replacedCharacterNote(input), ...s.warnings, ...s.scenarioWarnings];
  const signOff: Block[] = [{ kind: 'heading', text: 'Review and sign-off' }, { kind: 'signoff' }];
  if (warnings.length > 0) {
    const shown = warnings.slice(0, limits.warnings);
    if (warnings.length > shown.length) shown.push(`${warnings.length - shown.length} more in summary.json`);
    blocks.push({ kind: 'columns', columns: [{ weight: 1.1, blocks: [{ kind: 'heading', text: 'Warnings' }, { kind: 'bullets', items: shown }] }, { weight: 1, blocks: signOff }] });
  } else {
    blocks.push(...signOff);
  }
  blocks.push({
    kind: 'rows',
    rows: [
      { label: 'Scenario hash', value: s.scenarioHash, font: 'mono' },
      { label: 'Reproduce with', value: `${grouped(s.samples)} samples, seed ${s.seed}; strewn ${s.version}, computed ${dateText(review.computedAt)}` },
    ],
  });
  return blocks;
}
