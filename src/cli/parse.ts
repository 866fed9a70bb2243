// cli stage: option parsers; each throws commander's InvalidArgumentError naming the bad value.

import { InvalidArgumentError } from 'commander';
import { CODE_CELL_LIMIT } from '../maps/code.ts';
import { SHARD_LIMIT } from '../maps/enumerate.ts';
import { type ArrangementFilter, checkFilter } from '../catalogue/filter.ts';

/** The largest cell count `list` enumerates without --large. */
export const LIST_LIMIT = 10;

const WHOLE = /^[0-9]+$/;

/** A whole number of cells, 1 to CODE_CELL_LIMIT (the most an arrangement code holds). */
export function parseCells(text: string): number {
  const t = text.trim();
  if (!WHOLE.test(t) || Number(t) < 1) {
    throw new InvalidArgumentError(`Cell count "${text}" is not valid when expected a whole number of at least 1.`);
  }
  if (Number(t) > CODE_CELL_LIMIT) {
    throw new InvalidArgumentError(`Cell count ${t} is above ${CODE_CELL_LIMIT} when expected at most ${CODE_CELL_LIMIT} (the most cells an arrangement code holds).`);
  }
  return Number(t);
}

/**
 * A whole number from `min` to `max`, for options such as --max-sides; `what` names the quantity in
 * messages (e.g. "Workers").
 */
export function wholeNumber(min: number, max = Number.MAX_SAFE_INTEGER, what = 'Value'): (text: string) => number {
  return (text) => {
    const t = text.trim();
    if (!WHOLE.test(t) || Number(t) < min) {
      throw new InvalidArgumentError(`${what} "${text}" is not valid when expected a whole number of at least ${min}.`);
    }
    if (Number(t) > max) {
      const most = max === Number.MAX_SAFE_INTEGER ? '2^53 - 1' : String(max);
      throw new InvalidArgumentError(`${what} ${t} is above ${most} when expected at most ${most}.`);
    }
    return Number(t);
  };
}

/** A shard "i/k" with 1 <= i <= k <= SHARD_LIMIT (one-based on the command line), returned zero-based. */
export function parseShard(text: string): { index: number; count: number } {
  const match = /^([0-9]+)\/([0-9]+)$/.exec(text.trim());
  const i = match ? Number(match[1]) : NaN;
  const k = match ? Number(match[2]) : NaN;
  if (!(i >= 1 && k >= 1 && i <= k)) {
    throw new InvalidArgumentError(`Shard "${text}" is not valid when expected i/k with 1 <= i <= k, e.g. 2/4.`);
  }
  if (k > SHARD_LIMIT) {
    throw new InvalidArgumentError(`Shard "${text}" has ${match![2]} parts when expected at most ${SHARD_LIMIT} (i/k with 1 <= i <= k <= ${SHARD_LIMIT}).`);
  }
  return { index: i - 1, count: k };
}

/** A number of seconds >= 0 written in decimal, e.g. 60, 2.5 or 1e3 (no hexadecimal, no Infinity). */
export function parseSeconds(what: string): (text: string) => number {
  return (text) => {
    const t = text.trim();
    const v = /^[+]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][-+]?[0-9]+)?$/.test(t) ? Number(t) : NaN;
    if (!Number.isFinite(v)) {
      throw new InvalidArgumentError(`${what} "${text}" is not valid when expected a decimal number of seconds >= 0, e.g. 60 or 2.5.`);
    }
    return v;
  };
}

/** One of a fixed set of words. */
export function oneOf<T extends string>(words: readonly T[], what: string): (text: string) => T {
  return (text) => {
    if (!(words as readonly string[]).includes(text)) {
      throw new InvalidArgumentError(`${what} "${text}" is not valid when expected one of ${words.join(', ')}.`);
    }
    return text as T;
  };
}

/** The arrangement filter of --three-connected, --no-lens, --max-sides and --min-sides. @throws UsageError. */
export function filterFromOptions(opts: { threeConnected?: boolean; lens?: boolean; maxSides?: number; minSides?: number }): ArrangementFilter {
  const filter: ArrangementFilter = {};
  if (opts.threeConnected) filter.threeConnected = true;
  if (opts.lens === false) filter.lens = false;
  if (opts.maxSides !== undefined) filter.maxSides = opts.maxSides;
  if (opts.minSides !== undefined) filter.minSides = opts.minSides;
  checkFilter(filter);
  return filter;
}
