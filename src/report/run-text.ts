import type { SummaryParts } from '../analysis/summary.js';
import type { RunSummary } from './run-summary.js';
import { CAUTION } from './caution.js';
import { grouped, levelText, percent, unitFormatter, type UnitFormatter, type UnitSystem } from './format-number.js';
import { riskLinesText } from './risk-text.js';

/** An expected count per flight: three significant figures, plain below 1,000. */
function perFlight(x: number): string {
  if (x === 0) return '0';
  return x >= 0.01 ? Number(x.toPrecision(3)).toLocaleString('en') : x.toExponential(1);
}

/** Contour, keep-out zone and area lines, the same for `run` and `analyze`. */
export function findingLines(parts: SummaryParts, u: UnitFormatter, withWarnings = true): string[] {
  const lines: string[] = [];
  for (const c of parts.contours) lines.push(`  ${`${levelText(c.level)} region`.padEnd(15)}${u.area(c.area_m2)}, reaches ${u.length(c.maxDistance_m)} from the pad`);
  if (Number.isFinite(parts.keepOut.area_m2)) {
    lines.push(`  keep-out zone  ${u.area(parts.keepOut.area_m2)}, reaches ${u.length(parts.keepOut.maxDistance_m)} (level ${levelText(parts.keepOut.level)}, margin ${u.distance(parts.keepOut.margin_m)})`);
  }
  for (const p of parts.parts ?? []) {
    const modes = p.byMode.filter((m) => m.expectedLandings > 0).map((m) => `${m.mode} ${perFlight(m.expectedLandings)}`).join(', ');
    lines.push(`  part           ${p.name}: ${perFlight(p.expectedLandings)} landings per flight${modes === '' ? '' : ` (${modes})`}, ${grouped(p.landings)} written`);
  }
  for (const a of parts.areas) {
    const hits = `${grouped(a.hits)} ${a.hits === 1 ? 'hit' : 'hits'}`;
    // With pieces, the chance is of at least one piece inside; the pieces expected are beside it.
    const pieces = a.expectedLandings !== undefined ? `, ${perFlight(a.expectedLandings)} landings expected per flight` : '';
    lines.push(`  area           ${a.name} (${a.kind}): ${hits}, chance per flight ${percent(a.probability)}${a.expectedLandings !== undefined ? ' of any part' : ''}, 95 % upper bound ${percent(a.upper95)}${pieces}`);
  }
  if (withWarnings) for (const w of parts.warnings) lines.push(`  warning        ${w}`);
  return lines;
}

/** The short summary `strewn run` prints: samples, failures, apogee, farthest landing, zone, caution. */
export function formatRunSummary(s: RunSummary, folder: string, units: UnitSystem = 'metric'): string {
  const u = unitFormatter(units);
  const lines: string[] = [];
  lines.push(`${s.name}`);
  // Warnings first, where people read: a summary that scrolls past them hides them.
  for (const w of s.warnings) lines.push(`  warning        ${w}`);
  lines.push(`  samples        ${grouped(s.samples)} (seed ${s.seed})${s.failedSamples > 0 ? `, ${grouped(s.failedSamples)} failed` : ', none failed'}`);
  for (const f of s.failures) lines.push(`                 ${grouped(f.samples)} ${f.reason}`);
  for (const m of s.modes) if (m.name !== 'nominal' || s.modes.length > 1) lines.push(`  mode           ${m.name}: probability ${percent(m.probability)}, ${grouped(m.samples)} samples`);
  const op = s.operation;
  if (op !== undefined) {
    const length = op.duration_s === null ? '' : `${(op.duration_s / 60).toPrecision(3).replace(/\.?0+$/, '')} min`;
    const chance = op.chanceOfRelease === null ? '' : `; comes down ${op.rate_per_h} times per flight hour: chance ${percent(op.chanceOfRelease)} per operation (1 − e^(−λT)); the figures below are per release`;
    lines.push(`  operation      ${length}${chance}`);
  }
  lines.push(`  apogee         median ${u.length(s.apogee_m.p50)}, 5–95 % ${u.length(s.apogee_m.p05)} – ${u.length(s.apogee_m.p95)}, highest ${u.length(s.apogee_m.max)}`);
  if (s.farthestLanding) {
    const f = s.farthestLanding;
    lines.push(`  farthest       ${u.length(f.distance_m)} from the pad, bearing ${f.bearing_deg.toFixed(0)}° (sample ${f.sample}, ${f.mode})`);
  }
  lines.push(...findingLines(s, u, false));
  if (s.risk) lines.push(...riskLinesText(s.risk));
  lines.push(`  results        ${folder}`);
  lines.push('');
  lines.push(`CAUTION: ${CAUTION}`);
  lines.push('');
  return lines.join('\n');
}
