/**
 * The analysis and the writing run in this thread, so a Ctrl-C pressed meanwhile waits in the
 * event loop: two turns (one is not enough) let it reach its handler; honour it before the
 * results appear.
 */
export async function honourInterrupt(signal: AbortSignal): Promise<void> {
  for (let turn = 0; turn < 2; turn++) await new Promise((resolve) => setImmediate(resolve));
  signal.throwIfAborted();
}
