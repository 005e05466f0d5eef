import { beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { readResultsFolder } from '../../src/report/sheet/read-results.js';
import { buildSheet } from '../../src/report/sheet/index.js';
import type { PathShape, Shape } from '../../src/report/sheet/display-list.js';
import { unitFormatter, smallRate, grouped, significant } from '../../src/report/format-number.js';
import { bearingText } from '../../src/report/sheet/compass.js';
import { pdfPages, poppler, runDemo } from './sheet-helpers.js';
import { editedScenario, strewn, tempDir } from '../cli/helpers.js';

/**
 * The record page as a reader gets it (text by poppler, an independent PDF reader) carries the
 * rocket's stability figures and the risk-to-people table with the values summary.json holds, and
 * draws the rocket's side view to scale from its shape.
 */

const squash = (s: string) => s.replace(/\s+/g, ' ');

function find(shapes: Shape[], id: string): Shape | undefined {
  for (const s of shapes) {
    if (s.id === id) return s;
    if (s.kind === 'group' || s.kind === 'clip') {
      const inner = find(s.shapes, id);
      if (inner) return inner;
    }
  }
  return undefined;
}

function xs(shape: Shape): number[] {
  if (shape.kind === 'path') return shape.d.flatMap((c) => (c.length === 3 ? [c[1]] : []));
  if (shape.kind === 'group' || shape.kind === 'clip') return shape.shapes.flatMap(xs);
  return [];
}

function kinds(shape: Shape): string[] {
  return shape.kind === 'group' || shape.kind === 'clip' ? shape.shapes.flatMap(kinds) : [shape.kind];
}

describe('record page of the club rocket (metric, A4)', () => {
  let out: string;
  let summary: any;
  let scenario: any;
  let record: string;
  beforeAll(() => {
    out = runDemo('club-rocket.json', 400);
    summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    scenario = JSON.parse(readFileSync(join(out, 'scenario.json'), 'utf8'));
    // -layout keeps each printed line whole, also where two tables stand side by side.
    record = squash(poppler('pdftotext', ['-layout', '-f', '2', '-l', '2', join(out, 'sheet.pdf'), '-']));
  });

  it('shows the stability figures of summary.json (Barrowman, as strewn check prints them)', () => {
    const s = summary.stability;
    expect(s).toBeDefined();
    const u = unitFormatter('metric');
    // Stations along the rocket in mm: CP 0.8514 m -> '851 mm'.
    expect(record).toContain(`Centre of pressure ${u.diameter(s.cp_m)} from the nose tip`);
    expect(record).toContain(`${u.diameter(s.cg_m)} at lift-off, ${u.diameter(s.cgBurnout_m)} at burnout`);
    expect(record).toContain(`${significant(s.normalForceSlope_per_rad, 3)} per radian`);
    expect(record).toContain(`${significant(s.margin_cal, 3)} calibres at lift-off, ${significant(s.marginBurnout_cal, 3)} at burnout`);
    expect(record).toContain(`Rail exit ${u.speed(s.railExitSpeed_m_s)}, angle of attack ${significant(s.railExitAngleOfAttack_deg, 3)}`);
    const a = summary.nominalApogee;
    expect(record).toContain(`Nominal apogee ${u.length(a.height_m)} above the pad, ${u.length(a.distance_m)} from it toward ${bearingText(a.bearing_deg)}`);
    // The demo's invented shape gives about 1.5 calibres (scenario notes; common practice, no source).
    expect(s.margin_cal).toBeGreaterThan(1);
    expect(s.margin_cal).toBeLessThan(2);
  });

  it('shows the risk lines, standing distances, area risks, impacts by mode and the total of summary.json', () => {
    // poppler drops the space inside short right-aligned cells ('0 m' comes out '0m'): compare without spaces.
    const tight = (t: string) => t.replace(/\s+/g, '');
    const text = tight(record);
    const has = (t: string) => expect(text).toContain(tight(t));
    const r = summary.risk;
    const u = unitFormatter('metric');
    for (const l of r.lines) {
      const known = l.resolved ? 'yes' : `no: about ${l.samplesNeeded === null ? 'many more' : grouped(l.samplesNeeded)} needed`;
      has(`${smallRate(l.level)} ${u.area(l.area_m2)} ${u.length(l.maxDistance_m)} ${known}`);
    }
    const d = r.standingDistance_m;
    has(`risk under ${smallRate(r.standingLevel)} beyond${r.standingResolved ? '' : ' (not resolved)'} ${['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'].map((o) => u.length(d[o])).join(' ')}`);
    for (const a of r.areas) {
      if (a.expectedCasualties !== null) has(`${smallRate(a.expectedCasualties)} (${smallRate(a.upper95)}) ${smallRate(a.maxIndividualRisk)}`);
      else has(`- ${smallRate(a.maxIndividualRisk)}`);
    }
    has(`All areas ${smallRate(r.total.expectedCasualties)} (${smallRate(r.total.upper95)})`);
    for (const m of r.modes) has(`${m.name}`);
    has(`${significant(r.modes[0].impactEnergy_J.p50, 2)} J (${significant(r.modes[0].impactEnergy_J.p95, 2)} J)`);
    // No criteria in the demo: the record says so instead of judging.
    has('no criteria given (risk.criteria)');
  });

  it('draws the side view to scale: outline, CG and CP marks at their stations, a true scale bar; own marks, no circles', () => {
    const sheet = buildSheet(readResultsFolder(out));
    const page = sheet.pages[1]!;
    const view = find(page.shapes, 'side-view');
    expect(view).toBeDefined();
    const body = find(page.shapes, 'side-view-body') as PathShape;
    const scale = Number(body.data!.points_per_m);
    expect(Number(body.data!.length_m)).toBeCloseTo(scenario.vehicle.shape.length, 9);
    const bx = xs(body);
    const nose = Math.min(...bx);
    // Geometry: the outline spans the rocket's length at the drawing's scale.
    expect(Math.max(...bx) - nose).toBeCloseTo(scenario.vehicle.shape.length * scale, 6);
    // Readable: the 1.2 m rocket is drawn at least 100 points (35 mm) long (common practice, no source).
    expect(scenario.vehicle.shape.length * scale).toBeGreaterThan(100);
    const at = (id: string) => {
      const g = find(page.shapes, id)!;
      const stemX = xs(g);
      return (stemX[0]! - nose) / scale;
    };
    expect(at('side-view-cg')).toBeCloseTo(summary.stability.cg_m, 3);
    expect(at('side-view-cp')).toBeCloseTo(summary.stability.cp_m, 3);
    expect(at('side-view-cg-burnout')).toBeCloseTo(summary.stability.cgBurnout_m, 3);
    // A stable rocket: the CP mark lies aft of the CG mark by the margin in calibres x diameter.
    expect(at('side-view-cp') - at('side-view-cg')).toBeCloseTo(summary.stability.margin_cal * scenario.vehicle.diameter, 2);
    // The scale bar is as long as the length it is labelled with.
    const bar = find(page.shapes, 'side-view-scale')!;
    const barX = xs(bar);
    expect(Math.max(...barX) - Math.min(...barX)).toBeCloseTo(Number(bar.data!.metres) * scale, 6);
    // Our own marks (stems, crossbar, open square): no circles in the view.
    expect(kinds(view!)).not.toContain('circle');
    expect(record).toContain('CG at burnout');
    expect(record).toMatch(/\bCP\b/);
  });
});

describe('record pages of every demo', () => {
  for (const demo of ['club-rocket.json', 'display-shell.json', 'drone-power-loss.json', 'drone-route.json']) {
    it(`${demo}: two pages (map and record) on A4 in metric and on Letter in imperial`, () => {
      const out = runDemo(demo, 300);
      const input = readResultsFolder(out);
      for (const [paper, units] of [['a4', 'metric'], ['letter', 'imperial']] as const) {
        const sheet = buildSheet(input, { paper, units });
        expect(sheet.pages.length, `${demo} ${paper}`).toBe(2);
      }
      // A rocket without a shape or another vehicle has no side view; a shaped rocket has one.
      const sheet = buildSheet(input);
      expect(find(sheet.pages[1]!.shapes, 'side-view') !== undefined).toBe(input.summary.stability !== undefined);
    });
  }
});

describe('record page with risk criteria given', () => {
  it('judges each area and the total against them as summary.json does ("under / over your criterion", never a verdict)', () => {
    const path = editedScenario('club-rocket.json', (json) => {
      // Invented criteria of the size published range-safety practice uses (from memory): 1e-6 and 1e-4 per flight.
      json.risk = { ...(json.risk ?? {}), criteria: { individual: 1e-6, collective: 1e-4 } };
    });
    const out = join(tempDir(), 'out');
    const r = strewn(['run', path, '--out', out, '--samples', '300', '--quiet', '--workers', '1']);
    expect(r.status, r.stderr).toBe(0);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    const risk = summary.risk;
    const text = squash(poppler('pdftotext', ['-layout', '-f', '2', '-l', '2', join(out, 'sheet.pdf'), '-'])).replace(/\s+/g, '');
    const has = (t: string) => expect(text).toContain(t.replace(/\s+/g, ''));
    for (const a of risk.areas) {
      expect(a.individualCriterion).not.toBeNull();
      has(`${smallRate(a.maxIndividualRisk)} (${a.individualCriterion.startsWith('under') ? 'under' : 'over'})`);
    }
    has(`collective criterion 1.0e-4: total ${risk.total.collectiveCriterion} (bound ${risk.total.collectiveCriterionUpper95})`);
    has('individual criterion 1.0e-6: judged per area');
    expect(text).not.toContain('nocriteriagiven');
    expect(pdfPages(join(out, 'sheet.pdf'))).toBe(2);
  });
});
