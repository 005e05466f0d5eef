/**
 * The analysis layer: from landed samples to contours, keep-out zone, area figures, ellipses and
 * confidence, as one plain, JSON-serialisable result. Results are indicative: they support, and
 * never replace, the range-safety code that governs the site.
 *
 * @example
 *   const result = analyze(set, scenario.site, scenario.run);
 *   result.contours.features[1].properties  // { level: 0.9, area_m2, maxDistance_m }
 *   result.keepOut.properties.octants_m.NE
 *   writeContoursGeoJSON(result)            // string for contours.geojson
 */
import type { RunSettings, Site } from '../scenario/types.js';
import { assessAreas, type AreaResult } from './areas.js';
import { scottBandwidth, type Bandwidth } from './bandwidth.js';
import { keepOutOutsideBoundary } from './boundaryShare.js';
import { contourBands, outsideShare, topLevelWarning, type ContourBand, type OutsideShare } from './confidence.js';
import { traceContours, traceRegion } from './contours.js';
import { convexHull } from './convexHull.js';
import { densityAt, densityGrid } from './density.js';
import { modeEllipses, type ModeEllipse } from './ellipse.js';
import { createLocalFrame } from './geodesy.js';
import { gridMassThreshold, hdrThresholds } from './hdr.js';
import { keepOutZone } from './keepout.js';
import { countInside, createPolygonIndex } from './pointInPolygon.js';
import { polygonsToEastNorth } from './projectGeometry.js';
import type { ContourFeature, ContourProperties, FeatureCollection, KeepOutFeature, LandingSet, MultiPolygon } from './types.js';
import { effectiveSampleSize } from './weightedStats.js';
import { partFigures, sampleWeightsOf, type PartFigures } from './parts.js';
import { assessRisk, type RiskResult } from '../risk/index.js';
import type { RiskSettings } from '../risk/settings.js';

export interface AnalysisOptions {
  /** Fixed kernel bandwidth in metres (one number for both axes, or per axis). */
  bandwidth?: number | { east: number; north: number };
  /** Largest grid node count per axis (default 512). */
  maxGridNodes?: number;
  /** Grid nodes per bandwidth (default 4). */
  nodesPerBandwidth?: number;
  /**
   * The harm model (src/risk/settings.ts). With it, and impact energies in the landings, the result
   * carries the risk to people and the areas their expected casualties.
   */
  risk?: RiskSettings;
  /** Samples the run flew (for the samples a risk line needs; default: the landed count). */
  samples?: number;
}

export interface GridSummary {
  nx: number;
  ny: number;
  cellEast_m: number;
  cellNorth_m: number;
  /** East/north of node (0, 0), m from the pad. */
  originEast_m: number;
  originNorth_m: number;
}

export interface AnalysisResult {
  pad: { lat: number; lon: number };
  /** Landed samples analysed. */
  samples: number;
  /** Kish effective sample size of the weights. */
  effectiveSamples: number;
  levels: number[];
  bandwidth: Bandwidth;
  grid: GridSummary;
  /** Density threshold of each level, probability per m². */
  thresholds: number[];
  contours: FeatureCollection<MultiPolygon, ContourProperties>;
  bands: ContourBand[];
  keepOut: KeepOutFeature;
  /** Landings outside the keep-out zone. */
  keepOutOutside: OutsideShare;
  /** Part of the keep-out zone outside site.boundary (when a boundary is given). */
  keepOutOutsideBoundary?: { area_m2: number; share: number };
  areas: AreaResult[];
  ellipses: ModeEllipse[];
  /** Risk to people (absent without risk settings or without impact energies). */
  risk?: RiskResult;
  /** Landings per part (whole object, fragment classes), when the landings have parts. */
  parts?: PartFigures[];
  warnings: string[];
  /** Milliseconds per stage. */
  timing_ms: Record<string, number>;
}

/**
 * a ≥ b allowing for rounding: 1 − 0.99 is 0.010000000000000009 in floating point, and a mode of
 * probability 0.01 must count as "at or above" it.
 */
function atLeast(a: number, b: number): boolean {
  return a >= b - 1e-12;
}

function checkLevels(levels: number[]): number[] {
  const sorted = [...levels].sort((a, b) => a - b);
  sorted.forEach((p, k) => {
    if (!(p > 0 && p < 1)) throw new Error(`probability level must be between 0 and 1, got ${p}`);
    if (k > 0 && p === sorted[k - 1]) throw new Error(`probability level ${p} given twice`);
  });
  return sorted;
}

function checkSet(set: LandingSet): void {
  const n = set.east.length;
  if (n === 0) throw new Error('no landed samples to analyse');
  for (const [name, array] of [['north', set.north], ['weight', set.weight], ['mode', set.mode]] as const) {
    if (array.length !== n) throw new Error(`landing set: ${name} has ${array.length} entries, east has ${n}`);
  }
  for (let i = 0; i < n; i++) {
    if (!(set.weight[i] >= 0)) throw new Error(`landing set: weight of point ${i} is ${set.weight[i]}`);
    if (!Number.isFinite(set.east[i]) || !Number.isFinite(set.north[i])) {
      throw new Error(`landing set: point ${i} is not a finite position`);
    }
  }
}

export function analyze(set: LandingSet, site: Site, run: RunSettings, options: AnalysisOptions = {}): AnalysisResult {
  const timing: Record<string, number> = {};
  const started = performance.now();
  let mark = started;
  const lap = (stage: string) => {
    const now = performance.now();
    timing[stage] = now - mark;
    mark = now;
  };
  checkSet(set);
  const levels = checkLevels(run.levels);
  const frame = createLocalFrame(site.pad);
  const warnings: string[] = [];
  // Over flights: the pieces of one flight are not independent samples (parts.ts).
  const effectiveSamples = effectiveSampleSize(sampleWeightsOf(set));

  const bandwidth = scottBandwidth(set.east, set.north, set.weight, options.bandwidth);
  if (bandwidth.packed) {
    warnings.push('The landings are packed within a metre or so; the contours mostly show the smoothing kernel.');
  } else if (bandwidth.floored) {
    warnings.push('The landings lie along a line (one direction has almost no scatter); the contours across it mostly show the smoothing kernel.');
  }
  lap('bandwidth');

  const grid = densityGrid(set.east, set.north, set.weight, bandwidth, {
    maxNodes: options.maxGridNodes,
    nodesPerBandwidth: options.nodesPerBandwidth,
  });
  if (grid.dx > bandwidth.east || grid.dy > bandwidth.north) {
    warnings.push(
      `The density grid (${grid.nx} × ${grid.ny}) is coarser than the kernel bandwidth: the landings spread ` +
        'far compared with their local scatter, so the contours are smoother than the data.',
    );
  }
  lap('density');

  const atSamples = densityAt(grid, set.east, set.north);
  const wanted = levels.includes(run.keepOut.level) ? levels : [...levels, run.keepOut.level];
  const sampleThresholds = hdrThresholds(atSamples, set.weight, wanted);
  let peak = 0;
  for (let k = 0; k < grid.values.length; k++) peak = Math.max(peak, grid.values[k]);
  const allThresholds = sampleThresholds.map((t, k) => {
    // A threshold at the peak encloses nothing: many samples share one point (no spread). With a
    // few groups of coinciding landings the threshold sits at one group's peak instead; either way
    // the region holds far less of the smoothed probability than its level says.
    if (t < peak * (1 - 1e-6) && massAbove(grid.values, grid.dx * grid.dy, t) >= wanted[k] / 2) return t;
    warnings.push(
      `Many landings coincide, so the ${wanted[k]} region is drawn from the smoothed density and is wider than the data.`,
    );
    return gridMassThreshold(grid.values, grid.dx * grid.dy, wanted[k]);
  });
  const thresholds = allThresholds.slice(0, levels.length);
  lap('thresholds');

  const contourFeatures: ContourFeature[] = traceContours(grid, thresholds, levels, frame);
  lap('contours');

  const keepOutThreshold = allThresholds[wanted.indexOf(run.keepOut.level)];
  const hulls = set.modeNames
    .map((name, m) => ({ name, m }))
    .filter(({ m }) => atLeast(set.modeProbability[m] ?? 0, 1 - run.keepOut.level))
    .map(({ name, m }) => ({ mode: name, ring: convexHull(set.east, set.north, (i) => set.mode[i] === m) }));
  const keepOut = keepOutZone({
    regionMetres: traceRegion(grid, keepOutThreshold),
    hulls,
    minimumDistance: site.minimumDistance,
    level: run.keepOut.level,
    margin: run.keepOut.margin,
    frame,
  });
  const keepOutMetres = polygonsToEastNorth(frame, keepOut.geometry);
  lap('keepOut');

  const bands = contourBands(atSamples, set.weight, levels, thresholds);
  const bandWarning = topLevelWarning(bands, set.east.length);
  if (bandWarning) warnings.push(bandWarning.message);
  const inside = countInside(createPolygonIndex(keepOutMetres), set.east, set.north, set.weight);
  const keepOutOutside = outsideShare(inside.mask, set.weight);
  lap('confidence');

  const areas = assessAreas({
    areas: site.areas,
    set,
    frame,
    keepOut,
    effectiveN: effectiveSamples,
  });
  for (const area of areas) {
    if (area.intersectsKeepOut) warnings.push(`Area "${area.name}" (${area.kind}) overlaps the keep-out zone.`);
  }
  const outsideBoundary = site.boundary ? keepOutOutsideBoundary(keepOut, site.boundary, frame) : undefined;
  if (outsideBoundary && outsideBoundary.share > 0) {
    warnings.push(
      `${(outsideBoundary.share * 100).toFixed(1)} % of the keep-out zone lies outside the site boundary.`,
    );
  }
  lap('areas');

  const ellipses = modeEllipses(set, levels);
  lap('ellipses');

  let risk: RiskResult | undefined;
  if (options.risk !== undefined && set.impactEnergy !== undefined) {
    risk = assessRisk(set, site, options.risk, { samples: options.samples });
    risk.areas.forEach((r, k) => {
      const area = areas[k];
      area.maxIndividualRisk = r.maxIndividualRisk;
      if (r.peoplePerM2 === null || r.expectedCasualties === null) return;
      area.peoplePerM2 = r.peoplePerM2;
      area.sheltered = r.sheltered;
      area.expectedCasualties = r.expectedCasualties;
      area.casualtiesUpper95 = r.upper95 ?? undefined;
      area.note =
        'Not a compliance figure: people spread evenly over the area, casualty area of each impact from its angle, ' +
        'casualty when the impact energy reaches the threshold (or by the table); all modes counted.';
    });
    // The risk warnings stay in summary.json's risk.warnings, the terminal and the page (the record keeps two pages).
    lap('risk');
  }
  const parts = partFigures(set);
  timing.total = performance.now() - started;

  return {
    pad: { lat: site.pad.lat, lon: site.pad.lon },
    samples: set.east.length,
    effectiveSamples,
    levels,
    bandwidth,
    grid: {
      nx: grid.nx,
      ny: grid.ny,
      cellEast_m: grid.dx,
      cellNorth_m: grid.dy,
      originEast_m: grid.x0,
      originNorth_m: grid.y0,
    },
    thresholds,
    contours: { type: 'FeatureCollection', features: contourFeatures },
    bands,
    keepOut,
    keepOutOutside,
    ...(outsideBoundary ? { keepOutOutsideBoundary: outsideBoundary } : {}),
    areas,
    ellipses,
    ...(risk ? { risk } : {}),
    ...(parts ? { parts } : {}),
    warnings,
    timing_ms: timing,
  };
}

export type { LandingSet } from './types.js';
export { createLocalFrame, toLonLatArrays } from './geodesy.js';
export { clopperPearsonUpper, weightedUpperBound } from './clopperPearson.js';
export {
  landingsGeoJSONChunks,
  writeContoursGeoJSON,
  writeKeepOutGeoJSON,
  writeLandingsGeoJSON,
} from './geojsonWriters.js';
export { writeAreasCsv } from './areasCsv.js';
export { summaryParts } from './summary.js';
export { writeKml } from './kml.js';

/** Probability of the grid cells whose density is at least `threshold`. */
function massAbove(values: Float64Array, cellArea: number, threshold: number): number {
  let mass = 0;
  for (let k = 0; k < values.length; k++) if (values[k] >= threshold) mass += values[k];
  return mass * cellArea;
}
