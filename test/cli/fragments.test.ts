import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { editedScenario, ROOT, SCENARIOS, strewn, tempDir } from './helpers.js';

/**
 * The display-shell burst demo (scenarios/display-shell-burst.json, invented) through the command
 * line: check and run, the part and weight columns, and the project's reproducibility rule (a
 * sample depends only on scenario, seed, count and index: common practice, no source) for a
 * scenario whose samples yield many landings each.
 */
const DEMO = join(SCENARIOS, 'display-shell-burst.json');
const ENV = { SOURCE_DATE_EPOCH: '1700000000' };
const SAMPLES = '200';
// The files whose bytes come from the landings (sheet.pdf and map.svg carry the same numbers drawn).
const COMPARED = ['landings.csv', 'landings.geojson', 'landings.fgb', 'summary.json', 'contours.geojson', 'keepout.geojson', 'areas.csv', 'risk.geojson', 'result.kml'];

function files(dir: string): Record<string, Buffer> {
  return Object.fromEntries(readdirSync(dir).filter((n) => COMPARED.includes(n)).sort().map((name) => [name, readFileSync(join(dir, name))]));
}

function csvRows(path: string): Record<string, string>[] {
  const [head, ...rows] = readFileSync(path, 'utf8').trim().split('\n');
  const names = head.split(',');
  return rows.map((r) => Object.fromEntries(r.split(',').map((v, i) => [names[i], v])));
}

describe('fragments demo on the command line', () => {
  const dir = tempDir('strewn-fragments-');
  const one = join(dir, 'one');

  it('check accepts the demo and run writes one row per piece with its part and its sample weight', () => {
    const c = strewn(['check', DEMO]);
    expect(c.status).toBe(0);
    expect(c.stdout + c.stderr).toContain('is valid');
    const r = strewn(['run', DEMO, '--samples', SAMPLES, '--workers', '1', '--out', one], { env: ENV });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/part {11}casing shard: 9\.7 landings per flight/);
    const rows = csvRows(join(one, 'landings.csv'));
    const demo = JSON.parse(readFileSync(DEMO, 'utf8'));
    const parts = new Set(rows.map((row) => row.part));
    expect([...parts].sort()).toEqual(['whole', ...demo.breakup.fragments.map((f: { name: string }) => f.name)].sort());
    // Every row of a sample carries the same weight, and each sample's weight is its mode's probability over the mode's landed samples.
    const bySample = new Map<string, Set<string>>();
    for (const row of rows) bySample.set(row.sample, (bySample.get(row.sample) ?? new Set()).add(row.weight));
    for (const weights of bySample.values()) expect(weights.size).toBe(1);
    const summary = JSON.parse(readFileSync(join(one, 'summary.json'), 'utf8'));
    const shard = summary.parts.find((p: { name: string }) => p.name === 'casing shard');
    // 10 shards per burst × P(a burst: nominal or low break) (linearity of expectation, common practice, no source).
    expect(shard.expectedLandings).toBeCloseTo(10 * (1 - 0.03), 9);
    expect(rows.filter((row) => row.part === 'casing shard').length).toBe(10 * (summary.modes[0].landed + summary.modes[2].landed));
    expect(summary.parts.find((p: { name: string }) => p.name === 'whole').expectedLandings).toBeCloseTo(0.03, 9);
    expect(summary.risk.parts.map((p: { name: string }) => p.name)).toEqual(summary.parts.map((p: { name: string }) => p.name));
    const geo = JSON.parse(readFileSync(join(one, 'landings.geojson'), 'utf8'));
    expect(geo.features[0].properties.part).toBe(rows[0].part);
  });

  it('the same bytes on 2 workers and from 3 shards merged as on 1 worker', () => {
    const two = join(dir, 'two');
    expect(strewn(['run', DEMO, '--samples', SAMPLES, '--workers', '2', '--out', two, '--quiet'], { env: ENV }).status).toBe(0);
    const shards = join(dir, 'shards');
    for (let k = 0; k < 3; k++) {
      expect(strewn(['run', DEMO, '--samples', SAMPLES, '--shard', `${k}/3`, '--workers', '1', '--out', shards, '--quiet'], { env: ENV }).status).toBe(0);
    }
    const merged = join(dir, 'merged');
    expect(strewn(['merge', shards, '--out', merged, '--quiet'], { env: ENV }).status).toBe(0);
    const expected = files(one);
    expect(Object.keys(expected).length).toBe(COMPARED.length);
    expect(files(two)).toEqual(expected);
    expect(files(merged)).toEqual(expected);
  }, 240_000);

  it('analyze of the run\'s own landings.csv weights modes and counts pieces as the run did', () => {
    const out = join(dir, 'again');
    const r = strewn(['analyze', join(one, 'landings.csv'), '--scenario', DEMO, '--out', out, '--json']);
    expect(r.status).toBe(0);
    const again = JSON.parse(r.stdout);
    const run = JSON.parse(readFileSync(join(one, 'summary.json'), 'utf8'));
    for (const m of run.modes) expect(again.modes.find((x: { name: string }) => x.name === m.name).probability).toBeCloseTo(m.probability, 8);
    for (const p of run.parts) expect(again.parts.find((x: { name: string }) => x.name === p.name).expectedLandings).toBeCloseTo(p.expectedLandings, 7);
    run.contours.forEach((c: { area_m2: number }, k: number) => expect(again.contours[k].area_m2 / c.area_m2).toBeCloseTo(1, 4));
    expect(again.risk.total.expectedCasualties).toBeCloseTo(run.risk.total.expectedCasualties, 12);
  });

  it('a fragment class without a size is refused: exit 2, the field named, nothing written', () => {
    const bad = editedScenario('display-shell-burst.json', (json) => {
      delete json.breakup.fragments[1].dragArea;
    });
    const out = join(tempDir(), 'never');
    const r = strewn(['run', bad, '--out', out]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('breakup.fragments[1].diameter');
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(() => readdirSync(out)).toThrow();
  });

  it("effect 'early' must name the breakup and give a time", () => {
    const bad = editedScenario('display-shell-burst.json', (json) => {
      delete json.failures[1].time;
    });
    const r = strewn(['check', bad]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('failures[1].time');
  });
});

describe('landings.csv weight column (analyze weights modes as the run did, not by count)', () => {
  it('the club rocket, whose rare modes are over-sampled: analyze of its landings.csv gives the run\'s mode probabilities and zone', () => {
    const dir = tempDir('strewn-weights-');
    const club = join(ROOT, 'scenarios/club-rocket.json');
    const out = join(dir, 'run');
    expect(strewn(['run', club, '--samples', '400', '--out', out, '--quiet'], { env: ENV }).status).toBe(0);
    const run = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    // Over-sampled: some mode has a larger share of the samples than its probability.
    expect(run.modes.some((m: { samples: number; probability: number }) => m.samples / 400 > 2 * m.probability)).toBe(true);
    const r = strewn(['analyze', join(out, 'landings.csv'), '--scenario', club, '--out', join(dir, 'again'), '--json']);
    expect(r.status).toBe(0);
    const again = JSON.parse(r.stdout);
    for (const m of run.modes) expect(again.modes.find((x: { name: string }) => x.name === m.name).probability).toBeCloseTo(m.probability, 8);
    // Ten significant digits of weight in the file: the zone agrees to about 1e-6.
    expect(again.keepOut.area_m2 / run.keepOut.area_m2).toBeCloseTo(1, 4);
  });
});
