#!/usr/bin/env node
import { ScenarioError } from '../scenario/errors.js';
import { VERSION } from '../version.js';
import { EXIT_BAD_INPUT, EXIT_FAILURE, UsageError } from './errors.js';
import { COMMANDS, mainHelp } from './commands.js';

/**
 * `strewn <command> …`: parses the command word, hands the rest to the command, and turns errors
 * into exit codes: a user's mistake gets a message and exit 2, never a stack trace.
 */
async function main(argv: string[]): Promise<number> {
  const [word, ...rest] = argv;
  if (word === undefined || word === '--help' || word === '-h' || word === 'help') {
    process.stdout.write(mainHelp());
    return word === undefined ? EXIT_BAD_INPUT : 0;
  }
  if (word === '--version' || word === '-v') {
    process.stdout.write(`strewn ${VERSION}\n`);
    return 0;
  }
  const command = COMMANDS[word];
  if (!command) throw new UsageError(`unknown command '${word}'; expected one of: ${Object.keys(COMMANDS).join(', ')} (see strewn --help)`);
  return command.run(rest);
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    if (error instanceof ScenarioError || error instanceof UsageError) {
      process.stderr.write(`strewn: ${error.message}\n`);
      process.exitCode = EXIT_BAD_INPUT;
    } else if (error instanceof Error && error.name === 'AbortError') {
      process.stderr.write('strewn: cancelled; nothing was written\n');
      process.exitCode = 130;
    } else {
      const message = error instanceof Error ? error.message : String(error);
      process.stderr.write(`strewn: ${message}\n`);
      if (process.env.STREWN_DEBUG && error instanceof Error) process.stderr.write(`${error.stack}\n`);
      process.exitCode = EXIT_FAILURE;
    }
  },
);
