import { describe, expect, it } from 'vitest';
import { SYMBOLS as sheetSymbols, KEEP_OUT_STROKE, contourStyle as sheetContour, modeMarker, areaStyle as sheetArea } from '../../src/report/sheet/palette.js';
import { SYMBOLS as pageSymbols, KEEP_OUT, contourStyle as pageContour, modeStyle, areaStyle as pageArea, screenLine } from '../../web/src/map/palette.js';
import { SCREEN_PX_PER_PT, WORDS, modeSymbolIndex } from '../../src/report/symbols.js';
import { areaText } from '../../src/report/sheet/units.js';

/**
 * One symbol set for the review sheet and the page's map (src/report/symbols.ts). A safety officer
 * who prints the sheet and shows the page to a landowner must see the same zone drawn the same way
 * (common practice, no source).
 */
describe('one symbol set for the sheet and the page', () => {
  it('the page and the sheet read the very same style table', () => {
    expect(pageSymbols).toBe(sheetSymbols);
  });

  it('draws the keep-out zone, the regions, the landings and the areas alike on both', () => {
    expect(KEEP_OUT.color).toBe(KEEP_OUT_STROKE.color);
    expect(KEEP_OUT.width).toBeCloseTo(KEEP_OUT_STROKE.width * SCREEN_PX_PER_PT, 9);
    expect(KEEP_OUT.dash.length > 0).toBe((KEEP_OUT_STROKE.dash ?? []).length > 0);
    for (let i = 0; i < 6; i++) {
      const sheet = sheetContour(i);
      const page = pageContour(i);
      expect(page.color).toBe(sheet.color);
      // maplibre counts dashes in line widths: the same pattern relative to the line on both.
      const want = (sheet.dash ?? []).map((d) => d * SCREEN_PX_PER_PT);
      expect(page.dash.length).toBe(want.length);
      page.dash.forEach((d, k) => expect(d * page.width).toBeCloseTo(want[k]!, 9));
      expect(modeStyle(i).shape).toBe(modeMarker(i).symbol);
      expect(modeStyle(i).color).toBe(modeMarker(i).color);
    }
    for (const kind of ['spectators', 'parking', 'road', 'building', 'water', 'other', 'unknown-kind']) {
      expect(pageArea(kind).fill).toBe(sheetArea(kind).fill.color);
      expect(pageArea(kind).line).toEqual(screenLine(sheetArea(kind).stroke));
    }
  });

  it('keeps every class apart by more than hue: regions by dash, modes by shape', () => {
    const dashes = sheetSymbols.contours.map((c) => JSON.stringify(c.dash ?? []));
    expect(new Set(dashes).size).toBe(dashes.length);
    const shapes = sheetSymbols.modes.map((m) => m.shape);
    expect(new Set(shapes).size).toBe(shapes.length);
    // The nominal dot never comes back for a failure mode past the table.
    for (let i = 1; i < 20; i++) expect(modeSymbolIndex(i)).toBeGreaterThan(0);
    // The zone is the heaviest line of all.
    const widths = [...sheetSymbols.contours, sheetSymbols.boundary, sheetSymbols.rings, sheetSymbols.track, sheetSymbols.minimumDistance].map((l) => l.width);
    expect(sheetSymbols.keepOut.line.width).toBeGreaterThan(Math.max(...widths));
  });

  it('uses the same words on both: an area with no landing says so, not "0 %"', () => {
    expect(WORDS.areaChance(0, '0 %', '0.16 %')).toBe('no landing (95 % bound 0.16 %)');
    expect(WORDS.areaChance(3, '0.29 %', '0.61 %')).toBe('0.29 % (95 % bound 0.61 %)');
    expect(WORDS.keepOutMadeOf(['0.99 density region', 'convex hull of mode "no recovery"', 'grown by 25 m'], '99 %', '25 m')).toBe('99 % region and mode hulls, grown by 25 m');
  });

  // 1 ha = 10 000 m² (SI Brochure, 9th ed., 2019, table 8); 1 acre = 43 560 ft² (NIST Handbook 44, appendix C).
  it('has one area rule: m² or ft² below a hectare or an acre, ha or acres from one up', () => {
    expect(areaText(9_999, 'metric')).toBe('9,999 m²');
    expect(areaText(400_600, 'metric')).toBe('40.06 ha');
    expect(areaText(4046.8564224 - 1, 'imperial')).toBe('43,549 ft²');
    expect(areaText(4046.8564224 * 2.5, 'imperial')).toBe('2.50 acres');
  });
});
