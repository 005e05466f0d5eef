import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { canonicalJson, hashScenario, scenarioHash, sha256Hex } from '../../src/scenario/hash.js';
import { parseScenario } from '../../src/scenario/load.js';
import { fixture } from './helpers.js';

describe('SHA-256', () => {
  // Test vectors: FIPS 180-2 (2002), Appendix B.1 and B.2; the empty-string digest from NIST's
  // published SHA-256 examples (from memory).
  it.each([
    ['abc', 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'],
    ['abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq', '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'],
    ['', 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855'],
  ])('hashes %j', (text, digest) => {
    expect(scenarioHash(text)).toBe(digest);
  });

  it('agrees with node:crypto on any text, including block-boundary lengths and non-ASCII (property)', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 300 }), fc.string({ unit: 'binary', maxLength: 130 })), (text) => {
        return scenarioHash(text) === createHash('sha256').update(text, 'utf8').digest('hex');
      }),
      { numRuns: 300 },
    );
    for (const n of [55, 56, 63, 64, 65, 119, 120, 1000]) {
      const bytes = new Uint8Array(n).fill(0x61);
      expect(sha256Hex(bytes)).toBe(createHash('sha256').update(bytes).digest('hex'));
    }
  });
});

describe('scenario hash', () => {
  it('writes canonical JSON with sorted keys and no undefined members', () => {
    expect(canonicalJson({ b: 1, a: { d: [2, { z: 1, y: undefined }], c: 'x' } })).toBe('{"a":{"c":"x","d":[2,{"z":1}]},"b":1}');
  });

  it('is the same for two files that say the same thing in different words', () => {
    const a = fixture('minimal-rocket.json');
    const b = fixture('minimal-rocket.json');
    b.weather = { wind: { from: 270, speed: 5.36448, height: '10 m' } }; // same values, other order and spelling
    b.launch.tilt = 5;
    expect(hashScenario(parseScenario(b).scenario)).toBe(hashScenario(parseScenario(a).scenario));
  });

  it('changes when any value changes', () => {
    const a = fixture('minimal-rocket.json');
    const b = fixture('minimal-rocket.json');
    b.run = { seed: 2 };
    expect(hashScenario(parseScenario(b).scenario)).not.toBe(hashScenario(parseScenario(a).scenario));
  });
});
