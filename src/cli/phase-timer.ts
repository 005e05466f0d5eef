/**
 * Main-thread phases of a command, printed to stderr when STREWN_TIMING=1 (for `npm run bench`
 * and anyone asking where the time goes): `strewn-phase NAME MS`, one line a phase.
 */
export class PhaseTimer {
  // The first phase runs from the start of the process (performance.timeOrigin), module loading included.
  private mark = 0;
  private readonly on = process.env.STREWN_TIMING === '1';

  /** Ends the phase running since the last call and names it. */
  lap(name: string): void {
    const now = performance.now();
    if (this.on) process.stderr.write(`strewn-phase ${name} ${(now - this.mark).toFixed(1)}\n`);
    this.mark = now;
  }
}

