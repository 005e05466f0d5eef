/**
 * A sample's own random stream, derived from (seed, sample index) alone, so a sample draws the
 * same numbers whichever worker flies it and however the run is split.
 *
 * The stream is Alea (J. Baagøe, 2010) keyed with the text `${seed}\u241f${index}`, exactly as
 * `seedrandom.alea` computes it. It is written out here, rather than called from seedrandom,
 * because seedrandom builds a new generator (closures, a hash function and the key text) for
 * every call, and a run keys one generator per flight: this version keeps the three-number state
 * in fields and hashes the key straight from the seed text and the index digits, allocating
 * nothing. A test checks it against seedrandom.alea number for number.
 */

const TWO_POW_M32 = 2.3283064365386963e-10; // 2^-32
const SEPARATOR = 0x241f;

export class SampleStream {
  private s0 = 0;
  private s1 = 0;
  private s2 = 0;
  private c = 1;
  private spare = NaN;
  /** Mash state (Alea's key hash). */
  private n = 0;
  private readonly digits = new Uint8Array(20);
  private digitCount = 0;

  /** Points the stream at sample `index` of the run seeded with `seed`. */
  select(seed: string, index: number): void {
    // Decimal digits of the index, most significant first (as String(index) would give them).
    let count = 0;
    let rest = index;
    do {
      this.digits[count++] = 48 + (rest % 10);
      rest = Math.floor(rest / 10);
    } while (rest > 0);
    // Reversed in place (a subarray view would be a new object per sample).
    const d = this.digits;
    for (let i = 0, j = count - 1; i < j; i++, j--) {
      const c = d[i];
      d[i] = d[j];
      d[j] = c;
    }
    this.digitCount = count;

    this.n = 0xefc8249d;
    let s0 = this.mashSpace();
    let s1 = this.mashSpace();
    let s2 = this.mashSpace();
    s0 -= this.mashKey(seed);
    if (s0 < 0) s0 += 1;
    s1 -= this.mashKey(seed);
    if (s1 < 0) s1 += 1;
    s2 -= this.mashKey(seed);
    if (s2 < 0) s2 += 1;
    this.s0 = s0;
    this.s1 = s1;
    this.s2 = s2;
    this.c = 1;
    this.spare = NaN;
  }

  /** Alea's next number in [0, 1). */
  private next(): number {
    const t = 2091639 * this.s0 + this.c * TWO_POW_M32;
    this.s0 = this.s1;
    this.s1 = this.s2;
    this.c = t | 0;
    return (this.s2 = t - this.c);
  }

  /** One character through Mash. */
  private mashChar(code: number): void {
    let n = this.n + code;
    let h = 0.02519603282416938 * n;
    n = h >>> 0;
    h -= n;
    h *= n;
    n = h >>> 0;
    h -= n;
    this.n = n + h * 0x100000000;
  }

  private mashSpace(): number {
    this.mashChar(32);
    return (this.n >>> 0) * TWO_POW_M32;
  }

  /** Mash of the key text `${seed}\u241f${index}`, without building it. */
  private mashKey(seed: string): number {
    for (let i = 0; i < seed.length; i++) this.mashChar(seed.charCodeAt(i));
    this.mashChar(SEPARATOR);
    for (let i = 0; i < this.digitCount; i++) this.mashChar(this.digits[i]);
    return (this.n >>> 0) * TWO_POW_M32;
  }

  /** Uniform on (0, 1): never exactly 0, so it can feed an inverse CDF. */
  uniform(): number {
    let u = this.next();
    while (u === 0) u = this.next();
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
      x = 2 * this.next() - 1;
      y = 2 * this.next() - 1;
      r = x * x + y * y;
    } while (r >= 1 || r === 0);
    const f = Math.sqrt((-2 * Math.log(r)) / r);
    this.spare = y * f;
    return x * f;
  }
}
