import { safeStorage } from '../scenario/persist.js';
import { UNIT_SYSTEMS, type UnitSystem } from '../units/systems.js';

/** The unit system chosen last time (metric the first time). */
const KEY = 'strewn.units';

export function recallUnits(): UnitSystem {
  try {
    const kept = safeStorage()?.getItem(KEY);
    return UNIT_SYSTEMS.includes(kept as UnitSystem) ? (kept as UnitSystem) : 'metric';
  } catch {
    return 'metric';
  }
}

export function keepUnits(units: UnitSystem): void {
  try {
    safeStorage()?.setItem(KEY, units);
  } catch {
    // Storage unavailable: the choice lasts until reload.
  }
}
