import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/analysis/index.js';
import { makeRun, makeSite, mixtureSet } from './fixtures.js';

describe('keep-out zone: hulls of modes at or above 1 − level', () => {
  it('a mode of probability exactly 0.01 counts at level 0.99 (despite 1 − 0.99 > 0.01 in floating point)', () => {
    const set = mixtureSet('keepout-modes', [
      { name: 'nominal', probability: 0.99, samples: 3000, shape: { sigmaMajor: 40, sigmaMinor: 30, azimuthDeg: 0 } },
      { name: 'ballistic', probability: 0.01, samples: 200, shape: { sigmaMajor: 20, sigmaMinor: 20, azimuthDeg: 0, meanEast: 600 } },
    ]);
    const result = analyze(set, makeSite(), makeRun());
    expect(result.keepOut.properties.parts).toContain('convex hull of mode "ballistic"');
    // Every landing of a mode whose hull is in the zone is inside the zone.
    expect(result.keepOutOutside.samples).toBe(0);
  });

  it('a mode below 1 − level is left to the density region', () => {
    const set = mixtureSet('keepout-modes-rare', [
      { name: 'nominal', probability: 0.995, samples: 3000, shape: { sigmaMajor: 40, sigmaMinor: 30, azimuthDeg: 0 } },
      { name: 'ballistic', probability: 0.005, samples: 200, shape: { sigmaMajor: 20, sigmaMinor: 20, azimuthDeg: 0, meanEast: 600 } },
    ]);
    const result = analyze(set, makeSite(), makeRun());
    expect(result.keepOut.properties.parts).not.toContain('convex hull of mode "ballistic"');
  });
});
