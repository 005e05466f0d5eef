import { convertQuantity } from './units.js';
import type { Issue, UncertaintyName, VehicleKind } from './types.js';
import { breakupChecks } from './breakup-checks.js';

/**
 * Checks that involve more than one field. They read the raw JSON and look only at what is
 * present and readable, so they still run (and report) when other parts of the file are broken;
 * values that cannot be read are left to the schema, which reports them once.
 */
export function crossCheck(raw: Record<string, unknown>, kind: VehicleKind | undefined): Issue[] {
  const stageNames = recoveryStageNames(raw.recovery);
  const breakupName = isRecord(raw.breakup) && typeof raw.breakup.name === 'string' ? raw.breakup.name : undefined;
  return [
    ...referenceAreaChecks(raw.vehicle),
    ...recoveryChecks(raw.recovery, kind),
    ...failureChecks(raw.failures, stageNames, Array.isArray(raw.recovery) && raw.recovery.length > 0, operationDuration(raw, kind), breakupName),
    ...breakupChecks(raw, stageNames),
    ...releaseRouteChecks(raw.launch, kind),
    ...gustChecks(raw.weather),
    ...profileChecks(raw.weather),
    ...forecastChecks(raw.weather),
    ...uncertaintyChecks(raw, kind),
    ...riskChecks(raw),
  ];
}

export function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** An area gives its people one way; the harm model gives casualty energy one way. */
function riskChecks(raw: Record<string, unknown>): Issue[] {
  const issues: Issue[] = [];
  const site = raw.site;
  if (isRecord(site) && Array.isArray(site.areas)) {
    site.areas.forEach((area: unknown, i) => {
      if (isRecord(area) && area.people !== undefined && area.density !== undefined) {
        issues.push({ path: `site.areas[${i}].density`, message: 'give either people (a head count) or density (people per m²), not both' });
      }
    });
  }
  const risk = raw.risk;
  if (isRecord(risk) && risk.casualtyEnergy !== undefined && risk.casualtyProbability !== undefined) {
    issues.push({ path: 'risk.casualtyProbability', message: 'give either casualtyEnergy (a threshold) or casualtyProbability (a table), not both' });
  }
  return issues;
}

/** The file gives the reference size one way: a diameter or an area. */
function referenceAreaChecks(vehicle: unknown): Issue[] {
  if (!isRecord(vehicle)) return [];
  const hasDiameter = vehicle.diameter !== undefined;
  const hasArea = vehicle.referenceArea !== undefined;
  if (hasDiameter && hasArea) {
    return [{ path: 'vehicle.referenceArea', message: 'give either diameter or referenceArea, not both' }];
  }
  if (!hasDiameter && !hasArea) {
    return [{ path: 'vehicle.diameter', message: 'missing (required); give either diameter or referenceArea' }];
  }
  return [];
}

function recoveryChecks(recovery: unknown, kind: VehicleKind | undefined): Issue[] {
  if (recovery === undefined) return [];
  if (kind === 'projectile') {
    return [{ path: 'recovery', message: "a projectile has no recovery stages; remove 'recovery' or change vehicle.kind" }];
  }
  if (!Array.isArray(recovery)) return [];
  const issues: Issue[] = [];
  const firstIndexOfName = new Map<string, number>();
  recovery.forEach((stage: unknown, i) => {
    if (!isRecord(stage)) return;
    const at = (field: string): string => `recovery[${i}].${field}`;
    issues.push(...triggerFieldChecks(stage, at));

    const hasArea = stage.dragArea !== undefined;
    const hasRate = stage.descentRate !== undefined;
    const hasDiameter = stage.diameter !== undefined;
    const hasDrag = stage.drag !== undefined;
    const ways = [hasArea && 'dragArea', hasRate && 'descentRate', (hasDiameter || hasDrag) && 'diameter and drag'].filter((w): w is string => w !== false);
    if (ways.length > 1) issues.push({ path: at(hasRate ? 'descentRate' : 'diameter'), message: `give one of dragArea, descentRate, or diameter with drag, not ${ways.join(' and ')}` });
    if (ways.length === 0) {
      issues.push({ path: at('dragArea'), message: 'missing (required); give dragArea (Cd·A), descentRate, or the canopy diameter with its drag coefficient drag' });
    }
    if (hasDiameter && !hasDrag) issues.push({ path: at('drag'), message: "missing (required) with diameter; expected the canopy's drag coefficient referred to that diameter, e.g. 0.8 for a flat circular canopy" });
    if (hasDrag && !hasDiameter) issues.push({ path: at('diameter'), message: 'missing (required) with drag; expected the canopy diameter the drag coefficient refers to' });
    if (stage.canopy !== undefined && !hasDiameter) issues.push({ path: at('canopy'), message: 'a canopy note goes with diameter and drag; remove it or give the canopy by its size' });

    if (typeof stage.name === 'string') {
      // Failure modes name stages, and "all" means every stage, so names must be unambiguous.
      if (stage.name === 'all') issues.push({ path: at('name'), message: "'all' is reserved for failures that affect every stage; choose another name" });
      const earlier = firstIndexOfName.get(stage.name);
      if (earlier !== undefined) {
        issues.push({ path: at('name'), message: `'${stage.name}' is already the name of recovery[${earlier}]; stage names must be unique` });
      } else {
        firstIndexOfName.set(stage.name, i);
      }
    }
  });
  return issues;
}

/** Trigger "altitude" needs `altitude`, "time" needs `time`; either field with another trigger is a mistake. */
function triggerFieldChecks(stage: Record<string, unknown>, at: (field: string) => string): Issue[] {
  const trigger = stage.trigger;
  if (trigger !== 'apogee' && trigger !== 'altitude' && trigger !== 'time') return [];
  const issues: Issue[] = [];
  const needs: Record<'altitude' | 'time', string> = {
    altitude: 'the height above the pad, met on the way down, at which the stage deploys',
    time: 'the time after launch at which the stage deploys',
  };
  for (const field of ['altitude', 'time'] as const) {
    const present = stage[field] !== undefined;
    if (trigger === field && !present) issues.push({ path: at(field), message: `missing (required) for trigger '${field}'; expected ${needs[field]}` });
    if (trigger !== field && present) issues.push({ path: at(field), message: `is used only with trigger '${field}', but this stage's trigger is '${trigger}'` });
  }
  return issues;
}

function recoveryStageNames(recovery: unknown): string[] {
  if (!Array.isArray(recovery)) return [];
  return recovery.flatMap((stage: unknown) => (isRecord(stage) && typeof stage.name === 'string' ? [stage.name] : []));
}

/**
 * The operation's duration in seconds when the launch gives a readable one (releases only);
 * `null` when the scenario cannot have one, `undefined` when it is missing or unreadable.
 */
function operationDuration(raw: Record<string, unknown>, kind: VehicleKind | undefined): number | null | undefined {
  if (kind !== 'release') return null;
  if (!isRecord(raw.launch) || raw.launch.duration === undefined) return undefined;
  const d = convertQuantity(raw.launch.duration, 'time');
  return d.ok && d.value > 0 ? d.value : undefined;
}

/** A release starts at one point, along a path or over an area: one of the three. */
function releaseRouteChecks(launch: unknown, kind: VehicleKind | undefined): Issue[] {
  if (kind !== 'release' || !isRecord(launch)) return [];
  const issues: Issue[] = [];
  const hasPath = launch.path !== undefined;
  const hasArea = launch.area !== undefined;
  const hasOffset = launch.east !== undefined || launch.north !== undefined;
  if (hasPath && hasArea) issues.push({ path: 'launch.area', message: 'give either path or area, not both' });
  if ((hasPath || hasArea) && hasOffset) {
    issues.push({ path: launch.east !== undefined ? 'launch.east' : 'launch.north', message: `east/north give one release point; remove them when a ${hasPath ? 'path' : 'area'} gives where it flies` });
  }
  if (!hasPath && !hasArea && launch.heading === undefined) {
    issues.push({ path: 'launch.heading', message: 'missing (required); give the heading, or a path that the heading follows' });
  }
  if (hasPath && launch.heading !== undefined) {
    issues.push({ path: 'launch.heading', message: 'the heading follows the path; remove it (a launch.azimuth spread still turns it)' });
  }
  if (hasPath) {
    const speed = convertQuantity(launch.speed, 'speed');
    if (speed.ok && !(speed.value > 0)) issues.push({ path: 'launch.speed', message: `${speed.shown} along a path never gets anywhere; expected the speed along the path, more than 0 m/s` });
  }
  if (launch.rate !== undefined && launch.duration === undefined) {
    issues.push({ path: 'launch.duration', message: 'missing; a rate per flight hour needs the operation\'s duration to become a chance per operation' });
  }
  return issues;
}

function failureChecks(failures: unknown, stageNames: string[], hasStages: boolean, duration: number | null | undefined, breakupName?: string): Issue[] {
  if (!Array.isArray(failures)) return [];
  const issues: Issue[] = [];
  const seen = new Map<string, number>();
  let total = 0;
  let rateTotal = 0;
  let allReadable = true;
  failures.forEach((failure: unknown, i) => {
    if (!isRecord(failure)) {
      allReadable = false;
      return;
    }
    const stage = failure.stage;
    if (typeof stage === 'string' && stage !== '' && stage === breakupName) {
      // The breakup is named like a stage: 'skip' keeps the object whole, 'early' moves the break.
    } else if (typeof stage === 'string' && stage !== '') {
      if (!hasStages) {
        issues.push({ path: `failures[${i}].stage`, message: `'${stage}' cannot fail: the scenario has no recovery stages` });
      } else if (stage !== 'all' && !stageNames.includes(stage)) {
        const choices = [...stageNames, 'all'].map((n) => `'${n}'`).join(', ');
        issues.push({ path: `failures[${i}].stage`, message: `'${stage}' is not a recovery stage; expected one of ${choices}` });
      }
    }
    if (typeof failure.name === 'string') {
      // The samples outside every failure mode form the mode "nominal".
      if (failure.name === 'nominal') issues.push({ path: `failures[${i}].name`, message: "'nominal' is the name of the samples without a failure; choose another name" });
      const earlier = seen.get(failure.name);
      if (earlier !== undefined) issues.push({ path: `failures[${i}].name`, message: `'${failure.name}' is already the name of failures[${earlier}]; names must be unique` });
      else seen.set(failure.name, i);
    }
    const hasP = failure.probability !== undefined;
    const hasRate = failure.rate !== undefined;
    if (hasP && hasRate) {
      issues.push({ path: `failures[${i}].rate`, message: 'give either probability (per flight) or rate (per flight hour), not both' });
      allReadable = false;
    } else if (!hasP && !hasRate) {
      issues.push({ path: `failures[${i}].probability`, message: "missing (required); give the probability per flight, or a rate per flight hour such as '0.05 /h'" });
      allReadable = false;
    } else if (hasRate) {
      if (duration === null) {
        issues.push({ path: `failures[${i}].rate`, message: 'a rate per flight hour needs a released object with launch.duration; give a probability per flight instead' });
        allReadable = false;
      } else if (duration === undefined) {
        issues.push({ path: `failures[${i}].rate`, message: 'a rate per flight hour needs launch.duration (the length of the operation) to become a chance per operation' });
        allReadable = false;
      } else {
        const r = convertQuantity(failure.rate, 'rate');
        if (r.ok) rateTotal += r.value;
        else allReadable = false;
      }
    } else {
      const p = convertQuantity(failure.probability, 'fraction');
      if (p.ok) total += p.value;
      else allReadable = false;
    }
  });
  // Rate modes compete over the operation: together they take 1 − e^(−ΛT) (see normalize.ts).
  if (rateTotal > 0 && typeof duration === 'number') total += 1 - Math.exp(-rateTotal * duration);
  // A small tolerance so that 0.1 + 0.2 + 0.7 (which sums to 1.0000000000000002) passes.
  if (allReadable && total > 1 + 1e-9) {
    issues.push({ path: 'failures', message: `the probabilities add up to ${Number(total.toPrecision(6))}; they must add up to at most 1` });
  }
  return issues;
}

/** A gust is the peak speed, so it cannot be below the mean. */
function gustChecks(weather: unknown): Issue[] {
  const wind = isRecord(weather) ? weather.wind : undefined;
  if (!isRecord(wind) || wind.gust === undefined) return [];
  const mean = convertQuantity(wind.speed, 'speed');
  const gust = convertQuantity(wind.gust, 'speed');
  if (!mean.ok || !gust.ok || gust.value >= mean.value) return [];
  return [{ path: 'weather.wind.gust', message: `${gust.shown} is below the mean speed ${mean.shown}; the gust is the peak speed, at least the mean` }];
}

/**
 * With `weather.forecast` the wind's speed, direction and profile come from the file; without one
 * the wind must be given.
 */
function forecastChecks(weather: unknown): Issue[] {
  if (!isRecord(weather)) return [];
  const wind = weather.wind;
  if (weather.forecast !== undefined) {
    if (!isRecord(wind)) return [];
    return (['speed', 'from', 'profile'] as const)
      .filter((key) => wind[key] !== undefined)
      .map((key) => ({ path: `weather.wind.${key}`, message: 'comes from weather.forecast; remove it here, or remove the forecast' }));
  }
  if (wind === undefined) return [{ path: 'weather.wind', message: 'missing (required) unless weather.forecast gives the wind' }];
  if (!isRecord(wind)) return [];
  return (['speed', 'from'] as const)
    .filter((key) => wind[key] === undefined)
    .map((key) => ({ path: `weather.wind.${key}`, message: `missing (required); expected ${key === 'speed' ? 'a speed' : 'an angle'}, unless weather.forecast gives the wind` }));
}

/** Profile rows may come in any order, but two rows at one altitude would make the wind there ambiguous. */
function profileChecks(weather: unknown): Issue[] {
  const wind = isRecord(weather) ? weather.wind : undefined;
  const profile = isRecord(wind) ? wind.profile : undefined;
  if (!Array.isArray(profile)) return [];
  const issues: Issue[] = [];
  const firstRowAt = new Map<number, number>();
  profile.forEach((row: unknown, i) => {
    const altitude = convertQuantity(isRecord(row) ? row.altitude : undefined, 'length');
    if (!altitude.ok) return;
    const earlier = firstRowAt.get(altitude.value);
    if (earlier !== undefined) {
      issues.push({ path: `weather.wind.profile[${i}].altitude`, message: `${altitude.shown} is the same altitude as profile[${earlier}]; each row needs its own altitude` });
    } else {
      firstRowAt.set(altitude.value, i);
    }
  });
  return issues;
}

/** Which vehicle kinds each launch parameter exists for. */
const LAUNCH_SPREAD_KINDS: Partial<Record<UncertaintyName, VehicleKind[]>> = {
  'launch.tilt': ['rocket'],
  // For a release, the azimuth spread turns the heading.
  'launch.azimuth': ['rocket', 'projectile', 'release'],
  'launch.speed': ['projectile', 'release'],
  'launch.elevation': ['projectile'],
  'launch.height': ['projectile', 'release'],
  'motor.impulse': ['rocket'],
  'motor.misalignment': ['rocket'],
  'vehicle.cg': ['rocket'],
};

/** A spread on a parameter the scenario does not have is a mistake, not something to ignore silently. */
function uncertaintyChecks(raw: Record<string, unknown>, kind: VehicleKind | undefined): Issue[] {
  const uncertainty = raw.uncertainty;
  if (!isRecord(uncertainty)) return [];
  const issues: Issue[] = [];
  const hasStages = Array.isArray(raw.recovery) && raw.recovery.length > 0;
  const wind = isRecord(raw.weather) && isRecord(raw.weather.wind) ? raw.weather.wind : undefined;
  for (const name of Object.keys(uncertainty)) {
    const path = `uncertainty.${name}`;
    const kinds = LAUNCH_SPREAD_KINDS[name as UncertaintyName];
    if (kind !== undefined && kinds !== undefined && !kinds.includes(kind)) {
      issues.push({ path, message: `a ${kind} has no ${name.split('.')[1]}; remove this spread` });
    }
    if ((name === 'motor.misalignment' || name === 'vehicle.cg') && kind === 'rocket' && isRecord(raw.vehicle) && raw.vehicle.shape === undefined) {
      issues.push({ path, message: 'this spread needs vehicle.shape (a rocket without a shape flies as a point mass, which has no thrust line or balance point); give a shape or remove this spread' });
    }
    if ((name === 'recovery.delay' || name === 'recovery.rate') && !hasStages) {
      issues.push({ path, message: 'the scenario has no recovery stages; remove this spread' });
    }
    if (name === 'wind.gust' && wind !== undefined && wind.gust === undefined) {
      issues.push({ path, message: 'weather.wind.gust is not given, so there is no gust to vary; remove this spread or give a gust' });
    }
  }
  return issues;
}
