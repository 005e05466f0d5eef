/**
 * Analysis timing: 100,000 and 1,000,000 landed samples (a 97 % nominal mode and a 3 % no-parachute
 * mode drawn from seeded normals), through `analyze` and the landings writer.
 *
 * Run after building: node dist/test/bench/analysis-bench.js
 */
import seedrandom from 'seedrandom';
import { analyze, landingsGeoJSONChunks, type LandingSet } from '../../src/analysis/index.js';
import type { RunSettings, Site } from '../../src/scenario/types.js';

function normalPair(random: () => number): [number, number] {
  const u = 1 - random();
  const v = random();
  const r = Math.sqrt(-2 * Math.log(u));
  return [r * Math.cos(2 * Math.PI * v), r * Math.sin(2 * Math.PI * v)];
}

function makeSet(count: number): LandingSet {
  const random = seedrandom.alea(`bench ${count}`);
  const east = new Float64Array(count);
  const north = new Float64Array(count);
  const weight = new Float64Array(count);
  const mode = new Uint8Array(count);
  const rare = Math.round(count * 0.1); // the 3 % mode over-sampled to 10 % and weighted back
  for (let i = 0; i < count; i++) {
    const [a, b] = normalPair(random);
    if (i < count - rare) {
      east[i] = 40 + a * 80 * 0.5 + b * 35 * 0.866;
      north[i] = 150 + a * 80 * 0.866 - b * 35 * 0.5;
      weight[i] = 0.97 / (count - rare);
    } else {
      east[i] = 600 + a * 150;
      north[i] = 900 + b * 110;
      weight[i] = 0.03 / rare;
      mode[i] = 1;
    }
  }
  return {
    east,
    north,
    weight,
    mode,
    modeNames: ['nominal', 'no parachute'],
    modeProbability: [0.97, 0.03],
    modeCarriesParachute: [true, false],
  };
}

const site: Site = {
  pad: { lat: 47.2, lon: 8.6, elevation: 420 },
  minimumDistance: 150,
  areas: [
    {
      name: 'spectators',
      kind: 'spectators',
      people: 300,
      geometry: { type: 'Polygon', coordinates: [[[8.598, 47.198], [8.597, 47.198], [8.597, 47.199], [8.598, 47.199], [8.598, 47.198]]] },
    },
  ],
};
const run: RunSettings = { samples: 0, seed: '1', levels: [0.5, 0.9, 0.99], keepOut: { level: 0.99, margin: 25 } };

for (const count of [100_000, 1_000_000]) {
  const set = makeSet(count);
  const result = analyze(set, site, run);
  const start = performance.now();
  let characters = 0;
  for (const piece of landingsGeoJSONChunks(set, site.pad)) characters += piece.length;
  const writeMs = performance.now() - start;
  const stages = Object.entries(result.timing_ms)
    .map(([k, v]) => `${k} ${v.toFixed(0)}`)
    .join(', ');
  console.log(
    `${count} points: grid ${result.grid.nx} x ${result.grid.ny} (cell ${result.grid.cellEast_m.toFixed(2)} x ` +
      `${result.grid.cellNorth_m.toFixed(2)} m), bandwidth ${result.bandwidth.east.toFixed(2)} x ` +
      `${result.bandwidth.north.toFixed(2)} m; analyze ms: ${stages}; landings.geojson ${writeMs.toFixed(0)} ms ` +
      `(${(characters / 1e6).toFixed(0)} MB)`,
  );
}
