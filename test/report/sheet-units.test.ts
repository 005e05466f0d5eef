import { describe, expect, it } from 'vitest';
import { percent, unitFormatter, levelText, smallRate } from '../../src/report/sheet/units.js';
import { roundDown125, roundLengthAtMost } from '../../src/report/sheet/nice-length.js';
import { toWinAnsi } from '../../src/report/sheet/winansi.js';
import { compassPoint } from '../../src/report/sheet/compass.js';
import { renderPdf } from '../../src/report/sheet/render-pdf.js';
import type { Page } from '../../src/report/sheet/display-list.js';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tempDir } from '../cli/helpers.js';
import { poppler } from './sheet-helpers.js';

describe('units on the sheet', () => {
  const metric = unitFormatter('metric');
  const imperial = unitFormatter('imperial');

  // International Yard and Pound Agreement (1959): 1 ft = 0.3048 m, 1 mi = 5280 ft, 1 lb = 0.45359237 kg;
  // 1 acre = 43 560 ft²; 1 mph = 1609.344 m / 3600 s = 0.44704 m/s.
  it('converts with the exact definitions of the foot, mile, acre, pound and mph', () => {
    expect(imperial.length(304.8)).toBe('1,000 ft');
    expect(imperial.length(1609.344 * 2.5)).toBe('2.50 mi');
    expect(imperial.area(43560 * 0.3048 ** 2 * 3)).toBe('3.00 acres');
    expect(imperial.area(100 * 0.3048 ** 2)).toBe('100 ft²');
    expect(imperial.speed(0.44704 * 20)).toBe('20 mph');
    expect(imperial.mass(0.45359237 * 3)).toBe('3 lb');
    expect(imperial.lengthUnit.metres).toBe(0.3048);
  });

  // 1 ha = 10 000 m² (SI Brochure, 9th ed., 2019, table 8): areas from one hectare up in ha.
  it('writes metric values in m, km, m² below a hectare and ha from one up, m/s', () => {
    expect(metric.length(973.4)).toBe('973 m');
    expect(metric.length(12_345)).toBe('12.3 km');
    expect(metric.area(1_149_242.1)).toBe('114.92 ha');
    expect(metric.area(9_999)).toBe('9,999 m²');
    expect(metric.area(10_000)).toBe('1.00 ha');
    expect(metric.speed(4.9174)).toBe('4.9 m/s');
    expect(metric.speed(22)).toBe('22 m/s');
  });

  // °F = °C × 9/5 + 32 and 0 °C = 273.15 K (SI Brochure, 9th ed., 2019); 1 inHg = 3386.389 Pa (NIST SP 811, from memory).
  it('converts temperature and pressure', () => {
    expect(metric.temperature(287.15)).toBe('14.0 °C');
    expect(imperial.temperature(273.15 + 100)).toBe('212.0 °F');
    expect(metric.pressure(96_200)).toBe('962.0 hPa');
    expect(imperial.pressure(101_325)).toBe('29.92 inHg');
  });

  it('gives probabilities as percentages with two significant figures, without rounding up a digit', () => {
    expect(percent(0.00009999999999)).toBe('0.01 %');
    expect(percent(0.0288)).toBe('2.9 %');
    expect(percent(0)).toBe('0 %');
    expect(percent(null)).toBe('n/a');
    expect(levelText(0.995)).toBe('99.5 %');
    expect(smallRate(2.8e-6)).toBe('2.8e-6');
    expect(smallRate(0.012)).toBe('0.012');
  });
});

describe('round lengths for the scale bar and the rings', () => {
  it('picks the largest 1-2-5 step not above the bound (common practice, no source)', () => {
    expect(roundDown125(730)).toBe(500);
    expect(roundDown125(199.99)).toBe(100);
    expect(roundDown125(200)).toBe(200);
    expect(roundDown125(0.03)).toBeCloseTo(0.02, 12);
    expect(roundLengthAtMost(730, 'metric')).toEqual({ metres: 500, label: '500 m' });
    expect(roundLengthAtMost(2400, 'metric')).toEqual({ metres: 2000, label: '2 km' });
    expect(roundLengthAtMost(700, 'imperial')).toEqual({ metres: 2000 * 0.3048, label: '2,000 ft' });
    expect(roundLengthAtMost(2000, 'imperial')).toEqual({ metres: 1609.344, label: '1 mi' });
  });
});

describe('text for the standard PDF fonts', () => {
  // A PDF reader decodes the standard fonts with WinAnsiEncoding (PDF 1.7, ISO 32000-1, annex D);
  // poppler's pdftotext reading back exactly what was written shows every character survived.
  it('reads back unchanged from a PDF for every kind of character', () => {
    const samples = ['>= 99 % minus ±2 m', toWinAnsi('≥ 99 % − ±2 m'), toWinAnsi('Łódź “quoted” – dash … •'), toWinAnsi('東京 site'), toWinAnsi('χ² 5 °C, 3 m²'), toWinAnsi('naïve café Ærø € ™'), toWinAnsi('Ab\u202fCd\u00a0Ef')];
    const page: Page = { width: 500, height: 300, shapes: samples.map((text, i) => ({ kind: 'text', x: 10, y: 20 + 20 * i, text, size: 10, font: 'regular', anchor: 'start', color: '#000000' })) };
    const file = join(tempDir(), 'chars.pdf');
    writeFileSync(file, renderPdf([page], { title: 't', creator: 'c', date: new Date(0) }));
    const lines = poppler('pdftotext', ['-layout', file, '-']).split('\n').map((l) => l.trim()).filter((l) => l.length > 0);
    expect(lines).toEqual(samples.map((s) => s.trim()));
  });

  it('keeps what it can and spells out what it cannot', () => {
    expect(toWinAnsi('≥ 99 %')).toBe('>= 99 %');
    expect(toWinAnsi('Łódź')).toBe('Lódz');
    expect(toWinAnsi('5 °C, 3 m², 10–20')).toBe('5 °C, 3 m², 10–20');
    expect(toWinAnsi('東')).toBe('?');
  });
});

describe('compass points', () => {
  // The 16-point compass rose, 22.5° apart (common practice, no source).
  it('names bearings', () => {
    expect(compassPoint(250)).toBe('WSW');
    expect(compassPoint(359)).toBe('N');
    expect(compassPoint(-45)).toBe('NW');
    expect(compassPoint(101.24)).toBe('E');
    expect(compassPoint(101.26)).toBe('ESE');
  });
});
