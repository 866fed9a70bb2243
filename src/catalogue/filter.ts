// catalogue stage: filters on arrangements, shared by list and rank.

import { type ClusterSummary } from '../maps/describe.ts';
import { UsageError } from '../errors.ts';

/** Which arrangements to keep. Every field is optional; an empty filter keeps everything. */
export interface ArrangementFilter {
  /** Keep only arrangements whose map is 3-connected. */
  threeConnected?: boolean;
  /** false: leave out arrangements with a 2-sided cell. @default true */
  lens?: boolean;
  /** Keep only arrangements whose cells have at most this many sides. */
  maxSides?: number;
  /** Keep only arrangements whose cells have at least this many sides. */
  minSides?: number;
}

/** Whether a summary passes the filter. */
export function passesFilter(s: ClusterSummary, f: ArrangementFilter): boolean {
  if (f.threeConnected === true && !s.threeConnected) return false;
  if (f.lens === false && s.lenses > 0) return false;
  if (f.maxSides !== undefined && s.sides.some((k) => k > f.maxSides!)) return false;
  if (f.minSides !== undefined && s.sides.some((k) => k < f.minSides!)) return false;
  return true;
}

/** Whether the filter removes anything at all. */
export function isFiltering(f: ArrangementFilter): boolean {
  return f.threeConnected === true || f.lens === false || f.maxSides !== undefined || f.minSides !== undefined;
}

/**
 * Check that a filter can keep anything: side bounds are whole numbers of at least 1 and --min-sides
 * is not above --max-sides. @throws UsageError naming both bounds.
 */
export function checkFilter(f: ArrangementFilter): void {
  for (const [key, option] of [['maxSides', '--max-sides'], ['minSides', '--min-sides']] as const) {
    const v = f[key];
    if (v !== undefined && !(Number.isSafeInteger(v) && v >= 1)) {
      throw new UsageError(`${option} is ${v} when expected a whole number of at least 1.`);
    }
  }
  if (f.minSides !== undefined && f.maxSides !== undefined && f.minSides > f.maxSides) {
    throw new UsageError(
      `--min-sides ${f.minSides} is above --max-sides ${f.maxSides} when expected at most ${f.maxSides} (no arrangement could pass).`,
    );
  }
}
