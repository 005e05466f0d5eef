/**
 * Reads envelope.json back (for `strewn sheet --envelope`), checking every field the wind-limits
 * page draws from, so a damaged or foreign file gives a message naming the file and the field,
 * never a stack trace or a page drawn from nonsense.
 *
 * @example
 *   const record = readEnvelopeFolder('results/club-rocket-envelope');  // throws ResultsFolderError
 */
import { existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { Check, parse, readText, ResultsFolderError } from '../report/sheet/read-results.js';
import type { CaseResult, DirectionLimit, EnvelopeResult } from './envelope.js';
import type { EnvelopeRecord } from './sheet-page.js';

export const ENVELOPE_FILE = 'envelope.json';

function checkEnvelope(file: string, json: unknown): EnvelopeRecord {
  const c = new Check(file);
  const o = c.object(json, '');
  const hash = c.text(o.scenarioHash, 'scenarioHash');
  if (!/^[0-9a-f]{64}$/.test(hash)) c.fail('scenarioHash', '64 hexadecimal digits', hash);
  const version = c.text(o.version, 'version');
  let computedAt: string | null = null;
  if (o.computedAt !== undefined) {
    computedAt = c.text(o.computedAt, 'computedAt');
    if (Number.isNaN(new Date(computedAt).getTime())) c.fail('computedAt', 'an ISO 8601 date', computedAt);
  }
  c.text(o.name, 'name');
  const samples = c.number(o.samples, 'samples');
  if (!Number.isInteger(samples) || samples < 1) c.fail('samples', 'a whole number of at least 1', samples);
  c.text(o.seed, 'seed');
  if (o.method !== 'bisection' && o.method !== 'exhaustive') c.fail('method', '"bisection" or "exhaustive"', o.method);
  const directions = c.array(o.directions, 'directions').map((d, i) => c.number(d, `directions[${i}]`));
  if (directions.length === 0) c.fail('directions', 'at least one direction', o.directions);
  const speeds = c.array(o.speeds, 'speeds').map((v, i) => c.number(v, `speeds[${i}]`));
  if (speeds.length === 0) c.fail('speeds', 'at least one speed', o.speeds);
  const forecast = c.object(o.forecast, 'forecast');
  c.number(forecast.from, 'forecast.from');
  c.number(forecast.speed, 'forecast.speed');
  const limits = c.array(o.limits, 'limits');
  if (limits.length !== directions.length) c.fail('limits', `one entry per direction (${directions.length})`, `${limits.length} entries`);
  limits.forEach((entry, i) => {
    const p = `limits[${i}]`;
    const d = c.object(entry, p);
    if (c.number(d.from, `${p}.from`) !== directions[i]) c.fail(`${p}.from`, `the direction ${directions[i]}`, d.from);
    if (d.limit !== null) c.number(d.limit, `${p}.limit`);
    if (typeof d.aboveGrid !== 'boolean') c.fail(`${p}.aboveGrid`, 'true or false', d.aboveGrid);
    c.array(d.firstFailure, `${p}.firstFailure`).forEach((t, j) => c.text(t, `${p}.firstFailure[${j}]`));
    c.array(d.cases, `${p}.cases`).forEach((x, j) => {
      const k = c.object(x, `${p}.cases[${j}]`);
      c.number(k.speed, `${p}.cases[${j}].speed`);
      if (typeof k.pass !== 'boolean') c.fail(`${p}.cases[${j}].pass`, 'true or false', k.pass);
      c.array(k.failing, `${p}.cases[${j}].failing`).forEach((t, m) => c.text(t, `${p}.cases[${j}].failing[${m}]`));
    });
  });
  c.number(o.casesFlown, 'casesFlown');
  const envelope: EnvelopeResult = {
    name: o.name as string,
    samples,
    seed: o.seed as string,
    directions,
    speeds,
    method: o.method as EnvelopeResult['method'],
    forecast: { from: forecast.from as number, speed: forecast.speed as number },
    limits: (limits as Record<string, unknown>[]).map((d) => ({
      from: d.from as number,
      limit: d.limit as number | null,
      aboveGrid: d.aboveGrid as boolean,
      firstFailure: d.firstFailure as string[],
      ...(isRail(d.rail) ? { rail: d.rail } : {}),
      // JSON keeps NaN areas as null; the page does not draw them, but the type wants numbers.
      cases: (d.cases as Record<string, unknown>[]).map((k) => ({ ...k, keepOutArea_m2: (k.keepOutArea_m2 as number | null) ?? NaN, keepOutMaxDistance_m: (k.keepOutMaxDistance_m as number | null) ?? NaN }) as CaseResult),
    })) as DirectionLimit[],
    ...(isAim(o.aim) ? { aim: o.aim } : {}),
    casesFlown: o.casesFlown as number,
    elapsed_s: typeof o.elapsed_s === 'number' ? o.elapsed_s : NaN,
  };
  return { envelope, scenarioHash: hash, version, computedAt };
}

/** Reads and checks envelope.json in `folder`. */
export function readEnvelopeFolder(folder: string): EnvelopeRecord {
  if (!existsSync(folder)) throw new ResultsFolderError(`${folder}: no such folder`);
  if (!statSync(folder).isDirectory()) throw new ResultsFolderError(`${folder}: is a file; expected the folder strewn envelope wrote`);
  return checkEnvelope(join(folder, ENVELOPE_FILE), parse(folder, ENVELOPE_FILE, readText(folder, ENVELOPE_FILE)));
}

function isRail(x: unknown): x is { azimuth: number; tilt: number } {
  return typeof x === 'object' && x !== null && typeof (x as { azimuth?: unknown }).azimuth === 'number' && typeof (x as { tilt?: unknown }).tilt === 'number';
}

function isAim(x: unknown): x is NonNullable<EnvelopeResult['aim']> {
  const a = x as { mode?: unknown; maxTilt?: unknown } | null;
  return typeof a === 'object' && a !== null && (a.mode === 'fixed' || a.mode === 'into-wind' || a.mode === 'away-from') && typeof a.maxTilt === 'number';
}
