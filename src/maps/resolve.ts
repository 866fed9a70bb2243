// maps stage: turn what a user typed (an id such as "4.2" or a code such as "3:...b7a") into a cluster.

import { type Cluster, clusterFromCode, enumerateClusters } from './cluster.ts';
import { MapError } from '../errors.ts';

/** Largest cell count whose ids are resolved by enumeration. */
export const ID_LIMIT = 10;

/**
 * Resolve an arrangement id ("n.k": the k-th arrangement `lather list n` prints) or a code.
 * @throws MapError when the id does not exist or the code is malformed or not admissible.
 */
export function resolveArrangement(text: string): Cluster {
  const id = /^([0-9]+)\.([0-9]+)$/.exec(text.trim());
  if (id === null) return clusterFromCode(text);
  const n = Number(id[1]);
  const k = Number(id[2]);
  if (n < 1 || n > ID_LIMIT) {
    throw new MapError(`Arrangement id "${text}" has ${n} cells when expected 1 to ${ID_LIMIT} (use a code beyond that).`);
  }
  let i = 0;
  for (const cluster of enumerateClusters(n)) {
    if (++i === k) return cluster;
  }
  throw new MapError(`Arrangement id "${text}" does not exist when expected ${n}.1 to ${n}.${i}.`);
}

/** The id ("n.k") of every arrangement of n cells, keyed by code. */
export function arrangementIds(n: number): Map<string, string> {
  const ids = new Map<string, string>();
  let k = 0;
  for (const cluster of enumerateClusters(n)) ids.set(cluster.code, `${n}.${++k}`);
  return ids;
}
