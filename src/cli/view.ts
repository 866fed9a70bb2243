// cli stage: `lather view FILE.json --out page.html`, a catalogue as one self-contained web page.

import { basename } from 'node:path';
import { type Command } from 'commander';
import { renderViewPage } from '../view/page.ts';
import { withRunFiles, writeOut } from './output.ts';
import { pageScript } from './page-script.ts';
import { loadCatalogue } from './show.ts';

/** Attach `view` to the program. */
export function addViewCommand(program: Command): void {
  program
    .command('view')
    .argument('<file>', 'catalogue file (.json) written by rank --out')
    .option('--out <page.html>', 'write the page to a file (default: standard output)')
    .action(async (file: string, opts: { out?: string }) => {
      await withRunFiles([file], (files) => (opts.out === undefined ? null : files.add(opts.out, '--out')), async (out) => {
        const catalogue = loadCatalogue(file);
        const page = renderViewPage(catalogue, await pageScript(), basename(file));
        if (out !== null) out.write(page);
        else writeOut(page);
      });
    });
}
