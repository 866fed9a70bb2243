// maps stage: the T1 neighbour swap of one wall, the move a cluster makes when that wall shrinks to zero.
//
// Wall d = (u, v). Around u (counter-clockwise) the other walls are a = next(d), b = prev(d); around v
// they are c = next(d'), e = prev(d'), d' the twin of d. Shrinking d merges u and v into one point with
// walls a, b, c, e in counter-clockwise order; the swap splits it the other way, {b, c} | {e, a}:
//
//        a     e                 a       e
//         \   /                   \     /
//          u-v        --T1-->       v'
//         /   \                     |
//        b     c                    u'
//                                  / \
//                                 b   c
//
// The faces at the two ends of d become neighbours; the two faces beside d each lose a side.

import { CubicMap, next, prev } from './cubic-map.ts';
import { type Cluster, clusterOf } from './cluster.ts';
import { validateCluster } from './validate.ts';
import { MapError } from '../errors.ts';

/**
 * The map after the T1 swap of the wall of dart `d`, in the same dart numbering (d and its twin are the
 * new wall; each other dart keeps its wall-half, moved to its new junction), and the new dart of each
 * old dart. Not checked for admissibility.
 */
export function t1SwapMap(map: CubicMap, d: number): { map: CubicMap; slot: Int32Array } {
  const m = map.twins.length;
  const old = map.twins;
  const dt = old[d];
  // new slot of each role: u keeps d as the new wall, then b, c; v keeps d' as the new wall, then e, a
  const slot = new Int32Array(m);
  for (let x = 0; x < m; x++) slot[x] = x;
  const a = next(d);
  const b = prev(d);
  const c = next(dt);
  const e = prev(dt);
  slot[b] = next(d);
  slot[c] = prev(d);
  slot[e] = next(dt);
  slot[a] = prev(dt);
  const twins = new Int32Array(m);
  for (let x = 0; x < m; x++) twins[slot[x]] = slot[old[x]];
  return { map: new CubicMap(twins), slot };
}

/**
 * The cluster reached by the T1 swap of the wall of dart `d` (outside kept), in canonical form, or null
 * when the swap leaves no admissible cluster (a loop or a bridge appears, as when d bounds a lens).
 */
export function t1Swap(cluster: Cluster, d: number): Cluster | null {
  const { map } = cluster;
  const m = map.twins.length;
  if (m === 0 || d < 0 || d >= m) return null;
  const dt = map.twins[d];
  const { map: swapped, slot } = t1SwapMap(map, d);
  try {
    validateCluster(swapped, cluster.cells);
  } catch (error) {
    if (error instanceof MapError) return null;
    throw error;
  }
  // the outside: follow a dart of it that is not on the swapped wall
  let x = map.faceDarts[map.faceStarts[0]];
  if (x === d || x === dt) x = map.faceDarts[map.faceStarts[0] + 1];
  return clusterOf(swapped, swapped.faceOf[slot[x]]);
}

/** Dart of wall k in map.wallIndex() numbering: the k-th dart e (ascending) with e < twins[e]. */
export function lowerDartOfWall(twins: Int32Array, k: number): number {
  let seen = 0;
  for (let e = 0; e < twins.length; e++) {
    if (e < twins[e]) {
      if (seen === k) return e;
      seen++;
    }
  }
  return -1;
}

/**
 * The code of the arrangement the T1 swap of wall k (map.wallIndex() numbering) leads to, or null when
 * the cluster has no walls or the swap leaves no admissible cluster.
 */
export function wallSwapCode(cluster: Cluster, k: number): string | null {
  const dart = lowerDartOfWall(cluster.map.twins, k);
  return dart < 0 ? null : (t1Swap(cluster, dart)?.code ?? null);
}
