/** Compass words for bearings, for wind directions and octant tables. */

const POINTS16 = ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW'];

/** The 16-point compass name of a bearing in degrees clockwise from north ('WSW' for 250). */
export function compassPoint(bearingDeg: number): string {
  const b = ((bearingDeg % 360) + 360) % 360;
  return POINTS16[Math.round(b / 22.5) % 16];
}

/** A bearing as '250° (WSW)'. */
export function bearingText(bearingDeg: number): string {
  const b = ((bearingDeg % 360) + 360) % 360;
  return `${Math.round(b) % 360}\u00b0 (${compassPoint(b)})`;
}
