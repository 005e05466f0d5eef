/**
 * The wind grid of an envelope: directions (from, degrees) and mean speeds (m/s at the reference
 * height) as inclusive ranges "start:stop:step".
 *
 * @example
 * rangeValues('0:330:30') // [0, 30, 60, …, 330]
 * rangeValues('0:14:1')   // [0, 1, …, 14]
 */
export function rangeValues(text: string): number[] | string {
  const parts = text.split(':').map((p) => Number(p.trim()));
  if (parts.length !== 3 || parts.some((p) => !Number.isFinite(p))) return `'${text}' is not start:stop:step`;
  return rangeFrom(parts[0]!, parts[1]!, parts[2]!, text);
}

/** The inclusive range start, start + step, … up to stop; `text` names it in messages. */
export function rangeFrom(start: number, stop: number, step: number, text: string): number[] | string {
  if (!(step > 0)) return `'${text}' has a step of ${step}; expected a positive step`;
  if (stop < start) return `'${text}' stops before it starts`;
  const count = Math.floor((stop - start) / step + 1e-9) + 1;
  if (count > 1000) return `'${text}' gives ${count} values; expected at most 1000`;
  return Array.from({ length: count }, (_, i) => Math.round((start + i * step) * 1e9) / 1e9);
}
