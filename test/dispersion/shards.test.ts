import { describe, expect, it } from 'vitest';
import { orderShards, shardRange, ShardSetError } from '../../src/dispersion/shards.js';

// Contiguous, near-equal split by floor(S·k/N) bounds (common practice, no source).
describe('shardRange', () => {
  it('tiles every sample exactly once, in order, sizes within one', () => {
    for (const [samples, count] of [[10, 4], [7, 7], [1_000_003, 16], [5, 1]]) {
      let next = 0;
      const sizes: number[] = [];
      for (let index = 0; index < count; index++) {
        const [first, size] = shardRange(samples, { index, count });
        expect(first).toBe(next);
        next += size;
        sizes.push(size);
      }
      expect(next).toBe(samples);
      expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
    }
    expect(shardRange(10, { index: 1, count: 4 })).toEqual([2, 3]);
  });

  it('orderShards sorts pieces and refuses gaps, overlaps and another study', () => {
    const id = { scenarioHash: 'h', seed: 's', samples: 10 };
    const piece = (label: string, first: number, count: number, identity = id) => ({ label, identity, first, count, value: label });
    expect(orderShards([piece('b', 5, 5), piece('a', 0, 5)]).map((p) => p.label)).toEqual(['a', 'b']);
    expect(() => orderShards([piece('a', 0, 5)])).toThrow(/samples 5–9 of 10 are missing/);
    expect(() => orderShards([piece('a', 0, 6), piece('b', 5, 5)])).toThrow(/'b' repeats samples 5–5 already in 'a'/);
    expect(() => orderShards([piece('a', 0, 5), piece('b', 5, 5, { ...id, samples: 11 })])).toThrow(ShardSetError);
  });
});
