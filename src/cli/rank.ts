// cli stage: `lather rank`, every arrangement ranked by perimeter at the given areas.

import { availableParallelism } from 'node:os';
import { type Command, InvalidArgumentError } from 'commander';
import { type RankOptions, rankAreas, defaultWorkers, RANK_LIMIT, WORKER_LIMIT } from '../catalogue/rank.ts';
import { rankShard, writePart } from '../catalogue/shard.ts';
import { UsageError } from '../errors.ts';
import { DEFAULT_STARTS } from '../solver/equilibria.ts';
import { packageInfo } from '../version.ts';
import { writeCatalogue } from '../catalogue/format.ts';
import { areasFrom, parseAreas } from './areas.ts';
import { type TensionText, parseTensions, parseTypes, typingFrom } from './tensions.ts';
import { filterFromOptions, parseSeconds, parseShard, wholeNumber } from './parse.ts';
import { type RunFiles, withRunFiles, writeOut } from './output.ts';
import { catalogueTable } from './table.ts';
import { catalogueFileBytes } from './show.ts';
import { checkSheetTop, entriesSheet, SHEET_LIMIT } from './drawings.ts';
import { startProgress, type Progress } from './progress.ts';
import { cliStreams } from './streams.ts';
import { type CellTyping, tensionPairs } from '../solver/tensions.ts';

/** A shard of a ranking, 1-based. */
interface Shard {
  index: number;
  count: number;
}

function workersCapText(): string {
  const cores = availableParallelism();
  return `at most ${cores} (the cores available; up to ${WORKER_LIMIT} with --force-workers)`;
}

/** --workers: a whole number from 1 to WORKER_LIMIT. */
function parseWorkers(text: string): number {
  const v = wholeNumber(1, Infinity, 'Workers')(text);
  if (v > WORKER_LIMIT) throw new InvalidArgumentError(`Workers ${text.trim()} is above ${WORKER_LIMIT} when expected ${workersCapText()}.`);
  return v;
}

/**
 * The worker threads of a run: --workers (at most the cores available, unless --force-workers, and
 * never above WORKER_LIMIT) or the cores available. @throws UsageError naming the cap.
 */
function workersFrom(opts: { workers?: number; forceWorkers?: boolean }): number {
  if (opts.workers === undefined) {
    if (opts.forceWorkers) throw new UsageError('Got --force-workers without --workers when expected --workers <n> with it.');
    return defaultWorkers();
  }
  if (opts.workers > availableParallelism() && !opts.forceWorkers) {
    throw new UsageError(`Workers ${opts.workers} is above the cores available when expected ${workersCapText()}.`);
  }
  return opts.workers;
}

/** --shard: "i/k" (1-based) or "slurm". */
function rankShardOption(text: string): Shard | 'slurm' {
  if (text.trim() === 'slurm') return 'slurm';
  const { index, count } = parseShard(text);
  return { index: index + 1, count };
}

/** The shard of a Slurm job array task, from its environment. @throws UsageError naming a missing variable. */
export function slurmShard(env: NodeJS.ProcessEnv): Shard {
  const read = (name: string, fallback?: number): number => {
    const text = env[name];
    if (text === undefined && fallback !== undefined) return fallback;
    if (text === undefined || !/^[0-9]+$/.test(text)) {
      throw new UsageError(`Variable ${name} is ${text === undefined ? 'not set' : `"${text}"`} when expected a whole number from a Slurm job array (--shard slurm).`);
    }
    return Number(text);
  };
  const index = read('SLURM_ARRAY_TASK_ID') - read('SLURM_ARRAY_TASK_MIN', 0) + 1;
  const count = read('SLURM_ARRAY_TASK_COUNT');
  if (!(index >= 1 && index <= count)) {
    throw new UsageError(`Slurm array task ${index} of ${count} is not valid when expected an array of consecutive task ids (e.g. --array=1-${count}).`);
  }
  return { index, count };
}

/** rank --shard: rank one shard and write its part file. */
async function rankPart(areas: number[], shard: Shard, options: RankOptions, opts: { out?: string; sheet?: string }): Promise<void> {
  if (opts.out === undefined) throw new UsageError('Option --shard given without --out when expected a part file to write.');
  if (opts.sheet !== undefined) throw new UsageError('Option --sheet given with --shard when expected it with a whole ranking (or with merge).');
  const part = await withRunFiles([], (files) => files.add(opts.out as string, '--out'), async (out) => {
    let progress: Progress | null = null;
    const part = await rankShard(areas, shard, packageInfo().version, {
      ...options,
      onProgress: (done, total) => {
        progress ??= startProgress(`relaxing shard ${shard.index}/${shard.count}`, total);
        progress.update(done);
      },
    });
    (progress as Progress | null)?.stop();
    out.write(writePart(part));
    return part;
  });
  writeOut(
    `shard ${shard.index}/${shard.count}: ${part.tasks.length} of ${part.totals.tasks} arrangements, ` +
      `${part.entries.length} candidates relaxed; part written to ${opts.out}\n`,
  );
}

/** The heading of a ranking's contact sheet: the areas, and the types and tensions when typed. */
function sheetTitle(areas: number[], typing: CellTyping | undefined): string {
  if (typing === undefined) return `areas ${areas.join(', ')}`;
  const pairs = Object.entries(tensionPairs(typing)).map(([k, v]) => `${k} ${v}`);
  return `areas ${areas.map((a, i) => `${a}${typing.table.labels[typing.types[i]]}`).join(', ')}; tensions ${pairs.length > 0 ? pairs.join(', ') : 'all 1'}`;
}

/** Attach `rank` to the program. */
export function addRankCommand(program: Command): void {
  program
    .command('rank')
    .option('--areas <list>', 'cell areas, comma separated, e.g. 1,1,2.5', parseAreas)
    .option('--example <name>', 'a built-in example (tray-pair, tray-trio, tray-mixed, tray-six, tray-dyed)')
    .option('--types <list>', 'a type label per area, in --areas order, e.g. a,a,b,b (the outside is "out")', parseTypes)
    .option('--tension <list>', 'tension of walls between two types, e.g. a:b=1.3,a:out=1 (default 1); ranks by energy', parseTensions)
    .option('--top <k>', 'rows shown of equilibria and of failures', wholeNumber(1, undefined, 'Top'), 25)
    .option('--stable-only', 'show only equilibria of index 0')
    .option('--three-connected', 'only arrangements whose map is 3-connected')
    .option('--no-lens', 'leave out arrangements with a 2-sided cell')
    .option('--max-sides <k>', 'only arrangements whose cells have at most k sides', wholeNumber(1, undefined, 'Sides'))
    .option('--min-sides <k>', 'only arrangements whose cells have at least k sides', wholeNumber(1, undefined, 'Sides'))
    .option('--budget <seconds>', 'work allowed before switching from exhaustive ranking to search', parseSeconds('Budget'), 60)
    .option('--workers <n>', 'worker threads (default: the cores available)', parseWorkers)
    .option('--force-workers', `allow --workers above the cores available (up to ${WORKER_LIMIT})`)
    .option('--seed <n>', 'seed of the search starts (when not exhaustive) and of the perturbed first drawings', wholeNumber(0, 0xffffffff, 'Seed'), 1)
    .option('--starts <k>', `first drawings tried per candidate (barycentric, construction path, then seeded perturbations; default ${DEFAULT_STARTS})`, wholeNumber(1, undefined, 'Starts'))
    .option('--unstable', 'also look for saddles (index >= 1) and list them')
    .option('--large', `allow more than ${RANK_LIMIT} cells`)
    .option('--out <file.json>', 'write the catalogue (whole or not at all)')
    .option('--sheet <file.svg>', `write a contact sheet of the top drawings (at most ${SHEET_LIMIT})`)
    .option('--compact', 'write only the certified entries (failures as counts by kind), for a census; FILE.json.gz is gzip-compressed')
    .option(
      '--shard <i/k>',
      'rank only part i of k and write it with --out as a part file for `lather merge`; "slurm" takes i and k ' +
        'from a Slurm job array (SLURM_ARRAY_TASK_ID, SLURM_ARRAY_TASK_MIN, SLURM_ARRAY_TASK_COUNT)',
      rankShardOption,
    )
    .action(async (opts, command: Command) => {
      const areas = areasFrom(opts);
      const typing = typingFrom(opts as { types?: string[]; tension?: TensionText[]; example?: string }, areas.length);
      const filter = filterFromOptions(opts);
      const workers = workersFrom(opts);
      checkSheetTop(opts.top, command.getOptionValueSource('top') === 'cli', opts.sheet);
      if (opts.shard !== undefined) {
        for (const option of ['top', 'stableOnly'] as const) {
          if (command.getOptionValueSource(option) === 'cli') {
            const name = option === 'top' ? '--top' : '--stable-only';
            throw new UsageError(`Option ${name} given with --shard when expected it with a whole ranking (a part file has no table).`);
          }
        }
        await rankPart(areas, opts.shard === 'slurm' ? slurmShard(process.env) : opts.shard, {
          filter, budgetSeconds: opts.budget, workers, seed: opts.seed, large: opts.large, starts: opts.starts, unstable: Boolean(opts.unstable), typing,
        }, opts);
        return;
      }
      const declare = (files: RunFiles) => ({
        out: opts.out === undefined ? null : files.add(opts.out, '--out'),
        sheet: opts.sheet === undefined ? null : files.add(opts.sheet, '--sheet'),
      });
      const catalogue = await withRunFiles([], declare, async ({ out, sheet }, files) => {
        let progress: Progress | null = null;
        const catalogue = await rankAreas(areas, {
          filter, budgetSeconds: opts.budget, workers, seed: opts.seed, large: opts.large, starts: opts.starts, unstable: Boolean(opts.unstable),
          typing,
          onProgress: (done, total) => {
            progress ??= startProgress('relaxing', total);
            progress.update(done);
          },
        });
        (progress as Progress | null)?.stop();
        if (opts.compact) catalogue.compact = true;
        out?.write(catalogueFileBytes(writeCatalogue(catalogue), opts.out));
        if (sheet !== null) {
          const top = catalogue.entries.filter((e) => e.rank !== null && (!opts.stableOnly || e.index === 0)).slice(0, Math.min(opts.top, SHEET_LIMIT));
          if (top.length > 0) sheet.write(entriesSheet(top, sheetTitle(areas, typing), typing));
          else {
            files.discard(sheet);
            cliStreams().err.write('lather: no certified equilibrium to draw; no sheet written\n');
          }
        }
        return catalogue;
      });
      writeOut(catalogueTable(catalogue, opts.top, Boolean(opts.stableOnly)).join('\n') + '\n');
    });
}
