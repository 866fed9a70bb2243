// maps stage: what a user reads of a cluster: side counts, contacts with the outside, lenses.

import { type Cluster } from './cluster.ts';

/** A readable summary of one arrangement. Cells are numbered 1..n; 0 is the outside. */
export interface ClusterSummary {
  /** Canonical code. */
  code: string;
  /** Number of cells. */
  cells: number;
  /** sides[i] is the side count (walls) of cell i + 1. */
  sides: number[];
  /** Side count of the outside (walls on the cluster's boundary). */
  outsideSides: number;
  /** Cells that share a wall with the outside, ascending. */
  touchingOutside: number[];
  /** Order of the symmetry group (automorphisms fixing the outside), reflections included. */
  symmetry: number;
  /** True when no reflection is a symmetry: the mirror image is a different drawing of it. */
  chiral: boolean;
  /** Whether the underlying map is 3-connected. */
  threeConnected: boolean;
  /** Number of 2-sided cells (lenses). */
  lenses: number;
  /** One entry per wall: the two regions it separates, smaller first (repeated contacts kept). */
  contacts: [number, number][];
}

/** Summarise a cluster. The circle has one wall between cell 1 and the outside. */
export function summarizeCluster(cluster: Cluster): ClusterSummary {
  const { map, cells } = cluster;
  if (cells === 1) {
    return {
      code: cluster.code, cells, sides: [1], outsideSides: 1, touchingOutside: [1], symmetry: 1,
      chiral: false, threeConnected: false, lenses: 0, contacts: [[0, 1]],
    };
  }
  const sides: number[] = [];
  for (let f = 1; f <= cells; f++) sides.push(map.faceSize(f));
  const contacts: [number, number][] = [];
  const touching = new Set<number>();
  const { twins, faceOf } = map;
  for (let e = 0; e < twins.length; e++) {
    const t = twins[e];
    if (e > t) continue;
    const a = Math.min(faceOf[e], faceOf[t]);
    const b = Math.max(faceOf[e], faceOf[t]);
    contacts.push([a, b]);
    if (a === 0) touching.add(b);
  }
  contacts.sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  return {
    code: cluster.code,
    cells,
    sides,
    outsideSides: map.faceSize(0),
    touchingOutside: [...touching].sort((p, q) => p - q),
    symmetry: cluster.symmetry,
    chiral: !cluster.reflective,
    threeConnected: cluster.threeConnected,
    lenses: sides.filter((s) => s === 2).length,
    contacts,
  };
}
