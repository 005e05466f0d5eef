import { describe, expect, it } from 'vitest';
import { cpSync, existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SCENARIOS, strewn, tempDir } from './helpers.js';

/** A copy of the demo folder with a small event plan (invented) built from the club demo. */
function smallEvent(edit: (plan: Record<string, any>) => void = () => {}): { dir: string; path: string } {
  const dir = tempDir('strewn-event-');
  cpSync(SCENARIOS, dir, { recursive: true });
  const plan = JSON.parse(readFileSync(join(SCENARIOS, 'club-day.event.json'), 'utf8'));
  for (const item of plan.items) item.samples = 200;
  edit(plan);
  const path = join(dir, 'small.event.json');
  writeFileSync(path, JSON.stringify(plan));
  return { dir, path };
}

describe('strewn event', () => {
  it('writes one folder: each item in its own sub-folder and the event files; the sheet has two pages', () => {
    const { dir, path } = smallEvent();
    const out = join(dir, 'out');
    const r = strewn(['event', path, '--out', out, '--workers', '2', '--quiet']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    for (const f of ['event.json', 'event-zones.geojson', 'event-risk.geojson', 'event-areas.csv', 'event-sheet.pdf', 'event-map.svg']) expect(existsSync(join(out, f))).toBe(true);
    const items = readdirSync(join(out, 'items')).sort();
    expect(items).toEqual(['01-sport-rocket-g-motor', '02-sport-rocket-f-motor-pad-2', '03-drone-filming-runs']);
    for (const item of items) expect(existsSync(join(out, 'items', item, 'summary.json'))).toBe(true);
    const event = JSON.parse(readFileSync(join(out, 'event.json'), 'utf8'));
    expect(event.flights).toBe(34);
    const zones = JSON.parse(readFileSync(join(out, 'event-zones.geojson'), 'utf8'));
    expect(zones.features.map((f: any) => f.properties.kind)).toEqual(['item keep-out zone', 'item keep-out zone', 'item keep-out zone', 'event keep-out zone']);
    // Expected landings per area = Σ flights × the item's own per-flight chance (its summary.json).
    const crowd = event.areas.find((a: any) => a.name === 'Spectator line');
    let sum = 0;
    event.items.forEach((row: any, i: number) => {
      const s = JSON.parse(readFileSync(join(out, 'items', items[i], 'summary.json'), 'utf8'));
      sum += row.flights * row.chancePerFlight * s.areas.find((a: any) => a.name === 'Spectator line').probability;
    });
    expect(crowd.expectedLandings).toBeCloseTo(sum, 12);
    const pdf = readFileSync(join(out, 'event-sheet.pdf'), 'latin1');
    expect((pdf.match(/\/Type\s*\/Page\b/g) ?? []).length).toBe(2);
  }, 60_000);

  it('bad plans exit 2 naming the field and write nothing', () => {
    const cases: [(p: Record<string, any>) => void, RegExp][] = [
      [(p) => (p.items[1].flights = 0), /items\[1\]\.flights/],
      [(p) => (p.items[0].scenario = 'nowhere.json'), /items\[0\]\.scenario/],
      [(p) => (p.items[0].window = { start: 'tomorrow', end: 'later' }), /items\[0\]\.window/],
      [(p) => (p.items[1].motor.propellantMass = '-1 kg'), /items\[1\]\.motor\.propellantMass/],
      [(p) => (p.site.pad.lat = 123), /site\.pad\.lat/],
      [(p) => (p.itemz = []), /itemz/],
    ];
    for (const [edit, field] of cases) {
      const { dir, path } = smallEvent(edit);
      const out = join(dir, 'out');
      const r = strewn(['event', path, '--out', out]);
      expect(r.status).toBe(2);
      expect(r.stderr).toMatch(field);
      expect(r.stderr).not.toMatch(/\n\s+at /);
      expect(existsSync(out)).toBe(false);
    }
  }, 60_000);
});
