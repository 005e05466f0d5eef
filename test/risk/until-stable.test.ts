import { describe, expect, it } from 'vitest';
import { STABLE_TOLERANCE, untilStable } from '../../src/risk/until-stable.js';

// The stopping rule the issue sets (common practice, no source): double the samples until the
// line's farthest reach moves less than 2 % between rounds (and the line is resolved), or the cap.
describe('--until-stable rounds', () => {
  it('stops once the reach moves less than 2 % and the line is resolved, doubling the samples each round', async () => {
    const reach: Record<number, number> = { 1000: 400, 2000: 330, 4000: 310, 8000: 306, 16000: 305.5 };
    const resolvedFrom = 8000;
    const r = await untilStable(1000, 1_000_000, async (n) => ({ outcome: n, reach: reach[n], resolved: n >= resolvedFrom }));
    expect(r.rounds.map((x) => x.samples)).toEqual([1000, 2000, 4000, 8000]);
    expect(r.stopped).toBe('stable');
    expect(r.outcome).toBe(8000);
    expect(r.rounds[3].moved!).toBeLessThan(STABLE_TOLERANCE);
    expect(r.rounds[2].moved!).toBeGreaterThan(STABLE_TOLERANCE);
  });

  it('two rounds that agree by chance do not stop it while the line is unresolved', async () => {
    const r = await untilStable(1000, 4000, async (n) => ({ outcome: n, reach: 300, resolved: false }));
    expect(r.stopped).toBe('cap');
    expect(r.rounds.map((x) => x.samples)).toEqual([1000, 2000, 4000]);
  });

  it('stops at the cap and says so when the reach keeps moving', async () => {
    const r = await untilStable(1000, 5000, async (n) => ({ outcome: n, reach: n / 10, resolved: true }));
    expect(r.stopped).toBe('cap');
    expect(r.rounds[r.rounds.length - 1].samples).toBe(4000);
  });
});
