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
export class GustField {
  /** Node spacing, m: finer than the smallest vertical scale length that matters (L_w = h). */
  static readonly STEP = 2;

  /** Per-height tables shared by every sample of a scenario. */
  private readonly ratioU: Float64Array;
  private readonly phiU: Float64Array;
  private readonly phiW: Float64Array;
  private readonly tableLast: number;

  private east = new Float64Array(1024);
  private north = new Float64Array(1024);
  private vert = new Float64Array(1024);
  private generated = 0;
  private sigmaW = 0;
  private normal: () => number = () => 0;

  constructor(topHeight = 60_000) {
    const n = Math.ceil(topHeight / GustField.STEP) + 2;
    this.ratioU = new Float64Array(n);
    this.phiU = new Float64Array(n);
    this.phiW = new Float64Array(n);
    this.tableLast = n - 1;
    const p = { sigmaRatioU: 1, lengthU: 0, lengthW: 0 };
    for (let i = 0; i < n; i++) {
      drydenAt(i * GustField.STEP, p);
      this.ratioU[i] = p.sigmaRatioU;
      this.phiU[i] = Math.exp(-GustField.STEP / p.lengthU);
      this.phiW[i] = Math.exp(-GustField.STEP / p.lengthW);
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
    let x = height / GustField.STEP;
    if (!(x > 0)) x = 0;
    if (x >= this.tableLast) x = this.tableLast - 1e-9;
    const i = x | 0;
    if (i + 1 >= this.generated) this.generate(i + 2);
    const f = x - i;
    const s = this.sigmaW;
    out[0] += s * (this.east[i] + f * (this.east[i + 1] - this.east[i]));
    out[1] += s * (this.north[i] + f * (this.north[i + 1] - this.north[i]));
    out[2] += s * (this.vert[i] + f * (this.vert[i + 1] - this.vert[i]));
  }

  /** Generates nodes up to (not including) index `upto`. Values are stored already scaled by σ_u/σ_w. */
  private generate(upto: number): void {
    if (upto > this.east.length) this.grow(upto);
    const normal = this.normal;
    let k = this.generated;
    if (k === 0) {
      this.east[0] = this.ratioU[0] * normal();
      this.north[0] = this.ratioU[0] * normal();
      this.vert[0] = normal();
      k = 1;
    }
    for (; k < upto; k++) {
      const r0 = this.ratioU[k - 1];
      const r1 = this.ratioU[k];
      // Step the unit process, stored scaled: divide the previous node back to unit variance.
      this.east[k] = r1 * markovStep(this.east[k - 1] / r0, this.phiU[k - 1], normal());
      this.north[k] = r1 * markovStep(this.north[k - 1] / r0, this.phiU[k - 1], normal());
      this.vert[k] = markovStep(this.vert[k - 1], this.phiW[k - 1], normal());
    }
    this.generated = upto;
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
