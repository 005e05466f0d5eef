/** A chunk failed on its first worker and again on a fresh one: the run cannot finish. */
export class ChunkFailedError extends Error {
  readonly start: number;
  readonly count: number;

  constructor(start: number, count: number, first: unknown, second: unknown) {
    const last = start + count - 1;
    const a = causeText(first);
    const b = causeText(second);
    const causes = a === b ? `both times: ${b}` : `first: ${a}; then: ${b}`;
    super(`samples ${start} to ${last} failed twice, on two workers (${causes})`);
    this.name = 'ChunkFailedError';
    this.start = start;
    this.count = count;
  }
}

export function causeText(cause: unknown): string {
  if (cause instanceof Error) return cause.message || cause.name;
  return String(cause);
}

/** The error a cancelled run ends with when the signal gives no reason of its own. */
export function cancelledError(): Error {
  return Object.assign(new Error('cancelled'), { name: 'AbortError' });
}
