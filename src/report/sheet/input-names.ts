/**
 * Plain names of the scenario's inputs for people reading the sheet ("wind speed" rather than
 * "wind.speed"); the scenario file and summary.json keep the dotted names.
 */
import type { UncertaintyName } from '../../scenario/types.js';

export const SPREAD_WORDS: Record<UncertaintyName, string> = {
  'wind.speed': 'wind speed',
  'wind.from': 'wind direction',
  'wind.gust': 'gust speed',
  'launch.tilt': 'rail tilt',
  'launch.azimuth': 'launch direction',
  'launch.speed': 'launch speed',
  'launch.elevation': 'launch elevation',
  'launch.height': 'launch height',
  'motor.impulse': 'motor impulse',
  'vehicle.mass': 'vehicle mass',
  'vehicle.drag': 'drag coefficient',
  'recovery.delay': 'deployment delay',
  'recovery.rate': 'descent rate (drag area)',
  'motor.misalignment': 'thrust misalignment',
  'vehicle.cg': 'balance point',
};

/** The plain name of a spread or of "failure mode"; names this table lacks are shown as written. */
export function inputWords(input: string): string {
  return (SPREAD_WORDS as Record<string, string>)[input] ?? input;
}
