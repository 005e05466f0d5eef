import { describe, expect, it } from 'vitest';
import seedrandom from 'seedrandom';
import { SampleStream } from '../../src/dispersion/random.js';

// The stream is Alea (J. Baagøe, 2010) as the seedrandom package (3.0.5) implements it; the
// reference is that package itself, keyed the way the runs always keyed it.
describe('SampleStream', () => {
  it('gives exactly the numbers of seedrandom.alea keyed with seed ␟ index', () => {
    const stream = new SampleStream();
    for (const seed of ['harrowmere-1', '', 'ünïcode ✓', '42']) {
      for (const index of [0, 1, 9, 10, 99, 12_345, 999_999, 9_999_999, 2 ** 31 + 7]) {
        const reference = seedrandom.alea(`${seed}\u241f${index}`);
        stream.select(seed, index);
        for (let k = 0; k < 50; k++) {
          let u = reference();
          while (u === 0) u = reference();
          expect(stream.uniform()).toBe(u);
        }
      }
    }
  });

  it('normal() pairs follow the Marsaglia polar method on the same uniforms', () => {
    const stream = new SampleStream();
    stream.select('s', 3);
    const reference = seedrandom.alea('s\u241f3');
    let x: number, y: number, r: number;
    do {
      x = 2 * reference() - 1;
      y = 2 * reference() - 1;
      r = x * x + y * y;
    } while (r >= 1 || r === 0);
    const f = Math.sqrt((-2 * Math.log(r)) / r);
    expect(stream.normal()).toBe(x * f);
    expect(stream.normal()).toBe(y * f);
  });
});
