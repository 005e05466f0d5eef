import { runCommand, RUN_HELP } from './run.js';
import { checkCommand, CHECK_HELP } from './check.js';
import { analyzeCommand, ANALYZE_HELP } from './analyze.js';
import { sheetCommand, SHEET_HELP } from './sheet.js';
import { envelopeCommand, ENVELOPE_HELP } from './envelope.js';
import { forecastCommand, FORECAST_HELP } from './forecast.js';

export interface Command {
  summary: string;
  help: string;
  run(args: string[]): Promise<number>;
}

export const COMMANDS: Record<string, Command> = {
  run: { summary: 'fly a scenario\'s Monte-Carlo samples and write landing points, zones and a summary', help: RUN_HELP, run: runCommand },
  analyze: { summary: 'draw contours, the keep-out zone and area figures from landing points recorded elsewhere', help: ANALYZE_HELP, run: analyzeCommand },
  check: { summary: 'validate a scenario and print it normalised to SI units, with warnings', help: CHECK_HELP, run: checkCommand },
  sheet: { summary: 'draw the review sheet (sheet.pdf, map.svg) again from a results folder', help: SHEET_HELP, run: sheetCommand },
  forecast: { summary: 'read a GRIB2 forecast at the pad and print (or write) the wind and air profile', help: FORECAST_HELP, run: forecastCommand },
  envelope: { summary: 'find the highest wind, by direction, at which the keep-out zone still fits the site', help: ENVELOPE_HELP, run: envelopeCommand },
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
