/**
 * Shapes shared by the analysis modules. The analysis layer knows nothing about how the landing
 * points were made: it reads a `LandingSet` (plain typed arrays) and the scenario's `Site` and
 * `RunSettings`, and returns plain, JSON-serialisable objects.
 */
import type { Feature, FeatureCollection, MultiPolygon, Polygon } from 'geojson';

/**
 * The landed samples of one run, one entry per landed sample (failed samples are left out before
 * they reach the analysis).
 *
 * Weights: `weight[i]` is the probability that sample i stands for. The weights of all landed
 * samples of a mode sum to that mode's probability, so rare modes can be over-sampled and weighted
 * back. The analysis divides by the total weight, so weights that sum to something other than 1
 * (e.g. all ones) are also accepted.
 */
export interface LandingSet {
  /** Metres east of the pad. */
  east: Float64Array;
  /** Metres north of the pad. */
  north: Float64Array;
  /** Weight of each point (see above). */
  weight: Float64Array;
  /** Mode index of each point: 0 = nominal, k = the k-th failure mode. */
  mode: Uint8Array;
  /** Name of each mode, indexed like `mode`. */
  modeNames: string[];
  /** Probability of each mode per flight, indexed like `mode`. */
  modeProbability: number[];
  /**
   * Whether each mode comes down under a parachute. Absent means "no mode does", which is the
   * cautious reading for the casualty figure.
   */
  modeCarriesParachute?: boolean[];
  /** Original sample number of each point (for the landings file); absent means 0, 1, 2, ... */
  sample?: Uint32Array;
  /** Apogee above the pad, m (for the landings file). */
  apogee?: Float64Array;
  /** Time from launch to landing, s (for the landings file). */
  flightTime?: Float64Array;
  /** Speed at impact, m/s (for the landings file). */
  impactSpeed?: Float64Array;
  /** Impact angle above the horizontal, deg (absent: taken as vertical by the risk model). */
  impactAngle?: Float64Array;
  /** Impact energy ½ m v² of the mass that lands, J (the risk model needs it). */
  impactEnergy?: Float64Array;
  /**
   * Which part of the object each landing is (index into `partNames`): absent when every sample
   * lands whole, one landing each. With parts, a sample's rows share its weight (see parts.ts).
   */
  part?: Uint8Array;
  /** Name of each part: 'whole' for an object that lands in one piece, else the fragment class. */
  partNames?: string[];
  /** Casualty radius of each part, m (NaN: the risk settings' object radius). */
  partRadius?: number[];
}

export type AreaGeometry = Polygon | MultiPolygon;

export interface ContourProperties {
  /** Probability level p: the region holds this share of the landings. */
  level: number;
  /** Area of the region, m². */
  area_m2: number;
  /** Farthest point of the region from the pad, m. */
  maxDistance_m: number;
}

export type ContourFeature = Feature<MultiPolygon, ContourProperties>;

/** Distance of the farthest point of a region in each compass octant, m (null: none there). */
export interface OctantDistances {
  N: number | null;
  NE: number | null;
  E: number | null;
  SE: number | null;
  S: number | null;
  SW: number | null;
  W: number | null;
  NW: number | null;
}

export interface KeepOutProperties {
  level: number;
  margin_m: number;
  area_m2: number;
  maxDistance_m: number;
  octants_m: OctantDistances;
  /** What went into the union, for the reader of the map. */
  parts: string[];
}

export type KeepOutFeature = Feature<AreaGeometry, KeepOutProperties>;

export type { Feature, FeatureCollection, MultiPolygon, Polygon };
