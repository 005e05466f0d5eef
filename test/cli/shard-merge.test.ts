import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { readFileSync, readdirSync, writeFileSync, cpSync } from 'node:fs';
import { join } from 'node:path';
import { CLI, ROOT, strewn, tempDir } from './helpers.js';

/**
 * A study split into shards and merged must give exactly the bytes of one run (issue 13's
 * acceptance check; that a sample depends only on scenario, seed, count and index is the
 * project's reproducibility rule, common practice, no source). The club rocket has failure modes
 * assigned by index blocks, so a shard that numbered its samples from its own start, reseeded,
 * or planned modes from its own size would change landings.csv.
 */
const SCENARIO = join(ROOT, 'scenarios/club-rocket.json');
const SAMPLES = '600';
const ENV = { SOURCE_DATE_EPOCH: '1700000000' };

function files(dir: string): Record<string, Buffer> {
  return Object.fromEntries(readdirSync(dir).sort().map((name) => [name, readFileSync(join(dir, name))]));
}

/** Starts every shard process at once, as a batch engine would, with K from the environment. */
function runShardsAtOnce(count: number, out: string, variable: string): Promise<number[]> {
  return Promise.all(
    Array.from({ length: count }, (_, k) =>
      new Promise<number>((resolve, reject) => {
        const child = spawn(process.execPath, [CLI, 'run', SCENARIO, '--samples', SAMPLES, '--shard', `auto/${count}`, '--workers', '1', '--out', out, '--quiet'], {
          cwd: ROOT,
          env: { ...process.env, ...ENV, [variable]: String(k), JOB_COMPLETION_INDEX: variable === 'JOB_COMPLETION_INDEX' ? String(k) : '' },
          stdio: ['ignore', 'ignore', 'inherit'],
        });
        child.on('error', reject);
        child.on('exit', (code) => resolve(code ?? -1));
      }),
    ),
  );
}

describe('strewn run --shard and strewn merge', () => {
  const dir = tempDir('strewn-shards-');
  const single = join(dir, 'single');
  const shards = join(dir, 'shards');

  it('4 shards started at once and merged (in two orders) equal one run byte for byte', async () => {
    expect(strewn(['run', SCENARIO, '--samples', SAMPLES, '--out', single, '--quiet'], { env: ENV }).status).toBe(0);
    expect(await runShardsAtOnce(4, shards, 'JOB_COMPLETION_INDEX')).toEqual([0, 0, 0, 0]);
    expect(readdirSync(shards).sort()).toEqual(['shard-0-of-4', 'shard-1-of-4', 'shard-2-of-4', 'shard-3-of-4']);

    const inOrder = join(dir, 'merged');
    expect(strewn(['merge', shards, '--out', inOrder, '--quiet'], { env: ENV }).status).toBe(0);
    const reversed = join(dir, 'merged-reversed');
    const order = ['shard-2-of-4', 'shard-0-of-4', 'shard-3-of-4', 'shard-1-of-4'].map((name) => join(shards, name));
    const r = strewn(['merge', ...order, '--out', reversed], { env: ENV });
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('never replace');

    const expected = files(single);
    expect(Object.keys(expected)).toContain('landings.csv');
    expect(files(inOrder)).toEqual(expected);
    expect(files(reversed)).toEqual(expected);
  }, 60_000);

  it('Slurm array task ids pick the shard too; merged with shards of another split it still equals one run', async () => {
    const slurm = join(dir, 'slurm');
    expect(await runShardsAtOnce(3, slurm, 'SLURM_ARRAY_TASK_ID')).toEqual([0, 0, 0]);
    const manifest = JSON.parse(readFileSync(join(slurm, 'shard-1-of-3/shard.json'), 'utf8'));
    // floor(600·k/3): samples 200–399.
    expect([manifest.first, manifest.count]).toEqual([200, 200]);
    const out = join(dir, 'merged-slurm');
    expect(strewn(['merge', slurm, '--out', out, '--quiet'], { env: ENV }).status).toBe(0);
    expect(readFileSync(join(out, 'landings.csv'))).toEqual(readFileSync(join(single, 'landings.csv')));
    expect(readFileSync(join(out, 'summary.json'))).toEqual(readFileSync(join(single, 'summary.json')));
  }, 60_000);

  it('a missing, repeated or foreign shard exits 2 naming it, and writes nothing', () => {
    const s = (k: number) => join(shards, `shard-${k}-of-4`);
    const out = join(dir, 'bad');
    const missing = strewn(['merge', s(0), s(1), s(3), '--out', out]);
    expect(missing.status).toBe(2);
    expect(missing.stderr).toMatch(/samples 300–449 of 600 are missing/);

    const repeated = strewn(['merge', s(0), s(1), s(1), s(2), s(3), '--out', out]);
    expect(repeated.status).toBe(2);
    expect(repeated.stderr).toContain(`'${s(1)}' is given twice`);

    const overlapping = strewn(['merge', s(0), s(1), s(2), s(3), join(dir, 'slurm/shard-1-of-3'), '--out', out]);
    expect(overlapping.status).toBe(2);
    expect(overlapping.stderr).toContain(`shard '${join(dir, 'slurm/shard-1-of-3')}' repeats samples`);

    const foreign = join(dir, 'foreign');
    expect(strewn(['run', SCENARIO, '--samples', SAMPLES, '--seed', 'another', '--shard', '2/4', '--out', foreign, '--quiet', '--workers', '1']).status).toBe(0);
    const other = strewn(['merge', s(0), s(1), join(foreign, 'shard-2-of-4'), s(3), '--out', out]);
    expect(other.status).toBe(2);
    expect(other.stderr).toContain(`shard '${join(foreign, 'shard-2-of-4')}' belongs to another study`);
    expect(other.stderr).toContain("seed 'another'");

    // A damaged landing file is caught by its checksum.
    const damaged = join(dir, 'damaged');
    cpSync(s(2), damaged, { recursive: true });
    const bytes = readFileSync(join(damaged, 'columns.bin'));
    bytes[17] ^= 1;
    writeFileSync(join(damaged, 'columns.bin'), bytes);
    const broken = strewn(['merge', s(0), s(1), damaged, s(3), '--out', out]);
    expect(broken.status).toBe(2);
    expect(broken.stderr).toContain(`shard '${damaged}': columns.bin does not match its checksum`);

    for (const r of [missing, repeated, overlapping, other, broken]) expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(readdirSync(dir)).not.toContain('bad');
  }, 60_000);

  it('a shard number outside 0…N−1, or none in the environment, is refused with exit 2', () => {
    const bad = strewn(['run', SCENARIO, '--samples', '100', '--shard', '4/4', '--out', join(dir, 'x')]);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain('shard 4 of 4 does not exist');
    const none = strewn(['run', SCENARIO, '--samples', '100', '--shard', 'auto/4', '--out', join(dir, 'x')], { env: { JOB_COMPLETION_INDEX: '', SLURM_ARRAY_TASK_ID: '' } });
    expect(none.status).toBe(2);
    expect(none.stderr).toContain('neither is set');
    const disagree = strewn(['run', SCENARIO, '--samples', '100', '--shard', 'auto/4', '--out', join(dir, 'x')], { env: { JOB_COMPLETION_INDEX: '1', SLURM_ARRAY_TASK_ID: '2' } });
    expect(disagree.status).toBe(2);
    expect(disagree.stderr).toContain('disagree');
  });
});
