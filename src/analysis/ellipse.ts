/**
 * Dispersion ellipses per mode: the weighted mean landing point, the covariance, and for each level
 * p the ellipse that holds p of a bivariate normal with that covariance. Its semi-axes are
 * sqrt(χ²₂(p) λ) with λ the covariance's eigenvalues and χ²₂(p) = −2 ln(1 − p), the chi-square
 * quantile with two degrees of freedom (closed form). A quick summary next to the density contours,
 * which do not assume normality.
 *
 * @example
 *   modeEllipses(set, [0.5, 0.9])[0].ellipses[1]  // { level: 0.9, semiMajor_m, semiMinor_m, azimuth_deg, area_m2 }
 */
import type { LandingSet } from './types.js';

export interface LevelEllipse {
  level: number;
  semiMajor_m: number;
  semiMinor_m: number;
  /** Direction of the major axis, degrees clockwise from true north, in [0, 180). */
  azimuth_deg: number;
  area_m2: number;
}

export interface ModeEllipse {
  mode: string;
  samples: number;
  meanEast_m: number;
  meanNorth_m: number;
  /** [[var east, cov], [cov, var north]], m². */
  covariance: [[number, number], [number, number]];
  ellipses: LevelEllipse[];
}

/** χ²₂(p) = −2 ln(1 − p). */
export function chiSquare2(p: number): number {
  return -2 * Math.log1p(-p);
}

/** Ellipses for one covariance matrix. */
export function levelEllipses(varEast: number, varNorth: number, cov: number, levels: number[]): LevelEllipse[] {
  const middle = (varEast + varNorth) / 2;
  const radius = Math.hypot((varEast - varNorth) / 2, cov);
  const major = middle + radius;
  const minor = Math.max(0, middle - radius);
  // Angle of the major axis from east, counter-clockwise; turned into a compass azimuth.
  const fromEast = 0.5 * Math.atan2(2 * cov, varEast - varNorth);
  const azimuth = ((((90 - (fromEast * 180) / Math.PI) % 180) + 180) % 180);
  return levels.map((level) => {
    const c = chiSquare2(level);
    const a = Math.sqrt(c * major);
    const b = Math.sqrt(c * minor);
    return { level, semiMajor_m: a, semiMinor_m: b, azimuth_deg: azimuth, area_m2: Math.PI * a * b };
  });
}

export function modeEllipses(set: LandingSet, levels: number[]): ModeEllipse[] {
  const out: ModeEllipse[] = [];
  set.modeNames.forEach((name, m) => {
    let w1 = 0;
    let w2 = 0;
    let se = 0;
    let sn = 0;
    let samples = 0;
    for (let i = 0; i < set.east.length; i++) {
      if (set.mode[i] !== m) continue;
      const w = set.weight[i];
      samples++;
      w1 += w;
      w2 += w * w;
      se += w * set.east[i];
      sn += w * set.north[i];
    }
    if (samples === 0) return;
    const me = se / w1;
    const mn = sn / w1;
    let ee = 0;
    let nn = 0;
    let en = 0;
    for (let i = 0; i < set.east.length; i++) {
      if (set.mode[i] !== m) continue;
      const w = set.weight[i];
      const de = set.east[i] - me;
      const dn = set.north[i] - mn;
      ee += w * de * de;
      nn += w * dn * dn;
      en += w * de * dn;
    }
    // Unbiased for weights that are frequencies of importance (reliability weights): divide by
    // Σw − Σw²/Σw, which is n − 1 for equal weights.
    const denominator = w1 - w2 / w1;
    const scale = denominator > 0 ? 1 / denominator : 0;
    const varEast = ee * scale;
    const varNorth = nn * scale;
    const cov = en * scale;
    out.push({
      mode: name,
      samples,
      meanEast_m: me,
      meanNorth_m: mn,
      covariance: [
        [varEast, cov],
        [cov, varNorth],
      ],
      ellipses: levelEllipses(varEast, varNorth, cov, levels),
    });
  });
  return out;
}
