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

const G0 = 9.80665; // standard gravity (U.S. Standard Atmosphere, 1976)
const D = Math.PI / 180;

export interface ReferenceOptions {
  tolerance: number;
  /** Turbulence: σ_w and the normal source (the same stream as the engine's flight). */
  sigmaW?: number;
  normal?: () => number;
  air?: Air;
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

  let onRail = false;
  let rail = [0, 0, 1];
  let railLength = 0;
  let dragArea = 0;
  let activeStage = -1;
  let evaluations = 0;

  const rhs = (t: number, y: number[]): number[] => {
    evaluations++;
    wind.at(y[2], w);
    w[2] = 0;
    gusts.addAt(y[2], w);
    const rel = [y[3] - w[0], y[4] - w[1], y[5] - w[2]];
    const speed = Math.hypot(rel[0], rel[1], rel[2]);
    const mass = sc.vehicle.mass + (motor ? motor.propellantAt(t) : 0);
    const cda = dragArea > 0 ? dragArea : drag.at(speed / air.speedOfSoundAt(y[2])) * sc.vehicle.referenceArea;
    const q = (air.densityAt(y[2]) * cda * speed) / (2 * mass);
    const a = [-q * rel[0], -q * rel[1], -q * rel[2] - G0];
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

  let y: number[];
  const l = sc.launch;
  if (l.kind === 'rocket') {
    rail = [Math.sin(l.tilt * D) * Math.sin(l.azimuth * D), Math.sin(l.tilt * D) * Math.cos(l.azimuth * D), Math.cos(l.tilt * D)];
    railLength = l.rail;
    onRail = railLength > 0;
    y = [0, 0, 0, 0, 0, 0];
  } else if (l.kind === 'projectile') {
    const ce = Math.cos(l.elevation * D);
    y = [0, 0, l.height, l.speed * ce * Math.sin(l.azimuth * D), l.speed * ce * Math.cos(l.azimuth * D), l.speed * Math.sin(l.elevation * D)];
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
  const solver = new odex.Solver(6);
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
        const at = (tt: number) => [0, 1, 2, 3, 4, 5].map((c) => dense(c, tt));
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
        y = [railLength * rail[0], railLength * rail[1], railLength * rail[2], vs * rail[0], vs * rail[1], vs * rail[2]];
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
