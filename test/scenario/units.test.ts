import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ScenarioError } from '../../src/scenario/errors.js';
import { convertQuantity, parseQuantity, type Dimension } from '../../src/scenario/units.js';

/**
 * Expected values are worked out by hand from the unit definitions:
 * - foot = 0.3048 m, inch = 0.0254 m, pound = 0.45359237 kg, mile = 1609.344 m: International
 *   Yard and Pound Agreement (1959).
 * - nautical mile = 1852 m (hence knot = 1852/3600 m/s): SI Brochure, 8th ed. (2006), Table 8.
 * - pound-force = pound × standard gravity 9.80665 m/s² = 4.4482216152605 N: NIST SP 811 (2008), App. B.
 * - K = °C + 273.15, °F = °C × 9/5 + 32: SI Brochure, 9th ed. (2019), §2.3.1 and NIST SP 811.
 * - conventional inch of mercury = 3386.389 Pa: NIST SP 811 (2008), App. B (from memory).
 */
const cases: Array<[Dimension, string, number]> = [
  ['length', '1500 m', 1500],
  ['length', '2.5 km', 2500],
  ['length', '30 cm', 0.3],
  ['length', '54 mm', 0.054],
  ['length', '1500 ft', 457.2],
  ['length', '12 in', 0.3048],
  ['length', '2 mi', 3218.688],
  ['speed', '7 m/s', 7],
  ['speed', '36 km/h', 10],
  ['speed', '12 mph', 5.36448],
  ['speed', '10 kn', 5.144444444444445],
  ['speed', '50 ft/s', 15.24],
  ['mass', '2 kg', 2],
  ['mass', '60 g', 0.06],
  ['mass', '3.5 lb', 1.587573295],
  ['mass', '2 oz', 0.05669904625],
  ['force', '100 N', 100],
  ['force', '10 lbf', 44.482216152605],
  ['impulse', '160 N s', 160],
  ['impulse', '160 Ns', 160],
  ['impulse', '160 N·s', 160],
  ['impulse', '2 lbf s', 8.896443230521],
  ['pressure', '101325 Pa', 101325],
  ['pressure', '1013 hPa', 101300],
  ['pressure', '101.3 kPa', 101300],
  ['pressure', '29.92 inHg', 101320.75888],
  ['temperature', '288.15 K', 288.15],
  ['temperature', '18 C', 291.15],
  ['temperature', '-40 F', 233.15],
  ['temperature', '212 F', 373.15],
  ['area', '0.5 m2', 0.5],
  ['area', '0.5 m²', 0.5],
  ['area', '200 cm2', 0.02],
  ['area', '200 cm²', 0.02],
  ['area', '1 ft2', 0.09290304],
  ['area', '10 in2', 0.0064516],
  ['angle', '250 deg', 250],
  ['angle', '1 rad', 57.29577951308232],
  ['time', '1.5 s', 1.5],
  ['time', '500 ms', 0.5],
  ['fraction', '5 %', 0.05],
];

describe('convertQuantity: each unit converts to SI', () => {
  it.each(cases)('%s %s', (dimension, text, expected) => {
    const result = convertQuantity(text, dimension);
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.value).toBeCloseTo(expected, 9);
      expect(result.relative).toBe(false);
    }
  });

  it('takes plain numbers as SI (degrees for angles, kelvin for temperatures)', () => {
    expect(convertQuantity(12.5, 'speed')).toMatchObject({ ok: true, value: 12.5 });
    expect(convertQuantity(270, 'angle')).toMatchObject({ ok: true, value: 270 });
    expect(convertQuantity(290, 'temperature')).toMatchObject({ ok: true, value: 290 });
  });

  it('accepts no space between number and unit, an exponent and a sign', () => {
    const value = (text: string, dimension: Dimension): number => {
      const r = convertQuantity(text, dimension);
      if (!r.ok) throw new Error(r.message);
      return r.value;
    };
    expect(value('54mm', 'length')).toBeCloseTo(0.054, 12);
    expect(value('1.5e3 ft', 'length')).toBeCloseTo(457.2, 9);
    expect(value('-10 deg', 'angle')).toBe(-10);
  });

  it('reads "8 %" as a relative 0.08 only where relative spreads are allowed', () => {
    expect(convertQuantity('8 %', 'speed', { allowRelative: true })).toMatchObject({ ok: true, value: 0.08, relative: true });
    const refused = convertQuantity('8 %', 'speed');
    expect(refused.ok).toBe(false);
    if (!refused.ok) expect(refused.message).toContain('relative');
  });

  it('agrees with the foot definition for any number (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (x) => {
        const r = convertQuantity(`${x} ft`, 'length');
        return r.ok && r.value === x * 0.3048;
      }),
    );
  });
});

describe('convertQuantity: bad input', () => {
  it('names the dimension of a unit given in the wrong place', () => {
    expect(convertQuantity('12 kg', 'speed')).toEqual({
      ok: false,
      message: "'12 kg' has a unit of mass; expected a speed (m/s, km/h, mph, kn, ft/s)",
    });
  });

  it('rejects an unknown unit and suggests the right case', () => {
    const unknown = convertQuantity('12 furlongs', 'length');
    expect(unknown.ok).toBe(false);
    if (!unknown.ok) expect(unknown.message).toContain("unknown unit 'furlongs'");
    const wrongCase = convertQuantity('1013 HPA', 'pressure');
    expect(wrongCase.ok).toBe(false);
    if (!wrongCase.ok) expect(wrongCase.message).toContain("did you mean 'hPa'?");
  });

  it.each([
    ['NaN', 'not a number'],
    ['Infinity m', 'not a number'],
    ['twelve mph', 'not a number'],
    ['', 'not a number'],
    ['1e999 m', 'too large'],
  ])('rejects the text %j', (text, fragment) => {
    const r = convertQuantity(text, 'speed');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain(fragment);
  });

  it('rejects non-finite numbers and non-numbers', () => {
    for (const value of [Number.NaN, Number.POSITIVE_INFINITY, true, null, [1], { v: 1 }]) {
      expect(convertQuantity(value, 'length').ok).toBe(false);
    }
  });

  it('rejects a quoted number without a unit, suggesting both fixes', () => {
    const r = convertQuantity('1500', 'length');
    expect(r).toEqual({
      ok: false,
      message: "'1500' has no unit; write the plain number 1500 for m, or add a unit, e.g. '1500 m'; expected a length (m, km, cm, mm, ft, in, mi)",
    });
  });
});

describe('parseQuantity', () => {
  it('returns the SI value', () => {
    expect(parseQuantity('12 mph', 'speed', 'weather.wind.speed').value).toBeCloseTo(5.36448, 12);
  });

  it('throws a ScenarioError naming the field', () => {
    let caught: unknown;
    try {
      parseQuantity('12 kg', 'speed', 'weather.wind.speed');
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(ScenarioError);
    const error = caught as ScenarioError;
    expect(error.issues).toEqual([
      { path: 'weather.wind.speed', message: "'12 kg' has a unit of mass; expected a speed (m/s, km/h, mph, kn, ft/s)" },
    ]);
    expect(error.message).toContain("weather.wind.speed: '12 kg' has a unit of mass");
  });
});
