/**
 * A fault that tests inject into workers to prove that failed chunks are retried: set
 * STREWN_TEST_FAULT to `exit@1234` (the worker thread ends itself) or `throw@1234` (the chunk call
 * throws) when it reaches sample 1234, on the chunk's first attempt. `exit@1234x2` faults on the
 * first two attempts, i.e. also on the retry.
 */
export interface TestFault {
  kind: 'exit' | 'throw';
  sample: number;
  /** How many attempts at the chunk holding `sample` fail (attempts count from 0). */
  attempts: number;
}

export const TEST_FAULT_VARIABLE = 'STREWN_TEST_FAULT';

/** Reads the fault; an unset or empty variable means none. A malformed one is an error, not ignored. */
export function parseTestFault(text: string | undefined): TestFault | null {
  if (text === undefined || text === '') return null;
  const match = /^(exit|throw)@(\d+)(?:x(\d+))?$/.exec(text.trim());
  const attempts = match?.[3] === undefined ? 1 : Number(match[3]);
  if (!match || !Number.isSafeInteger(Number(match[2])) || attempts < 1) {
    throw new Error(`${TEST_FAULT_VARIABLE}: '${text}' is not a fault; expected exit@SAMPLE or throw@SAMPLE, optionally followed by xATTEMPTS (at least 1)`);
  }
  return { kind: match[1] as TestFault['kind'], sample: Number(match[2]), attempts };
}

/** Whether this attempt at samples [start, start + count) is to fail. */
export function faultHits(fault: TestFault | null, start: number, count: number, attempt: number): fault is TestFault {
  return fault !== null && attempt < fault.attempts && fault.sample >= start && fault.sample < start + count;
}
