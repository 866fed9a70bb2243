// solver stage: the topology of a cluster as flat arrays, shared by every pass of the relaxer.
//
// The state z of a relaxation is one Float64Array of length size = 2V + E + n, in this order:
//   z[2v], z[2v + 1]   junction v's coordinates,
//   z[2V + k]          wall k's bulge coordinate (arcs/arc.ts: the bulge t itself, or for a wall near a
//                      full circle its gap to one held to full precision; positive bulges into the face
//                      LEFT of wall k's lower dart, the face map.faceOf[e] of the dart e < twins[e]),
//   z[2V + E + f - 1]  cell f's pressure (the outside, face 0, has pressure 0 and no unknown).

import type { CubicMap } from '../maps/cubic-map.ts';

/** The topology of a cluster as flat arrays, shared by the residual, the Jacobian and the solver. */
export interface ClusterProblem {
  /** Number of cells n. */
  cells: number;
  /** Number of junctions V. */
  junctions: number;
  /** Number of walls E. */
  walls: number;
  /** starts[k]: junction wall k's lower dart leaves. */
  starts: Int32Array;
  /** ends[k]: junction wall k's lower dart points to. */
  ends: Int32Array;
  /** lefts[k]: cell index (face - 1) on the left of wall k's lower dart, -1 for the outside. */
  lefts: Int32Array;
  /** rights[k]: cell index on the right of wall k's lower dart, -1 for the outside. */
  rights: Int32Array;
  /** wallOf[e]: the wall of dart e (map.wallIndex()). */
  wallOf: Int32Array;
  /** twins of the map, for walks around junctions. */
  twins: Int32Array;
  /** Number of unknowns 2V + E + n. */
  size: number;
  /** Order of the bordered Jacobian, size + 3. */
  order: number;
  /** Unknowns of cell f (its junctions' coordinates and its walls' bulges) are cellVars[cellVarStarts[f] .. cellVarStarts[f + 1]). */
  cellVarStarts: Int32Array;
  /** Unknown indices per cell, see cellVarStarts (3 per side: a 2-connected cell meets each junction once). */
  cellVars: Int32Array;
  /**
   * Tension of each wall (its weight in the energy sum s_k L_k), or null when every wall has tension 1
   * (the soap-film case: energy = perimeter, and no pass multiplies by anything).
   */
  tensions: Float64Array | null;
}

const PROBLEMS = new WeakMap<CubicMap, ClusterProblem>();

/** The flat topology of `map` (cached per map object). */
export function problemOf(map: CubicMap): ClusterProblem {
  const cached = PROBLEMS.get(map);
  if (cached) return cached;
  const { twins, faceOf } = map;
  const junctions = map.junctionCount;
  const walls = twins.length / 2;
  const cells = map.faceCount - 1;
  const starts = new Int32Array(walls);
  const ends = new Int32Array(walls);
  const lefts = new Int32Array(walls);
  const rights = new Int32Array(walls);
  let k = 0;
  for (let e = 0; e < twins.length; e++) {
    const t = twins[e];
    if (e > t) continue;
    starts[k] = (e / 3) | 0;
    ends[k] = (t / 3) | 0;
    lefts[k] = faceOf[e] - 1;
    rights[k] = faceOf[t] - 1;
    k++;
  }
  const size = 2 * junctions + walls + cells;
  const wallOf = map.wallIndex();
  // each dart of a cell's walk contributes its junction (2 unknowns) and its wall's bulge
  const { faceStarts, faceDarts } = map;
  const cellVarStarts = new Int32Array(cells + 1);
  const cellVars = new Int32Array(3 * (faceStarts[cells + 1] - faceStarts[1]));
  let m = 0;
  for (let f = 1; f <= cells; f++) {
    cellVarStarts[f - 1] = m;
    for (let i = faceStarts[f]; i < faceStarts[f + 1]; i++) {
      const e = faceDarts[i];
      const v = (e / 3) | 0;
      cellVars[m++] = 2 * v;
      cellVars[m++] = 2 * v + 1;
      cellVars[m++] = 2 * junctions + wallOf[e];
    }
  }
  cellVarStarts[cells] = m;
  const problem = {
    cells, junctions, walls, starts, ends, lefts, rights, wallOf, twins, size, order: size + 3, cellVarStarts, cellVars,
    tensions: null,
  };
  PROBLEMS.set(map, problem);
  return problem;
}

/**
 * `problem` with wall tensions `tensions` (one per wall, by map.wallIndex()): the same object when
 * tensions is null or every entry is 1 (so unit tension costs nothing), otherwise a copy sharing the
 * topology arrays. Entries are taken as they are (checked by resolveOptions).
 */
export function withTensions(problem: ClusterProblem, tensions: Float64Array | null): ClusterProblem {
  if (tensions === null) return problem;
  let unit = true;
  for (let k = 0; k < problem.walls; k++) if (tensions[k] !== 1) unit = false;
  return unit ? problem : { ...problem, tensions };
}

/** The mean of the junctions' x (axis 0) or y (axis 1) coordinates in state z: their centroid. */
export function junctionMean(z: Float64Array, junctions: number, axis: 0 | 1): number {
  let sum = 0;
  for (let v = 0; v < junctions; v++) sum += z[2 * v + axis];
  return sum / junctions;
}
