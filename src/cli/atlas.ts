// cli stage: `lather atlas`, which arrangement wins over the whole simplex of area ratios, sampled.

import { type Command, InvalidArgumentError } from 'commander';
import { runAtlas } from '../atlas/atlas.ts';
import { ATLAS_MAX_CELLS, ATLAS_MAX_SAMPLES, ATLAS_MIN_CELLS, DEFAULT_MIN_SHARE, checkDesign } from '../atlas/design.ts';
import { atlasJson } from '../atlas/format.ts';
import { WORKER_LIMIT } from '../catalogue/rank.ts';
import { atlasPlot, atlasTable } from './atlas-output.ts';
import { type RunFiles, withRunFiles, writeOut } from './output.ts';
import { wholeNumber } from './parse.ts';
import { startProgress, type Progress } from './progress.ts';
import { type TensionText, parseTensions, parseTypes, typingFrom } from './tensions.ts';
import { UsageError } from '../errors.ts';

function cellsArgument(text: string): number {
  const v = Number(text.trim());
  if (!/^[0-9]+$/.test(text.trim()) || v < ATLAS_MIN_CELLS || v > ATLAS_MAX_CELLS) {
    throw new InvalidArgumentError(`Cells "${text}" is not valid when expected a whole number from ${ATLAS_MIN_CELLS} to ${ATLAS_MAX_CELLS}.`);
  }
  return v;
}

const samplesOption = wholeNumber(1, ATLAS_MAX_SAMPLES, 'Samples');

function shareOption(text: string): number {
  const v = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(v) || v < 0) {
    throw new InvalidArgumentError(`Least share "${text}" is not valid when expected a number of at least 0 and below 1/cells.`);
  }
  return v;
}

/** Attach `atlas` to the program. */
export function addAtlasCommand(program: Command): void {
  program
    .command('atlas')
    .argument('<cells>', `number of cells (${ATLAS_MIN_CELLS} to ${ATLAS_MAX_CELLS})`, cellsArgument)
    .requiredOption('--samples <k>', 'samples of the simplex of areas', samplesOption)
    .option('--seed <s>', 'seed of the design', wholeNumber(0, 0xffffffff, 'Seed'), 1)
    .option('--min-share <m>', `least share of the total area of any cell (default ${DEFAULT_MIN_SHARE}: ratios beyond 1:9000 reachable)`, shareOption)
    .option('--types <list>', 'a type label per cell, e.g. a,a,b,b (the outside is "out"): areas sampled in order within each type only', parseTypes)
    .option('--tension <list>', 'tension of walls between two types, e.g. a:b=1.3,a:out=1 (default 1); winners by energy', parseTensions)
    .option('--workers <n>', `worker threads, at most ${WORKER_LIMIT} (the atlas does not depend on them)`, wholeNumber(1, WORKER_LIMIT, 'Workers'), 1)
    .option('--boundaries <k>', 'most class boundaries located by bisection (four cells)', wholeNumber(0, undefined, 'Boundaries'), 100)
    .option('--warm', 'start each candidate from its equilibrium at the nearest solved sample (measured no faster; off: rank\'s own starts)')
    .option('--json [file]', 'write every sample and the summary as a lather-atlas JSON file (or to stdout instead of the table)')
    .option('--plot <file.svg>', 'draw the winner classes (slices of the simplex for four cells) and a histogram of margins')
    .action(async (cells: number, opts) => {
      // everything is checked before any relaxing
      const design = checkDesign({ cells, samples: opts.samples, seed: opts.seed, minShare: opts.minShare });
      const typing = typingFrom(opts as { types?: string[]; tension?: TensionText[] }, cells);
      if (typing !== undefined && opts.plot !== undefined) {
        throw new UsageError('Option --plot given with --types when expected it without types (the figure reads areas as largest first).');
      }
      const declare = (files: RunFiles) => ({
        json: typeof opts.json === 'string' ? files.add(opts.json, '--json') : null,
        plot: opts.plot === undefined ? null : files.add(opts.plot, '--plot'),
      });
      const text = await withRunFiles([], declare, async (outputs) => {
        let progress: Progress | null = null;
        const atlas = await runAtlas({
          ...design, workers: opts.workers, warmStart: opts.warm === true, maxBoundaries: opts.boundaries, typing,
          onProgress: (done, total) => {
            progress ??= startProgress('atlas', total);
            progress.update(done);
          },
        });
        (progress as Progress | null)?.stop();
        const json = atlasJson(atlas);
        outputs.json?.write(json);
        outputs.plot?.write(atlasPlot(atlas));
        return opts.json === true ? json : `${atlasTable(atlas).join('\n')}\n`;
      });
      writeOut(text);
    });
}
