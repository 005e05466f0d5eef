import { stabilityFigures } from '../physics/aero.js';
import { formatNumber } from '../scenario/units.js';
import { WARNING_LIMITS } from '../scenario/warnings.js';
import type { Issue, Scenario } from '../scenario/types.js';

/**
 * Static-margin warnings of a rocket with a shape, at lift-off and at burnout: under 1 calibre it
 * is marginally stable, over 6 it turns hard into the wind (common practice, no source). They need
 * the Barrowman figures of physics/aero.ts, so they live above the physics layer rather than with
 * the scenario's own warnings; `strewn check`/`run`/`envelope`, the page and the event add them.
 *
 * @example
 *   const warnings = [...loaded.warnings, ...stabilityWarnings(loaded.scenario)];
 */
export function stabilityWarnings(scenario: Scenario): Issue[] {
  const v = scenario.vehicle;
  if (v.kind !== 'rocket' || v.shape === undefined || v.diameter === undefined || v.motor?.length === undefined) return [];
  const f = stabilityFigures(v.shape, v.diameter, v.mass, v.motor.propellantMass, v.motor.length);
  const issues: Issue[] = [];
  const judge = (margin: number, when: string, path: string) => {
    if (margin < WARNING_LIMITS.minMargin) {
      issues.push({
        path,
        message: `the static margin ${when} is ${formatNumber(Number(margin.toFixed(2)))} calibres, under the ${WARNING_LIMITS.minMargin} calibre usually asked for${margin < 0 ? ' (the CP is ahead of the CG: the rocket is unstable)' : ''}; check the shape and the balance point`,
      });
    } else if (margin > WARNING_LIMITS.maxMargin) {
      issues.push({
        path,
        message: `the static margin ${when} is ${formatNumber(Number(margin.toFixed(2)))} calibres, over the ${WARNING_LIMITS.maxMargin} calibres beyond which a rocket turns hard into the wind; check the shape and the balance point`,
      });
    }
  };
  judge(f.margin_cal, 'at lift-off', 'vehicle.shape.cg');
  judge(f.marginBurnout_cal, 'at burnout', 'vehicle.shape.cg');
  return issues;
}
