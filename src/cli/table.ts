// cli stage: the readable table of a catalogue (rank, show), and how every printed table writes numbers.

import type { Catalogue, CatalogueEntry } from '../catalogue/types.ts';
import { formatValue, plural } from '../render/format.ts';
import { DEFAULT_STARTS } from '../solver/equilibria.ts';

/** Significant digits of perimeters and parameter values in printed tables (catalogue files keep 12). */
export const TABLE_DIGITS = 10;

/**
 * A number in a table column: `digits` significant digits, trailing zeros kept so a column lines up,
 * an exponent for magnitudes from 1e6 or below 1e-4 (render/format.ts formatValue).
 */
export function tableNumber(x: number, digits = TABLE_DIGITS): string {
  return formatValue(x, digits, true);
}

/** A parameter value in a table: as tableNumber, trailing zeros removed ("0.5", "2"). */
export function tableValue(x: number): string {
  return formatValue(x, TABLE_DIGITS);
}

/** Which area sits in which cell, e.g. "1:2.5 2:1 3:1". */
export function cellAreasText(e: CatalogueEntry, types?: readonly string[]): string {
  return e.cellAreas.map((a, i) => `${i + 1}:${a}${types === undefined ? '' : `(${types[e.assignment[i]]})`}`).join(' ');
}

function stabilityText(e: CatalogueEntry): string {
  if (e.index === null) return '-';
  return e.zeroModes ? `${e.index} (+${e.zeroModes} zero)` : String(e.index);
}

/** Where a lens family's lens can slide, e.g. "lens 2 slides 0.12-0.88 of walls 3+5 (at 0.5)". */
export function familyText(family: NonNullable<CatalogueEntry['family']>): string {
  const share = (x: number) => formatValue(x, 3);
  return `lens ${family.cell} slides ${share(family.from)}-${share(family.to)} of walls ${family.walls[0]}+${family.walls[1]} (at ${share(family.at)})`;
}

/** The status column of a certified entry: "ok" or "saddle", and its lens family where it has one. */
function equilibriumText(e: CatalogueEntry): string {
  const kind = e.index === 0 ? 'ok' : `saddle (index ${e.index})`;
  return e.family === null ? kind : `${kind}, ${familyText(e.family)}`;
}

/**
 * What a candidate without an equilibrium says, with what was tried: e.g. "wall-collapse: no equilibrium
 * from 3 starts; the flow collapses wall 7 (T1 to 5.33)". A solver that did not converge says nothing
 * about existence.
 */
export function failureText(e: Pick<CatalogueEntry, 'status' | 'collapsingWall' | 'collapsingCell' | 'becomes' | 'tried'>): string {
  const from = plural(e.tried, 'start');
  if (e.status === 'no-convergence') return `no-convergence: the solver did not converge from ${from} (existence unknown)`;
  let how: string;
  if (e.status === 'wall-collapse') {
    const to = e.becomes === null ? 'no admissible T1 neighbour' : `T1 to ${e.becomes.id}`;
    how = `the flow collapses wall ${e.collapsingWall} (${to})`;
  } else if (e.status === 'cell-collapse') how = `the flow collapses cell ${e.collapsingCell}`;
  else if (e.status === 'walls-cross') how = 'the walls cross';
  else if (e.status === 'junction-unbalanced') how = 'a junction\'s three tensions cannot balance (one at least the sum of the others)';
  else how = `the branch folds back`;
  return `${e.status}: no equilibrium from ${from}; ${how}`;
}

/**
 * Table lines: the ranked equilibria (at most `top`; a saddle says so in its status, with its index),
 * then failures (at most `top`) with what was tried. A column of the starts that reached each
 * equilibrium out of those tried appears when some candidate was tried from more than one start.
 */
export function catalogueTable(c: Catalogue, top: number, stableOnly: boolean): string[] {
  const lines: string[] = [];
  const k = c.counts;
  const q = c.query;
  const n = q.areas.length;
  // the search said when it is not the default one (a version 1 file: one start)
  const search = q.starts !== DEFAULT_STARTS || q.unstable ? `, ${plural(q.starts, 'start')} each${q.unstable ? ', saddles searched' : ''}` : '';
  lines.push(
    `${n} cells, areas ${q.areas.join(', ')}: ${k.arrangements} arrangements` +
      (k.arrangements !== k.enumerated ? ` (of ${k.enumerated}, filtered)` : '') +
      `, ${k.candidates} candidates, ${k.tried} relaxed${search}` +
      (k.exhaustive ? ' (exhaustive)' : ` (NOT exhaustive: local search within the budget, ${k.skipped} candidates skipped)`),
  );
  const kinds = Object.entries(k.failures).map(([kind, v]) => `${v} ${kind}`).join(', ');
  const failed = Object.values(k.failures).reduce((p, v) => p + v, 0);
  const saddles = k.saddles > 0 || q.unstable ? `, ${plural(k.saddles, 'saddle')}` : '';
  lines.push(`${k.equilibria} certified equilibria (${k.stable} stable${saddles}), ${failed} failures${kinds ? ` (${kinds})` : ''}`);
  // cells of different types: ranked by energy, the total length beside it
  const types = q.types;
  if (types !== undefined) {
    const pairs = Object.entries(q.tensions ?? {}).map(([pair, v]) => `${pair} ${v}`);
    lines.push(`types ${types.join(' ')} by area; tensions ${pairs.length > 0 ? pairs.join(', ') : 'all 1'} (others 1); ranked by energy`);
  }
  lines.push('');
  const withStarts = c.entries.some((e) => e.tried > 1);
  const ranked = c.entries.filter((e) => e.rank !== null && (!stableOnly || e.index === 0));
  const measures = types === undefined ? ['perimeter'] : ['energy', 'length'];
  const head = ['rank', ...measures, 'gap %', 'id', 'sides', 'areas by cell', 'index', ...(withStarts ? ['reached'] : []), 'status'];
  const rows: string[][] = ranked.slice(0, top).map((e) => [
    String(e.rank), ...(types === undefined ? [] : [tableNumber(e.energy!)]), tableNumber(e.perimeter!), e.gapPercent!.toFixed(3), e.id,
    e.sides.join(''), cellAreasText(e, types), stabilityText(e), ...(withStarts ? [`${e.reached}/${e.tried}`] : []), equilibriumText(e),
  ]);
  const failures = c.entries.filter((e) => e.rank === null);
  const failRows: string[][] = stableOnly ? [] : failures.slice(0, top).map((e) => [
    '-', ...measures.map(() => '-'), '-', e.id, e.sides.join(''), cellAreasText(e, types), '-', ...(withStarts ? [`0/${e.tried}`] : []), failureText(e),
  ]);
  const all = [head, ...rows, ...failRows];
  const widths = head.map((_, j) => Math.max(...all.map((r) => r[j].length)));
  const numeric = 1 + measures.length;
  const line = (r: string[]) => r.map((cell, j) => (j <= numeric ? cell.padStart(widths[j]) : cell.padEnd(widths[j]))).join('  ').trimEnd();
  lines.push(line(head));
  for (const r of rows) lines.push(line(r));
  if (ranked.length > top) lines.push(`... ${ranked.length - top} more equilibria (--top ${ranked.length} shows them)`);
  for (const r of failRows) lines.push(line(r));
  if (!stableOnly && failures.length > top) lines.push(`... ${failures.length - top} more failures${c.compact === true ? '' : ' (all are in the catalogue file)'}`);
  if (c.compact === true && !stableOnly) lines.push('(a compact catalogue: its failures are counted above, not listed)');
  return lines;
}
