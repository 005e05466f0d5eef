import type { AnalysisResult } from '../analysis/index.js';
import type { AreaKind, Scenario } from '../scenario/types.js';

/** Kinds of area the keep-out zone must stay clear of. */
export const PROTECTED_KINDS: readonly AreaKind[] = ['spectators', 'parking', 'road', 'building'];

export interface ZoneVerdict {
  pass: boolean;
  /** Tests that failed, in a fixed order: "site boundary" first, then areas in file order. */
  failing: string[];
}

/**
 * The envelope's tests of a keep-out zone: it lies inside `site.boundary` (when there is one) and
 * touches no area of a protected kind.
 */
export function judgeZone(analysis: AnalysisResult, scenario: Scenario): ZoneVerdict {
  const failing: string[] = [];
  const outside = analysis.keepOutOutsideBoundary;
  // A sliver of a square metre is drawing noise at the boundary, not a breach.
  if (scenario.site.boundary && outside && outside.area_m2 > 1) failing.push('site boundary');
  scenario.site.areas.forEach((area, i) => {
    if (PROTECTED_KINDS.includes(area.kind) && analysis.areas[i]?.intersectsKeepOut) failing.push(`${area.kind}: ${area.name}`);
  });
  return { pass: failing.length === 0, failing };
}
