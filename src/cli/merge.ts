// cli stage: `lather merge PART... --out FILE`, the parts of a sharded ranking put back together into the
// catalogue a single run writes (byte for byte), checked before anything is written.

import { typingOfPairs } from '../solver/tensions.ts';
import { readFileSync } from 'node:fs';
import { type Command } from 'commander';
import { readCatalogue, writeCatalogue } from '../catalogue/format.ts';
import { mergeParts, readPart } from '../catalogue/shard.ts';
import { UsageError } from '../errors.ts';
import { packageInfo } from '../version.ts';
import { checkSheetTop, entriesSheet, SHEET_LIMIT } from './drawings.ts';
import { type RunFiles, withRunFiles, writeOut } from './output.ts';
import { wholeNumber } from './parse.ts';
import { catalogueTable } from './table.ts';
import { catalogueFileBytes } from './show.ts';

/** Attach `merge` to the program. */
export function addMergeCommand(program: Command): void {
  program
    .command('merge')
    .argument('<parts...>', 'the part files written by rank --shard i/k, every shard once, in any order')
    .requiredOption('--out <file.json>', 'write the merged catalogue (whole or not at all)')
    .option('--sheet <file.svg>', `write a contact sheet of the top drawings (at most ${SHEET_LIMIT})`)
    .option('--compact', 'write only the certified entries (failures as counts by kind), for a census; FILE.json.gz is gzip-compressed')
    .option('--top <k>', 'rows shown of equilibria and of failures', wholeNumber(1, undefined, 'Top'), 25)
    .action(async (paths: string[], opts, command: Command) => {
      checkSheetTop(opts.top, command.getOptionValueSource('top') === 'cli', opts.sheet);
      const declare = (files: RunFiles) => ({
        out: files.add(opts.out, '--out'),
        sheet: opts.sheet === undefined ? null : files.add(opts.sheet, '--sheet'),
      });
      const catalogue = await withRunFiles(paths, declare, ({ out, sheet }) => {
        const parts = paths.map((source) => {
          let text: string;
          try {
            text = readFileSync(source, 'utf8');
          } catch (error) {
            throw new UsageError(`Cannot read part ${source} (${(error as NodeJS.ErrnoException).code ?? 'error'}) when expected a part file.`);
          }
          return { part: readPart(text, source), source };
        });
        const merged = mergeParts(parts, packageInfo().version);
        if (opts.compact) merged.compact = true;
        const text = writeCatalogue(merged);
        // the merged catalogue must pass every check a reader makes
        const catalogue = readCatalogue(text, opts.out);
        out.write(catalogueFileBytes(text, opts.out));
        const top = catalogue.entries.filter((e) => e.rank !== null).slice(0, Math.min(opts.top, SHEET_LIMIT));
        // (a typed ranking's sheet draws the cells by type)
        const { areas, types, tensions } = catalogue.query;
        const typing = types === undefined ? undefined : typingOfPairs(types, tensions ?? {}, areas.length);
        if (sheet !== null) sheet.write(entriesSheet(top, `areas ${areas.join(', ')}`, typing));
        return catalogue;
      });
      writeOut(catalogueTable(catalogue, opts.top, false).join('\n') + '\n');
    });
}
