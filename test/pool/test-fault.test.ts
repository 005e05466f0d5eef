import { describe, expect, it } from 'vitest';
import { faultHits, parseTestFault } from '../../workers/test-fault.js';

describe('STREWN_TEST_FAULT', () => {
  it('is off when unset or empty', () => {
    expect(parseTestFault(undefined)).toBeNull();
    expect(parseTestFault('')).toBeNull();
  });

  it('reads the kind, the sample and the attempts it affects', () => {
    expect(parseTestFault('exit@1234')).toEqual({ kind: 'exit', sample: 1234, attempts: 1 });
    expect(parseTestFault('throw@0x2')).toEqual({ kind: 'throw', sample: 0, attempts: 2 });
  });

  it.each(['boom@3', 'exit@', 'exit@-1', 'exit@12x0', 'exit@1.5', 'throw 12'])('rejects %s with a message saying what is expected', (text) => {
    expect(() => parseTestFault(text)).toThrow(`STREWN_TEST_FAULT: '${text}' is not a fault; expected exit@SAMPLE or throw@SAMPLE`);
  });

  it('hits only the chunk holding the sample, and only its first attempts', () => {
    const fault = parseTestFault('throw@100x2');
    expect(faultHits(fault, 100, 1, 0)).toBe(true);
    expect(faultHits(fault, 50, 51, 1)).toBe(true);
    expect(faultHits(fault, 50, 51, 2)).toBe(false);
    expect(faultHits(fault, 50, 50, 0)).toBe(false);
    expect(faultHits(fault, 101, 10, 0)).toBe(false);
    expect(faultHits(null, 0, 1000, 0)).toBe(false);
  });
});
