/**
 * The words the envelope's chart, page and table share, in metric or imperial speeds, so the
 * SVG, the PDF page and the web page say the same thing the same way.
 */
import { grouped, unitFormatter, type UnitSystem } from '../report/format-number.js';
import type { DirectionLimit, EnvelopeResult } from './envelope.js';

/** A speed in m/s as text in the chosen units ("4.9 m/s", "11 mph"). */
export function speedWords(units: UnitSystem): (metresPerSecond: number) => string {
  const u = unitFormatter(units);
  return (v) => u.speed(v);
}

export function envelopeTitle(e: EnvelopeResult): string {
  return `Wind limits: ${e.name}`;
}

/** What the chart shows, in one sentence. */
export function envelopeSubtitle(units: UnitSystem): string {
  const unit = units === 'imperial' ? 'mph' : 'm/s';
  return `Highest mean wind (${unit}, at the reference height) by direction the wind blows from, at which the keep-out zone stays inside the site boundary and clear of spectators, parking, roads and buildings.`;
}

/** How the limits were found: the same random numbers at every grid point, then bisection or all points. */
export function methodWords(e: Pick<EnvelopeResult, 'method'>): string {
  return e.method === 'bisection' ? 'common random numbers; bisection over speeds' : 'common random numbers; every grid point flown (exhaustive)';
}

export function samplesWords(e: Pick<EnvelopeResult, 'samples' | 'seed' | 'method'>): string {
  return `${grouped(e.samples)} samples per grid point, seed ${e.seed}; ${methodWords(e)}`;
}

/** The grid as ranges ("0° to 330° every 30°; 0 to 14 m/s every 1 m/s"). */
export function gridWords(e: Pick<EnvelopeResult, 'directions' | 'speeds' | 'casesFlown'>, units: UnitSystem): string {
  const range = (values: readonly number[], text: (v: number) => string) => {
    if (values.length === 1) return text(values[0]);
    const step = values[1] - values[0];
    const even = values.every((v, i) => i === 0 || Math.abs(v - values[i - 1] - step) < 1e-6);
    return even ? `${text(values[0])} to ${text(values[values.length - 1])} every ${text(step)}` : values.map(text).join(', ');
  };
  const speed = speedWords(units);
  return `directions ${range(e.directions, (d) => `${d}\u00b0`)}; speeds ${range(e.speeds, speed)}; ${grouped(e.casesFlown)} grid points flown`;
}

/** A direction's limit in words ("up to 6 m/s", "at least 14 m/s (top of the grid)"). */
export function limitWords(d: DirectionLimit, e: Pick<EnvelopeResult, 'speeds'>, units: UnitSystem): string {
  const speed = speedWords(units);
  if (d.limit === null) return `none: fails at ${speed(e.speeds[0])}`;
  return d.aboveGrid ? `at least ${speed(d.limit)} (top of the grid)` : `up to ${speed(d.limit)}`;
}

/** The launcher as aimed for a direction ("rail toward 250°, 5° from vertical"), or ''. */
export function railWords(d: DirectionLimit): string {
  return d.rail ? `rail toward ${Math.round(d.rail.azimuth)}\u00b0, ${Math.round(d.rail.tilt * 10) / 10}\u00b0 from vertical` : '';
}

/** How the launcher was aimed, for the method notes. */
export function aimWords(e: Pick<EnvelopeResult, 'aim'>): string {
  const a = e.aim;
  if (!a) return "rail fixed at the scenario's azimuth";
  const cap = `lean at most ${a.maxTilt}\u00b0 from vertical`;
  if (a.mode === 'fixed') return `rail fixed at the scenario's azimuth; ${cap}`;
  if (a.mode === 'into-wind') return `rail turned into each wind direction; ${cap}`;
  return `rail leaning away from ${a.area}; ${cap}`;
}

/** The test that fails first above the limit, or why there is none. */
export function failureWords(d: DirectionLimit): string {
  if (d.firstFailure.length > 0) return d.firstFailure.join('; ');
  return d.aboveGrid ? 'none within the grid' : '';
}

export function forecastWords(e: EnvelopeResult, units: UnitSystem): string {
  return `forecast: ${speedWords(units)(e.forecast.speed)} from ${Math.round(e.forecast.from)}\u00b0`;
}
