/**
 * Dryden turbulence, low-altitude form of MIL-F-8785C (1980) / MIL-HDBK-1797.
 *
 * With h in feet: L_u = L_v = h / (0.177 + 0.000823 h)^1.2, L_w = h,
 * σ_w = 0.1 W20, σ_u = σ_v = σ_w / (0.177 + 0.000823 h)^0.4.
 * The low-altitude forms hold below 1000 ft. Above it the turbulence is taken as isotropic with the
 * 1000 ft intensity, and the scale length grows linearly to 1750 ft at 2000 ft and stays there
 * (the medium/high-altitude scale length; from memory). Below 10 ft the 10 ft values are used,
 * since the forms are singular at the ground.
 *
 * Each component is a first-order Gauss–Markov process: the longitudinal Dryden filter
 * H(s) = σ sqrt(2L/(πV)) / (1 + (L/V) s) is exactly that, with correlation time L/V and variance σ².
 * The vertical component is given the same first-order form with its own L_w and σ_w (a common
 * simplification of its second-order filter).
 */

const FT = 0.3048;

export interface DrydenPoint {
  /** σ_u / σ_w at this height (dimensionless). */
  sigmaRatioU: number;
  /** Longitudinal/lateral scale length, m. */
  lengthU: number;
  /** Vertical scale length, m. */
  lengthW: number;
}

/** Intensity ratio and scale lengths at a height above ground (m). */
export function drydenAt(height: number, out: DrydenPoint = { sigmaRatioU: 1, lengthU: 0, lengthW: 0 }): DrydenPoint {
  const hFt = Math.min(Math.max(height / FT, 10), 1000);
  const base = 0.177 + 0.000823 * hFt;
  out.sigmaRatioU = 1 / Math.pow(base, 0.4);
  let lu = hFt / Math.pow(base, 1.2);
  let lw = hFt;
  const above = height / FT;
  if (above > 1000) {
    const f = Math.min((above - 1000) / 1000, 1);
    lu = 1000 + f * 750;
    lw = lu;
  }
  out.lengthU = lu * FT;
  out.lengthW = lw * FT;
  return out;
}

/** σ_w from the mean wind at 20 ft (6.096 m) above ground: σ_w = 0.1 W20 (MIL-F-8785C). */
export function sigmaWFromW20(w20: number): number {
  return 0.1 * w20;
}

/**
 * σ_w that makes σ_u at the reference height equal to (gust − mean) / 3: a peak gust is taken as
 * the mean plus three standard deviations (common practice, no source).
 */
export function sigmaWFromGust(gust: number, mean: number, referenceHeight: number): number {
  return sigmaWFromGustRatio(gust, mean, drydenAt(referenceHeight).sigmaRatioU);
}

/** The same with σ_u/σ_w at the reference height worked out once (per scenario, not per sample). */
export function sigmaWFromGustRatio(gust: number, mean: number, ratioAtReference: number): number {
  const sigmaU = Math.max(0, gust - mean) / 3;
  return sigmaU / ratioAtReference;
}

/** One step of a unit-variance first-order Gauss–Markov process with correlation φ = exp(−Δ/τ). */
export function markovStep(previous: number, phi: number, normal: number): number {
  return phi * previous + Math.sqrt(1 - phi * phi) * normal;
}

/**
 * A series of a first-order Gauss–Markov process with standard deviation σ and correlation time τ,
 * sampled every dt: the exact discretisation of the Dryden longitudinal filter (τ = L/V).
 */
export function gaussMarkovSeries(
  normal: () => number,
  sigma: number,
  tau: number,
  dt: number,
  out: Float64Array,
): Float64Array {
  const phi = Math.exp(-dt / tau);
  let x = normal();
  for (let i = 0; i < out.length; i++) {
    out[i] = sigma * x;
    x = markovStep(x, phi, normal());
  }
  return out;
}
