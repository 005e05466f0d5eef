/**
 * The normalised scenario: what the scenario file says, with every quantity converted to SI
 * (m, kg, s, m/s, N, Pa, K, m²; angles stay in degrees as the format document fixes) and every
 * default filled in. Everything downstream of `src/scenario` reads only this shape.
 */

export type VehicleKind = 'rocket' | 'projectile' | 'release';

/** Drag coefficient by Mach number; a constant Cd is a one-row table. Linear between rows, held outside. */
export interface DragTable {
  mach: number[];
  cd: number[];
}

/** Thrust curve: strictly increasing times from 0, thrust never negative. */
export interface ThrustCurve {
  time: number[];
  thrust: number[];
}

export interface Motor {
  thrust: ThrustCurve;
  /** Where the curve came from: "inline" or the CSV path as written in the scenario. */
  source: string;
  propellantMass: number;
  /** Motor length, m (required with a shape: the propellant sits at motorEnd − length/2). */
  length?: number;
}

export type NoseForm = 'cone' | 'ogive' | 'parabola';

/** A conical shoulder or boattail; positions from the nose tip, m. */
export interface Transition {
  position: number;
  length: number;
  foreDiameter: number;
  aftDiameter: number;
}

/** A set of identical fins; positions from the nose tip, m. */
export interface FinSet {
  count: 3 | 4;
  /** Root leading edge from the nose tip. */
  position: number;
  rootChord: number;
  tipChord: number;
  /** One fin, body to tip. */
  span: number;
  /** Root leading edge to tip leading edge, along the body. */
  sweep: number;
}

/**
 * The rocket's outside shape and balance, every default filled (see the format's
 * "vehicle.shape"). With a shape the rocket flies as a rigid body.
 */
export interface RocketShape {
  nose: { form: NoseForm; length: number };
  transitions: Transition[];
  fins: FinSet[];
  /** Nose tip to the aft end, m. */
  length: number;
  /** Balance point ready to fly, motor loaded, from the nose tip, m. */
  cg: number;
  /** Transverse moment of inertia about `cg`, ready to fly, kg m². */
  inertia: number;
  /** Nose tip to the nozzle exit, m. */
  motorEnd: number;
}

export interface Vehicle {
  kind: VehicleKind;
  /** kg; for rockets, without propellant. */
  mass: number;
  /** m². */
  referenceArea: number;
  drag: DragTable;
  motor?: Motor;
  /** Body diameter, m (rockets with a shape: the nose base and the reference for calibres). */
  diameter?: number;
  /** Rockets only: with a shape the rocket flies as a rigid body, without one as a point mass. */
  shape?: RocketShape;
}

export interface RocketLaunch {
  kind: 'rocket';
  rail: number;
  tilt: number;
  azimuth: number;
}

export interface ProjectileLaunch {
  kind: 'projectile';
  speed: number;
  elevation: number;
  azimuth: number;
  height: number;
}

export interface ReleaseLaunch {
  kind: 'release';
  height: number;
  /** Horizontal speed at release, m/s; with a `path`, the speed along it. */
  speed: number;
  /** deg; with a `path` the heading follows the path and this is only the nominal of a heading spread (0). */
  heading: number;
  east: number;
  north: number;
  /** The route flown (lon, lat): the release point is uniform in time along it, heading along it. */
  path?: LineStringGeometry;
  /** The ground the operation covers (lon, lat): the release point is uniform over it. */
  area?: PolygonGeometry;
  /** Set when the file gives no heading (an area then draws a uniform heading). */
  headingFree?: true;
  /**
   * Length of the operation, s: as given, or one pass along the path at `speed`. Turns failure
   * rates into chances per operation; with a path longer than one pass the route is flown back
   * and forth.
   */
  duration?: number;
  /** How often the object comes down per second of flying (the file gives it per hour), if given. */
  rate?: number;
}

export type Launch = RocketLaunch | ProjectileLaunch | ReleaseLaunch;

export type TriggerKind = 'apogee' | 'altitude' | 'time';

export interface RecoveryStage {
  name: string;
  trigger: TriggerKind;
  /** s after the trigger. */
  delay: number;
  /** m above the pad, for trigger "altitude" (met on the way down). */
  altitude?: number;
  /** s after launch, for trigger "time". */
  time?: number;
  /** Cd·A in m²; a `descentRate` in the file is converted with 2 m g0 / (1.225 v²). */
  dragArea: number;
  /** The descent rate as written, when the file gave one (kept for reports). */
  descentRate?: number;
  /** The canopy as written, when the file gave its size: nominal diameter (m), Cd referred to it, shape note. */
  canopy?: { diameter: number; drag: number; note?: string };
}

export interface ProfileRow {
  altitude: number;
  speed: number;
  from: number;
}

export interface Wind {
  /** Mean speed at the reference height, m/s. */
  speed: number;
  /** Direction the wind blows from, degrees clockwise from true north. */
  from: number;
  /** Peak gust speed at the reference height, m/s (optional). */
  gust?: number;
  /** Reference height above the pad, m. */
  height: number;
  /** Power-law exponent (used when there is no profile, and below the lowest profile row). */
  shear: number;
  /** Rows sorted by altitude above the pad. */
  profile?: ProfileRow[];
}

export interface Weather {
  wind: Wind;
  /**
   * Dryden turbulence on or off. Defaults to on when a gust is given, off otherwise, so that a
   * scenario with no spreads and no gust flies the nominal flight in every sample.
   */
  turbulence: boolean;
  /** Air temperature at the pad, K; absent means the standard atmosphere at the pad's elevation. */
  temperature?: number;
  /** Air pressure at the pad, Pa; absent means the standard atmosphere at the pad's elevation. */
  pressure?: number;
  /**
   * Temperature (K) and pressure (Pa) by altitude above the pad (m), sorted, from a forecast; the
   * air model takes its temperature from these rows instead of the standard atmosphere's shape.
   */
  air?: { altitude: number; temperature: number; pressure: number }[];
  /** Where the wind and air came from when `weather.forecast` was given. */
  forecast?: ForecastSource;
}

export interface ForecastSource {
  /** The file as written in the scenario. */
  file: string;
  /** Valid time asked for, ISO 8601 UTC. */
  time: string;
  /** Forecast steps interpolated between (ISO 8601 UTC). */
  steps: string[];
  /** Reference (analysis) time of the forecast run, ISO 8601 UTC. */
  referenceTime: string;
  /** Ensemble members averaged (0 for a deterministic forecast). */
  members: number;
  /** Half-width of the time window whose steps entered the spread, s. */
  window?: number;
  /** Profiles the wind spread came from, and the spread; absent when there was only one. */
  spread?: { profiles: number; speedSd: number; fromSdDeg: number; layerTop: number };
}

/**
 * Parameters a spread may vary. Absolute spreads are in the parameter's SI unit: m/s for the wind
 * and launch speeds, degrees for directions and angles, m for launch.height, N s for motor.impulse
 * (of the whole curve), kg for vehicle.mass, a plain Cd for vehicle.drag, s for recovery.delay.
 * recovery.rate is always relative (it scales every stage's drag area); wind.from and
 * launch.azimuth are never relative. For a release, launch.azimuth varies the heading.
 * motor.misalignment (deg, the angle between thrust line and body axis; its direction around the
 * axis is drawn uniform) and vehicle.cg (m) apply to rockets with a shape.
 */
export type UncertaintyName =
  | 'wind.speed'
  | 'wind.from'
  | 'wind.gust'
  | 'launch.tilt'
  | 'launch.azimuth'
  | 'launch.speed'
  | 'launch.elevation'
  | 'launch.height'
  | 'motor.impulse'
  | 'vehicle.mass'
  | 'vehicle.drag'
  | 'recovery.delay'
  | 'recovery.rate'
  | 'motor.misalignment'
  | 'vehicle.cg';

export const UNCERTAINTY_NAMES: readonly UncertaintyName[] = [
  'wind.speed',
  'wind.from',
  'wind.gust',
  'launch.tilt',
  'launch.azimuth',
  'launch.speed',
  'launch.elevation',
  'launch.height',
  'motor.impulse',
  'vehicle.mass',
  'vehicle.drag',
  'recovery.delay',
  'recovery.rate',
  'motor.misalignment',
  'vehicle.cg',
];

/**
 * A spread. `relative: true` means the numbers are fractions of the nominal value (the file said
 * "8 %"); otherwise they are in the parameter's SI unit (degrees for angles).
 */
export type Spread =
  | { kind: 'normal'; sd: number; relative: boolean; limit?: number }
  | { kind: 'uniform'; lo: number; hi: number; relative: boolean };

export interface FailureMode {
  name: string;
  /** Chance per flight (or per operation, when the file gave a `rate`). */
  probability: number;
  /** The rate per second the probability was worked out from, when the file gave one. */
  rate?: number;
  /**
   * 'skip': the named stage (or every recovery stage, "all") never deploys, or the named breakup
   * never happens. 'early': the named breakup happens at `time` after launch instead.
   */
  effect: 'skip' | 'early';
  /** A recovery stage name, "all", or the breakup's name. */
  stage: string;
  /** Effect 'early': seconds after launch at which the breakup happens. */
  time?: number;
}

/**
 * One class of pieces the object breaks into (scenario `breakup.fragments`). Every piece flies
 * as a point mass from the break state with its own drag and an added velocity of `speed` in a
 * direction drawn uniformly over the sphere.
 */
export interface FragmentClass {
  name: string;
  /** Pieces of this class per breakup (a whole number, 1 or more). */
  count: number;
  /** kg, one piece. */
  mass: number;
  /** Drag coefficient times reference area of one piece, m². */
  dragArea: number;
  /** Drag coefficient (1 when the file gives dragArea only). */
  drag: number;
  /** Reference area, m² (π d²/4 from `diameter`, or dragArea / drag). */
  referenceArea: number;
  /** Added speed relative to the object at the break, m/s (0: the piece keeps the object's velocity). */
  speed: number;
  /** Radius for the casualty area, m: `radius`, else half the diameter, else √(A/π). */
  radius: number;
}

/** The object breaks into fragment classes at a trigger (scenario `breakup`). */
export interface Breakup {
  /** Named by failure modes ('skip': no breakup; 'early': a breakup at another time). */
  name: string;
  trigger: 'apogee' | 'time';
  /** Seconds after apogee (trigger apogee), default 0. */
  delay: number;
  /** Seconds after launch (trigger time). */
  time?: number;
  fragments: FragmentClass[];
}

export interface KeepOut {
  level: number;
  /** m. */
  margin: number;
}

export interface RunSettings {
  samples: number;
  seed: string;
  levels: number[];
  keepOut: KeepOut;
  /** How results are shown when no --units is given (absent: metric). Not part of the scenario hash. */
  units?: 'metric' | 'imperial';
  /** Paper of the review sheet when no --paper is given (absent: a4). Not part of the scenario hash. */
  paper?: 'a4' | 'letter';
}

export type AreaKind = 'spectators' | 'parking' | 'road' | 'building' | 'water' | 'other';

export interface LineStringGeometry {
  type: 'LineString';
  coordinates: number[][];
}

export interface PolygonGeometry {
  type: 'Polygon';
  coordinates: number[][][];
}

export interface Area {
  name: string;
  kind: AreaKind;
  geometry: PolygonGeometry;
  people?: number;
  /** People per m² (instead of `people`). */
  density?: number;
  /** Share of the people under cover, 0–1 (absent: 0). */
  sheltered?: number;
}

export interface Site {
  pad: { lat: number; lon: number; elevation: number };
  minimumDistance?: number;
  boundary?: PolygonGeometry;
  areas: Area[];
  /** GeoJSON FeatureCollection, passed through untouched. */
  basemap?: { type: 'FeatureCollection'; features: unknown[] };
  /** The ground from `site.terrain` (a GeoTIFF elevation model); absent means level ground. */
  terrain?: TerrainGrid;
}

/**
 * Ground height above the pad's elevation (m) on a regular east/north grid (m from the pad):
 * node (i, j) at (east0 + i step, north0 + j step), row-major from the south-west; bilinear
 * between nodes and held at the edge outside.
 */
export interface TerrainGrid {
  /** The GeoTIFF as written in the scenario. */
  file: string;
  east0: number;
  north0: number;
  step: number;
  nx: number;
  ny: number;
  heights: number[];
}

/**
 * The harm model as the file gives it, in SI (J, m). Absent fields take the defaults of
 * src/risk/settings.ts, so a scenario without a `risk` block keeps its hash.
 */
export interface RiskInput {
  casualtyEnergy?: number;
  /** Casualty probability by impact energy: energies (J) increasing, probabilities 0–1. */
  casualtyProbability?: { energy: number[]; probability: number[] };
  personRadius?: number;
  personHeight?: number;
  objectRadius?: number;
  levels?: number[];
  criteria?: { individual?: number; collective?: number };
}

export interface Scenario {
  strewn: 1;
  name: string;
  notes?: string;
  site: Site;
  vehicle: Vehicle;
  launch: Launch;
  recovery: RecoveryStage[];
  weather: Weather;
  uncertainty: Partial<Record<UncertaintyName, Spread>>;
  failures: FailureMode[];
  run: RunSettings;
  risk?: RiskInput;
  /** The object breaks into pieces (absent: it always lands whole; the hash stays as it was). */
  breakup?: Breakup;
}

/** One input problem: the field path, the value given, and what was expected. */
export interface Issue {
  path: string;
  message: string;
}
