import type { RunSummary } from './run-summary.js';
import { CAUTION } from './caution.js';
import { riskLinesText } from './risk-text.js';
import { areaText } from './sheet/units.js';

/** A probability as a percentage with two significant digits ("0 %", "0.01 %", "2.9 %"). */
function percent(p: number): string {
  if (!Number.isFinite(p)) return 'n/a';
  if (p === 0) return '0 %';
  return `${Number((p * 100).toPrecision(2))} %`;
}

function metres(x: number): string {
  return Number.isFinite(x) ? `${Math.round(x).toLocaleString('en')} m` : 'n/a';
}

/** The short summary `strewn run` prints: samples, failures, apogee, farthest landing, zone, caution. */
export function formatRunSummary(s: RunSummary, folder: string): string {
  const lines: string[] = [];
  lines.push(`${s.name}`);
  // Warnings first, where people read: a summary that scrolls past them hides them.
  for (const w of s.warnings) lines.push(`  warning        ${w}`);
  lines.push(`  samples        ${s.samples.toLocaleString('en')} (seed ${s.seed})${s.failedSamples > 0 ? `, ${s.failedSamples.toLocaleString('en')} failed` : ', none failed'}`);
  for (const f of s.failures) lines.push(`                 ${f.samples.toLocaleString('en')} ${f.reason}`);
  for (const m of s.modes) if (m.name !== 'nominal' || s.modes.length > 1) lines.push(`  mode           ${m.name}: probability ${(m.probability * 100).toFixed(1)} %, ${m.samples.toLocaleString('en')} samples`);
  lines.push(`  apogee         median ${metres(s.apogee_m.p50)}, 5–95 % ${metres(s.apogee_m.p05)} – ${metres(s.apogee_m.p95)}, highest ${metres(s.apogee_m.max)}`);
  if (s.farthestLanding) {
    const f = s.farthestLanding;
    lines.push(`  farthest       ${metres(f.distance_m)} from the pad, bearing ${f.bearing_deg.toFixed(0)}° (sample ${f.sample}, ${f.mode})`);
  }
  for (const c of s.contours) lines.push(`  ${`${(c.level * 100).toFixed(c.level * 100 % 1 === 0 ? 0 : 1)} % region`.padEnd(15)}${areaText(c.area_m2, 'metric')}, reaches ${metres(c.maxDistance_m)} from the pad`);
  if (Number.isFinite(s.keepOut.area_m2)) {
    lines.push(`  keep-out zone  ${areaText(s.keepOut.area_m2, 'metric')}, reaches ${metres(s.keepOut.maxDistance_m)} (level ${s.keepOut.level}, margin ${metres(s.keepOut.margin_m)})`);
  }
  for (const a of s.areas) {
    const hits = `${a.hits.toLocaleString('en')} ${a.hits === 1 ? 'hit' : 'hits'}`;
    lines.push(`  area           ${a.name} (${a.kind}): ${hits}, chance per flight ${percent(a.probability)}, 95 % upper bound ${percent(a.upper95)}`);
  }
  if (s.risk) lines.push(...riskLinesText(s.risk));
  lines.push(`  results        ${folder}`);
  lines.push('');
  lines.push(`CAUTION: ${CAUTION}`);
  lines.push('');
  return lines.join('\n');
}
