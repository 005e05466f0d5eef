import type { Paper } from '../report/sheet/index.js';
import type { UnitSystem } from '../report/format-number.js';
import { UsageError } from './errors.js';

/** --units and --paper, shared by run, check, analyze and envelope (and sheet). */
export const DISPLAY_OPTIONS = {
  units: { type: 'string' },
  paper: { type: 'string' },
} as const;

function choice<T extends string>(name: string, value: unknown, choices: readonly T[]): T | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'string' || !(choices as readonly string[]).includes(value)) {
    throw new UsageError(`--${name}: '${String(value)}' is not one of ${choices.join(', ')}`);
  }
  return value as T;
}

/** The option when given, else the scenario's run.units / run.paper, else metric and A4. */
export function displayChoices(
  values: { units?: unknown; paper?: unknown },
  fallback: { units?: UnitSystem; paper?: Paper } = {},
): { units: UnitSystem; paper: Paper } {
  return {
    units: choice<UnitSystem>('units', values.units, ['metric', 'imperial']) ?? fallback.units ?? 'metric',
    paper: choice<Paper>('paper', values.paper, ['a4', 'letter']) ?? fallback.paper ?? 'a4',
  };
}
