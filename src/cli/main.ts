// cli stage: the `lather` program; the verbs are list, relax, rank, sweep, draw and show.

import { Command, CommanderError, InvalidArgumentError } from 'commander';
import { CatalogueFormatError, FormulaError, MapError, UsageError } from '../errors.ts';
import { addListCommand } from './list.ts';
import { addRankCommand } from './rank.ts';
import { addShowCommand } from './show.ts';
import { addSweepCommand } from './sweep.ts';
import { addRelaxCommand } from './relax.ts';
import { addDrawCommand } from './draw.ts';

/** Build the commander program with every verb attached. */
export function buildProgram(): Command {
  const program = new Command('lather')
    .description('Enumerate, relax and rank the arrangements of planar bubble clusters.')
    .version('0.1.0')
    .showHelpAfterError(false)
    .exitOverride()
    .configureOutput({ writeErr: (text) => process.stderr.write(text) });
  addListCommand(program);
  addRelaxCommand(program);
  addRankCommand(program);
  addDrawCommand(program);
  addShowCommand(program);
  addSweepCommand(program);
  for (const command of program.commands) command.exitOverride();
  return program;
}

/** Errors that mean bad input (exit status 2) rather than a failed run (exit status 1). */
function isInputError(error: unknown): boolean {
  return (
    error instanceof UsageError ||
    error instanceof MapError ||
    error instanceof CatalogueFormatError ||
    error instanceof FormulaError ||
    error instanceof InvalidArgumentError ||
    error instanceof RangeError
  );
}

/** Run the program on argv; prints one line on failure and sets process.exitCode. */
export async function main(argv: string[]): Promise<void> {
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
  } catch (error) {
    if (error instanceof CommanderError) {
      // help and version exit cleanly; commander has already printed its one-line complaint
      process.exitCode = error.exitCode === 0 ? 0 : 2;
      return;
    }
    const message = error instanceof Error ? error.message : String(error);
    process.stderr.write(`lather: ${message.split('\n')[0]}\n`);
    process.exitCode = isInputError(error) ? 2 : 1;
  }
}
