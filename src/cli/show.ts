// cli stage: `lather show FILE.json`, the summary of a catalogue read back from its file.

import { readFileSync } from 'node:fs';
import { gunzipSync, gzipSync } from 'node:zlib';
import { type Command } from 'commander';
import { readCatalogue } from '../catalogue/format.ts';
import type { Catalogue } from '../catalogue/types.ts';
import { UsageError } from '../errors.ts';
import { wholeNumber } from './parse.ts';
import { catalogueTable } from './table.ts';
import { writeOut } from './output.ts';

/** The bytes of a catalogue file: gzip-compressed when its name ends in .gz (same text, same bytes). */
export function catalogueFileBytes(text: string, path: string): string | Uint8Array {
  return path.endsWith('.gz') ? gzipSync(text, { level: 9 }) : text;
}

/** Read and check a catalogue file. @throws UsageError or CatalogueFormatError. */
export function loadCatalogue(path: string): Catalogue {
  let text: string;
  try {
    const bytes = readFileSync(path);
    // a gzip file (a census written to FILE.json.gz) is read through
    text = (bytes[0] === 0x1f && bytes[1] === 0x8b ? gunzipSync(bytes) : bytes).toString('utf8');
  } catch (error) {
    const reason = (error as NodeJS.ErrnoException).code ?? 'error';
    throw new UsageError(`Cannot read ${path} (${reason}) when expected a catalogue file.`);
  }
  return readCatalogue(text, path);
}

/** Attach `show` to the program. */
export function addShowCommand(program: Command): void {
  program
    .command('show')
    .argument('<file>', 'catalogue file (.json)')
    .option('--top <k>', 'rows shown of equilibria and of failures', wholeNumber(1, undefined, 'Top'), 25)
    .option('--stable-only', 'show only equilibria of index 0')
    .action((file: string, opts) => {
      const catalogue = loadCatalogue(file);
      writeOut(catalogueTable(catalogue, opts.top, Boolean(opts.stableOnly)).join('\n') + '\n');
    });
}
