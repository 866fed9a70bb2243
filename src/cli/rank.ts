// cli stage: `lather rank`, every arrangement ranked by perimeter at the given areas.

import { type Command } from 'commander';
import { rankAreas, defaultWorkers } from '../catalogue/rank.ts';
import { writeCatalogue } from '../catalogue/format.ts';
import type { ArrangementFilter } from '../catalogue/filter.ts';
import { areasFrom, parseAreas } from './areas.ts';
import { wholeNumber } from './parse.ts';
import { type RunFiles, withRunFiles, writeOut } from './output.ts';
import { catalogueTable } from './table.ts';
import { entriesSheet } from './drawings.ts';
import { startProgress, type Progress } from './progress.ts';
import { InvalidArgumentError } from 'commander';
import { cliStreams } from './streams.ts';

function positiveSeconds(text: string): number {
  const v = Number(text);
  if (!(text.trim() !== '' && Number.isFinite(v) && v >= 0)) {
    throw new InvalidArgumentError(`Budget "${text}" is not valid when expected a number of seconds >= 0.`);
  }
  return v;
}

/** Attach `rank` to the program. */
export function addRankCommand(program: Command): void {
  program
    .command('rank')
    .option('--areas <list>', 'cell areas, comma separated, e.g. 1,1,2.5', parseAreas)
    .option('--example <name>', 'a built-in example (tray-pair, tray-trio, tray-mixed, tray-six)')
    .option('--top <k>', 'rows shown of equilibria and of failures', wholeNumber(1), 25)
    .option('--stable-only', 'show only equilibria of index 0')
    .option('--three-connected', 'only arrangements whose map is 3-connected')
    .option('--no-lens', 'leave out arrangements with a 2-sided cell')
    .option('--max-sides <k>', 'only arrangements whose cells have at most k sides', wholeNumber(1))
    .option('--min-sides <k>', 'only arrangements whose cells have at least k sides', wholeNumber(1))
    .option('--budget <seconds>', 'work allowed before switching from exhaustive ranking to search', positiveSeconds, 60)
    .option('--workers <n>', 'worker threads (default: the cores available)', wholeNumber(1))
    .option('--seed <n>', 'seed of the search starts (when not exhaustive)', wholeNumber(0), 1)
    .option('--large', 'allow more than 9 cells')
    .option('--out <file.json>', 'write the catalogue (whole or not at all)')
    .option('--sheet <file.svg>', 'write a contact sheet of the top drawings')
    .action(async (opts) => {
      const areas = areasFrom(opts);
      const filter: ArrangementFilter = {};
      if (opts.threeConnected) filter.threeConnected = true;
      if (opts.lens === false) filter.lens = false;
      if (opts.maxSides !== undefined) filter.maxSides = opts.maxSides;
      if (opts.minSides !== undefined) filter.minSides = opts.minSides;
      const declare = (files: RunFiles) => ({
        out: opts.out === undefined ? null : files.add(opts.out, '--out'),
        sheet: opts.sheet === undefined ? null : files.add(opts.sheet, '--sheet'),
      });
      const catalogue = await withRunFiles([], declare, async ({ out, sheet }, files) => {
        let progress: Progress | null = null;
        const catalogue = await rankAreas(areas, {
          filter, budgetSeconds: opts.budget, workers: opts.workers ?? defaultWorkers(), seed: opts.seed, large: opts.large,
          onProgress: (done, total) => {
            progress ??= startProgress('relaxing', total);
            progress.update(done);
          },
        });
        (progress as Progress | null)?.stop();
        out?.write(writeCatalogue(catalogue));
        if (sheet !== null) {
          const top = catalogue.entries.filter((e) => e.rank !== null && (!opts.stableOnly || e.index === 0)).slice(0, Math.min(opts.top, 12));
          if (top.length > 0) sheet.write(entriesSheet(top, `areas ${areas.join(', ')}`));
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
