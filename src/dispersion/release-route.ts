import earcut from 'earcut';
import { createLocalFrame } from '../analysis/geodesy.js';
import type { ReleaseLaunch, Site } from '../scenario/types.js';
import type { SampleStream } from './random.js';

/**
 * Where and in which direction a released object starts when the release is spread over a route
 * or an area (a drone operation), worked out once per scenario in the pad's local frame.
 *
 * - Path: the object flies the line at `speed`, back and forth for the operation's duration; the
 *   release time is uniform over the duration (a constant failure rate makes a failure equally
 *   likely at any moment of the flight), the heading is along the leg being flown. One uniform.
 * - Area: the release point is uniform over the polygon (holes left out), triangulated once;
 *   the heading is the launch heading when the file gives one, else uniform. Four uniforms
 *   (triangle, two for the point in it, heading), consumed whether or not the heading is drawn.
 *
 * These uniforms are drawn after every spread, so scenarios with one release point draw the same
 * numbers as before.
 */
export class ReleaseRoute {
  /** Uniforms a sample consumes for the route. */
  readonly draws: number;
  private readonly kind: 'path' | 'area';
  // Path: vertex coordinates and cumulative length at each vertex.
  private readonly px: Float64Array = new Float64Array(0);
  private readonly py: Float64Array = new Float64Array(0);
  private readonly cumulative: Float64Array = new Float64Array(0);
  private readonly length: number = 0;
  private readonly distanceFlown: number = 0;
  // Area: triangle corners (x0 y0 x1 y1 x2 y2 per triangle) and cumulative area share.
  private readonly triangles: Float64Array = new Float64Array(0);
  private readonly areaShare: Float64Array = new Float64Array(0);
  private readonly fixedHeading: number | null = null;

  /** Heading, east and north of the last `place` call. */
  heading = 0;
  east = 0;
  north = 0;

  private constructor(launch: ReleaseLaunch, site: Site) {
    const frame = createLocalFrame(site.pad);
    if (launch.path !== undefined) {
      this.kind = 'path';
      this.draws = 1;
      const n = launch.path.coordinates.length;
      this.px = new Float64Array(n);
      this.py = new Float64Array(n);
      this.cumulative = new Float64Array(n);
      launch.path.coordinates.forEach(([lon, lat], i) => {
        const [e, nn] = frame.toEastNorth(lon, lat);
        this.px[i] = e;
        this.py[i] = nn;
        if (i > 0) this.cumulative[i] = this.cumulative[i - 1] + Math.hypot(e - this.px[i - 1], nn - this.py[i - 1]);
      });
      this.length = this.cumulative[n - 1];
      this.distanceFlown = launch.speed * (launch.duration ?? this.length / Math.max(launch.speed, 1e-9));
    } else {
      this.kind = 'area';
      this.draws = 4;
      const rings = launch.area!.coordinates.map((ring) => ring.slice(0, -1).map(([lon, lat]) => frame.toEastNorth(lon, lat)));
      const flat: number[] = [];
      const holes: number[] = [];
      rings.forEach((ring, r) => {
        if (r > 0) holes.push(flat.length / 2);
        for (const [e, n] of ring) flat.push(e, n);
      });
      const index = earcut(flat, holes, 2);
      const count = index.length / 3;
      this.triangles = new Float64Array(count * 6);
      this.areaShare = new Float64Array(count);
      let total = 0;
      for (let t = 0; t < count; t++) {
        for (let k = 0; k < 3; k++) {
          this.triangles[t * 6 + 2 * k] = flat[2 * index[3 * t + k]];
          this.triangles[t * 6 + 2 * k + 1] = flat[2 * index[3 * t + k] + 1];
        }
        const a = this.triangles.subarray(t * 6, t * 6 + 6);
        total += Math.abs((a[2] - a[0]) * (a[5] - a[1]) - (a[4] - a[0]) * (a[3] - a[1])) / 2;
        this.areaShare[t] = total;
      }
      for (let t = 0; t < count; t++) this.areaShare[t] /= total;
      this.fixedHeading = launch.headingFree ? null : launch.heading;
    }
  }

  /** The route of a release launch, or null when it starts from one point. */
  static of(launch: ReleaseLaunch, site: Site): ReleaseRoute | null {
    if (launch.path === undefined && launch.area === undefined) return null;
    return new ReleaseRoute(launch, site);
  }

  /** Length of the path, m (0 for an area). */
  get pathLength(): number {
    return this.length;
  }

  /** Draws this sample's release point and heading (sets `east`, `north`, `heading`). */
  place(stream: SampleStream): void {
    if (this.kind === 'path') this.placeOnPath(stream.uniform());
    else this.placeInArea(stream.uniform(), stream.uniform(), stream.uniform(), stream.uniform());
  }

  /** u in (0, 1) is the share of the operation's time flown when the object is released. */
  placeOnPath(u: number): void {
    const L = this.length;
    let s = u * this.distanceFlown;
    let forward = true;
    if (L > 0) {
      // Back and forth: legs of length L, every other one reversed.
      const leg = Math.floor(s / L);
      s -= leg * L;
      forward = leg % 2 === 0;
      if (!forward) s = L - s;
    }
    const c = this.cumulative;
    let i = 1;
    while (i < c.length - 1 && c[i] < s) i++;
    const segment = c[i] - c[i - 1];
    const f = segment > 0 ? (s - c[i - 1]) / segment : 0;
    const dx = this.px[i] - this.px[i - 1];
    const dy = this.py[i] - this.py[i - 1];
    this.east = this.px[i - 1] + f * dx;
    this.north = this.py[i - 1] + f * dy;
    const bearing = (Math.atan2(dx, dy) * 180) / Math.PI;
    this.heading = forward ? bearing : bearing + 180;
  }

  /** Uniform point in the area: a triangle by area share, then a point in it (two uniforms). */
  placeInArea(uTriangle: number, u1: number, u2: number, uHeading: number): void {
    const share = this.areaShare;
    let t = 0;
    while (t < share.length - 1 && share[t] < uTriangle) t++;
    const a = this.triangles;
    const o = t * 6;
    // Uniform in a triangle: sqrt of one uniform for the distance from the first corner
    // (L. Devroye, Non-Uniform Random Variate Generation, 1986, ch. XI).
    const r = Math.sqrt(u1);
    const w0 = 1 - r;
    const w1 = r * (1 - u2);
    const w2 = r * u2;
    this.east = w0 * a[o] + w1 * a[o + 2] + w2 * a[o + 4];
    this.north = w0 * a[o + 1] + w1 * a[o + 3] + w2 * a[o + 5];
    this.heading = this.fixedHeading ?? 360 * uHeading;
  }
}
