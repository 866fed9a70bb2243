// maps stage: turn what a user typed (an id such as "4.2" or a code such as "3:...b7a") into a cluster.

import { type Cluster, clusterFromCode, enumerateClusters } from './cluster.ts';
import { MapError } from '../errors.ts';

/** Largest cell count whose ids are resolved by enumeration. */
export const ID_LIMIT = 10;

/**
 * ARRANGEMENT_COUNTS[n] is the number of arrangements of n cells (mirror images identified) for
 * 1 <= n <= ID_LIMIT: the ids n.1 to n.count. Counted by `lather list n --count`, whose rooting sums
 * match (n + 1) A000309(n - 1) (count.ts); tests/maps/resolve.test.ts re-counts the small ones.
 */
export const ARRANGEMENT_COUNTS: readonly number[] = [0, 1, 1, 3, 10, 45, 263, 1848, 15069, 136478, 1325933];

/**
 * Resolve an arrangement id ("n.k": the k-th arrangement `lather list n` prints) or a code. An id is
 * checked against the count of its cell count before anything is enumerated.
 * @throws MapError when the id does not exist or is written with leading zeros, or the code is
 *   malformed or not admissible.
 */
export function resolveArrangement(text: string): Cluster {
  const id = /^([0-9]+)\.([0-9]+)$/.exec(text.trim());
  if (id === null) return clusterFromCode(text);
  if (/^0[0-9]/.test(id[1]) || /^0[0-9]/.test(id[2])) {
    throw new MapError(`Arrangement id "${text}" has a leading zero when expected n.k written without them, e.g. 4.9.`);
  }
  const n = Number(id[1]);
  const k = Number(id[2]);
  if (n < 1 || n > ID_LIMIT) {
    throw new MapError(`Arrangement id "${text}" has ${id[1]} cells when expected 1 to ${ID_LIMIT} (use a code beyond that).`);
  }
  const count = ARRANGEMENT_COUNTS[n];
  if (k < 1 || k > count) {
    throw new MapError(`Arrangement id "${text}" does not exist when expected ${n}.1 to ${n}.${count}.`);
  }
  let i = 0;
  for (const cluster of enumerateClusters(n)) {
    if (++i === k) return cluster;
  }
  throw new Error(`lather: the enumeration of ${n} cells ended at ${i} when ARRANGEMENT_COUNTS says ${count}`);
}

/** The id ("n.k") of every arrangement of n cells, keyed by code. */
export function arrangementIds(n: number): Map<string, string> {
  const ids = new Map<string, string>();
  let k = 0;
  for (const cluster of enumerateClusters(n)) ids.set(cluster.code, `${n}.${++k}`);
  return ids;
}
