import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { dragAreaForDescentRate } from '../../src/scenario/normalize.js';
import { railExitSpeedWarnings, scenarioWarnings, WARNING_LIMITS } from '../../src/scenario/warnings.js';
import { fixture } from './helpers.js';

/**
 * Thresholds are facts of the trade (common practice, no source): rails within about 20° of
 * vertical, launches called off above about 9 m/s surface wind, descent rates between about
 * 3 and 40 m/s, rail exit at 15 m/s or more.
 */
function warningsFor(change: (s: Record<string, any>) => void) {
  const s = fixture('minimal-rocket.json');
  change(s);
  // The point-mass warning of a rocket without a shape has its own test (shape.test.ts).
  return parseScenario(s).warnings.filter((w) => w.path !== 'vehicle.shape');
}

const paths = (issues: Array<{ path: string }>) => issues.map((i) => i.path);

describe('warnings at their thresholds', () => {
  it('rail tilt: none at 20 deg, one just above', () => {
    expect(warningsFor((s) => (s.launch.tilt = 20))).toEqual([]);
    const over = warningsFor((s) => (s.launch.tilt = 20.5));
    expect(paths(over)).toEqual(['launch.tilt']);
    expect(over[0]!.message).toContain('20.5 deg is more than the 20 deg');
  });

  it('surface wind: none at 9 m/s, one just above', () => {
    expect(warningsFor((s) => (s.weather.wind.speed = 9))).toEqual([]);
    const over = warningsFor((s) => (s.weather.wind.speed = '21 mph')); // 9.39 m/s
    expect(paths(over)).toEqual(['weather.wind.speed']);
    expect(over[0]!.message).toContain('9.38784 m/s is above the 9 m/s');
  });

  it('descent rate as given: none at 3 and 40 m/s, one outside either end', () => {
    expect(warningsFor((s) => ((s.recovery[0].descentRate = 40), (s.recovery[1].descentRate = 3)))).toEqual([]);
    const slow = warningsFor((s) => (s.recovery[1].descentRate = 2.9));
    expect(paths(slow)).toEqual(['recovery[1].descentRate']);
    expect(slow[0]!.message).toContain("2.9 m/s is below 3 m/s; the 'main' stage");
    const fast = warningsFor((s) => (s.recovery[0].descentRate = 41));
    expect(paths(fast)).toEqual(['recovery[0].descentRate']);
    expect(fast[0]!.message).toContain('above 40 m/s');
  });

  it('descent rate implied by a drag area', () => {
    const mass = 3.5 * 0.45359237;
    const slow = warningsFor((s) => {
      delete s.recovery[1].descentRate;
      s.recovery[1].dragArea = dragAreaForDescentRate(mass, 2);
    });
    expect(paths(slow)).toEqual(['recovery[1].dragArea']);
    expect(slow[0]!.message).toMatch(/gives a sea-level descent rate of 2 m\/s, which is below 3 m\/s/);
    const fine = warningsFor((s) => {
      delete s.recovery[1].descentRate;
      s.recovery[1].dragArea = dragAreaForDescentRate(mass, 5);
    });
    expect(fine).toEqual([]);
  });

  it('reports several warnings together', () => {
    const all = warningsFor((s) => {
      s.launch.tilt = 30;
      s.weather.wind.speed = 12;
      s.recovery[1].descentRate = 1;
    });
    expect(paths(all)).toEqual(['launch.tilt', 'weather.wind.speed', 'recovery[1].descentRate']);
  });

  it('gives no tilt warning to a projectile (it has no rail)', () => {
    const s = fixture('minimal-rocket.json');
    s.vehicle = { kind: 'projectile', mass: 1, diameter: 0.05, drag: 0.3 };
    delete s.recovery;
    s.launch = { speed: 50, elevation: 80, azimuth: 0 };
    expect(scenarioWarnings(parseScenario(s).scenario)).toEqual([]);
  });

  it('rail exit speed: none at 15 m/s, one just below', () => {
    const { scenario } = parseScenario(fixture('minimal-rocket.json'));
    expect(railExitSpeedWarnings(scenario, WARNING_LIMITS.minRailExitSpeed)).toEqual([]);
    expect(paths(railExitSpeedWarnings(scenario, 14.9))).toEqual(['launch.rail']);
  });
});
