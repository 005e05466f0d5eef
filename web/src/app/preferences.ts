import { safeStorage } from '../scenario/persist.js';
import { UNIT_SYSTEMS, type UnitSystem } from '../units/systems.js';

/**
 * The unit system chosen last time on this browser; the first time, `fallback` (the opening
 * scenario's run.units, else metric).
 */
const KEY = 'strewn.units';

export function recallUnits(fallback: UnitSystem = 'metric'): UnitSystem {
  try {
    const kept = safeStorage()?.getItem(KEY);
    return UNIT_SYSTEMS.includes(kept as UnitSystem) ? (kept as UnitSystem) : fallback;
  } catch {
    return fallback;
  }
}

export function keepUnits(units: UnitSystem): void {
  try {
    safeStorage()?.setItem(KEY, units);
  } catch {
    // Storage unavailable: the choice lasts until reload.
  }
}
