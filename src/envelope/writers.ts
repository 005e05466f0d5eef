import type { EnvelopeResult } from './envelope.js';
import { csvField } from '../analysis/areasCsv.js';

/** envelope.csv: one row per direction. An empty limit means the lowest speed of the grid fails. */
export function writeEnvelopeCsv(e: EnvelopeResult): string {
  // The rail columns come only with an aim, so files without one keep their columns.
  const rail = e.aim !== undefined;
  const lines = [`direction_deg,limit_speed_m_s,limit_is_grid_top,first_failing_test${rail ? ',rail_azimuth_deg,rail_tilt_deg' : ''}`];
  for (const d of e.limits) {
    const row = [d.from, d.limit ?? '', d.aboveGrid ? 'yes' : 'no', csvField(d.firstFailure.join('; '))];
    if (rail) row.push(d.rail?.azimuth ?? '', d.rail?.tilt ?? '');
    lines.push(row.join(','));
  }
  return lines.join('\n') + '\n';
}

/** envelope.json: the grid, the limits and every grid point flown. */
export function writeEnvelopeJson(e: EnvelopeResult, extra: Record<string, unknown>): string {
  const round = (x: number) => (Number.isFinite(x) ? Math.round(x * 10) / 10 : null);
  return (
    JSON.stringify(
      {
        ...extra,
        ...e,
        limits: e.limits.map((d) => ({
          ...d,
          cases: d.cases.map((c) => ({ ...c, keepOutArea_m2: round(c.keepOutArea_m2), keepOutMaxDistance_m: round(c.keepOutMaxDistance_m) })),
        })),
      },
      null,
      2,
    ) + '\n'
  );
}

/** window.csv: the launch window, one row per forecast hour. */
export function writeWindowCsv(window: NonNullable<EnvelopeResult['window']>): string {
  const lines = ['time_utc,speed_m_s,from_deg,limit_speed_m_s,inside'];
  for (const h of window) lines.push([h.time, h.speed, h.from, h.limit ?? '', h.inside ? 'yes' : 'no'].join(','));
  return lines.join('\n') + '\n';
}
