import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseScenario } from '../../src/scenario/load.js';
import { ScenarioError } from '../../src/scenario/errors.js';
import { hashScenario } from '../../src/scenario/hash.js';
import { readLandingsCsv, LandingsInputError } from '../../src/analysis/landings-input.js';
import { analyze } from '../../src/analysis/index.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { SCENARIOS } from '../cli/helpers.js';

/**
 * Fuzzing (fast-check, property-based testing): mutated scenarios and landing files must end as
 * an accepted input or an input error (what the command line turns into exit 0 or exit 2), never
 * any other exception (exit 1 with an internal message). Seeded, so a failure reproduces.
 */

const BASES = ['club-rocket.json', 'display-shell.json', 'drone-power-loss.json'].map((name) => JSON.parse(readFileSync(join(SCENARIOS, name), 'utf8')));
const INLINE_CURVE = [[0, 0], [0.05, 138], [0.5, 120], [1.2, 0]];
for (const b of BASES) if (typeof b.vehicle.motor?.thrust === 'string') b.vehicle.motor.thrust = INLINE_CURVE;

/** Every path to a value inside a JSON document. */
function paths(value: unknown, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(prefix);
  if (Array.isArray(value)) value.forEach((v, i) => paths(v, [...prefix, i], out));
  else if (value !== null && typeof value === 'object') for (const [k, v] of Object.entries(value)) paths(v, [...prefix, k], out);
  return out;
}

const hostileValue = fc.oneof(
  fc.constantFrom(1e308, -1e308, 1e-300, -0, 0, -1, Number.MAX_SAFE_INTEGER, 1e400, NaN, null, true, '', ' ', '1e400 m', '0x10 m', '-100 C', '12 furlongs', '5 %', '__proto__', '=1+2', 'a\u0001b', '\u{1F680}', [], {}, [[]], { __proto__: 1 }),
  fc.double(),
  fc.integer(),
  fc.string({ maxLength: 12 }),
  fc.jsonValue({ maxDepth: 3 }),
);

type Mutation = { kind: 'set' | 'delete' | 'key'; pick: number; value: unknown; key: string };
const mutation: fc.Arbitrary<Mutation> = fc.record({
  kind: fc.constantFrom('set', 'set', 'set', 'delete', 'key'),
  pick: fc.nat(),
  value: hostileValue,
  key: fc.constantFrom('__proto__', 'constructor', 'x', 'sd', 'limit', 'range', 'dragArea', 'descentRate', 'people'),
});

function mutate(base: unknown, mutations: Mutation[]): unknown {
  const doc = structuredClone(base) as Record<string, any>;
  for (const m of mutations) {
    const all = paths(doc).filter((p) => p.length > 0);
    if (all.length === 0) break;
    const path = all[m.pick % all.length]!;
    let parent: any = doc;
    for (const part of path.slice(0, -1)) parent = parent[part];
    const last = path[path.length - 1]!;
    if (m.kind === 'delete') Array.isArray(parent) ? parent.splice(Number(last), 1) : delete parent[last];
    else if (m.kind === 'key') {
      const target = parent[last];
      if (target !== null && typeof target === 'object' && !Array.isArray(target)) Object.defineProperty(target, m.key, { value: m.value, enumerable: true, configurable: true, writable: true });
    } else parent[last] = structuredClone(m.value);
  }
  return doc;
}

/** 0: accepted, 2: an input error; anything else is rethrown and fails the property. */
function outcome(json: unknown): 0 | 2 {
  try {
    const { scenario } = parseScenario(JSON.parse(JSON.stringify(json) ?? 'null'));
    hashScenario(scenario);
    return 0;
  } catch (error) {
    if (error instanceof ScenarioError) {
      expect(error.message).not.toMatch(/\n\s+at /);
      return 2;
    }
    throw error;
  }
}

describe('fuzz: the scenario validator', () => {
  it('2,000 mutated scenarios each end accepted or as an input error', () => {
    const started = Date.now();
    const seen = { 0: 0, 2: 0 };
    fc.assert(
      fc.property(fc.nat(BASES.length - 1), fc.array(mutation, { minLength: 1, maxLength: 4 }), (b, ms) => {
        seen[outcome(mutate(BASES[b], ms))]++;
      }),
      { numRuns: 2000, seed: 11 },
    );
    // Both outcomes occur, so the mutations neither break everything nor nothing.
    expect(seen[0]).toBeGreaterThan(100);
    expect(seen[2]).toBeGreaterThan(700);
    expect(Date.now() - started).toBeLessThan(20_000);
  }, 30_000);
});

describe('fuzz: analyze\'s reader', () => {
  const frame = createLocalFrame({ lat: 47, lon: 8 });
  const cell = fc.oneof(
    fc.constantFrom('0', '-0', '1e308', '1e-300', '0x10', '', ' ', 'NaN', 'Infinity', '1e400', '"', '""', '=1+2', "'=1", '12345678901234567890', '4294967296', '-1', '1,5', '\u0001'),
    fc.double({ noNaN: false }).map(String),
    fc.integer({ min: -2000, max: 2000 }).map(String),
    fc.string({ maxLength: 6 }),
  );
  const header = fc.shuffledSubarray(['east_m', 'north_m', 'lat', 'lon', 'mode', 'weight', 'sample', 'other'], { minLength: 1 });

  it('1,500 generated landing files each read and analyse, or give a line-numbered input error', () => {
    const started = Date.now();
    let read = 0;
    fc.assert(
      fc.property(header, fc.array(fc.array(cell, { minLength: 1, maxLength: 8 }), { minLength: 0, maxLength: 30 }), fc.boolean(), fc.boolean(), (head, rows, plain, crlf) => {
        // Half the files have east_m,north_m first with sensible numbers in them, so that the
        // analysis runs too on whatever the other columns hold.
        const columns = plain ? ['east_m', 'north_m', ...head.filter((h) => h !== 'east_m' && h !== 'north_m' && h !== 'lat' && h !== 'lon')] : head;
        const body = (plain ? [...rows, ...Array.from({ length: 10 }, () => [])] : rows).map((r, i) =>
          (plain ? [String((i * 37) % 101), String((i * 11) % 23), ...r.slice(0, columns.length - 2)] : r).join(','),
        );
        const text = [columns.join(','), ...body].join(crlf ? '\r\n' : '\n');
        let set;
        try {
          set = readLandingsCsv(text, frame);
        } catch (error) {
          if (error instanceof LandingsInputError) return;
          throw error;
        }
        read++;
        analyze(set, { pad: { lat: 47, lon: 8, elevation: 0 }, areas: [] }, { samples: 0, seed: '', levels: [0.5, 0.9, 0.99], keepOut: { level: 0.99, margin: 25 } });
      }),
      { numRuns: 1500, seed: 11 },
    );
    expect(read).toBeGreaterThan(50);
    expect(Date.now() - started).toBeLessThan(20_000);
  }, 30_000);
});
