// maps stage: how many arrangements n cells have, and how long listing them takes, before doing it.

import { rootedMapCount } from './count.ts';

/** Clusters enumerated per second on one core of the reference machine (n = 10 listing, measured). */
const CLUSTERS_PER_SECOND = 2.0e5;

/**
 * Estimated number of clusters of n cells, (n + 1) a(n - 1) / 4E (most clusters have no symmetry),
 * and the seconds it takes to list them. The count is a lower bound: a cluster with automorphism
 * group G contributes 4E/|G| <= 4E rootings to (n + 1) a(n - 1) (count.ts).
 */
export function estimateClusterCount(cells: number): { clusters: number; seconds: number } {
  if (cells < 2) return { clusters: 1, seconds: 0 };
  const E = 3 * (cells - 1);
  const clusters = (Number(rootedMapCount(cells - 1)) * (cells + 1)) / (4 * E);
  return { clusters, seconds: clusters / CLUSTERS_PER_SECOND };
}

/** Counts above this are said in words rather than as a number of three significant digits. */
export const COUNT_IN_WORDS_ABOVE = 1e15;

/** Durations above this many seconds (a hundred years) are said in words. */
export const DURATION_IN_WORDS_ABOVE = 100 * 365.25 * 86400;

/** An estimated count for a message: "about 1.33e+6", or "more than 10^15" beyond COUNT_IN_WORDS_ABOVE. */
export function countText(count: number): string {
  if (!(count <= COUNT_IN_WORDS_ABOVE)) return 'more than 10^15';
  return `about ${count < 1000 ? String(Math.round(count)) : count.toPrecision(3)}`;
}

/**
 * An estimated duration for a message: "about 40 seconds", "about 3 minutes", "about 5 hours",
 * "about 12 days", "about 7 years", or "more than a hundred years" beyond DURATION_IN_WORDS_ABOVE.
 */
export function durationText(seconds: number): string {
  const year = 365.25 * 86400;
  if (!(seconds <= DURATION_IN_WORDS_ABOVE)) return 'more than a hundred years';
  if (seconds < 90) return `about ${Math.max(1, Math.round(seconds))} seconds`;
  if (seconds < 5400) return `about ${Math.round(seconds / 60)} minutes`;
  if (seconds < 172800) return `about ${Math.round(seconds / 3600)} hours`;
  if (seconds < 3 * year) return `about ${Math.round(seconds / 86400)} days`;
  return `about ${Math.round(seconds / year)} years`;
}
