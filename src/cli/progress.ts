import type { Progress } from '../dispersion/execute.js';

/** A one-line progress bar on stderr, drawn only when stderr is a terminal. */
export function progressBar(stream: NodeJS.WriteStream, enabled: boolean): { update(p: Progress): void; end(): void } {
  let active = enabled && stream.isTTY === true;
  let last = 0;
  return {
    update(p: Progress) {
      if (!active) return;
      const now = Date.now();
      if (now - last < 100 && p.done < p.total) return;
      last = now;
      const width = 30;
      const filled = Math.round((p.done / p.total) * width);
      const bar = '#'.repeat(filled) + '.'.repeat(width - filled);
      const pct = ((100 * p.done) / p.total).toFixed(0).padStart(3);
      stream.write(`\r[${bar}] ${pct}%  ${p.done.toLocaleString('en')} / ${p.total.toLocaleString('en')}  ${Math.round(p.rate).toLocaleString('en')} flights/s `);
    },
    /** Clears the bar; only the first call writes anything. */
    end() {
      if (active) stream.write('\r' + ' '.repeat(90) + '\r');
      active = false;
    },
  };
}
