import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { loadScenarioFileWithTerrain } from '../../src/scenario/file.js';
import { join, dirname } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeArrayBuffer } from 'geotiff';
import geodesic from 'geographiclib-geodesic';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import { readDem } from '../../src/terrain/dem.js';
import { localTerrainGrid } from '../../src/terrain/local-grid.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { body, constantAir, scenario } from '../helpers/build.js';
import { editedScenario, strewn } from '../cli/helpers.js';

const WGS84 = geodesic.Geodesic.WGS84;
const PAD = { lat: 45, lon: 7, elevation: 500 };

/**
 * A GeoTIFF elevation model (EPSG:4326, pixel is area) written with geotiff's own writer. Heights at
 * each pixel centre are `height(east, north)`, with east/north of the centre found by GeographicLib
 * (C. F. F. Karney, J. Geodesy 87, 2013): the azimuthal equidistant position, distance s12 along
 * azimuth azi1 from the pad.
 */
function demFile(path: string, height: (east: number, north: number) => number, halfSize = 0.02, pixels = 161): void {
  const d = (2 * halfSize) / pixels;
  const west = PAD.lon - halfSize, north = PAD.lat + halfSize;
  const values = new Float32Array(pixels * pixels);
  for (let j = 0; j < pixels; j++) {
    for (let i = 0; i < pixels; i++) {
      const lon = west + (i + 0.5) * d, lat = north - (j + 0.5) * d;
      const g = WGS84.Inverse(PAD.lat, PAD.lon, lat, lon);
      const az = (g.azi1! * Math.PI) / 180;
      values[j * pixels + i] = height(g.s12! * Math.sin(az), g.s12! * Math.cos(az));
    }
  }
  const buffer = writeArrayBuffer(values, {
    width: pixels, height: pixels, ModelPixelScale: [d, d, 0], ModelTiepoint: [0, 0, 0, west, north, 0],
    GeographicTypeGeoKey: 4326, GeogCitationGeoKey: 'WGS 84', GTModelTypeGeoKey: 2, GTRasterTypeGeoKey: 1, SampleFormat: [3], BitsPerSample: [32],
  });
  writeFileSync(path, new Uint8Array(buffer));
}

describe('terrain: a canopy meets a tilted plane where its straight descent line does (closed form)', () => {
  // Plane rising 15 % toward the east and 5 % toward the north through the pad.
  const A = 0.15, B = 0.05;
  const dir = dirname(editedScenario('drone-power-loss.json', () => {}));
  const tif = join(dir, 'plane.tif');
  demFile(tif, (e, n) => PAD.elevation + A * e + B * n);

  async function descent(withTerrain: boolean) {
    const m = 1.5, cda = 0.6, w = 6;
    const sc = scenario({
      vehicle: body('release', m, 0.8, 0.03),
      launch: { kind: 'release', height: 300, speed: w, heading: 90, east: 0, north: 0 },
      recovery: [{ name: 'canopy', trigger: 'apogee', delay: 0, dragArea: cda }],
      wind: { speed: w, from: 270, shear: 0 },
      elevation: PAD.elevation,
    });
    sc.site.pad = { ...PAD };
    if (withTerrain) sc.site.terrain = localTerrainGrid(await readDem(readFileSync(tif)), PAD.elevation, createLocalFrame(PAD), 'plane.tif');
    const model = new FlightModel(sc, { air: constantAir(1.2) });
    const inputs = emptyInputs(1);
    Object.assign(inputs, { height: 300, mass: m, windSpeed: w, speed: w, heading: 90 });
    let p: Float64Array | null = null;
    const r = model.fly(inputs, () => 0, emptyResult(), (t, y) => {
      if (p === null && y[2] < 200) p = Float64Array.from(y);
    });
    return { r: { ...r }, p: p!, v: Math.sqrt((2 * m * 9.80665) / (1.2 * cda)), w };
  }

  it('lands on the plane at the line–plane intersection, within 0.3 m', async () => {
    const { r, p, v, w } = await descent(true);
    expect(r.status).toBe(0);
    // Steady descent by then: moving with the wind, falling at the terminal rate sqrt(2 m g / (ρ CdA)).
    expect(p[3]).toBeCloseTo(w, 3);
    expect(Math.abs(p[5] / -v - 1)).toBeLessThan(0.005);
    // P + s (ve, vn, vz) meets z = A e + B n.
    const s = (p[2] - A * p[0] - B * p[1]) / (A * p[3] + B * p[4] - p[5]);
    const east = p[0] + p[3] * s, north = p[1] + p[4] * s;
    expect(Math.hypot(r.east - east, r.north - north)).toBeLessThan(0.3);
    expect(east).toBeGreaterThan(200);
    // The contact is on the plane, above the pad here, and the impact speed is the steady speed.
    expect(r.east).toBeGreaterThan(100);
    expect(r.impactSpeed).toBeCloseTo(Math.hypot(p[3], p[4], p[5]), 2);
  });

  it('level ground would put it tens of metres further downwind (the terrain matters)', async () => {
    const level = await descent(false);
    const tilted = await descent(true);
    expect(level.r.east - tilted.r.east).toBeGreaterThan(20);
  });
});

describe('terrain: a flat model at the pad elevation changes nothing', () => {
  it('landings.csv is byte-identical with and without it (drone demo, 300 samples)', async () => {
    const plain = editedScenario('drone-power-loss.json', (s) => (s.run.samples = 300));
    const flat = editedScenario('drone-power-loss.json', (s) => {
      s.run.samples = 300;
      s.site.terrain = 'flat.tif';
    });
    const json = JSON.parse(readFileSync(flat, 'utf8'));
    const elevation = Number(String(json.site.pad.elevation).replace(/\s*m$/, ''));
    const pad = { lat: json.site.pad.lat, lon: json.site.pad.lon };
    // The flat model around the demo pad, written the same way.
    const pixels = 41, half = 0.02, d = (2 * half) / pixels;
    const values = new Float32Array(pixels * pixels).fill(elevation);
    writeFileSync(join(dirname(flat), 'flat.tif'), new Uint8Array(writeArrayBuffer(values, {
      width: pixels, height: pixels, ModelPixelScale: [d, d, 0], ModelTiepoint: [0, 0, 0, pad.lon - half, pad.lat + half, 0],
      GeographicTypeGeoKey: 4326, GTModelTypeGeoKey: 2, GTRasterTypeGeoKey: 1, SampleFormat: [3], BitsPerSample: [32],
    })));
    const a = strewn(['run', plain, '--out', join(dirname(plain), 'out'), '--quiet', '--workers', '2']);
    const b = strewn(['run', flat, '--out', join(dirname(flat), 'out'), '--quiet', '--workers', '2']);
    expect(a.status, a.stderr).toBe(0);
    expect(b.status, b.stderr).toBe(0);
    const la = readFileSync(join(dirname(plain), 'out', 'landings.csv'));
    const lb = readFileSync(join(dirname(flat), 'out', 'landings.csv'));
    expect(lb.equals(la)).toBe(true);
    // The model did reach the flight: its grid is all zeros above the pad, and the same model
    // 5 m higher than the pad moves the landings.
    const loaded = await loadScenarioFileWithTerrain(flat);
    expect(loaded.scenario.site.terrain!.heights.every((h) => h === 0)).toBe(true);
    expect(loaded.scenario.site.terrain!.nx).toBeGreaterThan(10);
    const raised = editedScenario('drone-power-loss.json', (s) => {
      s.run.samples = 300;
      s.site.terrain = 'flat.tif';
      s.site.pad.elevation = `${elevation - 5} m`;
    });
    copyFileSync(join(dirname(flat), 'flat.tif'), join(dirname(raised), 'flat.tif'));
    const c = strewn(['run', raised, '--out', join(dirname(raised), 'out'), '--quiet', '--workers', '2']);
    expect(c.status, c.stderr).toBe(0);
    expect(readFileSync(join(dirname(raised), 'out', 'landings.csv')).equals(la)).toBe(false);
  });

  it('a model that is not there, or projected, is an input error naming site.terrain', () => {
    const missing = editedScenario('drone-power-loss.json', (s) => (s.site.terrain = 'nope.tif'));
    const r = strewn(['check', missing]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('site.terrain');
    expect(r.stderr).toContain('no such file');
  });
});
