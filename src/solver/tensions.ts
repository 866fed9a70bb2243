// solver stage: cell types and the tension of a wall between two of them (walls of different tension,
// design.md §8); the per-wall tensions relax() takes (options.tensions) from the types of a cluster's cells.

import { UsageError } from '../errors.ts';
import type { CubicMap } from '../maps/cubic-map.ts';

/** The type of the outside region. */
export const OUTSIDE_TYPE = 'out';

/**
 * Cell types and the tension of a wall between each pair of them (symmetric; 1 where not set).
 * Plain data, so it crosses thread boundaries.
 */
export interface TensionTable {
  /** Type labels, `labels[0]` = OUTSIDE_TYPE; the others in order of first appearance. */
  labels: string[];
  /** Tension between types i and j at values[i * labels.length + j] (= values[j * labels.length + i]). */
  values: number[];
}

/** A table of `labels` (the outside first) with every tension 1. */
export function unitTable(labels: readonly string[]): TensionTable {
  const m = labels.length;
  return { labels: [...labels], values: new Array<number>(m * m).fill(1) };
}

/** The tension between types i and j of `table`. */
export function tensionBetween(table: TensionTable, i: number, j: number): number {
  return table.values[i * table.labels.length + j];
}

/** Whether every tension of `table` is 1 (the soap film: energy = perimeter). */
export function isUnitTable(table: TensionTable | null | undefined): boolean {
  return table == null || table.values.every((v) => v === 1);
}

/**
 * The tension of each wall of `map` (by map.wallIndex(); the circle's one wall for a single cell) when
 * cell f has type cellTypes[f - 1] (an index into table.labels, never 0) and the outside type 0; null
 * when every wall's tension is 1.
 */
export function wallTensions(map: CubicMap, cellTypes: ArrayLike<number>, table: TensionTable | null | undefined): Float64Array | null {
  if (isUnitTable(table)) return null;
  const t = table as TensionTable;
  // (the circle: one wall, between its cell and the outside, though its map has no darts)
  const out = map.twins.length === 0 ? Float64Array.of(tensionBetween(t, cellTypes[0], 0)) : wallPairValues(map, cellTypes, t.values, t.labels.length);
  return out.every((s) => s === 1) ? null : out;
}

/**
 * Per wall of `map` (by map.wallIndex()), the entry values[i * m + j] of the types i, j of the two regions
 * it separates (cell f of type cellTypes[f - 1], the outside 0): a tension table's values, or their
 * derivatives in a parameter.
 */
export function wallPairValues(map: CubicMap, cellTypes: ArrayLike<number>, values: readonly number[], m: number): Float64Array {
  const { twins, faceOf } = map;
  const wallOf = map.wallIndex();
  const out = new Float64Array(twins.length / 2);
  for (let e = 0; e < twins.length; e++) {
    if (e > twins[e]) continue;
    const f = faceOf[e];
    const g = faceOf[twins[e]];
    out[wallOf[e]] = values[(f === 0 ? 0 : cellTypes[f - 1]) * m + (g === 0 ? 0 : cellTypes[g - 1])];
  }
  return out;
}

/** The tension of the walls between types `a` and `b` (either may be OUTSIDE_TYPE). */
export interface TensionSetting {
  a: string;
  b: string;
  value: number;
}

/** Cell types of a query: the tension table and the type (index into its labels, >= 1) of each area. */
export interface CellTyping {
  table: TensionTable;
  /** types[i]: the type of the query's i-th area. */
  types: number[];
}

const LABEL = /^[A-Za-z][A-Za-z0-9_]*$/;

/**
 * The typing of `cells` areas of types `types` (one label per area, in the areas' order) with the
 * tensions `settings` (symmetric; every pair not set is 1).
 * @throws UsageError naming a bad label, a count that does not match, a tension that is not positive and
 *   finite, or a pair set twice.
 */
export function cellTyping(types: readonly string[], settings: readonly TensionSetting[], cells: number): CellTyping {
  if (types.length !== cells) throw new UsageError(`Got ${types.length} types when expected ${cells}, one per area.`);
  for (const t of types) {
    if (t === OUTSIDE_TYPE) throw new UsageError(`Type "${t}" of a cell is the outside's when expected another label.`);
    if (!LABEL.test(t)) throw new UsageError(`Type "${t}" is not valid when expected a label of letters, digits and _ starting with a letter.`);
  }
  const labels = [OUTSIDE_TYPE, ...new Set(types)];
  const table = unitTable(labels);
  const m = labels.length;
  const set = new Set<string>();
  for (const { a, b, value } of settings) {
    const i = labels.indexOf(a);
    const j = labels.indexOf(b);
    for (const [label, k] of [[a, i], [b, j]] as const) {
      if (k < 0) throw new UsageError(`Tension type "${label}" is unknown when expected one of ${labels.join(', ')}.`);
    }
    if (!(value > 0) || !Number.isFinite(value)) {
      throw new UsageError(`Tension ${a}:${b} is ${value} when expected a positive finite number.`);
    }
    const key = `${Math.min(i, j)}:${Math.max(i, j)}`;
    if (set.has(key)) throw new UsageError(`Tension ${a}:${b} is given twice when expected once per pair of types.`);
    set.add(key);
    table.values[i * m + j] = value;
    table.values[j * m + i] = value;
  }
  return { table, types: types.map((t) => labels.indexOf(t)) };
}

/** The tensions of a typing that are not 1, as "a:b" -> value (each pair once, types in label order): how a catalogue's query records them. */
export function tensionPairs(typing: CellTyping): Record<string, number> {
  const { labels, values } = typing.table;
  const m = labels.length;
  const out: Record<string, number> = {};
  for (let i = 0; i < m; i++) {
    for (let j = i; j < m; j++) if (values[i * m + j] !== 1) out[`${labels[i]}:${labels[j]}`] = values[i * m + j];
  }
  return out;
}

/**
 * The typing a catalogue's query records: types by area and the tensions as tensionPairs writes them.
 * @throws UsageError as cellTyping does, or for a key that is not "type:type".
 */
export function typingOfPairs(types: readonly string[], pairs: Readonly<Record<string, number>>, cells: number): CellTyping {
  const settings = Object.entries(pairs).map(([key, value]) => {
    const [a, b, extra] = key.split(':');
    if (b === undefined || extra !== undefined) throw new UsageError(`Tension key "${key}" is not valid when expected type:type.`);
    return { a, b, value };
  });
  return cellTyping(types, settings, cells);
}
