/**
 * The harm model's settings with every default filled in, from the scenario's optional `risk`
 * block (scenario-format.md, section "risk").
 *
 * @example
 *   const s = riskSettings(scenario);
 *   s.objectRadius   // m; half the vehicle's reference diameter unless the file gives one
 */
import type { Scenario } from '../scenario/types.js';

/** Casualty energy threshold, J: about 11 ft·lbf (from memory: the level range safety treats as harmless to people in the open below). */
export const DEFAULT_CASUALTY_ENERGY_J = 15;
/** Radius and height of a standing person, m (from memory, the values range-safety casualty-area work uses). */
export const DEFAULT_PERSON_RADIUS_M = 0.3;
export const DEFAULT_PERSON_HEIGHT_M = 1.8;
/** Individual-risk levels per flight drawn by default. */
export const DEFAULT_RISK_LEVELS = [1e-4, 1e-5, 1e-6];

export interface RiskSettings {
  /** Threshold, J (used when there is no table). */
  casualtyEnergy: number;
  /** Casualty probability by energy (linear between rows, held outside); null: the threshold. */
  casualtyProbability: { energy: number[]; probability: number[] } | null;
  personRadius: number;
  personHeight: number;
  objectRadius: number;
  /** How the object radius was found, for reports. */
  objectRadiusSource: string;
  /** Decreasing (the innermost line first). */
  levels: number[];
  criteria: { individual?: number; collective?: number };
}

/**
 * The object's radius defaults to half its reference diameter, found from the reference area as
 * √(A/π) (the same number when the file gives `diameter`). A long body lying across a person's
 * path is wider than that; the file's `risk.objectRadius` overrides it.
 */
export function riskSettings(scenario: Pick<Scenario, 'vehicle' | 'risk'> & Partial<Pick<Scenario, 'breakup'>>): RiskSettings {
  const r = scenario.risk ?? {};
  const fromArea = Math.sqrt(scenario.vehicle.referenceArea / Math.PI);
  return {
    casualtyEnergy: r.casualtyEnergy ?? DEFAULT_CASUALTY_ENERGY_J,
    casualtyProbability: r.casualtyProbability ?? null,
    personRadius: r.personRadius ?? DEFAULT_PERSON_RADIUS_M,
    personHeight: r.personHeight ?? DEFAULT_PERSON_HEIGHT_M,
    objectRadius: r.objectRadius ?? fromArea,
    objectRadiusSource:
      (r.objectRadius !== undefined ? 'risk.objectRadius' : 'half the reference diameter, from the reference area') +
      // A breakup's pieces keep their own radius (breakup.fragments[].radius or their size).
      (scenario.breakup ? '; each fragment its own' : ''),
    levels: [...(r.levels ?? DEFAULT_RISK_LEVELS)].sort((a, b) => b - a),
    criteria: { ...(r.criteria ?? {}) },
  };
}
