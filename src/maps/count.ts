// maps stage: counts of arrangements and the rooting identities that certify the enumeration.
//
// OEIS A000309 counts rooted bridgeless cubic planar maps with 2m junctions:
//   a(m) = 2^(m+1) (3m)! / (m! (2m+2)!).
// Every map M with E walls has 4E flags (a dart and a side), and Aut(M) acts freely on them, so the sum
// over maps up to isomorphism of 4E/|Aut(M)| is a(m). Marking a face as the outside: the sum over
// clusters of 4E/|Aut(M, f)| is (F) a(m) = (n + 1) a(n - 1). A mismatch of one means a missing or
// duplicated map.

import { UsageError } from '../errors.ts';
import { type EnumerateOptions, enumerateMaps } from './enumerate.ts';

/** OEIS A000309: rooted bridgeless cubic planar maps with 2m vertices (exact, as a bigint). */
export function rootedMapCount(m: number): bigint {
  let r = 1n << BigInt(m + 1);
  for (let i = 1n; i <= BigInt(3 * m); i++) r *= i;
  let d = 1n;
  for (let i = 1n; i <= BigInt(m); i++) d *= i;
  for (let i = 1n; i <= BigInt(2 * m + 2); i++) d *= i;
  return r / d;
}

/** Counts of one enumeration and its identity sums. */
export interface ArrangementCounts {
  cells: number;
  /** Maps up to isomorphism (mirror images identified). */
  maps: number;
  /** Maps counted with mirror images apart. */
  mapsChiral: number;
  /** Clusters up to homeomorphism (mirror images identified). */
  clusters: number;
  /** Clusters with mirror images apart. */
  clustersChiral: number;
  threeConnectedMaps: number;
  threeConnectedMapsChiral: number;
  threeConnectedClusters: number;
  threeConnectedClustersChiral: number;
  /** 3-connected clusters by the number of cells touching the outside (index = that number). */
  threeConnectedByOutside: number[];
  /** Sum over maps of 4E/|Aut(M)|; equals a(n - 1) when complete. */
  mapRootings: bigint;
  /** Sum over maps up to orientation-preserving isomorphism of 2E/|Aut+(M)|; equals a(n - 1). */
  orientedRootings: bigint;
  /** Sum over clusters of 4E/|Aut(M, f)|; equals (n + 1) a(n - 1) when complete. */
  clusterRootings: bigint;
}

/**
 * Count the arrangements of n >= 2 cells (or one shard of them) without building cluster codes.
 * @throws UsageError when cells is not a whole number >= 1.
 */
export function countArrangements(cells: number, options: EnumerateOptions = {}): ArrangementCounts {
  const counts: ArrangementCounts = {
    cells, maps: 0, mapsChiral: 0, clusters: 0, clustersChiral: 0, threeConnectedMaps: 0,
    threeConnectedMapsChiral: 0, threeConnectedClusters: 0, threeConnectedClustersChiral: 0,
    threeConnectedByOutside: new Array(cells + 1).fill(0), mapRootings: 0n, orientedRootings: 0n, clusterRootings: 0n,
  };
  const E = 3 * (cells - 1);
  for (const item of enumerateMaps(cells, options)) {
    const mirrorCopies = item.reflective ? 1 : 2;
    counts.maps++;
    counts.mapsChiral += mirrorCopies;
    counts.mapRootings += BigInt((4 * E) / item.order);
    const orientedOrder = item.reflective ? item.order / 2 : item.order;
    counts.orientedRootings += BigInt(mirrorCopies * ((2 * E) / orientedOrder));
    if (item.threeConnected) {
      counts.threeConnectedMaps++;
      counts.threeConnectedMapsChiral += mirrorCopies;
    }
    const F = item.map.faceCount;
    for (let f = 0; f < F; f++) {
      if (item.orbitOf[f] !== f) continue;
      const copies = item.stabiliserReflective[f] === 1 ? 1 : 2;
      counts.clusters++;
      counts.clustersChiral += copies;
      counts.clusterRootings += BigInt((4 * E) / item.stabiliser[f]);
      if (item.threeConnected) {
        counts.threeConnectedClusters++;
        counts.threeConnectedClustersChiral += copies;
        // in a 3-connected map each cell meets the outside at most once
        counts.threeConnectedByOutside[item.map.faceSize(f)]++;
      }
    }
  }
  return counts;
}
