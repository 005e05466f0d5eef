import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { SCENARIOS, strewn, tempDir } from '../cli/helpers.js';

// The result files scenario-format.md ("Results") fixes for the risk model, and --until-stable's cap.
describe('strewn run: risk files and --until-stable', () => {
  const out = join(tempDir(), 'out');
  const r = strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '300', '--workers', '1', '--out', out, '--until-stable', '--stable-cap', '600']);

  it('stops at the cap and says so', () => {
    expect(r.status).toBe(0);
    expect(r.stderr).toMatch(/stopped at the cap of 600 samples per round/);
    const s = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(s.samples).toBe(600);
    expect(s.risk.untilStable.rounds.map((x: { samples: number }) => x.samples)).toEqual([300, 600]);
    expect(s.risk.untilStable.stopped).toBe('cap');
    expect(Object.keys(s.risk.standingDistance_m)).toEqual(['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW']);
    expect(Object.keys(s.risk.total)).toContain('upper95');
  });

  it('writes the risk columns, risk.geojson and the KML layers', () => {
    const csv = readFileSync(join(out, 'landings.csv'), 'utf8').split('\n')[0];
    expect(csv.endsWith(',impact_energy_J,impact_angle_deg,part,weight')).toBe(true);
    const geo = JSON.parse(readFileSync(join(out, 'risk.geojson'), 'utf8'));
    expect(geo.features.filter((f: { properties: { kind: string } }) => f.properties.kind === 'individual-risk')).toHaveLength(3);
    expect(readFileSync(join(out, 'areas.csv'), 'utf8')).toMatch(/expected_casualties,expected_casualties_upper95,max_individual_risk/);
    expect(readFileSync(join(out, 'result.kml'), 'utf8')).toMatch(/<Folder><name>Individual risk<\/name>/);
  });

  it('strewn analyze gives the risk from the recorded landings with --scenario', () => {
    const again = join(tempDir(), 'an');
    const a = strewn(['analyze', join(out, 'landings.csv'), '--scenario', join(SCENARIOS, 'club-rocket.json'), '--out', again, '--json']);
    expect(a.status).toBe(0);
    const s = JSON.parse(a.stdout);
    expect(s.risk.lines.map((l: { level: number }) => l.level)).toEqual([1e-4, 1e-5, 1e-6]);
    expect(s.risk.areas.length).toBeGreaterThan(0);
  });

  it('--stable-cap alone is a usage error', () => {
    const bad = strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--stable-cap', '100', '--out', join(tempDir(), 'x')]);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--stable-cap/);
  });
});
