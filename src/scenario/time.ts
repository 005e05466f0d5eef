/** Valid times as the scenario and the command line write them. */

/** Parses an ISO 8601 date-time that names its zone (Z or ±hh:mm); NaN otherwise. */
export function parseValidTime(text: string): number {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}(:\d{2}(:\d{2}(\.\d+)?)?)?(Z|[+-]\d{2}:?\d{2})$/.test(text.trim())) return NaN;
  let t = text.trim();
  // Date.parse needs minutes; "2026-06-01T12Z" is a common way to write a forecast hour.
  t = t.replace(/T(\d{2})(Z|[+-])/, 'T$1:00$2');
  return Date.parse(t);
}

export function isoTime(ms: number): string {
  return new Date(ms).toISOString().replace(/:00\.000Z$/, 'Z').replace(/\.000Z$/, 'Z');
}
