import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadScenarioFileWithTerrain } from '../../src/scenario/file.js';
import { DispersionRunner, allocateChunk } from '../../src/dispersion/runner.js';
import { piecesPerSample } from '../../src/dispersion/breakup.js';
import { resultColumns } from '../../src/dispersion/columns.js';
import { shardRange } from '../../src/dispersion/shards.js';
import { OutputFolder } from '../../src/cli/output-folder.js';
import { readShardInto, readShardManifest, writeShardFolder } from '../../src/cli/shard-folder.js';
import { SCENARIOS, tempDir } from './helpers.js';

/**
 * `strewn merge` reads each shard's columns straight into their place in the study's columns
 * (readShardInto), so no shard is held twice. The result must be exactly the columns of flying the
 * whole study at once (the project's reproducibility rule: a sample depends only on scenario,
 * seed, count and index; common practice, no source). The shell with a breakup has piece columns
 * of 13 entries per sample, so a wrong offset for a column's stride shows at once.
 */
describe('reading shards into the study columns', async () => {
  const { scenario, hash } = await loadScenarioFileWithTerrain(join(SCENARIOS, 'display-shell-burst.json'));
  const samples = 60;
  const seed = 'shard-read';
  const runner = new DispersionRunner(scenario, { samples, seed });
  const whole = runner.runChunk(0, samples);
  const dir = tempDir('strewn-shard-read-');
  const count = 3;
  const folders = Array.from({ length: count }, (_, index) => {
    const [first, n] = shardRange(samples, { index, count });
    const out = OutputFolder.prepare(join(dir, `shard-${index}-of-${count}`), { force: false, inputs: [], say: () => {} });
    writeShardFolder(out, runner.runChunk(first, n), { scenario, scenarioHash: hash, seed, samples, warnings: [], shard: { index, count } });
    out.commit();
    return join(dir, `shard-${index}-of-${count}`);
  });

  it('shards read in another order give every column of the single run, bit for bit', () => {
    expect(piecesPerSample(scenario)).toBeGreaterThan(1);
    const merged = allocateChunk(0, samples, piecesPerSample(scenario));
    // NaN marks what no shard wrote; a shard placed at the wrong offset leaves some behind.
    for (const [, column] of resultColumns(merged)) if (column instanceof Float64Array) column.fill(NaN);
    for (const k of [2, 0, 1]) readShardInto(merged, folders[k], readShardManifest(folders[k]));
    const expected = resultColumns(whole);
    const got = resultColumns(merged);
    expect(got.map(([name]) => name)).toEqual(expected.map(([name]) => name));
    got.forEach(([name, column], k) => {
      const want = expected[k][1];
      expect(column.length, name).toBe(want.length);
      expect(Buffer.from(column.buffer, column.byteOffset, column.byteLength).equals(Buffer.from(want.buffer, want.byteOffset, want.byteLength)), name).toBe(true);
    });
  });

  it('a damaged columns file is refused by its checksum, naming the shard', () => {
    const file = join(folders[1], 'columns.bin');
    const good = readFileSync(file);
    const bytes = Buffer.from(good);
    bytes[bytes.length >> 1] ^= 0x40;
    writeFileSync(file, bytes);
    try {
      expect(() => readShardInto(allocateChunk(0, samples, piecesPerSample(scenario)), folders[1], readShardManifest(folders[1]))).toThrow(
        `shard '${folders[1]}': columns.bin does not match its checksum`,
      );
      writeFileSync(file, bytes.subarray(0, bytes.length - 8));
      expect(() => readShardInto(allocateChunk(0, samples, piecesPerSample(scenario)), folders[1], readShardManifest(folders[1]))).toThrow('the manifest expects');
    } finally {
      writeFileSync(file, good);
    }
  });
});
