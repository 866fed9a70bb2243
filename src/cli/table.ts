// cli stage: the readable table of a catalogue (rank, show), and how every printed table writes numbers.

import type { Catalogue, CatalogueEntry } from '../catalogue/types.ts';
import { formatValue } from '../render/format.ts';

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
export function cellAreasText(e: CatalogueEntry): string {
  return e.cellAreas.map((a, i) => `${i + 1}:${a}`).join(' ');
}

function stabilityText(e: CatalogueEntry): string {
  if (e.index === null) return '-';
  return e.zeroModes ? `${e.index} (+${e.zeroModes} zero)` : String(e.index);
}

function failureText(e: CatalogueEntry): string {
  if (e.status === 'wall-collapse') {
    const to = e.becomes === null ? 'no admissible T1 neighbour' : `T1 to ${e.becomes.id}`;
    return `wall-collapse (wall ${e.collapsingWall}; ${to})`;
  }
  if (e.status === 'cell-collapse') return `cell-collapse (cell ${e.collapsingCell})`;
  return e.status;
}

/** Table lines: the ranked equilibria (at most `top`), then failures (at most `top`) with their kind. */
export function catalogueTable(c: Catalogue, top: number, stableOnly: boolean): string[] {
  const lines: string[] = [];
  const k = c.counts;
  const n = c.query.areas.length;
  lines.push(
    `${n} cells, areas ${c.query.areas.join(', ')}: ${k.arrangements} arrangements` +
      (k.arrangements !== k.enumerated ? ` (of ${k.enumerated}, filtered)` : '') +
      `, ${k.candidates} candidates, ${k.tried} relaxed` +
      (k.exhaustive ? ' (exhaustive)' : ` (NOT exhaustive: local search within the budget, ${k.skipped} candidates skipped)`),
  );
  const kinds = Object.entries(k.failures).map(([kind, v]) => `${v} ${kind}`).join(', ');
  lines.push(`${k.equilibria} certified equilibria (${k.stable} stable), ${k.tried - k.equilibria} failures${kinds ? ` (${kinds})` : ''}`);
  lines.push('');
  const ranked = c.entries.filter((e) => e.rank !== null && (!stableOnly || e.index === 0));
  const head = ['rank', 'perimeter', 'gap %', 'id', 'sides', 'areas by cell', 'index', 'status'];
  const rows: string[][] = ranked.slice(0, top).map((e) => [
    String(e.rank), tableNumber(e.perimeter!), e.gapPercent!.toFixed(3), e.id, e.sides.join(''), cellAreasText(e), stabilityText(e), e.status,
  ]);
  const failures = c.entries.filter((e) => e.rank === null);
  const failRows: string[][] = stableOnly ? [] : failures.slice(0, top).map((e) => ['-', '-', '-', e.id, e.sides.join(''), cellAreasText(e), '-', failureText(e)]);
  const all = [head, ...rows, ...failRows];
  const widths = head.map((_, j) => Math.max(...all.map((r) => r[j].length)));
  const line = (r: string[]) => r.map((cell, j) => (j <= 2 ? cell.padStart(widths[j]) : cell.padEnd(widths[j]))).join('  ').trimEnd();
  lines.push(line(head));
  for (const r of rows) lines.push(line(r));
  if (ranked.length > top) lines.push(`... ${ranked.length - top} more equilibria (--top ${ranked.length} shows them)`);
  for (const r of failRows) lines.push(line(r));
  if (!stableOnly && failures.length > top) lines.push(`... ${failures.length - top} more failures${c.compact === true ? '' : ' (all are in the catalogue file)'}`);
  if (c.compact === true && !stableOnly) lines.push('(a compact catalogue: its failures are counted above, not listed)');
  return lines;
}
