import type { FinSet, NoseForm, RocketShape, Transition } from '../scenario/types.js';

/**
 * Normal-force slopes and centres of pressure of a rocket's parts by Barrowman's subsonic method
 * (J. S. Barrowman, "The Practical Calculation of the Aerodynamic Characteristics of Slender
 * Finned Vehicles", 1967), exactly as the scenario format's "vehicle.shape" states it. Slopes are
 * per radian and referred to the area of the body diameter d; positions are from the nose tip.
 *
 * Only the fins depend on the Mach number (Prandtl–Glauert, 1/sqrt(1 − M²) with M capped at 0.8),
 * so a shape is reduced once to two groups of moments — body (nose and transitions) and fins —
 * from which the flight builds, at any Mach number and balance point, the total slope, the moment
 * slope and the damping sum without a loop or an allocation:
 *   Σ CNα_i             = b0 + k f0
 *   Σ CNα_i X_i         = b1 + k f1
 *   Σ CNα_i X_i²        = b2 + k f2           (k the fin Mach factor)
 */

/** Fraction of the nose length at which its normal force acts (Barrowman 1967). */
export const NOSE_CP_FRACTION: Record<NoseForm, number> = { cone: 2 / 3, ogive: 0.466, parabola: 1 / 2 };

/** Highest Mach number the fin compressibility factor is taken to. */
export const PRANDTL_GLAUERT_MACH_CAP = 0.8;

export interface AeroPart {
  /** 'nose', 'transitions[0]', 'fins[1]', ... (the scenario's field names). */
  name: string;
  /** Normal-force slope per radian at Mach 0, referred to the area of d. */
  cnAlpha: number;
  /** Centre of pressure from the nose tip, m. */
  cp: number;
  /** True for fin sets: their slope carries the Mach factor. */
  fins: boolean;
}

export interface AeroTable {
  parts: AeroPart[];
  /** Body moments: Σ CNα, Σ CNα X, Σ CNα X² over nose and transitions. */
  b0: number;
  b1: number;
  b2: number;
  /** The same over the fin sets, at Mach 0. */
  f0: number;
  f1: number;
  f2: number;
}

/** Nose: CNα = 2 at k L. */
export function noseTerm(form: NoseForm, length: number): { cnAlpha: number; cp: number } {
  return { cnAlpha: 2, cp: NOSE_CP_FRACTION[form] * length };
}

/** Conical transition: CNα = 2[(d_aft/d)² − (d_fore/d)²] at X_p + (L/3)[1 + 1/(1 + d_fore/d_aft)]. */
export function transitionTerm(t: Transition, d: number): { cnAlpha: number; cp: number } {
  const cnAlpha = 2 * ((t.aftDiameter / d) ** 2 - (t.foreDiameter / d) ** 2);
  // A transition that closes to a point (aft diameter 0) has its CP at the limit of the formula.
  const ratio = t.aftDiameter > 0 ? t.foreDiameter / t.aftDiameter : Infinity;
  const cp = t.position + (t.length / 3) * (1 + 1 / (1 + ratio));
  return { cnAlpha, cp };
}

/** Length of a fin's mid-chord line, from the middle of the root chord to the middle of the tip chord. */
export function midChordLength(fin: FinSet): number {
  const dx = fin.sweep + fin.tipChord / 2 - fin.rootChord / 2;
  return Math.sqrt(fin.span * fin.span + dx * dx);
}

/**
 * A fin set at Mach 0: [1 + R/(s + R)] · 4N(s/d)² / [1 + sqrt(1 + (2 l_m/(C_r + C_t))²)] with R
 * the body radius at the root leading edge, at X_b + X_r(C_r + 2C_t)/(3(C_r + C_t)) +
 * [(C_r + C_t) − C_r C_t/(C_r + C_t)]/6 (X_r: the sweep).
 */
export function finTerm(fin: FinSet, d: number, bodyRadius: number): { cnAlpha: number; cp: number } {
  const s = fin.span;
  const cr = fin.rootChord;
  const ct = fin.tipChord;
  const lm = midChordLength(fin);
  const interference = 1 + bodyRadius / (s + bodyRadius);
  const cnAlpha = (interference * 4 * fin.count * (s / d) ** 2) / (1 + Math.sqrt(1 + ((2 * lm) / (cr + ct)) ** 2));
  const cp = fin.position + (fin.sweep * (cr + 2 * ct)) / (3 * (cr + ct)) + (cr + ct - (cr * ct) / (cr + ct)) / 6;
  return { cnAlpha, cp };
}

/** The fins' compressibility factor 1/sqrt(1 − M²), M capped at 0.8 (M below 0 taken as 0). */
export function finMachFactor(mach: number): number {
  const m = mach > PRANDTL_GLAUERT_MACH_CAP ? PRANDTL_GLAUERT_MACH_CAP : mach > 0 ? mach : 0;
  return 1 / Math.sqrt(1 - m * m);
}

/**
 * Body radius at distance x from the nose tip: the nose profile (cone; tangent ogive; Barrowman's
 * parabolic series with K = 1, r = R(2ξ − ξ²)), then the body diameter changed by each conical
 * transition in turn. Used for the fin–body interference and the side view.
 */
export function bodyRadiusAt(shape: RocketShape, d: number, x: number): number {
  const R = d / 2;
  const L = shape.nose.length;
  if (x <= 0) return 0;
  if (x < L) {
    const xi = x / L;
    switch (shape.nose.form) {
      case 'cone':
        return R * xi;
      case 'parabola':
        return R * (2 * xi - xi * xi);
      case 'ogive': {
        // Tangent ogive: a circular arc of radius ρ tangent to the body at the nose base.
        const rho = (R * R + L * L) / (2 * R);
        return Math.sqrt(rho * rho - (L - x) * (L - x)) + R - rho;
      }
    }
  }
  let r = R;
  for (const t of shape.transitions) {
    if (x < t.position) break;
    if (x < t.position + t.length) return (t.foreDiameter + ((x - t.position) / t.length) * (t.aftDiameter - t.foreDiameter)) / 2;
    r = t.aftDiameter / 2;
  }
  return r;
}

/** The shape's parts and their moment sums, once per scenario. */
export function aeroTable(shape: RocketShape, d: number): AeroTable {
  const parts: AeroPart[] = [];
  const nose = noseTerm(shape.nose.form, shape.nose.length);
  parts.push({ name: 'nose', ...nose, fins: false });
  shape.transitions.forEach((t, i) => parts.push({ name: `transitions[${i}]`, ...transitionTerm(t, d), fins: false }));
  shape.fins.forEach((f, i) => parts.push({ name: `fins[${i}]`, ...finTerm(f, d, bodyRadiusAt(shape, d, f.position)), fins: true }));
  const table: AeroTable = { parts, b0: 0, b1: 0, b2: 0, f0: 0, f1: 0, f2: 0 };
  for (const p of parts) {
    if (p.fins) {
      table.f0 += p.cnAlpha;
      table.f1 += p.cnAlpha * p.cp;
      table.f2 += p.cnAlpha * p.cp * p.cp;
    } else {
      table.b0 += p.cnAlpha;
      table.b1 += p.cnAlpha * p.cp;
      table.b2 += p.cnAlpha * p.cp * p.cp;
    }
  }
  return table;
}

/** Total normal-force slope per radian and CP (slope-weighted mean position) at a Mach number. */
export function slopeAndCp(table: AeroTable, mach: number): { cnAlpha: number; cp: number } {
  const k = finMachFactor(mach);
  const cn = table.b0 + k * table.f0;
  return { cnAlpha: cn, cp: (table.b1 + k * table.f1) / cn };
}

/**
 * Mass properties at a moment of the flight, by the format's rules: the propellant a point mass at
 * motorEnd − motor.length/2, the dry balance point from the ready-to-fly `cg`, the dry rocket's
 * own inertia the ready-to-fly inertia less the parallel-axis terms of the dry mass and the full
 * propellant.
 */
export interface MassLayout {
  dryMass: number;
  dryCg: number;
  /** The dry rocket's own transverse inertia about its own balance point, kg m². */
  dryInertia: number;
  propellantMass: number;
  propellantAt: number;
}

export function massLayout(dryMass: number, propellantMass: number, cg: number, inertia: number, propellantAt: number): MassLayout {
  const dryCg = ((dryMass + propellantMass) * cg - propellantMass * propellantAt) / dryMass;
  const dryInertia = inertia - dryMass * (dryCg - cg) ** 2 - propellantMass * (propellantAt - cg) ** 2;
  return { dryMass, dryCg, dryInertia, propellantMass, propellantAt };
}

/** Balance point and transverse inertia about it with `propellant` kg left. */
export function balanceAndInertia(m: MassLayout, propellant: number): { cg: number; inertia: number } {
  const total = m.dryMass + propellant;
  const cg = (m.dryMass * m.dryCg + propellant * m.propellantAt) / total;
  const inertia = m.dryInertia + m.dryMass * (m.dryCg - cg) ** 2 + propellant * (m.propellantAt - cg) ** 2;
  return { cg, inertia };
}

/** Stability figures of a shaped rocket (Mach 0 slopes; margins in calibres of d). */
export interface StabilityFigures {
  cp_m: number;
  cg_m: number;
  normalForceSlope_per_rad: number;
  margin_cal: number;
  marginBurnout_cal: number;
  cgBurnout_m: number;
}

export function stabilityFigures(shape: RocketShape, d: number, dryMass: number, propellantMass: number, motorLength: number): StabilityFigures {
  const table = aeroTable(shape, d);
  const { cnAlpha, cp } = slopeAndCp(table, 0);
  const layout = massLayout(dryMass, propellantMass, shape.cg, shape.inertia, shape.motorEnd - motorLength / 2);
  const burnout = layout.dryCg;
  return {
    cp_m: cp,
    cg_m: shape.cg,
    normalForceSlope_per_rad: cnAlpha,
    margin_cal: (cp - shape.cg) / d,
    marginBurnout_cal: (cp - burnout) / d,
    cgBurnout_m: burnout,
  };
}
