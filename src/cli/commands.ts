/**
 * The commands, each loaded only when it is called: `strewn --help` and `strewn --version` load
 * none of them, and `strewn check` never loads the engine pool, the analysis or the sheet code.
 * Each command prints its own help (`strewn run --help`).
 */
export interface Command {
  summary: string;
  run(args: string[]): Promise<number>;
}

export const COMMANDS: Record<string, Command> = {
  run: { summary: 'fly a scenario\'s Monte-Carlo samples and write landing points, zones and a summary', run: async (args) => (await import('./run.js')).runCommand(args) },
  analyze: { summary: 'draw contours, the keep-out zone and area figures from landing points recorded elsewhere', run: async (args) => (await import('./analyze.js')).analyzeCommand(args) },
  check: { summary: 'validate a scenario and print it normalised to SI units, with warnings', run: async (args) => (await import('./check.js')).checkCommand(args) },
  sheet: { summary: 'draw the review sheet (sheet.pdf, map.svg) again from a results folder', run: async (args) => (await import('./sheet.js')).sheetCommand(args) },
  merge: { summary: 'put the shards of a study (strewn run --shard K/N) together into one results folder', run: async (args) => (await import('./merge.js')).mergeCommand(args) },
  envelope: { summary: 'find the highest wind, by direction, at which the keep-out zone still fits the site', run: async (args) => (await import('./envelope.js')).envelopeCommand(args) },
};

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
