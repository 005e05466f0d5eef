/**
 * A second, independent integration of the same equations of motion with the `odex` package
 * (Hairer & Wanner's ODEX extrapolation method, Solving Ordinary Differential Equations I), used
 * as the reference the engine is checked and benchmarked against.
 *
 * It shares only the sub-models that have their own tests (air, mean wind, gust field, motor, drag
 * curve) and writes the right-hand side, the rail constraint and the event logic afresh, in plain
 * arrays, in the simplest correct way.
 */
import odex from 'odex';
import type { Scenario } from '../../src/scenario/types.js';
import { AirModel, type Air } from '../../src/physics/air.js';
import { MeanWind } from '../../src/physics/wind.js';
import { GustField } from '../../src/physics/gust-field.js';
import { DragCurve } from '../../src/physics/drag.js';
import { MotorModel } from '../../src/physics/motor.js';
import { aeroTable } from '../../src/physics/aero.js';
import { normalGravityAt, WGS84, type Earth } from '../../src/physics/earth.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';

const D = Math.PI / 180;

export interface ReferenceOptions {
  tolerance: number;
  /** Turbulence: σ_w and the normal source (the same stream as the engine's flight). */
  sigmaW?: number;
  normal?: () => number;
  air?: Air;
  /** Replaces the rotating WGS 84 Earth (the same override the engine takes). */
  earth?: Earth;
  /** Rigid body: thrust misalignment angle and its direction around the axis, deg (engine convention). */
  misalignment?: number;
  misalignmentDirection?: number;
  /** Rigid body: balance point ready to fly, m from the nose tip (default: the shape's). */
  cg?: number;
  /**
   * Release along a path: the share u in (0, 1) of the operation's time flown when the object is
   * let go (the sample's route uniform). Required when the launch has a path.
   */
  releaseShare?: number;
}

export interface ReferenceLanding {
  east: number;
  north: number;
  apogee: number;
  flightTime: number;
  evaluations: number;
}

export function odexFlight(sc: Scenario, options: ReferenceOptions): ReferenceLanding {
  const air = options.air ?? new AirModel(sc.site.pad.elevation, sc.weather.temperature, sc.weather.pressure, sc.weather.air);
  const wind = new MeanWind(sc.weather.wind);
  const gusts = new GustField();
  gusts.reset(options.sigmaW ?? 0, options.normal ?? (() => 0));
  const drag = new DragCurve(sc.vehicle.drag);
  const motor = sc.vehicle.motor && sc.vehicle.kind === 'rocket' ? new MotorModel(sc.vehicle.motor) : null;
  const stages = sc.vehicle.kind === 'projectile' ? [] : sc.recovery;
  const w = new Float64Array(3);
  // Gravity straight down with WGS 84 normal gravity at the pad's latitude and the height above
  // sea level (NIMA TR8350.2 eq. 4-1, 4-3, evaluated afresh at every height), and the Earth's
  // rotation vector in the local east-north-up frame.
  const pad = sc.site.pad;
  const gravity = options.earth ? (z: number) => options.earth!.gravityAt(z) : (z: number) => normalGravityAt(pad.lat, pad.elevation + z);
  const omega = options.earth
    ? [0, options.earth.omegaNorth, options.earth.omegaUp]
    : [0, WGS84.omega * Math.cos(pad.lat * D), WGS84.omega * Math.sin(pad.lat * D)];

  let onRail = false;
  let rail = [0, 0, 1];
  let railLength = 0;
  let dragArea = 0;
  let activeStage = -1;
  let evaluations = 0;

  // Rigid body (a rocket with a shape): the attitude as a unit quaternion q (body → world; body x
  // the nose direction, body y the direction the misaligned thrust leans) and the angular rate in
  // world axes — a different attitude representation from the engine's body-fixed vectors. The
  // parts' normal forces and moments are summed part by part; mass and inertia are worked out
  // from the format's rules here afresh.
  const shape = sc.vehicle.kind === 'rocket' ? sc.vehicle.shape : undefined;
  const rigid = shape !== undefined;
  const n = rigid ? 13 : 6;
  const parts = rigid ? aeroTable(shape, sc.vehicle.diameter!).parts : [];
  const mp0 = sc.vehicle.motor?.propellantMass ?? 0;
  const xProp = rigid ? shape.motorEnd - sc.vehicle.motor!.length! / 2 : 0;
  const cg0 = options.cg ?? shape?.cg ?? 0;
  const dryMass = sc.vehicle.mass;
  const xDry = rigid ? ((dryMass + mp0) * cg0 - mp0 * xProp) / dryMass : 0;
  // Own inertia of the dry rocket about its own cg, from the shape's nominal cg and inertia.
  const xDryNominal = rigid ? ((dryMass + mp0) * shape.cg - mp0 * xProp) / dryMass : 0;
  const iDry = rigid ? shape.inertia - dryMass * (xDryNominal - shape.cg) ** 2 - mp0 * (xProp - shape.cg) ** 2 : 0;
  const sinMis = Math.sin((options.misalignment ?? 0) * D);
  const cosMis = Math.cos((options.misalignment ?? 0) * D);
  const rotate = (q: number[], v: number[]): number[] => {
    const [w0, x, yq, z] = q;
    // v' = v + 2 w (r × v) + 2 r × (r × v), r = (x, y, z)
    const c1 = [yq * v[2] - z * v[1], z * v[0] - x * v[2], x * v[1] - yq * v[0]];
    const c2 = [yq * c1[2] - z * c1[1], z * c1[0] - x * c1[2], x * c1[1] - yq * c1[0]];
    return [v[0] + 2 * (w0 * c1[0] + c2[0]), v[1] + 2 * (w0 * c1[1] + c2[1]), v[2] + 2 * (w0 * c1[2] + c2[2])];
  };
  const crossP = (a: number[], b: number[]) => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
  const dot = (a: number[], b: number[]) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];

  const rhsRigid = (t: number, y: number[]): number[] => {
    evaluations++;
    wind.at(y[2], w);
    w[2] = 0;
    gusts.addAt(y[2], w);
    const rel = [y[3] - w[0], y[4] - w[1], y[5] - w[2]];
    const speed = Math.hypot(rel[0], rel[1], rel[2]);
    const prop = motor ? motor.propellantAt(t) : 0;
    const mass = dryMass + prop;
    const rho = air.densityAt(y[2]);
    const v = [y[3], y[4], y[5]];
    const cor = crossP(omega, v);
    const force = [0, 0, 0];
    const moment = [0, 0, 0];
    const thrust = motor ? motor.thrustAt(t) : 0;
    let turning = !onRail;
    let inertia = 1;
    if (dragArea > 0) {
      turning = false;
      for (let i = 0; i < 3; i++) force[i] = -0.5 * rho * dragArea * speed * rel[i] + (thrust > 0 && speed > 0 ? (thrust * rel[i]) / speed : 0);
    } else {
      const mach = speed / air.speedOfSoundAt(y[2]);
      const A = sc.vehicle.referenceArea;
      const cd = drag.at(mach);
      const qn = Math.hypot(y[6], y[7], y[8], y[9]);
      const q = [y[6] / qn, y[7] / qn, y[8] / qn, y[9] / qn];
      const u = rotate(q, [1, 0, 0]);
      const p = rotate(q, [0, 1, 0]);
      const xcg = (dryMass * xDry + prop * xProp) / mass;
      const across = rel.map((r, i) => r - dot(rel, u) * u[i]);
      const fin = 1 / Math.sqrt(1 - Math.min(0.8, mach) ** 2);
      for (let i = 0; i < 3; i++) force[i] = -0.5 * rho * cd * A * speed * rel[i];
      let dampSum = 0;
      for (const part of parts) {
        const slope = part.cnAlpha * (part.fins ? fin : 1);
        // q A CNα sin α against the cross-flow, at the part's CP.
        const fPart = across.map((c) => -0.5 * rho * speed * A * slope * c);
        const arm = u.map((ui) => (xcg - part.cp) * ui);
        const m = crossP(arm, fPart);
        for (let i = 0; i < 3; i++) {
          force[i] += fPart[i];
          moment[i] += m[i];
        }
        dampSum += slope * (part.cp - xcg) ** 2;
      }
      if (thrust > 0) {
        const dir = u.map((ui, i) => cosMis * ui + sinMis * p[i]);
        const m = crossP(u.map((ui) => (xcg - shape!.motorEnd) * ui), dir.map((d) => thrust * d));
        for (let i = 0; i < 3; i++) {
          force[i] += thrust * dir[i];
          moment[i] += m[i];
        }
      }
      const rate = [y[10], y[11], y[12]];
      const rateAcross = rate.map((r, i) => r - dot(rate, u) * u[i]);
      const mdot = motor ? (mp0 * thrust) / motor.totalImpulse : 0;
      const damping = 0.5 * rho * speed * A * dampSum + mdot * (shape!.motorEnd - xcg) ** 2;
      for (let i = 0; i < 3; i++) moment[i] -= damping * rateAcross[i];
      inertia = iDry + dryMass * (xDry - xcg) ** 2 + prop * (xProp - xcg) ** 2;
    }
    const a = [force[0] / mass - 2 * cor[0], force[1] / mass - 2 * cor[1], force[2] / mass - gravity(y[2]) - 2 * cor[2]];
    if (onRail) {
      let along = dot(a, rail);
      const s = dot([y[0], y[1], y[2]], rail);
      const vs = dot(v, rail);
      if (s <= 0 && vs <= 0 && along < 0) along = 0;
      for (let i = 0; i < 3; i++) a[i] = along * rail[i];
    }
    const out = [y[3], y[4], y[5], a[0], a[1], a[2], 0, 0, 0, 0, 0, 0, 0];
    if (turning) {
      // q̇ = ½ (0, ω) ⊗ q with ω in world axes.
      const [qw, qx, qy, qz] = [y[6], y[7], y[8], y[9]];
      const [ox, oy, oz] = [y[10], y[11], y[12]];
      out[6] = 0.5 * (-ox * qx - oy * qy - oz * qz);
      out[7] = 0.5 * (ox * qw + oy * qz - oz * qy);
      out[8] = 0.5 * (oy * qw + oz * qx - ox * qz);
      out[9] = 0.5 * (oz * qw + ox * qy - oy * qx);
      for (let i = 0; i < 3; i++) out[10 + i] = moment[i] / inertia;
    }
    return out;
  };

  const rhsPoint = (t: number, y: number[]): number[] => {
    evaluations++;
    wind.at(y[2], w);
    w[2] = 0;
    gusts.addAt(y[2], w);
    const rel = [y[3] - w[0], y[4] - w[1], y[5] - w[2]];
    const speed = Math.hypot(rel[0], rel[1], rel[2]);
    const mass = sc.vehicle.mass + (motor ? motor.propellantAt(t) : 0);
    const cda = dragArea > 0 ? dragArea : drag.at(speed / air.speedOfSoundAt(y[2])) * sc.vehicle.referenceArea;
    const q = (air.densityAt(y[2]) * cda * speed) / (2 * mass);
    const v = [y[3], y[4], y[5]];
    // −2 Ω × v
    const cross = [omega[1] * v[2] - omega[2] * v[1], omega[2] * v[0] - omega[0] * v[2], omega[0] * v[1] - omega[1] * v[0]];
    const a = [-q * rel[0] - 2 * cross[0], -q * rel[1] - 2 * cross[1], -q * rel[2] - gravity(y[2]) - 2 * cross[2]];
    const thrust = motor ? motor.thrustAt(t) : 0;
    if (thrust > 0) {
      const dir = onRail ? rail : rel.map((v) => v / speed);
      for (let i = 0; i < 3; i++) a[i] += (thrust / mass) * dir[i];
    }
    if (onRail) {
      let along = a[0] * rail[0] + a[1] * rail[1] + a[2] * rail[2];
      const s = y[0] * rail[0] + y[1] * rail[1] + y[2] * rail[2];
      const vs = y[3] * rail[0] + y[4] * rail[1] + y[5] * rail[2];
      if (s <= 0 && vs <= 0 && along < 0) along = 0;
      for (let i = 0; i < 3; i++) a[i] = along * rail[i];
    }
    return [y[3], y[4], y[5], a[0], a[1], a[2]];
  };
  const rhs = rigid ? rhsRigid : rhsPoint;

  let y: number[];
  const l = sc.launch;
  if (l.kind === 'rocket') {
    rail = [Math.sin(l.tilt * D) * Math.sin(l.azimuth * D), Math.sin(l.tilt * D) * Math.cos(l.azimuth * D), Math.cos(l.tilt * D)];
    railLength = l.rail;
    onRail = railLength > 0;
    y = [0, 0, 0, 0, 0, 0];
    if (rigid) y.push(...initialQuaternion(rail, options.misalignmentDirection ?? 0), 0, 0, 0);
  } else if (l.kind === 'projectile') {
    const ce = Math.cos(l.elevation * D);
    y = [0, 0, l.height, l.speed * ce * Math.sin(l.azimuth * D), l.speed * ce * Math.cos(l.azimuth * D), l.speed * Math.sin(l.elevation * D)];
  } else if (l.path !== undefined) {
    const r = releaseOnPath(sc, options.releaseShare);
    y = [r.east, r.north, l.height, l.speed * Math.sin(r.heading * D), l.speed * Math.cos(r.heading * D), 0];
  } else if (l.area !== undefined) {
    throw new Error('the reference does not model a release over an area');
  } else {
    y = [l.east, l.north, l.height, l.speed * Math.sin(l.heading * D), l.speed * Math.cos(l.heading * D), 0];
  }

  const deployAt = stages.map((s) => (s.trigger === 'time' ? (s.time ?? 0) + s.delay : Infinity));
  const deployed = stages.map(() => false);
  const deploy = (i: number) => {
    deployed[i] = true;
    if (i > activeStage) {
      activeStage = i;
      dragArea = stages[i].dragArea;
    }
  };
  let apogeeDone = false;
  let apogee = y[2];
  const reachApogee = (t: number, z: number) => {
    apogeeDone = true;
    stages.forEach((s, i) => {
      if (s.trigger === 'apogee' || (s.trigger === 'altitude' && z <= (s.altitude ?? 0))) deployAt[i] = t + s.delay;
    });
  };
  let t = 0;
  if (l.kind !== 'rocket' && y[5] <= 0) reachApogee(0, y[2]);
  stages.forEach((_, i) => { if (!deployed[i] && deployAt[i] <= t) deploy(i); });

  const burnTime = motor ? motor.burnTime : 0;
  const solver = new odex.Solver(n);
  solver.denseOutput = true;
  solver.absoluteTolerance = options.tolerance;
  solver.relativeTolerance = options.tolerance;
  solver.maxSteps = 1_000_000;

  for (let segment = 0; segment < 1000; segment++) {
    // Event functions for this segment, each crossing from positive to non-positive.
    type Ev = { name: string; g: (y: number[]) => number; stage?: number };
    const events: Ev[] = [];
    if (onRail) events.push({ name: 'rail', g: (v) => railLength - (v[0] * rail[0] + v[1] * rail[1] + v[2] * rail[2]) });
    else {
      if (!apogeeDone) events.push({ name: 'apogee', g: (v) => v[5] });
      events.push({ name: 'ground', g: (v) => v[2] });
      if (apogeeDone)
        stages.forEach((s, i) => {
          if (s.trigger === 'altitude' && !deployed[i]) events.push({ name: 'stage', stage: i, g: (v) => v[2] - (s.altitude ?? 0) });
        });
    }
    let tEnd = 4000;
    if (motor && t < burnTime) tEnd = Math.min(tEnd, burnTime);
    stages.forEach((_, i) => { if (!deployed[i] && deployAt[i] > t) tEnd = Math.min(tEnd, deployAt[i]); });

    let hit: { ev: Ev; t: number; y: number[] } | null = null;
    const startValues = events.map((e) => e.g(y));
    const result = solver.solve(rhs, t, y, tEnd, (_n, xOld, x, yNew, dense) => {
      if (x === xOld || !dense) return;
      for (let k = 0; k < events.length; k++) {
        const ev = events[k];
        if (startValues[k] <= 0 && ev.name !== 'rail') continue;
        if (ev.g(yNew) > 0) continue;
        // Bisection on the dense output.
        let a = xOld, b = x;
        const at = (tt: number) => Array.from({ length: n }, (_, c) => dense(c, tt));
        for (let i = 0; i < 200 && b - a > 1e-13; i++) {
          const m = 0.5 * (a + b);
          if (ev.g(at(m)) > 0) a = m; else b = m;
        }
        if (!hit || b < hit.t) hit = { ev, t: b, y: at(b) };
      }
      if (hit) return false;
    });
    if (hit) {
      const h = hit as { ev: Ev; t: number; y: number[] };
      t = h.t;
      y = h.y;
      if (h.ev.name === 'ground') return { east: y[0], north: y[1], apogee, flightTime: t, evaluations };
      if (h.ev.name === 'rail') {
        const vs = y[3] * rail[0] + y[4] * rail[1] + y[5] * rail[2];
        y = [railLength * rail[0], railLength * rail[1], railLength * rail[2], vs * rail[0], vs * rail[1], vs * rail[2], ...y.slice(6)];
        onRail = false;
      } else if (h.ev.name === 'apogee') {
        apogee = Math.max(apogee, y[2]);
        reachApogee(t, y[2]);
      } else deploy(h.ev.stage!);
    } else {
      t = result.xEnd;
      y = result.y;
      apogee = Math.max(apogee, y[2]);
    }
    stages.forEach((_, i) => { if (!deployed[i] && deployAt[i] <= t + 1e-12) deploy(i); });
  }
  throw new Error('reference flight did not land');
}

/**
 * The quaternion turning body x onto the rail and body y onto the misalignment direction: the
 * axis-normal direction nearest north (east for a rail along north) turned by `direction` degrees
 * toward (that direction × rail), the engine's convention. From the rotation matrix whose columns
 * are the body axes in world coordinates (Shepperd's method, largest diagonal case first).
 */
function initialQuaternion(u: number[], direction: number): number[] {
  let r = [0, 1, 0];
  if (Math.abs(u[1]) > 0.9) r = [1, 0, 0];
  const along = r[0] * u[0] + r[1] * u[1] + r[2] * u[2];
  const a0 = r.map((ri, i) => ri - along * u[i]);
  const an = Math.hypot(a0[0], a0[1], a0[2]);
  const a = a0.map((x) => x / an);
  const b = [a[1] * u[2] - a[2] * u[1], a[2] * u[0] - a[0] * u[2], a[0] * u[1] - a[1] * u[0]];
  const c = Math.cos(direction * D);
  const s = Math.sin(direction * D);
  const p = a.map((ai, i) => c * ai + s * b[i]);
  const zb = [u[1] * p[2] - u[2] * p[1], u[2] * p[0] - u[0] * p[2], u[0] * p[1] - u[1] * p[0]];
  // R = [u p zb] (columns)
  const m = [
    [u[0], p[0], zb[0]],
    [u[1], p[1], zb[1]],
    [u[2], p[2], zb[2]],
  ];
  const tr = m[0][0] + m[1][1] + m[2][2];
  if (tr > 0) {
    const S = Math.sqrt(tr + 1) * 2;
    return [0.25 * S, (m[2][1] - m[1][2]) / S, (m[0][2] - m[2][0]) / S, (m[1][0] - m[0][1]) / S];
  }
  if (m[0][0] > m[1][1] && m[0][0] > m[2][2]) {
    const S = Math.sqrt(1 + m[0][0] - m[1][1] - m[2][2]) * 2;
    return [(m[2][1] - m[1][2]) / S, 0.25 * S, (m[0][1] + m[1][0]) / S, (m[0][2] + m[2][0]) / S];
  }
  if (m[1][1] > m[2][2]) {
    const S = Math.sqrt(1 + m[1][1] - m[0][0] - m[2][2]) * 2;
    return [(m[0][2] - m[2][0]) / S, (m[0][1] + m[1][0]) / S, 0.25 * S, (m[1][2] + m[2][1]) / S];
  }
  const S = Math.sqrt(1 + m[2][2] - m[0][0] - m[1][1]) * 2;
  return [(m[1][0] - m[0][1]) / S, (m[0][2] + m[2][0]) / S, (m[1][2] + m[2][1]) / S, 0.25 * S];
}

/**
 * Where and heading which way an object flying a path back and forth is let go after a share u of
 * the operation's time: the distance flown u·speed·duration folded onto the path as a triangle
 * wave of period twice its length (out along the path, then back), the heading along the segment
 * in the direction flown. Worked out here with plain arrays and a reflection, apart from the
 * engine's leg counting; shares only the tested local frame.
 */
function releaseOnPath(sc: Scenario, u: number | undefined): { east: number; north: number; heading: number } {
  const l = sc.launch;
  if (l.kind !== 'release' || l.path === undefined) throw new Error('no release path');
  if (u === undefined) throw new Error('releaseShare is needed for a release along a path');
  const frame = createLocalFrame(sc.site.pad);
  const points = l.path.coordinates.map(([lon, lat]) => frame.toEastNorth(lon, lat));
  const lengths = points.slice(1).map((p, i) => Math.hypot(p[0] - points[i][0], p[1] - points[i][1]));
  const total = lengths.reduce((a, b) => a + b, 0);
  const flown = u * l.speed * (l.duration ?? total / Math.max(l.speed, 1e-9));
  // Triangle wave: position along the path p in [0, total], and whether the leg runs backwards.
  const phase = total > 0 ? flown % (2 * total) : 0;
  const backwards = phase > total;
  let along = backwards ? 2 * total - phase : phase;
  for (let k = 0; k < lengths.length; k++) {
    if (along <= lengths[k] || k === lengths.length - 1) {
      const [a, b] = [points[k], points[k + 1]];
      const f = lengths[k] > 0 ? Math.min(1, along / lengths[k]) : 0;
      const bearing = (Math.atan2(b[0] - a[0], b[1] - a[1]) * 180) / Math.PI;
      return { east: a[0] + f * (b[0] - a[0]), north: a[1] + f * (b[1] - a[1]), heading: backwards ? bearing + 180 : bearing };
    }
    along -= lengths[k];
  }
  return { east: points[0][0], north: points[0][1], heading: 0 };
}
