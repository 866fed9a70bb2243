// maps stage: how many arrangements n cells have, and how long listing them takes, before doing it.

import { rootedMapCount } from './count.ts';

/** Clusters enumerated per second on one core of the reference machine (n = 10 listing, measured). */
const CLUSTERS_PER_SECOND = 2.0e5;

/**
 * Estimated number of clusters of n cells, (n + 1) a(n - 1) / 4E (most clusters have no symmetry),
 * and the seconds it takes to list them.
 */
export function estimateClusterCount(cells: number): { clusters: number; seconds: number } {
  if (cells < 2) return { clusters: 1, seconds: 0 };
  const E = 3 * (cells - 1);
  const clusters = (Number(rootedMapCount(cells - 1)) * (cells + 1)) / (4 * E);
  return { clusters, seconds: clusters / CLUSTERS_PER_SECOND };
}
