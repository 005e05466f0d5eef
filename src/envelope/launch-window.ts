import { hourlyWinds } from '../forecast/window.js';
import { isoTime } from '../scenario/time.js';
import type { Scenario } from '../scenario/types.js';
import { judgeWindow } from './chart.js';
import type { EnvelopeResult } from './envelope.js';

/**
 * The launch window of a scenario with `weather.forecast`: each hour of the chosen day (UTC) that
 * the forecast file covers, its wind at the envelope's reference height judged against the limits.
 * One function for `strewn envelope` and the page, given the forecast file's bytes.
 *
 * @example
 *   result.window = launchWindow(result, gribBytes, scenario);
 *   result.window[0]; // { time: '2011-01-15T00:00Z', speed: 6.1, from: 250, limit: 9.2, inside: true }
 */
export function launchWindow(result: EnvelopeResult, forecastBytes: Uint8Array, scenario: Scenario): NonNullable<EnvelopeResult['window']> {
  const f = scenario.weather.forecast;
  if (f === undefined) return [];
  const hours = hourlyWinds(forecastBytes, scenario.site.pad, Date.parse(f.time), scenario.weather.wind.height, scenario.weather.wind.shear);
  return judgeWindow(result, hours.map((h) => ({ time: isoTime(h.time), speed: h.speed, from: h.from })));
}
