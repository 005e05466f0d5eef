import type { NominalFigures } from '../../../src/report/stability.js';
import { grouped, type UnitFormatter } from '../../../src/report/format-number.js';
import { el } from './dom.js';

/**
 * The figures people judge a rocket's flight by, as `strewn check` prints them (src/report/
 * stability.ts `nominalFigures`): CP, CG at lift-off and burnout, normal-force slope, static margin
 * at lift-off and burnout, rail-exit speed and angle of attack, and the nominal apogee point.
 * Each value element carries its SI number in data-si, so a test can compare with the terminal.
 */
export function rocketFigures(figures: NominalFigures, u: UnitFormatter): HTMLElement {
  const list = el('dl', { class: 'rocket-figures', data: { test: 'rocket-figures' } });
  /** One figure: its SI value (and those of its detail) in data attributes for the tests. */
  const row = (id: string, term: string, value: string, si: number, detail?: string, detailSi: Record<string, string> = {}) => {
    list.appendChild(
      el(
        'div',
        { class: 'rocket-figure', data: { figure: id } },
        el('dt', { text: term }),
        el('dd', {}, el('span', { class: 'rocket-figure-value', text: value, data: { si: String(si) } }), detail ? el('span', { class: 'rocket-figure-detail', text: ` ${detail}`, data: detailSi }) : null),
      ),
    );
  };
  const s = figures.stability;
  if (s !== undefined) {
    row('cp', 'Centre of pressure (CP)', u.diameter(s.cp_m), s.cp_m, 'from the nose tip');
    row('cg', 'Balance point (CG)', u.diameter(s.cg_m), s.cg_m, `at lift-off, ${u.diameter(s.cgBurnout_m)} at burnout`, { si: String(s.cgBurnout_m) });
    row('cna', 'Normal-force slope', `${s.normalForceSlope_per_rad.toFixed(2)} per rad`, s.normalForceSlope_per_rad);
    row('margin', 'Static margin', `${s.margin_cal.toFixed(2)} cal`, s.margin_cal, `at lift-off, ${s.marginBurnout_cal.toFixed(2)} cal at burnout`, { si: String(s.marginBurnout_cal) });
    if (Number.isFinite(s.railExitSpeed_m_s)) {
      row('rail-exit', 'Rail exit', u.speed(s.railExitSpeed_m_s), s.railExitSpeed_m_s, `at ${grouped(s.railExitAngleOfAttack_deg, 1)}\u00b0 angle of attack in the mean wind`, { si: String(s.railExitAngleOfAttack_deg) });
    }
  }
  const a = figures.apogee;
  if (a !== null) {
    row('apogee', 'Nominal apogee', `${u.length(a.height_m)} above the pad`, a.height_m, `${u.distance(a.distance_m)} from it toward ${Math.round(a.bearing_deg) % 360}\u00b0`, {
      distance: String(a.distance_m),
      bearing: String(a.bearing_deg),
    });
  }
  return list;
}
