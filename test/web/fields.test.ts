import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { ScenarioError } from '../../src/scenario/errors.js';
import { attachedFileReader, valueAt, withValue, type ScenarioDocument } from '../../web/src/scenario/document.js';
import { dayFieldGroups, type DayField } from '../../web/src/scenario/day-fields.js';
import { shownValue, writtenValue } from '../../web/src/scenario/field-values.js';

/**
 * The page's field boxes against the scenario validator: what a user types must reach the
 * engine as the value they meant, in whichever unit system the page shows.
 */

const SCENARIOS = resolve(fileURLToPath(new URL('../../scenarios', import.meta.url)));
const MOTORS = Object.fromEntries(readdirSync(join(SCENARIOS, 'motors')).map((name) => [`motors/${name}`, readFileSync(join(SCENARIOS, 'motors', name), 'utf8')]));

const demo = (name: string): ScenarioDocument => ({
  json: JSON.parse(readFileSync(join(SCENARIOS, name), 'utf8')),
  files: MOTORS,
  fileName: name,
});

function fieldAt(doc: ScenarioDocument, issuePath: string): DayField {
  const field = dayFieldGroups(doc.json).flatMap((g) => g.fields).find((f) => f.issuePath === issuePath);
  if (!field) throw new Error(`no field ${issuePath}`);
  return field;
}

/** Types `text` into the field as the page shows it in `system`, and validates the result. */
function type(doc: ScenarioDocument, issuePath: string, text: string, system: 'metric' | 'imperial') {
  const field = fieldAt(doc, issuePath);
  const shown = shownValue(field, valueAt(doc.json, field.path), system);
  const next = withValue(doc, field.path, writtenValue(field, text, shown.unit));
  return { next, parse: () => parseScenario(next.json, { readText: attachedFileReader(next.files) }).scenario };
}

describe('field boxes', () => {
  it('reads a plain number in the unit shown beside it', () => {
    const doc = demo('club-rocket.json');
    // 1 mph = 1609.344 m / 3600 s exactly (international mile; NIST SP 811, appendix B).
    const imperial = type(doc, 'weather.wind.speed', '12', 'imperial');
    expect(valueAt(imperial.next.json, ['weather', 'wind', 'speed'])).toBe('12 mph');
    expect(imperial.parse().weather.wind.speed).toBeCloseTo((12 * 1609.344) / 3600, 12);
    const metric = type(doc, 'weather.wind.speed', '5.5', 'metric');
    expect(metric.parse().weather.wind.speed).toBe(5.5);
    // Degrees are the file's own unit for angles: written as a plain number.
    expect(valueAt(type(doc, 'weather.wind.from', '265', 'imperial').next.json, ['weather', 'wind', 'from'])).toBe(265);
  });

  it('keeps a unit the user typed, and shows values in the chosen system', () => {
    const doc = demo('club-rocket.json');
    expect(type(doc, 'weather.wind.speed', '7 kn', 'metric').parse().weather.wind.speed).toBeCloseTo((7 * 1852) / 3600, 12);
    // The demo says "11 mph": 4.91744 m/s, shown to four significant digits.
    const field = fieldAt(doc, 'weather.wind.speed');
    expect(shownValue(field, '11 mph', 'metric')).toMatchObject({ text: '4.917', unit: { label: 'm/s' } });
    expect(shownValue(field, '11 mph', 'imperial')).toMatchObject({ text: '11', unit: { label: 'mph' } });
  });

  it('writes probabilities and relative spreads as percentages', () => {
    const doc = demo('club-rocket.json');
    const failure = type(doc, 'failures[0].probability', '4.5', 'metric');
    expect(valueAt(failure.next.json, ['failures', 0, 'probability'])).toBe('4.5 %');
    expect(failure.parse().failures[0]!.probability).toBeCloseTo(0.045, 15);
    const spread = fieldAt(doc, 'uncertainty.vehicle.mass.sd');
    expect(shownValue(spread, '2 %', 'imperial').unit?.label).toBe('%');
    const mass = type(doc, 'uncertainty.vehicle.mass.sd', '5', 'metric').parse().uncertainty['vehicle.mass'];
    expect(mass).toMatchObject({ kind: 'normal', sd: 0.05, relative: true });
  });

  it('removes an optional field left empty, and lets the validator name a required one', () => {
    const doc = demo('club-rocket.json');
    const noGust = type(doc, 'weather.wind.gust', '', 'metric');
    expect(valueAt(noGust.next.json, ['weather', 'wind'])).not.toHaveProperty('gust');
    expect(noGust.parse().weather.wind.gust).toBeUndefined();
    const noSpeed = type(doc, 'weather.wind.speed', '  ', 'metric');
    try {
      noSpeed.parse();
      expect.unreachable('an empty wind speed was accepted');
    } catch (error) {
      expect(error).toBeInstanceOf(ScenarioError);
      expect((error as ScenarioError).issues.map((i) => i.path)).toContain('weather.wind.speed');
    }
    // The document it came from is untouched.
    expect(valueAt(doc.json, ['weather', 'wind', 'speed'])).toBe('11 mph');
  });

  it('offers the spreads and failures the file has, and no others', () => {
    const drone = dayFieldGroups(demo('drone-power-loss.json').json);
    const paths = drone.flatMap((g) => g.fields.map((f) => f.issuePath));
    expect(paths).toContain('uncertainty.launch.height.range[0]');
    expect(paths).toContain('failures[0].probability');
    expect(paths).not.toContain('uncertainty.motor.impulse.sd');
    const shell = dayFieldGroups(demo('display-shell.json').json);
    expect(shell.map((g) => g.id)).not.toContain('failures');
  });

  it('finds a motor curve opened beside the scenario by its file name', () => {
    const read = attachedFileReader({ 'curve.csv': 'time_s,thrust_N\n' });
    expect(read('motors/curve.csv')).toBe('time_s,thrust_N\n');
    expect(() => read('motors/other.csv')).toThrow(/other\.csv' was not opened with the scenario/);
  });
});
