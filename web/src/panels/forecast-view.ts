import type { Scenario } from '../../../src/scenario/types.js';
import { inUnit } from '../units/format.js';
import { figureUnits, type UnitSystem } from '../units/systems.js';
import { el } from './dom.js';

/**
 * The wind a scenario flies when it reads `weather.forecast`: where it came from (valid time, the
 * forecast run, the steps and members it was interpolated from, the spread it gives the run) and
 * the profile itself, by height above the pad, as loaded by the command line's own code
 * (src/forecast). Temperatures come from the forecast's air rows at the same heights.
 */
export function forecastProfileView(scenario: Scenario, units: UnitSystem): HTMLElement | null {
  const source = scenario.weather.forecast;
  const rows = scenario.weather.wind.profile;
  if (!source || !rows) return null;
  const { length, speed } = figureUnits(units);
  const air = scenario.weather.air ?? [];
  const temperatureAt = (altitude: number) => air.find((a) => Math.abs(a.altitude - altitude) < 0.05)?.temperature;
  const facts: string[] = [
    `Valid time ${source.time}, from the run of ${source.referenceTime}${source.steps.length > 1 ? `, between the steps ${source.steps.join(' and ')}` : ''}.`,
    source.members > 0 ? `Mean of ${source.members} ensemble members.` : 'A single (deterministic) forecast.',
  ];
  if (source.spread) {
    const s = source.spread;
    facts.push(`Wind spread from ${s.profiles} profiles (mean wind below ${inUnit(s.layerTop, length)}): speed ± ${(s.speedSd * 100).toFixed(1)} %, direction ± ${s.fromSdDeg.toFixed(1)}° (1 sd).`);
  }
  const table = el(
    'table',
    { class: 'forecast-table', data: { test: 'forecast-profile' } },
    el('caption', { text: `Wind by height above the pad (${rows.length} levels)` }),
    el('thead', {}, el('tr', {}, el('th', { text: 'Height', attrs: { scope: 'col' } }), el('th', { text: 'Speed', attrs: { scope: 'col' } }), el('th', { text: 'From', attrs: { scope: 'col' } }), el('th', { text: 'Temperature', attrs: { scope: 'col' } }))),
    el(
      'tbody',
      {},
      ...rows.map((row) => {
        const t = temperatureAt(row.altitude);
        return el(
          'tr',
          {},
          el('td', { text: inUnit(row.altitude, length) }),
          el('td', { text: inUnit(row.speed, speed, 1) }),
          el('td', { text: `${Math.round(row.from)}°` }),
          el('td', { text: t === undefined ? '' : units === 'metric' ? `${(t - 273.15).toFixed(1)} °C` : `${((t - 273.15) * 1.8 + 32).toFixed(0)} °F` }),
        );
      }),
    ),
  );
  return el('div', { class: 'forecast-view', data: { test: 'forecast-view' } }, el('p', { class: 'note', data: { test: 'forecast-time' }, text: facts.join(' ') }), el('div', { class: 'forecast-scroll' }, table));
}
