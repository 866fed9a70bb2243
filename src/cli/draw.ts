// cli stage: `lather draw`, SVG drawings of one arrangement or of entries of a catalogue file.

import { existsSync } from 'node:fs';
import { type Command, InvalidArgumentError } from 'commander';
import { resolveArrangement } from '../maps/resolve.ts';
import { relax } from '../solver/newton.ts';
import { renderClusterSvg } from '../render/svg.ts';
import { renderContactSheet, type SheetItem } from '../render/sheet.ts';
import { UsageError } from '../errors.ts';
import { parseAreas } from './areas.ts';
import { withRunFiles, writeOut } from './output.ts';
import { entryDrawing, equilibriumDrawing } from './drawings.ts';
import { areasForCluster } from './relax.ts';
import { loadCatalogue } from './show.ts';
import { cliStreams } from './streams.ts';

/** Parse "1-6" or "3" or "1,4,7" into ranks. */
export function parseRanks(text: string): number[] {
  const out: number[] = [];
  for (const part of text.split(',')) {
    const m = /^\s*([0-9]+)\s*(?:-\s*([0-9]+)\s*)?$/.exec(part);
    const lo = m ? Number(m[1]) : NaN;
    const hi = m ? Number(m[2] ?? m[1]) : NaN;
    if (!(lo >= 1 && hi >= lo)) throw new InvalidArgumentError(`Ranks "${text}" are not valid when expected e.g. 1-6 or 1,3,5.`);
    for (let r = lo; r <= hi; r++) out.push(r);
  }
  return out;
}

/** Attach `draw` to the program. */
export function addDrawCommand(program: Command): void {
  program
    .command('draw')
    .argument('<what>', 'an id (4.9), a code ("3:...b7a") or a catalogue file (.json)')
    .option('--areas <list>', 'cell areas for an arrangement (default: all 1)', parseAreas)
    .option('--ranks <list>', 'ranks to draw from a catalogue, e.g. 1-6', parseRanks)
    .option('--pressures', 'show pressures in the cell labels')
    .option('--junctions', 'mark junctions')
    .option('--out <file.svg>', 'write the SVG to a file (default: standard output)')
    .action(async (what: string, opts) => {
      const style = { pressures: opts.pressures, junctions: opts.junctions };
      const fromFile = what.endsWith('.json') || (existsSync(what) && !/^[0-9]+(\.[0-9]+|:.*)$/.test(what));
      await withRunFiles(fromFile ? [what] : [], (files) => (opts.out === undefined ? null : files.add(opts.out, '--out')), (out) => {
        const svg = fromFile ? catalogueSvg(what, opts.ranks, style) : arrangementSvg(what, opts, style);
        if (out !== null) out.write(svg);
        else writeOut(svg);
      });
    });
}

/** The drawing of ranked entries of a catalogue file (rank 1 alone by default). */
function catalogueSvg(what: string, given: number[] | undefined, style: { pressures?: boolean; junctions?: boolean }): string {
  const catalogue = loadCatalogue(what);
  const ranks: number[] = given ?? [1];
  const items: SheetItem[] = [];
  for (const r of ranks) {
    const entry = catalogue.entries.find((e) => e.rank === r);
    if (entry === undefined) {
      const most = catalogue.entries.filter((e) => e.rank !== null).length;
      throw new UsageError(`Rank ${r} is not in ${what} when expected 1 to ${most}.`);
    }
    items.push({ drawing: entryDrawing(entry)!, rank: r, id: entry.id, perimeter: entry.perimeter ?? undefined, note: `index ${entry.index}` });
  }
  return items.length === 1 && given === undefined
    ? renderClusterSvg({ ...items[0].drawing, caption: `#1  perimeter ${items[0].perimeter?.toPrecision(10)}` }, style)
    : renderContactSheet(items, { ...style, title: `${what}: ranks ${ranks.join(', ')}` });
}

/** The drawing of one arrangement at its equilibrium (or where the solve stopped, said on stderr). */
function arrangementSvg(what: string, opts: { areas?: number[]; ranks?: number[] }, style: { pressures?: boolean; junctions?: boolean }): string {
  if (opts.ranks !== undefined) throw new UsageError('Option --ranks given with an arrangement when expected a catalogue file.');
  const cluster = resolveArrangement(what);
  const areas = areasForCluster(cluster, opts.areas, what);
  const eq = relax(cluster.map, areas);
  if (eq.status !== 'ok') cliStreams().err.write(`lather: ${what} has no equilibrium at these areas (${eq.status}); drawn where the solve stopped\n`);
  return renderClusterSvg(equilibriumDrawing(cluster, areas, eq, what), style);
}
