// cli stage: the `lather` program; the verbs are list, relax, rank, merge, draw, show, view, sweep and atlas. Each verb's
// module (and the heavy libraries it needs) is imported only when that verb runs, so `lather --version`
// or `lather list 3` start in a fraction of the time the whole program would take to load.

import { Command, CommanderError, InvalidArgumentError } from 'commander';
import { LatherError } from '../errors.ts';
import { packageInfo } from '../version.ts';
import { OutputError } from './output.ts';
import { type CliStreams, cliStreams, ReaderClosed, withStreams } from './streams.ts';

/** One verb: its name, the summary shown by `lather --help`, and how to attach it to the program. */
interface Verb {
  name: string;
  summary: string;
  load(): Promise<(program: Command) => void>;
}

/** Every verb, in the order `lather --help` lists them; the summaries live here and nowhere else. */
const VERBS: readonly Verb[] = [
  {
    name: 'list',
    summary: 'print every arrangement of n cells (1 <= n <= 10; more with --large)',
    load: async () => (await import('./list.ts')).addListCommand,
  },
  {
    name: 'relax',
    summary: 'relax one arrangement to its least-perimeter equilibrium at the given areas',
    load: async () => (await import('./relax.ts')).addRelaxCommand,
  },
  {
    name: 'rank',
    summary: 'rank every arrangement of the given cell areas by perimeter, with stability and failures',
    load: async () => (await import('./rank.ts')).addRankCommand,
  },
  {
    name: 'merge',
    summary: 'put the parts of a sharded ranking (rank --shard) together into its catalogue',
    load: async () => (await import('./merge.ts')).addMergeCommand,
  },
  {
    name: 'draw',
    summary: 'draw an arrangement at its equilibrium, or ranked entries of a catalogue file, as SVG',
    load: async () => (await import('./draw.ts')).addDrawCommand,
  },
  {
    name: 'show',
    summary: 'summarise a catalogue file written by rank --out',
    load: async () => (await import('./show.ts')).addShowCommand,
  },
  {
    name: 'view',
    summary: 'write a catalogue file as one self-contained web page: cards, sorting, filters, live relax',
    load: async () => (await import('./view.ts')).addViewCommand,
  },
  {
    name: 'sweep',
    summary: 'which arrangement wins as the areas change: along a path, over a grid or over a triangle of shares',
    load: async () => (await import('./sweep.ts')).addSweepCommand,
  },
  {
    name: 'atlas',
    summary: 'which arrangement wins over the whole simplex of area ratios, sampled: winner classes by area rank, margins, boundaries',
    load: async () => (await import('./atlas.ts')).addAtlasCommand,
  },
];

/** The verb a command line asks for: its first word that is not an option (null for none or unknown). */
function requestedVerb(argv: readonly string[]): Verb | null {
  const words = argv.slice(2).filter((a) => !a.startsWith('-'));
  const word = words[0] === 'help' ? words[1] : words[0];
  return VERBS.find((v) => v.name === word) ?? null;
}

/**
 * Build the commander program. The verb the command line asks for is attached in full (its module
 * imported); the others only by name and summary, enough for `lather --help`.
 */
export async function buildProgram(argv: readonly string[] = []): Promise<Command> {
  const streams = cliStreams();
  const program = new Command('lather')
    .description('Enumerate, relax and rank the arrangements of planar bubble clusters.')
    .version(packageInfo().version)
    .showHelpAfterError(false)
    .exitOverride()
    .configureOutput({ writeOut: (text) => streams.out.write(text), writeErr: (text) => streams.err.write(text) });
  const wanted = requestedVerb(argv);
  for (const verb of VERBS) {
    if (verb === wanted) (await verb.load())(program);
    else program.command(verb.name);
    const command = program.commands[program.commands.length - 1];
    command.description(verb.summary).exitOverride();
    command.configureOutput(program.configureOutput());
  }
  return program;
}

/** Errors that mean bad input (exit status 2) rather than a failed run (exit status 1). */
function isInputError(error: unknown): boolean {
  return error instanceof LatherError || error instanceof InvalidArgumentError;
}

/**
 * Run the program on argv (node's, so the arguments start at argv[2]); returns the exit status: 0 done
 * (or standard output's reader closed early: the run ends quietly), 2 bad input, usage or an output that
 * cannot be written (one line on stderr), 1 a failed run. Writes to `streams` (the process's own by
 * default) and returns only when what it wrote has been handed on; never exits the process.
 */
export async function main(argv: readonly string[], streams: CliStreams = cliStreams()): Promise<number> {
  try {
    await withStreams(streams, (message) => new OutputError(message), async () => {
      const program = await buildProgram(argv);
      await program.parseAsync(argv as string[]);
    });
    return 0;
  } catch (error) {
    if (error instanceof ReaderClosed) return 0;
    if (error instanceof CommanderError) {
      // help and version exit cleanly; commander has already printed its one-line complaint
      return error.exitCode === 0 ? 0 : 2;
    }
    const message = error instanceof Error ? error.message : String(error);
    streams.err.write(`lather: ${message.split('\n')[0]}\n`);
    return isInputError(error) ? 2 : 1;
  }
}
