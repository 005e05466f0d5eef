/**
 * Casualty area of one impact: the ground area in which a standing person would be struck.
 *
 *   A_c = π (R_p + R_o)² + 2 (R_p + R_o) h_p / tan γ
 *
 * (basic casualty area, from memory, as range-safety debris analyses use it): the disc a person's
 * radius R_p widens round the object's radius R_o, plus the strip the object sweeps through a
 * person's height h_p on a path γ above the horizontal.
 *
 * @example
 *   casualtyArea(0.3, 0.027, 1.8, 90)  // π·0.327² ≈ 0.336 m² (vertical impact)
 */

/**
 * Shallowest path angle used, deg. Below it the strip term grows without bound (1/tan γ) while a
 * real object that grazing skids, bounces or stops; 5° caps the strip at about 23 (R_p + R_o) h_p.
 */
export const MIN_IMPACT_ANGLE_DEG = 5;

export function casualtyArea(personRadius: number, objectRadius: number, personHeight: number, angleDeg: number): number {
  const r = personRadius + objectRadius;
  const gamma = (Math.max(MIN_IMPACT_ANGLE_DEG, Math.min(90, angleDeg)) * Math.PI) / 180;
  // tan(90°) is 1.6e16 in floating point, so the strip term vanishes for a vertical impact.
  return Math.PI * r * r + (2 * r * personHeight) / Math.tan(gamma);
}
