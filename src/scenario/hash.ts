import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';
import type { Scenario } from './types.js';

/**
 * Scenario fingerprints. Synchronous and without node:crypto, so the command line and the browser
 * compute the same hash from the same code.
 */

/** SHA-256 (FIPS 180-4) of the UTF-8 bytes of `text`, as 64 lowercase hex digits. */
export function scenarioHash(text: string): string {
  return sha256Hex(new TextEncoder().encode(text));
}

/** The hash reports carry: SHA-256 of the canonical JSON of the normalised scenario. */
export function hashScenario(scenario: Scenario): string {
  // How results are shown (run.units, run.paper) does not change what is computed.
  const { units: _units, paper: _paper, ...run } = scenario.run;
  return scenarioHash(canonicalJson({ ...scenario, run }));
}

/**
 * JSON with object keys sorted and `undefined` members dropped, no whitespace. Two scenarios that
 * mean the same thing normalise to the same object, and this makes them the same text.
 */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(sortKeys(value));
}

function sortKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortKeys);
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const key of Object.keys(value).sort()) {
      const member = (value as Record<string, unknown>)[key];
      if (member !== undefined) out[key] = sortKeys(member);
    }
    return out;
  }
  return value;
}

/** SHA-256 of bytes as 64 lowercase hex digits (@noble/hashes: audited, synchronous, browser-safe). */
export function sha256Hex(bytes: Uint8Array): string {
  return bytesToHex(sha256(bytes));
}
