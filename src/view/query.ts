// view stage: what the catalogue viewer shows: the view's settings, their URL fragment, and the
// filtered, sorted rows. Pure functions, shared by the page script and the tests.

import type { CatalogueEntry } from '../catalogue/types.ts';

/** What the page knows of an entry besides the catalogue's own fields (computed when the page is made). */
export interface EntryFacts {
  /** A short name unique in the catalogue: the id, with the assignment when the id repeats. */
  key: string;
  /** Whether some cell has two sides. */
  lens: boolean;
  /** Whether the arrangement's map is 3-connected. */
  threeConnected: boolean;
  /** Fewest and most sides of a cell. */
  minSides: number;
  maxSides: number;
  /**
   * The T1 neighbour: for a failure, the arrangement its collapsing wall's swap leads to; for an
   * equilibrium, the one the swap of its shortest wall leads to. Its code, or null when there is none.
   */
  t1: string | null;
  /** For an equilibrium, the wall (map.wallIndex numbering) that is shortest; otherwise null. */
  shortestWall: number | null;
}

/** One row of the viewer: an entry, its facts, and its position in the catalogue file. */
export interface ViewRow {
  entry: CatalogueEntry;
  facts: EntryFacts;
  position: number;
}

/** The keys the rows sort by. */
export const SORT_KEYS = ['perimeter', 'gap', 'sides', 'index'] as const;
export type SortKey = (typeof SORT_KEYS)[number];

/** Which statuses are shown: all, certified only, failures only, or one status by name. */
export type StatusFilter = 'all' | 'ok' | 'failures' | string;

/** Everything that decides what the viewer shows; the URL fragment holds it. */
export interface ViewState {
  sort: SortKey;
  descending: boolean;
  status: StatusFilter;
  stableOnly: boolean;
  /** 'any', or '3' (3-connected only), or 'not3'. */
  connectivity: 'any' | '3' | 'not3';
  /** 'any', 'with' (some 2-sided cell) or 'without'. */
  lens: 'any' | 'with' | 'without';
  /** Every cell has at least minSides and at most maxSides sides (null: no bound). */
  minSides: number | null;
  maxSides: number | null;
  /** Text looked for in the code and the id (case folded). */
  search: string;
  /** The key of the entry whose details are open. */
  selected: string | null;
  /** Keys of the entries picked for comparison (at most two). */
  compare: string[];
}

/** The view of a page opened without a fragment. */
export const DEFAULT_VIEW: Readonly<ViewState> = Object.freeze({
  sort: 'perimeter', descending: false, status: 'all', stableOnly: false, connectivity: 'any', lens: 'any',
  minSides: null, maxSides: null, search: '', selected: null, compare: [],
});

/** The fragment (without '#') that reproduces a view: only the settings that differ from the default. */
export function writeFragment(view: ViewState): string {
  const parts: string[] = [];
  const put = (name: string, value: string): void => {
    parts.push(`${name}=${encodeURIComponent(value)}`);
  };
  if (view.sort !== DEFAULT_VIEW.sort) put('sort', view.sort);
  if (view.descending) parts.push('desc');
  if (view.status !== DEFAULT_VIEW.status) put('status', view.status);
  if (view.stableOnly) parts.push('stable');
  if (view.connectivity !== 'any') put('conn', view.connectivity);
  if (view.lens !== 'any') put('lens', view.lens);
  if (view.minSides !== null || view.maxSides !== null) put('sides', `${view.minSides ?? ''}-${view.maxSides ?? ''}`);
  if (view.search !== '') put('q', view.search);
  if (view.selected !== null) put('sel', view.selected);
  if (view.compare.length > 0) put('cmp', view.compare.join(','));
  return parts.join('&');
}

function bound(text: string): number | null {
  if (!/^[0-9]+$/.test(text)) return null;
  return Number(text);
}

/**
 * The view a fragment (with or without '#') describes. Settings it does not name, or names with a value
 * that is not one of theirs, keep their default: a hand-edited link still opens a page.
 */
export function readFragment(fragment: string): ViewState {
  const view: ViewState = { ...DEFAULT_VIEW, compare: [] };
  const text = fragment.startsWith('#') ? fragment.slice(1) : fragment;
  for (const part of text.split('&')) {
    if (part === '') continue;
    const eq = part.indexOf('=');
    const name = eq === -1 ? part : part.slice(0, eq);
    let value = '';
    try {
      value = eq === -1 ? '' : decodeURIComponent(part.slice(eq + 1));
    } catch {
      continue; // a broken escape: the setting keeps its default
    }
    switch (name) {
      case 'sort':
        if ((SORT_KEYS as readonly string[]).includes(value)) view.sort = value as SortKey;
        break;
      case 'desc':
        view.descending = true;
        break;
      case 'status':
        if (value !== '') view.status = value;
        break;
      case 'stable':
        view.stableOnly = true;
        break;
      case 'conn':
        if (value === '3' || value === 'not3') view.connectivity = value;
        break;
      case 'lens':
        if (value === 'with' || value === 'without') view.lens = value;
        break;
      case 'sides': {
        const [lo, hi] = value.split('-');
        view.minSides = bound(lo ?? '');
        view.maxSides = bound(hi ?? '');
        break;
      }
      case 'q':
        view.search = value;
        break;
      case 'sel':
        view.selected = value === '' ? null : value;
        break;
      case 'cmp':
        view.compare = value.split(',').filter((k) => k !== '').slice(0, 2);
        break;
    }
  }
  return view;
}

/** Whether a row passes the view's filters. */
export function passesView(row: ViewRow, view: ViewState): boolean {
  const { entry, facts } = row;
  const ok = entry.status === 'ok';
  if (view.status === 'ok' && !ok) return false;
  if (view.status === 'failures' && ok) return false;
  if (view.status !== 'all' && view.status !== 'ok' && view.status !== 'failures' && entry.status !== view.status) return false;
  if (view.stableOnly && entry.index !== 0) return false;
  if (view.connectivity === '3' && !facts.threeConnected) return false;
  if (view.connectivity === 'not3' && facts.threeConnected) return false;
  if (view.lens === 'with' && !facts.lens) return false;
  if (view.lens === 'without' && facts.lens) return false;
  if (view.minSides !== null && facts.minSides < view.minSides) return false;
  if (view.maxSides !== null && facts.maxSides > view.maxSides) return false;
  if (view.search !== '') {
    const q = view.search.toLowerCase();
    if (!entry.code.toLowerCase().includes(q) && !entry.id.toLowerCase().includes(q) && !facts.key.toLowerCase().includes(q)) return false;
  }
  return true;
}

/** Compare two side lists already sorted largest first: [6, 5, 5] comes after [6, 5, 4]. */
function compareSides(x: readonly number[], y: readonly number[]): number {
  for (let i = 0; i < Math.min(x.length, y.length); i++) if (x[i] !== y[i]) return x[i] - y[i];
  return x.length - y.length;
}

/** Compare two numbers that may be missing: missing ones last whatever the direction. */
function compareMissingLast(a: number | null, b: number | null, sign: number): number {
  if (a === null || b === null) return (a === null ? 1 : 0) - (b === null ? 1 : 0);
  return sign * (a - b);
}

/**
 * The rows a view shows, in its order. Perimeter and gap sort by their value; sides by the side counts,
 * largest first; index by the stability index, then the perimeter. Rows without the value (failures)
 * come last in either direction; ties keep the catalogue's order.
 */
export function viewRows(rows: readonly ViewRow[], view: ViewState): ViewRow[] {
  const sign = view.descending ? -1 : 1;
  const kept = rows.filter((row) => passesView(row, view));
  // side lists sorted largest first, once per row rather than once per comparison
  const sides = new Map<ViewRow, number[]>();
  if (view.sort === 'sides') for (const row of kept) sides.set(row, [...row.entry.sides].sort((p, q) => q - p));
  const order = (a: ViewRow, b: ViewRow): number => {
    const x = a.entry;
    const y = b.entry;
    let c = 0;
    // (in a catalogue of typed cells the ranking's energy: entries carry it beside the perimeter)
    if (view.sort === 'perimeter') c = compareMissingLast(x.energy === undefined ? x.perimeter : x.energy, y.energy === undefined ? y.perimeter : y.energy, sign);
    else if (view.sort === 'gap') c = compareMissingLast(x.gapPercent, y.gapPercent, sign);
    else if (view.sort === 'sides') c = sign * compareSides(sides.get(a)!, sides.get(b)!);
    else c = compareMissingLast(x.index, y.index, sign) || compareMissingLast(x.perimeter, y.perimeter, sign);
    return c || a.position - b.position;
  };
  return kept.sort(order);
}
