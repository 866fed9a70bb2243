// solver stage: the working arrays of the relaxer, allocated once per problem size and reused.

import { type KktWorkspace, kktWorkspace } from './kkt.ts';
import { WALL_STRIDE } from './wall-terms.ts';
import type { ClusterProblem } from './problem.ts';

/**
 * Every buffer one relaxation needs. Sizes: `size` = 2V + E + n state entries (coordinates, bulges,
 * pressures; problem.ts), `dim` = 2V + E geometry unknowns. The contents are scratch between calls.
 */
export interface Workspace {
  /** Current state, length size. */
  z: Float64Array;
  /** Trial state of a step, length size. */
  trial: Float64Array;
  /** The start of a relaxation, kept for a second attempt, length size. */
  saved: Float64Array;
  /** Normalised target areas (mean 1), length n. */
  targets: Float64Array;
  /** Cell areas at z, length n. */
  areas: Float64Array;
  /** Cell areas at the trial state, length n. */
  trialAreas: Float64Array;
  /** Multipliers of the merit, length n. */
  mult: Float64Array;
  /** Pressure estimates at z, length n. */
  mu: Float64Array;
  /** Pressures in the step's Hessian (mu within its bound), length n. */
  hessianPressures: Float64Array;
  /** Pressures of a step, length n. */
  lambda: Float64Array;
  /** Area gradients of the cells, n * dim. */
  cellGrad: Float64Array;
  /** Normal equations of the pressure fit, n^2. */
  normal: Float64Array;
  /** Scratch of length n (pivots and a row of the pressure fit). */
  pivots: Float64Array;
  /** Scratch of length n. */
  row: Float64Array;
  /** Area change a step asks of each cell, length n. */
  change: Float64Array;
  /** Gradient of the merit, length dim. */
  grad: Float64Array;
  /** Gradient of the perimeter, length dim. */
  lengthGrad: Float64Array;
  /** Scale of the diagonal shift per unknown, length dim. */
  shift: Float64Array;
  /** Step, length dim. */
  direction: Float64Array;
  /** Per-wall cache of the perimeter pass, E * WALL_STRIDE. */
  cache: Float64Array;
  /** The same at the trial state of a step, E * WALL_STRIDE. */
  trialCache: Float64Array;
  /** Chord of every wall at z, length E. */
  chords: Float64Array;
  /** The three rigid motions of the junctions, 3 * 2V. */
  rigid: Float64Array;
  /** The reduced step system. */
  kkt: KktWorkspace;
}

const WORKSPACES = new Map<number, Workspace>();

/** The workspace for problems with this many junctions (every such problem has the same sizes). */
export function workspaceFor(problem: ClusterProblem): Workspace {
  const key = problem.junctions;
  let ws = WORKSPACES.get(key);
  if (!ws) {
    const { size, cells, walls, junctions } = problem;
    const dim = 2 * junctions + walls;
    ws = {
      z: new Float64Array(size),
      trial: new Float64Array(size),
      saved: new Float64Array(size),
      targets: new Float64Array(cells),
      areas: new Float64Array(cells),
      trialAreas: new Float64Array(cells),
      mult: new Float64Array(cells),
      mu: new Float64Array(cells),
      hessianPressures: new Float64Array(cells),
      lambda: new Float64Array(cells),
      cellGrad: new Float64Array(cells * dim),
      normal: new Float64Array(cells * cells),
      pivots: new Float64Array(cells),
      row: new Float64Array(cells),
      change: new Float64Array(cells),
      grad: new Float64Array(dim),
      lengthGrad: new Float64Array(dim),
      shift: new Float64Array(dim),
      direction: new Float64Array(dim),
      cache: new Float64Array(walls * WALL_STRIDE),
      trialCache: new Float64Array(walls * WALL_STRIDE),
      chords: new Float64Array(walls),
      rigid: new Float64Array(6 * junctions),
      kkt: kktWorkspace(problem),
    };
    WORKSPACES.set(key, ws);
  }
  return ws;
}
