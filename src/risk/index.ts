/**
 * The risk to people of a set of landings: individual-risk lines, where people may stand, expected
 * casualties per marked area and in total, each against the user's criteria. Pure: landings and
 * settings in, plain data out. Results are indicative and never replace the range-safety code
 * that governs the site.
 *
 * @example
 *   const risk = assessRisk(set, scenario.site, riskSettings(scenario), { samples: 2000 });
 *   risk.lines[2]              // { level: 1e-6, resolved, area_m2, maxDistance_m, samplesNeeded, ... }
 *   risk.standingDistance_m.NE
 *   riskSummary(risk)          // summary.json's `risk` object
 */
import { createLocalFrame } from '../analysis/geodesy.js';
import type { LandingSet } from '../analysis/types.js';
import { effectiveSampleSize, weightedQuantile } from '../analysis/weightedStats.js';
import type { Site } from '../scenario/types.js';
import { areaRisks, UPPER_BOUND_METHOD, type AreaRisk } from './areas.js';
import { impactHarm, type ImpactHarm } from './impacts.js';
import { MIN_LINE_SAMPLES, riskLines, riskSurface, type RiskLine, type RiskSurface } from './individual.js';
import type { RiskSettings } from './settings.js';
import { standingDistances, standingRing, type StandingDistances } from './standing.js';
import type { Ring } from '../analysis/rings.js';
import { sampleWeightsOf } from '../analysis/parts.js';

export type Judgement = 'under your criterion' | 'over your criterion';

/** "under" strictly below the criterion; at or above it is "over". Never a verdict on the event. */
export function againstCriterion(value: number, criterion: number | undefined): Judgement | null {
  if (criterion === undefined) return null;
  return value < criterion ? 'under your criterion' : 'over your criterion';
}

export interface ModeImpacts {
  name: string;
  impactSpeed_m_s: { p50: number; p95: number };
  impactEnergy_J: { p50: number; p95: number };
  /** Share of the mode's landings (weighted) at or above the casualty energy (chance-weighted with a table). */
  harmfulShare: number;
  /** Expected casualties per flight from this mode, over the areas with people. */
  expectedCasualties: number;
}

export interface RiskResult {
  settings: RiskSettings;
  surface: RiskSurface | null;
  /**
   * The risk weight of each landing (what the event's combined surface adds up). The other
   * per-landing harm figures are used up inside `assessRisk` and not kept: at millions of
   * landings they were the largest thing the analysis held while the files were written.
   */
  harm: Pick<ImpactHarm, 'weight'>;
  lines: RiskLine[];
  /** Level the standing distances are for: the individual criterion, or the smallest level. */
  standingLevel: number;
  /** The line at the standing level (one of `lines` when the level is one of the levels). */
  standingLine: RiskLine;
  standingDistance_m: StandingDistances;
  /** East/north metres; null when nowhere is over the level. */
  standingRing: Ring | null;
  areas: AreaRisk[];
  total: { expectedCasualties: number; upper95: number };
  modes: ModeImpacts[];
  /** The same per part (whole object, fragment classes), when the landings have parts. */
  parts?: ModeImpacts[];
  warnings: string[];
}

export function assessRisk(set: LandingSet, site: Site, settings: RiskSettings, options: { samples?: number } = {}): RiskResult {
  const frame = createLocalFrame(site.pad);
  const harm = impactHarm(set, settings);
  const surface = riskSurface(set.east, set.north, harm.weight);
  const samples = options.samples ?? set.east.length;
  const lines = riskLines(surface, settings.levels, samples);
  const standingLevel = settings.criteria.individual ?? Math.min(...settings.levels);
  const standing = standingDistances(surface, standingLevel);
  // Effective samples over flights: the pieces of one flight are not independent samples.
  const areas = areaRisks(site.areas, set, harm, surface, frame, effectiveSampleSize(sampleWeightsOf(set)));
  const withPeople = areas.filter((a) => a.expectedCasualties !== null);
  const total = {
    expectedCasualties: withPeople.reduce((s, a) => s + (a.expectedCasualties ?? 0), 0),
    // The sum of the areas' bounds: at least the 95 % bound of the sum.
    upper95: withPeople.reduce((s, a) => s + (a.upper95 ?? 0), 0),
  };
  const warnings: string[] = [];
  for (const line of lines) {
    if (line.resolved) continue;
    const need = line.samplesNeeded === null ? 'many more samples' : `about ${line.samplesNeeded.toLocaleString('en')} samples`;
    warnings.push(`The ${line.level.toExponential(0)} individual-risk line is not resolved (${Math.floor(line.effectiveSamples)} effective samples, ${MIN_LINE_SAMPLES} wanted); ${need} would resolve it (--until-stable).`);
  }
  return {
    settings,
    surface,
    harm: { weight: harm.weight },
    lines,
    standingLevel,
    standingLine: lines.find((l) => l.level === standingLevel) ?? riskLines(surface, [standingLevel], samples)[0],
    standingDistance_m: standing,
    standingRing: standingRing(standing),
    areas,
    total,
    modes: modeImpacts(set, harm, areas),
    ...(set.part && set.partNames ? { parts: modeImpacts(set, harm, areas, true) } : {}),
    warnings,
  };
}

/** Impact figures per mode, or per part with `byPart` (a piece's own speed, energy and casualties). */
function modeImpacts(set: LandingSet, harm: ImpactHarm, areas: AreaRisk[], byPart = false): ModeImpacts[] {
  const names = byPart ? set.partNames! : set.modeNames;
  const groupOf = byPart ? set.part! : set.mode;
  const n = set.east.length;
  return names.map((name, m) => {
    // The quantiles read the landing set's own columns through a list of the group's indices (none
    // when the group is every landing): at millions of landings, copies of each group's figures
    // made most of the analysis's peak memory.
    let count = 0;
    for (let i = 0; i < n; i++) if (groupOf[i] === m) count++;
    let members: Uint32Array | null = null;
    if (count < n) {
      members = new Uint32Array(count);
      for (let i = 0, j = 0; i < n; i++) if (groupOf[i] === m) members[j++] = i;
    }
    let harmful = 0;
    let total = 0;
    for (let j = 0; j < count; j++) {
      const i = members ? members[j] : j;
      harmful += set.weight[i] * harm.chance[i];
      total += set.weight[i];
    }
    const q = (values: Float64Array | undefined, p: number) => {
      if (count === 0 || values === undefined) return NaN;
      for (let j = 0; j < count; j++) if (!Number.isFinite(values[members ? members[j] : j])) return NaN;
      return weightedQuantile(values, set.weight, p, members);
    };
    return {
      name,
      impactSpeed_m_s: { p50: q(set.impactSpeed, 0.5), p95: q(set.impactSpeed, 0.95) },
      impactEnergy_J: { p50: q(set.impactEnergy, 0.5), p95: q(set.impactEnergy, 0.95) },
      harmfulShare: total > 0 ? harmful / total : 0,
      expectedCasualties: areas.reduce((s, a) => s + ((byPart ? a.byPart : a.byMode)[m] ?? 0), 0),
    };
  });
}

/** summary.json's `risk` object (scenario-format.md, "Results"); all figures per flight. */
export interface RiskSummary {
  lines: { level: number; resolved: boolean; area_m2: number; maxDistance_m: number; samplesNeeded: number | null; effectiveSamples: number }[];
  standingLevel: number;
  /** Whether the samples resolve the line the standing distances are read from. */
  standingResolved: boolean;
  standingDistance_m: StandingDistances;
  areas: {
    name: string;
    expectedCasualties: number | null;
    upper95: number | null;
    maxIndividualRisk: number;
    peoplePerM2: number | null;
    sheltered: number;
    harmfulHits: number;
    individualCriterion: Judgement | null;
  }[];
  total: { expectedCasualties: number; upper95: number; collectiveCriterion: Judgement | null; collectiveCriterionUpper95: Judgement | null };
  modes: ModeImpacts[];
  /** Per part, when the object may break up (harmfulShare: share of the part's landings). */
  parts?: ModeImpacts[];
  settings: {
    casualtyEnergy_J: number | null;
    casualtyProbability: { energy_J: number[]; probability: number[] } | null;
    personRadius_m: number;
    personHeight_m: number;
    objectRadius_m: number;
    objectRadiusFrom: string;
    levels: number[];
    criteria: { individual?: number; collective?: number };
  };
  bandwidth_m: { east: number; north: number } | null;
  upper95Method: string;
  warnings: string[];
  /** Set by `run --until-stable`: the rounds flown and why it stopped. */
  untilStable?: { rounds: { samples: number; reach_m: number; moved: number | null }[]; stopped: 'stable' | 'cap'; tolerance: number; cap: number };
}

export function riskSummary(r: RiskResult): RiskSummary {
  const s = r.settings;
  return {
    lines: r.lines.map((l) => ({
      level: l.level,
      resolved: l.resolved,
      area_m2: l.area_m2,
      maxDistance_m: l.maxDistance_m,
      samplesNeeded: l.samplesNeeded,
      effectiveSamples: Number.isFinite(l.effectiveSamples) ? Math.round(l.effectiveSamples * 10) / 10 : l.effectiveSamples,
    })),
    standingLevel: r.standingLevel,
    standingResolved: r.standingLine.resolved,
    standingDistance_m: r.standingDistance_m,
    areas: r.areas.map((a) => ({
      name: a.name,
      expectedCasualties: a.expectedCasualties,
      upper95: a.upper95,
      maxIndividualRisk: a.maxIndividualRisk,
      peoplePerM2: a.peoplePerM2,
      sheltered: a.sheltered,
      harmfulHits: a.harmfulHits,
      individualCriterion: againstCriterion(a.maxIndividualRisk, s.criteria.individual),
    })),
    total: {
      ...r.total,
      collectiveCriterion: againstCriterion(r.total.expectedCasualties, s.criteria.collective),
      collectiveCriterionUpper95: againstCriterion(r.total.upper95, s.criteria.collective),
    },
    modes: r.modes,
    ...(r.parts ? { parts: r.parts } : {}),
    settings: {
      casualtyEnergy_J: s.casualtyProbability === null ? s.casualtyEnergy : null,
      casualtyProbability: s.casualtyProbability === null ? null : { energy_J: s.casualtyProbability.energy, probability: s.casualtyProbability.probability },
      personRadius_m: s.personRadius,
      personHeight_m: s.personHeight,
      objectRadius_m: s.objectRadius,
      objectRadiusFrom: s.objectRadiusSource,
      levels: s.levels,
      criteria: s.criteria,
    },
    bandwidth_m: r.surface ? { east: r.surface.bandwidth.east, north: r.surface.bandwidth.north } : null,
    upper95Method: UPPER_BOUND_METHOD,
    warnings: r.warnings,
  };
}

export { riskSettings } from './settings.js';
export type { RiskSettings } from './settings.js';
