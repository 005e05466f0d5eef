import type { Scenario } from '../scenario/types.js';

/**
 * The scenario with its mean wind replaced by one point of the envelope grid. The gust keeps its
 * ratio to the mean wind (a gusty day stays as gusty in stronger wind); a profile is scaled by the
 * new speed and turned by the new direction, as a spread would do. Every spread and failure mode
 * is kept, and the seed is shared by every grid point, so all points see the same random numbers.
 */
export function windCase(scenario: Scenario, from: number, speed: number): Scenario {
  const wind = scenario.weather.wind;
  const gustRatio = wind.gust !== undefined && wind.speed > 0 ? wind.gust / wind.speed : undefined;
  const turn = from - wind.from;
  const scale = wind.speed > 0 ? speed / wind.speed : 1;
  return {
    ...scenario,
    weather: {
      ...scenario.weather,
      wind: {
        ...wind,
        speed,
        from,
        gust: gustRatio !== undefined ? speed * gustRatio : wind.gust !== undefined ? speed + (wind.gust - wind.speed) : undefined,
        profile: wind.profile?.map((row) => ({ ...row, speed: row.speed * scale, from: (((row.from + turn) % 360) + 360) % 360 })),
      },
    },
  };
}
