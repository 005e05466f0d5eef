/**
 * Chance that an impact of a given energy makes a casualty of a person it strikes: a threshold
 * (1 at or above the casualty energy, 0 below) or the user's table (linear between rows, held
 * constant outside them, as the drag table is).
 *
 * @example
 *   casualtyChance(18, { casualtyEnergy: 15, casualtyProbability: null })  // 1
 */
import type { RiskSettings } from './settings.js';

export function casualtyChance(energy: number, settings: Pick<RiskSettings, 'casualtyEnergy' | 'casualtyProbability'>): number {
  const table = settings.casualtyProbability;
  if (table === null) return energy >= settings.casualtyEnergy ? 1 : 0;
  const e = table.energy;
  const p = table.probability;
  if (energy <= e[0]) return p[0];
  const last = e.length - 1;
  if (energy >= e[last]) return p[last];
  let k = 0;
  while (e[k + 1] < energy) k++;
  const t = (energy - e[k]) / (e[k + 1] - e[k]);
  return p[k] + t * (p[k + 1] - p[k]);
}

/** Kinetic energy ½ m v², J. */
export function impactEnergy(mass: number, speed: number): number {
  return 0.5 * mass * speed * speed;
}
