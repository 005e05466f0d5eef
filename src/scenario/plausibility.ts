import jstatModule from 'jstat';
import { formatNumber } from './units.js';
import type { Issue, Scenario, Spread } from './types.js';

const { jStat } = jstatModule;

/**
 * Warnings (not errors) for values no real event has: most likely a slip in the file (a unit, a
 * sign, an extra zero). The scenario still runs; the warnings are printed, kept in summary.json and
 * shown on the sheet and the page. Thresholds are common practice, no source: the highest
 * airfields and launch sites lie below 9,000 m, the lowest dry land near -430 m (the Dead Sea
 * shore, from memory); hobby and display events keep their activity within a few kilometres of
 * the pad; sounding rockets that reach 150 km are not planned with a hobby tool.
 */
export const PLAUSIBLE = {
  /** m above sea level. */
  minPadElevation: -500,
  maxPadElevation: 9000,
  /** m from the pad to a release point. */
  maxReleaseDistance: 50_000,
  /** m, a site's minimum distance. */
  maxMinimumDistance: 20_000,
  /** m, the nominal apogee above the pad. */
  maxApogee: 150_000,
  /** people in one area. */
  maxHeadCount: 1_000_000,
} as const;

/** Dry mass kept by the sampler when a mass spread draws below it (src/dispersion/draw.ts). */
export const MASS_FLOOR_SHARE = 1e-3;

export function plausibilityWarnings(scenario: Scenario): Issue[] {
  const issues: Issue[] = [];
  const { pad, minimumDistance, areas } = scenario.site;
  if (pad.elevation < PLAUSIBLE.minPadElevation || pad.elevation > PLAUSIBLE.maxPadElevation) {
    issues.push({
      path: 'site.pad.elevation',
      message: `${formatNumber(pad.elevation)} m above sea level is outside ${PLAUSIBLE.minPadElevation} to ${PLAUSIBLE.maxPadElevation} m, where every real site lies; check the unit (ft or m) and the sign`,
    });
  }
  if (scenario.launch.kind === 'release') {
    const d = Math.hypot(scenario.launch.east, scenario.launch.north);
    if (d > PLAUSIBLE.maxReleaseDistance) {
      issues.push({
        path: 'launch.east',
        message: `the release point is ${formatNumber(d / 1000)} km from the pad, more than ${PLAUSIBLE.maxReleaseDistance / 1000} km; east and north are metres from the pad (check the unit)`,
      });
    }
  }
  if (minimumDistance !== undefined && minimumDistance > PLAUSIBLE.maxMinimumDistance) {
    issues.push({
      path: 'site.minimumDistance',
      message: `${formatNumber(minimumDistance / 1000)} km is more than the ${PLAUSIBLE.maxMinimumDistance / 1000} km any code asks around a pad; check the unit (m, ft, km)`,
    });
  }
  areas.forEach((area, i) => {
    if (area.people !== undefined && area.people > PLAUSIBLE.maxHeadCount) {
      issues.push({ path: `site.areas[${i}].people`, message: `${area.people.toLocaleString('en')} people in '${area.name}' is more than ${PLAUSIBLE.maxHeadCount.toLocaleString('en')}; check the number` });
    }
  });
  const massSpread = scenario.uncertainty['vehicle.mass'];
  if (massSpread !== undefined) {
    const share = shareBelow(massSpread, scenario.vehicle.mass, -(1 - MASS_FLOOR_SHARE) * scenario.vehicle.mass);
    if (share > 0) {
      issues.push({
        path: 'uncertainty.vehicle.mass',
        message: `the spread draws a mass of ${formatNumber(MASS_FLOOR_SHARE * scenario.vehicle.mass)} kg or less (nearly none, or negative) in about ${percent(share)} of samples; those draws are clamped to ${formatNumber(MASS_FLOOR_SHARE * scenario.vehicle.mass)} kg. Use a smaller spread`,
      });
    }
  }
  return issues;
}

/** From the nominal flight: an apogee no event planned with this tool reaches. */
export function apogeeWarnings(apogee: number): Issue[] {
  if (!(apogee > PLAUSIBLE.maxApogee)) return [];
  return [
    {
      path: 'vehicle',
      message: `the nominal flight reaches ${formatNumber(apogee / 1000)} km, above ${PLAUSIBLE.maxApogee / 1000} km; check the motor, the mass and their units (the flat, still atmosphere used here does not hold there)`,
    },
  ];
}

/** Share of draws of `spread` (around `nominal`) whose offset lies below `offset`. */
export function shareBelow(spread: Spread, nominal: number, offset: number): number {
  const unit = spread.relative ? Math.abs(nominal) : 1;
  if (spread.kind === 'uniform') {
    const lo = spread.lo * unit;
    const hi = spread.hi * unit;
    if (!(hi > lo)) return lo < offset ? 1 : 0;
    return Math.min(1, Math.max(0, (offset - lo) / (hi - lo)));
  }
  const sd = spread.sd * unit;
  if (!(sd > 0)) return 0;
  const z = offset / sd;
  if (spread.limit === undefined) return jStat.normal.cdf(z, 0, 1);
  if (z <= -spread.limit) return 0;
  const lo = jStat.normal.cdf(-spread.limit, 0, 1);
  return (jStat.normal.cdf(z, 0, 1) - lo) / (1 - 2 * lo);
}

function percent(share: number): string {
  const p = share * 100;
  return `${p >= 1 ? formatNumber(Math.round(p * 10) / 10) : Number(p.toPrecision(2))} %`;
}
