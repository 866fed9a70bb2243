// cli stage: `lather draw`, SVG drawings of one arrangement or of entries of a catalogue file.

import { existsSync } from 'node:fs';
import { type Command, InvalidArgumentError } from 'commander';
import { resolveArrangement } from '../maps/resolve.ts';
import { relax } from '../solver/newton.ts';
import { renderClusterSvg } from '../render/svg.ts';
import { renderContactSheet, type SheetItem } from '../render/sheet.ts';
import { UsageError } from '../errors.ts';
import type { Catalogue } from '../catalogue/types.ts';
import { parseAreas } from './areas.ts';
import { withRunFiles, writeOut } from './output.ts';
import { entryDrawing, equilibriumDrawing, typedDrawing } from './drawings.ts';
import { typingOfPairs } from '../solver/tensions.ts';
import { areasForCluster } from './relax.ts';
import { loadCatalogue } from './show.ts';
import { cliStreams } from './streams.ts';

/** Most drawings `draw --ranks` puts on one sheet. */
export const DRAW_RANKS_LIMIT = 100;

/** Parse "1-6" or "3" or "1,4,7" into ranks, at most DRAW_RANKS_LIMIT of them (counted before any is listed). */
export function parseRanks(text: string): number[] {
  const ranges: [number, number][] = [];
  let count = 0;
  for (const part of text.split(',')) {
    const m = /^\s*([0-9]+)\s*(?:-\s*([0-9]+)\s*)?$/.exec(part);
    const lo = m ? Number(m[1]) : NaN;
    const hi = m ? Number(m[2] ?? m[1]) : NaN;
    if (!(lo >= 1 && hi >= lo)) throw new InvalidArgumentError(`Ranks "${text}" are not valid when expected e.g. 1-6 or 1,3,5.`);
    if (!Number.isSafeInteger(hi)) {
      throw new InvalidArgumentError(`Ranks "${text}" name rank ${m![2] ?? m![1]} when expected ranks below 2^53.`);
    }
    ranges.push([lo, hi]);
    count += hi - lo + 1;
  }
  if (count > DRAW_RANKS_LIMIT) {
    throw new InvalidArgumentError(`Ranks "${text}" are ${count} drawings when expected at most ${DRAW_RANKS_LIMIT} on one sheet.`);
  }
  const out: number[] = [];
  for (const [lo, hi] of ranges) for (let r = lo; r <= hi; r++) out.push(r);
  return out;
}

/**
 * Check that every rank asked is in the catalogue, before drawing any.
 * @throws UsageError naming the ranks missing (in one line) and the ranks the file has.
 */
function checkRanks(ranks: readonly number[], catalogue: Catalogue, path: string): void {
  const most = catalogue.entries.filter((e) => e.rank !== null).length;
  const missing = ranks.filter((r) => !(r <= most));
  if (missing.length === 0) return;
  const has = most === 0 ? 'none (no certified equilibrium)' : `1 to ${most}`;
  const which = missing.length === 1 ? `Rank ${missing[0]} is` : `Ranks ${missing.slice(0, 3).join(', ')}${missing.length > 3 ? ` and ${missing.length - 3} more` : ''} are`;
  throw new UsageError(`${which} not in ${path} when expected ranks it has: ${has}.`);
}

/** Attach `draw` to the program. */
export function addDrawCommand(program: Command): void {
  program
    .command('draw')
    .argument('<what>', 'an id (4.9), a code ("3:...b7a") or a catalogue file (.json)')
    .option('--areas <list>', 'cell areas for an arrangement (default: all 1)', parseAreas)
    .option('--ranks <list>', `ranks to draw from a catalogue, e.g. 1-6 (at most ${DRAW_RANKS_LIMIT})`, parseRanks)
    .option('--pressures', 'show pressures in the cell labels')
    .option('--junctions', 'mark junctions')
    .option('--out <file.svg>', 'write the SVG to a file (default: standard output)')
    .action(async (what: string, opts) => {
      const style = { pressures: opts.pressures, junctions: opts.junctions };
      const fromFile = what.endsWith('.json') || (existsSync(what) && !/^[0-9]+(\.[0-9]+|:.*)$/.test(what));
      if (fromFile && opts.areas !== undefined) {
        throw new UsageError(`Option --areas given with the catalogue ${what} when expected it only with an arrangement (a catalogue has its areas).`);
      }
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
  checkRanks(ranks, catalogue, what);
  const items: SheetItem[] = [];
  // a typed catalogue: cells by type, walls with their tensions, the energy in the caption
  const { types, tensions } = catalogue.query;
  const typing = types === undefined ? undefined : typingOfPairs(types, tensions ?? {}, types.length);
  for (const r of ranks) {
    const entry = catalogue.entries.find((e) => e.rank === r)!;
    const drawing = typing === undefined ? entryDrawing(entry)! : typedDrawing(entryDrawing(entry)!, entry.assignment, typing);
    const value = (typing === undefined ? entry.perimeter : entry.energy) ?? undefined;
    items.push({ drawing, rank: r, id: entry.id, perimeter: value, ...(typing === undefined ? {} : { energy: true }), note: `index ${entry.index}` });
  }
  const measure = typing === undefined ? 'perimeter' : 'energy';
  return items.length === 1 && given === undefined
    ? renderClusterSvg({ ...items[0].drawing, caption: `#1  ${measure} ${items[0].perimeter?.toPrecision(10)}` }, style)
    : renderContactSheet(items, { ...style, title: `${what}: ranks ${ranks.join(', ')}` });
}

/** The drawing of one arrangement at its equilibrium (or where the solve stopped, said on stderr). */
function arrangementSvg(what: string, opts: { areas?: number[]; ranks?: number[] }, style: { pressures?: boolean; junctions?: boolean }): string {
  if (opts.ranks !== undefined) throw new UsageError('Option --ranks given with an arrangement when expected a catalogue file.');
  const cluster = resolveArrangement(what);
  const areas = areasForCluster(cluster, opts.areas, what);
  const eq = relax(cluster.map, areas);
  if (eq.status === 'no-convergence') cliStreams().err.write(`lather: ${what}: the solver did not converge (existence unknown); drawn where the solve stopped\n`);
  else if (eq.status !== 'ok') cliStreams().err.write(`lather: ${what} has no equilibrium at these areas (${eq.status}); drawn where the solve stopped\n`);
  return renderClusterSvg(equilibriumDrawing(cluster, areas, eq, what), style);
}
