/**
 * The commands, each loaded only when it is called: `strewn --help` and `strewn --version` load
 * none of them, and `strewn check` never loads the engine pool, the analysis or the sheet code
 * (test/cli/startup.test.ts checks both).
 * Each command prints its own help (`strewn run --help`).
 */
export interface Command {
  summary: string;
  run(args: string[]): Promise<number>;
}

export const COMMANDS: Record<string, Command> = {
  run: { summary: 'fly a scenario\'s Monte-Carlo samples and write landing points, zones and a summary', run: runWithEarlyWorkers },
  analyze: { summary: 'draw contours, the keep-out zone and area figures from landing points recorded elsewhere', run: async (args) => (await import('./analyze.js')).analyzeCommand(args) },
  check: { summary: 'validate a scenario and print it normalised to SI units, with warnings', run: async (args) => (await import('./check.js')).checkCommand(args) },
  sheet: { summary: 'draw the review sheet (sheet.pdf, map.svg) again from a results folder', run: async (args) => (await import('./sheet.js')).sheetCommand(args) },
  new: { summary: 'write a starting scenario for a rocket, projectile or release, in metric or imperial units', run: async (args) => (await import('./new.js')).newCommand(args) },
  merge: { summary: 'put the shards of a study (strewn run --shard K/N) together into one results folder', run: async (args) => (await import('./merge.js')).mergeCommand(args) },
  event: { summary: 'fly every item of an event plan and add up zones, landings and casualties for the whole event', run: async (args) => (await import('./event.js')).eventCommand(args) },
  compare: { summary: 'compare two results folders: zone area and reach, area chances and expected casualties, both zones on one map', run: async (args) => (await import('./compare.js')).compareCommand(args) },
  forecast: { summary: 'read a GRIB2 forecast at the pad and print (or write) the wind and air profile', run: async (args) => (await import('./forecast.js')).forecastCommand(args) },
  envelope: { summary: 'find the highest wind, by direction, at which the keep-out zone still fits the site', run: async (args) => (await import('./envelope.js')).envelopeCommand(args) },
};

/**
 * `strewn run`: the engine threads start before the command's code is loaded, so they load the
 * engine meanwhile; whatever the command did not take is ended however it ends.
 */
async function runWithEarlyWorkers(args: string[]): Promise<number> {
  const early = (await import('./early-workers.js')).startRunWorkers(args);
  try {
    return await (await import('./run.js')).runCommand(args, early);
  } finally {
    early?.dispose();
  }
}

export function mainHelp(): string {
  const lines = [
    'strewn: where things that go up will come down (Monte-Carlo landing dispersion)',
    '',
    'Usage: strewn <command> [options]',
    '',
    'Commands:',
    ...Object.entries(COMMANDS).map(([name, c]) => `  ${name.padEnd(10)}${c.summary}`),
    '',
    'Options:',
    '  --help       help for strewn, or for a command (strewn run --help)',
    '  --version    print the version',
    '',
  ];
  return lines.join('\n');
}
