// solver stage: the geometric tests that name how a relaxation ended (collapses, order at junctions).

import { BULGE_FACTORS, G, bulgeFactorsInto } from '../arcs/arc.ts';
import { junctionInOrder } from '../arcs/junction.ts';
import type { ClusterProblem } from './problem.ts';
import type { EquilibriumStatus } from './result.ts';

/** How a relaxation ended, with the wall or cell a collapse names. */
export interface Verdict {
  /** The status of the answer. */
  status: EquilibriumStatus;
  /** For 'wall-collapse', the collapsing wall. */
  wall: number | null;
  /** For 'cell-collapse', the collapsing cell (1..n). */
  cell: number | null;
}

/** The verdict of a certified relaxation. */
export const OK: Verdict = { status: 'ok', wall: null, cell: null };

// A cell pinches off when all its walls are below this many collapse lengths while one collapses.
const COLLAPSE_SPREAD = 10;

/** Whether the walls at every junction of state z leave it in the map's counter-clockwise order. */
export function ordersHold(problem: ClusterProblem, z: Float64Array): boolean {
  const { junctions, twins, wallOf } = problem;
  for (let v = 0; v < junctions; v++) if (!junctionInOrder(twins, wallOf, z, z, 2 * junctions, v)) return false;
  return true;
}

const FACTORS = new Float64Array(BULGE_FACTORS);

// The arc length of wall k at state z.
function wallLength(problem: ClusterProblem, z: Float64Array, k: number): number {
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  bulgeFactorsInto(z[2 * problem.junctions + k], FACTORS);
  return Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]) * FACTORS[G];
}

/**
 * The largest length of the sum of the three unit tangents (away from the junction along each wall) over
 * the junctions of state z: Plateau's 120-degree law, computed from each wall's chord direction turned by
 * its bulge (well conditioned at every bulge, a wall near a full circle included).
 */
export function tangentResidualOf(problem: ClusterProblem, z: Float64Array): number {
  const { junctions, twins, wallOf } = problem;
  const t0 = 2 * junctions;
  let worst = 0;
  for (let v = 0; v < junctions; v++) {
    let sx = 0;
    let sy = 0;
    for (let i = 0; i < 3; i++) {
      const e = 3 * v + i;
      const w = (twins[e] / 3) | 0;
      const t = e < twins[e] ? z[t0 + wallOf[e]] : -z[t0 + wallOf[e]];
      const dx = z[2 * w] - z[2 * v];
      const dy = z[2 * w + 1] - z[2 * v + 1];
      const c = Math.hypot(dx, dy);
      const cos = Math.cos(t);
      const sin = Math.sin(t);
      sx += (dx * cos - dy * sin) / c;
      sy += (dx * sin + dy * cos) / c;
    }
    const r = Math.hypot(sx, sy);
    if (!(r <= worst)) worst = Number.isNaN(r) ? Infinity : r;
  }
  return worst;
}

/**
 * The wall of smallest arc length relative to its size scale, sqrt of the smaller target area of the
 * cells on its two sides, and that relative length (named `chord` as the collapse length is). By
 * length, not chord: the outer wall of a large cell beside a tiny one has a tiny chord and is long.
 */
export function shortestWall(problem: ClusterProblem, z: Float64Array, targets: Float64Array): { wall: number; chord: number } {
  const { walls, starts, ends, lefts, rights } = problem;
  let wall = 0;
  let chord = Infinity;
  for (let k = 0; k < walls; k++) {
    const l = lefts[k];
    const r = rights[k];
    const area = Math.min(l >= 0 ? targets[l] : Infinity, r >= 0 ? targets[r] : Infinity);
    const c = wallLength(problem, z, k) / Math.sqrt(area);
    if (c < chord) {
      chord = c;
      wall = k;
    }
  }
  return { wall, chord };
}

// A cell all of whose walls have chords shorter than `limit` times sqrt(its target area), as a cell number, or 0.
function pinchedCell(problem: ClusterProblem, z: Float64Array, targets: Float64Array, limit: number): number {
  const { walls, starts, ends, lefts, rights, cells } = problem;
  for (let f = 0; f < cells; f++) {
    let all = true;
    let any = false;
    const scale = limit * Math.sqrt(targets[f]);
    for (let k = 0; k < walls && all; k++) {
      if (lefts[k] !== f && rights[k] !== f) continue;
      any = true;
      const a = 2 * starts[k];
      const b = 2 * ends[k];
      if (Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]) >= scale) all = false;
    }
    if (any && all) return f + 1;
  }
  return 0;
}

/**
 * Name a collapse at state z: a cell whose walls all shrink together pinches off ('cell-collapse'),
 * otherwise the shortest wall collapses ('wall-collapse', the T1 swap the arrangement wants).
 */
export function collapseOf(problem: ClusterProblem, z: Float64Array, targets: Float64Array, collapseLength: number): Verdict {
  const cell = pinchedCell(problem, z, targets, COLLAPSE_SPREAD * collapseLength);
  if (cell > 0) return { status: 'cell-collapse', wall: null, cell };
  return { status: 'wall-collapse', wall: shortestWall(problem, z, targets).wall, cell: null };
}

/**
 * The first junction whose three walls' tensions violate the triangle inequality (one at least the sum
 * of the other two: no Neumann triangle, so no balanced junction; design.md §8), or -1 when every
 * junction can balance or every tension is 1.
 */
export function unbalancedJunctionOf(problem: ClusterProblem): number {
  const { junctions, wallOf, tensions } = problem;
  if (tensions === null) return -1;
  for (let v = 0; v < junctions; v++) {
    const a = tensions[wallOf[3 * v]];
    const b = tensions[wallOf[3 * v + 1]];
    const c = tensions[wallOf[3 * v + 2]];
    if (a >= b + c || b >= a + c || c >= a + b) return v;
  }
  return -1;
}
