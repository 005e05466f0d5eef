import seedrandom from 'seedrandom';

/**
 * A sample's own random stream, derived from (seed, sample index) alone, so a sample draws the
 * same numbers whichever worker flies it and however the run is split.
 */
export class SampleStream {
  private prng: () => number = Math.random;
  private spare = NaN;

  /** Points the stream at sample `index` of the run seeded with `seed`. */
  select(seed: string, index: number): void {
    this.prng = seedrandom.alea(`${seed}\u241f${index}`);
    this.spare = NaN;
  }

  /** Uniform on (0, 1): never exactly 0, so it can feed an inverse CDF. */
  uniform(): number {
    let u = this.prng();
    while (u === 0) u = this.prng();
    return u;
  }

  /** Standard normal by the Marsaglia polar method (pairs; the second value is kept for the next call). */
  normal(): number {
    if (this.spare === this.spare) {
      const s = this.spare;
      this.spare = NaN;
      return s;
    }
    let x: number, y: number, r: number;
    do {
      x = 2 * this.prng() - 1;
      y = 2 * this.prng() - 1;
      r = x * x + y * y;
    } while (r >= 1 || r === 0);
    const f = Math.sqrt((-2 * Math.log(r)) / r);
    this.spare = y * f;
    return x * f;
  }
}
