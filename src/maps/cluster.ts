// maps stage: clusters (a map with a marked outside) in canonical form, and what a user reads of them.

import { CubicMap } from './cubic-map.ts';
import { canonicalCluster, labellingOrder } from './canonical.ts';
import { encodeCode, mapFromCode } from './code.ts';
import { type EnumerateOptions, enumerateMaps, isThreeConnected } from './enumerate.ts';
import { validateCluster } from './validate.ts';
import { MapError } from '../errors.ts';

/**
 * A cluster in canonical labelling: face 0 of `map` is the outside and faces 1..n are cells 1..n, so
 * cell numbers are canonical (up to the cluster's own symmetry).
 */
export interface Cluster {
  /** Number of cells n. */
  cells: number;
  /** Canonical code, e.g. "3:..4.8" (see code.ts). */
  code: string;
  /** The map in canonical labelling. */
  map: CubicMap;
  /** Order of the symmetry group of the cluster (automorphisms fixing the outside), reflections included. */
  symmetry: number;
  /** Whether a reflection is among the symmetries (false: the cluster is chiral). */
  reflective: boolean;
  /** Whether the underlying map is 3-connected. */
  threeConnected: boolean;
}

/** The canonical cluster of `map` with outside face `outer`. */
export function clusterOf(map: CubicMap, outer: number, threeConnected = isThreeConnected(map)): Cluster {
  const cells = map.faceCount - 1;
  if (map.twins.length === 0) {
    return { cells: 1, code: '1:', map, symmetry: 1, reflective: true, threeConnected: false };
  }
  const form = canonicalCluster(map, outer);
  return {
    cells,
    code: encodeCode(cells, form.code),
    map: new CubicMap(form.code, true),
    symmetry: form.order,
    reflective: form.reflective,
    threeConnected,
  };
}

/**
 * Read a cluster from its code (canonical or not) and put it in canonical form.
 * @throws MapError when the code is malformed or not an admissible cluster.
 */
export function clusterFromCode(code: string): Cluster {
  const { cells, map } = mapFromCode(code);
  try {
    validateCluster(map, cells);
  } catch (error) {
    if (error instanceof MapError) throw new MapError(`Arrangement code "${code}" is not admissible: ${error.message}`);
    throw error;
  }
  return clusterOf(map, map.faceOf.length > 0 ? map.faceOf[0] : 1);
}

/**
 * Every cluster of n cells up to homeomorphism of the plane (mirror images identified), in a
 * deterministic order: maps in enumeration order, then their faces up to symmetry by smallest dart.
 */
export function* enumerateClusters(cells: number, options: EnumerateOptions = {}): Generator<Cluster> {
  if (cells === 1) {
    if ((options.shard?.index ?? 0) === 0) yield clusterOf(new CubicMap(new Int32Array(0)), 1);
    return;
  }
  for (const item of enumerateMaps(cells, options)) {
    for (let f = 0; f < item.map.faceCount; f++) {
      if (item.orbitOf[f] !== f) continue;
      yield clusterOf(item.map, f, item.threeConnected);
    }
  }
}

/**
 * The symmetries of a cluster acting on its cells: each row maps cell i (1..n) to row[i - 1].
 * The identity comes first.
 */
export function cellPermutations(cluster: Cluster): Int32Array[] {
  const { map } = cluster;
  const n = cluster.cells;
  if (map.twins.length === 0) return [Int32Array.of(1)];
  const form = canonicalCluster(map, 0);
  const base = labellingOrder(map.twins, form.starts[0]);
  const rows: Int32Array[] = [];
  for (let k = 0; k < form.starts.length; k++) {
    const order = labellingOrder(map.twins, form.starts[k]);
    const flip = (form.starts[k] & 1) !== (form.starts[0] & 1);
    const row = new Int32Array(n);
    for (let j = 0; j < order.length; j++) {
      const from = map.faceOf[base[j]];
      const d = order[j];
      // a reflection swaps the sides of a dart: the face on its left becomes the one on its right
      row[from - 1] = flip ? map.faceOf[d % 3 === 0 ? d + 2 : d - 1] : map.faceOf[d];
    }
    rows.push(row);
  }
  return rows;
}
