// cli stage: option parsers; each throws commander's InvalidArgumentError naming the bad value.

import { InvalidArgumentError } from 'commander';

/** The largest cell count `list` enumerates without --large. */
export const LIST_LIMIT = 10;

/** A whole number of cells, at least 1. */
export function parseCells(text: string): number {
  if (!/^[0-9]+$/.test(text.trim()) || Number(text) < 1) {
    throw new InvalidArgumentError(`Cell count "${text}" is not valid when expected a whole number of at least 1.`);
  }
  return Number(text);
}

/** A whole number of at least `min`, for options such as --max-sides. */
export function wholeNumber(min: number): (text: string) => number {
  return (text) => {
    if (!/^[0-9]+$/.test(text.trim()) || Number(text) < min) {
      throw new InvalidArgumentError(`Value "${text}" is not valid when expected a whole number of at least ${min}.`);
    }
    return Number(text);
  };
}

/** A shard "i/k" with 1 <= i <= k (one-based on the command line), returned zero-based. */
export function parseShard(text: string): { index: number; count: number } {
  const match = /^([0-9]+)\/([0-9]+)$/.exec(text.trim());
  const i = match ? Number(match[1]) : NaN;
  const k = match ? Number(match[2]) : NaN;
  if (!(i >= 1 && k >= 1 && i <= k)) {
    throw new InvalidArgumentError(`Shard "${text}" is not valid when expected i/k with 1 <= i <= k, e.g. 2/4.`);
  }
  return { index: i - 1, count: k };
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
