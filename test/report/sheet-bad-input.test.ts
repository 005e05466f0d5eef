import { beforeAll, describe, expect, it } from 'vitest';
import { copyFileSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { strewn, tempDir } from '../cli/helpers.js';
import { runDemo } from './sheet-helpers.js';

/**
 * `strewn sheet` on a folder it cannot use: exit 2, a message naming the file, no stack trace, and
 * nothing written (the project's rule for bad input, DEVELOPERS.md).
 */

let results: string;
beforeAll(() => {
  results = runDemo('drone-power-loss.json', 200);
});

/** A copy of the demo results without the sheet, changed by `edit`. */
function damaged(edit: (folder: string) => void): string {
  const folder = join(tempDir(), 'results');
  mkdirSync(folder);
  for (const name of readdirSync(results)) if (name !== 'sheet.pdf' && name !== 'map.svg') copyFileSync(join(results, name), join(folder, name));
  edit(folder);
  return folder;
}

function expectRefused(folder: string, args: string[], named: RegExp): void {
  const before = existsSync(folder) ? readdirSync(folder).sort() : null;
  const r = strewn(['sheet', ...args]);
  expect(r.status, r.stderr).toBe(2);
  expect(r.stderr).toMatch(named);
  expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
  expect(existsSync(folder) ? readdirSync(folder).sort() : null).toEqual(before);
}

describe('strewn sheet refuses bad input', () => {
  it('a folder that does not exist', () => {
    const missing = join(tempDir(), 'nowhere');
    expectRefused(missing, [missing], /nowhere: no such folder/);
  });

  it('a folder without summary.json', () => {
    const folder = damaged((f) => rmSync(join(f, 'summary.json')));
    expectRefused(folder, [folder], /summary\.json: cannot read it: the file is missing/);
  });

  it('malformed JSON', () => {
    const folder = damaged((f) => writeFileSync(join(f, 'summary.json'), '{"name": "x", '));
    expectRefused(folder, [folder], /summary\.json: not valid JSON/);
  });

  it('a summary field of the wrong type, named by its path', () => {
    const folder = damaged((f) => {
      const s = JSON.parse(readFileSync(join(f, 'summary.json'), 'utf8'));
      s.areas[1].probability = 'high';
      writeFileSync(join(f, 'summary.json'), JSON.stringify(s));
    });
    expectRefused(folder, [folder], /summary\.json: areas\[1\]\.probability should be a number, found "high"/);
  });

  it('a scenario.json that is not the one the run used', () => {
    const folder = damaged((f) => {
      const s = JSON.parse(readFileSync(join(f, 'scenario.json'), 'utf8'));
      s.weather.wind.speed += 1;
      writeFileSync(join(f, 'scenario.json'), JSON.stringify(s));
    });
    expectRefused(folder, [folder], /scenario\.json: its hash .* differs from scenarioHash/);
  });

  it('a missing keepout.geojson when the run drew zones', () => {
    const folder = damaged((f) => rmSync(join(f, 'keepout.geojson')));
    expectRefused(folder, [folder], /keepout\.geojson: cannot read it: the file is missing/);
  });

  it('a broken contour geometry', () => {
    const folder = damaged((f) => {
      const c = JSON.parse(readFileSync(join(f, 'contours.geojson'), 'utf8'));
      c.features[0].geometry.coordinates[0][0][2] = ['east', 3];
      writeFileSync(join(f, 'contours.geojson'), JSON.stringify(c));
    });
    expectRefused(folder, [folder], /contours\.geojson: features\[0\]\.geometry\.coordinates\[0\]\[0\]\[2\]\[0\] should be a number/);
  });

  it('unknown paper and units', () => {
    const folder = damaged(() => {});
    expectRefused(folder, [folder, '--paper', 'a3'], /--paper: 'a3' is not one of a4, letter/);
    expectRefused(folder, [folder, '--units', 'furlongs'], /--units: 'furlongs' is not one of metric, imperial/);
  });

  it('writes both files when the folder is good', () => {
    const folder = damaged(() => {});
    const r = strewn(['sheet', folder]);
    expect(r.status, r.stderr).toBe(0);
    expect(readdirSync(folder).filter((n) => n.startsWith('.') && n !== '.strewn-results')).toEqual([]);
    expect(readFileSync(join(folder, 'sheet.pdf')).subarray(0, 5).toString()).toBe('%PDF-');
    expect(readFileSync(join(folder, 'map.svg'), 'utf8')).toContain('<svg');
  });
});
