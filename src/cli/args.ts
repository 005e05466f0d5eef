import { parseArgs, type ParseArgsConfig } from 'node:util';
import { UsageError } from './errors.js';

type Options = NonNullable<ParseArgsConfig['options']>;

/** Parses a command's arguments strictly; unknown options and missing values are usage errors. */
export function parseCommandArgs<O extends Options>(command: string, args: string[], options: O) {
  try {
    return parseArgs({ args, options: { ...options, help: { type: 'boolean', short: 'h' } }, allowPositionals: true, strict: true });
  } catch (error) {
    const message = error instanceof Error ? error.message.replace(/^.*?: /, '') : String(error);
    throw new UsageError(`${command}: ${message} (see strewn ${command} --help)`);
  }
}

/** A whole number within [min, max] from an option's text. */
export function integerOption(name: string, text: string | undefined, min: number, max: number, hint = ''): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text.replace(/_/g, ''));
  if (!Number.isInteger(value) || value < min || value > max) {
    throw new UsageError(`--${name}: '${text}' is not a whole number from ${min.toLocaleString('en')} to ${max.toLocaleString('en')}${hint}`);
  }
  return value;
}

export function onePositional(command: string, positionals: string[], what: string): string {
  if (positionals.length !== 1) throw new UsageError(`${command}: expected one ${what}, got ${positionals.length === 0 ? 'none' : positionals.join(' ')} (see strewn ${command} --help)`);
  return positionals[0];
}
