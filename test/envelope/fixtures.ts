import type { DirectionLimit, EnvelopeResult } from '../../src/envelope/envelope.js';
import { rangeValues } from '../../src/envelope/grid.js';

/**
 * An envelope result made up for drawing tests (nothing is flown): limits follow `limitOf`, a
 * limit at the top of the grid counts as passing the whole grid, a null limit fails at once.
 */
export function madeUpEnvelope(options: {
  directions?: string;
  speeds?: string;
  name?: string;
  forecast?: { from: number; speed: number };
  limitOf?: (from: number, i: number) => number | null;
}): EnvelopeResult {
  const directions = rangeValues(options.directions ?? '0:330:30') as number[];
  const speeds = rangeValues(options.speeds ?? '0:14:1') as number[];
  const top = speeds[speeds.length - 1];
  const limitOf = options.limitOf ?? ((from: number) => Math.round(4 + 4 * Math.cos((from * Math.PI) / 180)));
  const limits: DirectionLimit[] = directions.map((from, i) => {
    const limit = limitOf(from, i);
    const aboveGrid = limit !== null && limit >= top;
    return {
      from,
      limit,
      aboveGrid,
      firstFailure: aboveGrid ? [] : i % 2 === 0 ? ['site boundary'] : ['spectators: Spectator line', 'building: Brookside farmhouse'],
      cases: [],
    };
  });
  return {
    name: options.name ?? 'Made-up field',
    samples: 200,
    seed: 'drawing',
    directions,
    speeds,
    method: 'bisection',
    forecast: options.forecast ?? { from: 250, speed: 4.9 },
    limits,
    casesFlown: directions.length * 5,
    elapsed_s: 1,
  };
}
