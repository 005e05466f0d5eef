import type { RiskSummary } from '../risk/index.js';
import { smallRate as rate } from './sheet/units.js';


/**
 * The risk lines `strewn run` and `strewn analyze` print: each individual-risk line, the standing
 * distances, each area's expected casualties, the total, each against the user's criterion
 * ("under / over your criterion", never a verdict).
 */
export function riskLinesText(r: RiskSummary): string[] {
  const lines: string[] = [];
  for (const l of r.lines) {
    const known = l.resolved ? '' : `; not resolved, about ${l.samplesNeeded === null ? 'many more' : l.samplesNeeded.toLocaleString('en')} samples needed`;
    lines.push(`  risk line      ${rate(l.level)} per flight: ${Math.round(l.area_m2).toLocaleString('en')} m², reaches ${Math.round(l.maxDistance_m)} m${known}`);
  }
  const d = r.standingDistance_m;
  lines.push(
    `  stand beyond   risk under ${rate(r.standingLevel)}: N ${Math.round(d.N)}, NE ${Math.round(d.NE)}, E ${Math.round(d.E)}, SE ${Math.round(d.SE)}, ` +
      `S ${Math.round(d.S)}, SW ${Math.round(d.SW)}, W ${Math.round(d.W)}, NW ${Math.round(d.NW)} m${r.standingResolved ? '' : ' (line not resolved)'}`,
  );
  for (const a of r.areas) {
    const ir = `largest individual risk ${rate(a.maxIndividualRisk)}${a.individualCriterion ? ` (${a.individualCriterion})` : ''}`;
    const e = a.expectedCasualties === null ? 'no people given' : `expected casualties ${rate(a.expectedCasualties)} (95 % bound ${rate(a.upper95)})`;
    lines.push(`  area risk      ${a.name}: ${e}, ${ir}`);
  }
  // Per part: a piece's own speed and energy (½ m v² with its own mass) and its share of the casualties.
  for (const p of r.parts ?? []) {
    if (!Number.isFinite(p.impactEnergy_J.p50)) continue;
    lines.push(
      `  part impacts   ${p.name}: speed median ${p.impactSpeed_m_s.p50.toFixed(1)} m/s (95 % ${p.impactSpeed_m_s.p95.toFixed(1)}), ` +
        `energy median ${p.impactEnergy_J.p50.toPrecision(3)} J (95 % ${p.impactEnergy_J.p95.toPrecision(3)}), ${Math.round(p.harmfulShare * 100)} % at or over the casualty energy, ` +
        `expected casualties ${rate(p.expectedCasualties)} per flight`,
    );
  }
  const c = r.total.collectiveCriterion ? `; ${r.total.collectiveCriterion}, bound ${r.total.collectiveCriterionUpper95}` : '';
  for (const w of r.warnings) lines.push(`  warning        ${w}`);
  lines.push(`  casualties     ${rate(r.total.expectedCasualties)} per flight in all areas (95 % bound ${rate(r.total.upper95)})${c}`);
  return lines;
}
