import { isRecord } from './cross-checks.js';
import type { Issue } from './types.js';

/**
 * Checks of the `breakup` block that span fields, on the raw JSON (see cross-checks.ts): each
 * fragment class gives its size one way, the trigger's own field goes with its trigger, the name
 * is not a recovery stage's, and failure modes with effect 'early' name the breakup and a time.
 */
export function breakupChecks(raw: Record<string, unknown>, stageNames: string[]): Issue[] {
  const issues: Issue[] = [];
  const breakup = raw.breakup;
  const name = isRecord(breakup) && typeof breakup.name === 'string' ? breakup.name : undefined;
  if (isRecord(breakup)) {
    if (name === 'all') issues.push({ path: 'breakup.name', message: "'all' is reserved for failures that affect every recovery stage; choose another name" });
    else if (name !== undefined && stageNames.includes(name)) {
      issues.push({ path: 'breakup.name', message: `'${name}' is already the name of a recovery stage; failure modes name the breakup, so the names must differ` });
    }
    if (breakup.trigger === 'time' && breakup.time === undefined) issues.push({ path: 'breakup.time', message: "missing; trigger 'time' needs the time after launch at which the object breaks up" });
    if (breakup.trigger !== 'time' && breakup.time !== undefined) issues.push({ path: 'breakup.time', message: `is used only with trigger 'time', but the breakup's trigger is '${String(breakup.trigger)}'` });
    if (breakup.trigger === 'time' && breakup.delay !== undefined) issues.push({ path: 'breakup.delay', message: "is used only with trigger 'apogee' (the time after apogee); with trigger 'time' give the time itself" });
    if (Array.isArray(breakup.fragments)) {
      const seen = new Map<string, number>();
      breakup.fragments.forEach((f: unknown, i) => {
        if (!isRecord(f)) return;
        const at = `breakup.fragments[${i}]`;
        const sizes = ['diameter', 'referenceArea', 'dragArea'].filter((k) => f[k] !== undefined);
        if (sizes.length === 0) issues.push({ path: `${at}.diameter`, message: 'missing; give the size of one piece as diameter or referenceArea (with drag), or as dragArea (Cd·A)' });
        else if (sizes.length > 1) issues.push({ path: `${at}.${sizes[1]}`, message: `give one of diameter, referenceArea and dragArea, not ${sizes.join(' and ')}` });
        else if (sizes[0] !== 'dragArea' && f.drag === undefined) issues.push({ path: `${at}.drag`, message: `missing; a piece given by its ${sizes[0]} needs its drag coefficient` });
        else if (sizes[0] === 'dragArea' && f.drag !== undefined) issues.push({ path: `${at}.drag`, message: 'dragArea is already Cd·A; give drag only with diameter or referenceArea' });
        if (typeof f.name === 'string') {
          if (f.name === 'whole') issues.push({ path: `${at}.name`, message: "'whole' is the part name of an object that lands in one piece; choose another name" });
          const earlier = seen.get(f.name);
          if (earlier !== undefined) issues.push({ path: `${at}.name`, message: `'${f.name}' is already the name of breakup.fragments[${earlier}]; names must be unique` });
          else seen.set(f.name, i);
        }
      });
    }
  }
  if (Array.isArray(raw.failures)) {
    raw.failures.forEach((f: unknown, i) => {
      if (!isRecord(f)) return;
      const early = f.effect === 'early';
      if (early && (name === undefined || f.stage !== name)) {
        issues.push({ path: `failures[${i}].stage`, message: `effect 'early' moves the breakup; expected stage '${name ?? '(no breakup given)'}'${name === undefined ? ': add a breakup block' : ''}` });
      }
      if (early && f.time === undefined) issues.push({ path: `failures[${i}].time`, message: "missing; effect 'early' needs the time after launch at which the object breaks up" });
      if (!early && f.time !== undefined) issues.push({ path: `failures[${i}].time`, message: "is used only with effect 'early'" });
    });
  }
  return issues;
}
