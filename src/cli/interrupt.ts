/**
 * Turns Ctrl-C (SIGINT) and SIGTERM into an aborted signal for the duration of a command, so the
 * pool stops its workers and the command leaves nothing behind. `dispose` restores the defaults.
 */
export function interruptSignal(): { signal: AbortSignal; dispose(): void } {
  const controller = new AbortController();
  const onSignal = () => controller.abort(Object.assign(new Error('cancelled'), { name: 'AbortError' }));
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  return {
    signal: controller.signal,
    dispose() {
      process.off('SIGINT', onSignal);
      process.off('SIGTERM', onSignal);
    },
  };
}

/** Options every command that flies a study takes (see each command's help). */
export const STUDY_OPTIONS = {
  samples: { type: 'string' },
  seed: { type: 'string' },
  workers: { type: 'string' },
  out: { type: 'string' },
  force: { type: 'boolean' },
  quiet: { type: 'boolean' },
  json: { type: 'boolean' },
  'allow-outside-files': { type: 'boolean' },
} as const;
