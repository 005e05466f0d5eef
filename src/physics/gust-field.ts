import { drydenAt, markovStep } from './dryden.js';

/**
 * One sample's turbulence as a frozen field in altitude: three unit-variance Gauss–Markov
 * processes along height (east, north, vertical), scaled by the Dryden intensities.
 *
 * Why altitude: a rising rocket or a falling parachute crosses the air mostly vertically, so the
 * correlation time it sees is L / V with V its speed through the air, as the Dryden form requires
 * (frozen turbulence). The field is a pure function of height, which keeps the equations of motion
 * deterministic for the adaptive integrator however it steps back and forth.
 *
 * Nodes are generated lazily from the ground up, only as high as the flight goes, from the sample's
 * own random stream. Buffers are reused between samples; they only grow.
 */
const STEP = 10;
const INV_STEP = 1 / STEP;

export class GustField {
  /**
   * Node spacing, m. The field between nodes is a cubic B-spline of the node values: C², so the
   * adaptive integrator takes smooth steps through it instead of stopping at every kink of a
   * piecewise-linear path. Scales shorter than a few node spacings (the vertical component within
   * a few metres of the ground) are smoothed away; they average out over a descent anyway.
   */
  static readonly STEP = STEP;

  /** Per-node tables shared by every sample of a scenario. Node k sits at height (k − 1)·STEP. */
  private readonly ratioU: Float64Array;
  private readonly phiU: Float64Array;
  private readonly phiW: Float64Array;
  /** Restores the unit variance the spline's averaging of neighbouring nodes takes away. */
  private readonly gainU: Float64Array;
  private readonly gainW: Float64Array;
  private readonly nodeLast: number;

  private east = new Float64Array(1024);
  private north = new Float64Array(1024);
  private vert = new Float64Array(1024);
  private generated = 0;
  private sigmaW = 0;
  private normal: () => number = () => 0;

  constructor(topHeight = 60_000) {
    const n = Math.ceil(topHeight / STEP) + 4;
    this.ratioU = new Float64Array(n);
    this.phiU = new Float64Array(n);
    this.phiW = new Float64Array(n);
    this.gainU = new Float64Array(n);
    this.gainW = new Float64Array(n);
    this.nodeLast = n - 1;
    const p = { sigmaRatioU: 1, lengthU: 0, lengthW: 0 };
    for (let k = 0; k < n; k++) {
      drydenAt(Math.max(0, (k - 1) * STEP), p);
      this.ratioU[k] = p.sigmaRatioU;
      this.phiU[k] = Math.exp(-STEP / p.lengthU);
      this.phiW[k] = Math.exp(-STEP / p.lengthW);
      this.gainU[k] = splineGain(this.phiU[k]);
      this.gainW[k] = splineGain(this.phiW[k]);
    }
  }

  /** Starts a new sample. σ_w = 0 turns turbulence off. `normal` draws N(0, 1) from the sample's stream. */
  reset(sigmaW: number, normal: () => number): void {
    this.sigmaW = sigmaW;
    this.normal = normal;
    this.generated = 0;
  }

  get enabled(): boolean {
    return this.sigmaW > 0;
  }

  /** Adds the gust at `height` (m above ground) to out[0..2] (east, north, up). */
  addAt(height: number, out: Float64Array): void {
    if (this.sigmaW <= 0) return;
    let x = height * INV_STEP;
    if (!(x > 0)) x = 0;
    if (x > this.nodeLast - 3) x = this.nodeLast - 3;
    const i = x | 0; // spline segment: nodes i .. i + 3 (heights (i − 1)·STEP .. (i + 2)·STEP)
    if (i + 4 > this.generated) this.generate(i + 4);
    const f = x - i;
    const f2 = f * f;
    const f3 = f2 * f;
    const g = 1 - f;
    const b0 = (g * g * g) / 6;
    const b1 = (3 * f3 - 6 * f2 + 4) / 6;
    const b2 = (-3 * f3 + 3 * f2 + 3 * f + 1) / 6;
    const b3 = f3 / 6;
    const s = this.sigmaW;
    const e = this.east, n = this.north, v = this.vert;
    out[0] += s * (b0 * e[i] + b1 * e[i + 1] + b2 * e[i + 2] + b3 * e[i + 3]);
    out[1] += s * (b0 * n[i] + b1 * n[i + 1] + b2 * n[i + 2] + b3 * n[i + 3]);
    out[2] += s * (b0 * v[i] + b1 * v[i + 1] + b2 * v[i + 2] + b3 * v[i + 3]);
  }

  /** Adds d/d(height) of the gust at `height` (1/s) to out[0..2]; 0 where the field is held. */
  addSlopeAt(height: number, out: Float64Array): void {
    if (this.sigmaW <= 0) return;
    const x = height * INV_STEP;
    if (!(x > 0) || x > this.nodeLast - 3) return;
    const i = x | 0;
    if (i + 4 > this.generated) this.generate(i + 4);
    const f = x - i;
    const g = 1 - f;
    // Derivatives of the B-spline weights in f, times df/dz = 1 / STEP.
    const d0 = -0.5 * g * g;
    const d1 = 1.5 * f * f - 2 * f;
    const d2 = -1.5 * f * f + f + 0.5;
    const d3 = 0.5 * f * f;
    const s = this.sigmaW * INV_STEP;
    const e = this.east, n = this.north, v = this.vert;
    out[0] += s * (d0 * e[i] + d1 * e[i + 1] + d2 * e[i + 2] + d3 * e[i + 3]);
    out[1] += s * (d0 * n[i] + d1 * n[i + 1] + d2 * n[i + 2] + d3 * n[i + 3]);
    out[2] += s * (d0 * v[i] + d1 * v[i + 1] + d2 * v[i + 2] + d3 * v[i + 3]);
  }

  /**
   * Generates nodes up to (not including) index `upto`: unit Gauss–Markov processes along height,
   * stored multiplied by the local σ ratio and spline gain.
   */
  private generate(upto: number): void {
    if (upto > this.east.length) this.grow(upto);
    const normal = this.normal;
    let k = this.generated;
    if (k === 0) {
      this.east[0] = this.scaleU(0) * normal();
      this.north[0] = this.scaleU(0) * normal();
      this.vert[0] = this.gainW[0] * normal();
      k = 1;
    }
    for (; k < upto; k++) {
      const back = 1 / this.scaleU(k - 1);
      const here = this.scaleU(k);
      this.east[k] = here * markovStep(this.east[k - 1] * back, this.phiU[k - 1], normal());
      this.north[k] = here * markovStep(this.north[k - 1] * back, this.phiU[k - 1], normal());
      this.vert[k] = this.gainW[k] * markovStep(this.vert[k - 1] / this.gainW[k - 1], this.phiW[k - 1], normal());
    }
    this.generated = upto;
  }

  private scaleU(k: number): number {
    return this.ratioU[k] * this.gainU[k];
  }

  private grow(minimum: number): void {
    const size = Math.max(minimum, this.east.length * 2);
    const e = new Float64Array(size);
    const n = new Float64Array(size);
    const v = new Float64Array(size);
    e.set(this.east.subarray(0, this.generated));
    n.set(this.north.subarray(0, this.generated));
    v.set(this.vert.subarray(0, this.generated));
    this.east = e;
    this.north = n;
    this.vert = v;
  }
}

/**
 * 1 / standard deviation of a cubic B-spline at a node, for unit-variance node values with
 * neighbour correlation φ: the weights (1, 4, 1)/6 give variance (18 + 16φ + 2φ²)/36.
 */
function splineGain(phi: number): number {
  return 1 / Math.sqrt((18 + 16 * phi + 2 * phi * phi) / 36);
}
