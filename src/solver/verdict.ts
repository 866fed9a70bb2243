// solver stage: the geometric tests that name how a relaxation ends (collapses, watched during the descent
// and named at its end; order at junctions).

import { bulgeOf } from '../arcs/arc.ts';
import { junctionInOrder } from '../arcs/junction.ts';
import type { ClusterProblem } from './problem.ts';
import type { EquilibriumStatus } from './result.ts';
import { WALL_STRIDE, W_C, W_G } from './wall-terms.ts';

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
      const t = e < twins[e] ? bulgeOf(z[t0 + wallOf[e]]) : -bulgeOf(z[t0 + wallOf[e]]);
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
 * Wall k's arc length (chord times g(t), from its record of perimeterInto, wall-terms.ts) relative to its
 * size scale, sqrt of the smaller target area of the cells on its two sides.
 */
export function relativeLengthOf(problem: ClusterProblem, cache: Float64Array, targets: Float64Array, k: number): number {
  const l = problem.lefts[k];
  const r = problem.rights[k];
  const area = Math.min(l >= 0 ? targets[l] : Infinity, r >= 0 ? targets[r] : Infinity);
  return (cache[k * WALL_STRIDE + W_C] * cache[k * WALL_STRIDE + W_G]) / Math.sqrt(area);
}

/**
 * The wall of smallest relative arc length (relativeLengthOf) at the records `cache` of perimeterInto.
 * By length, not chord: the outer wall of a large cell beside a tiny one has a tiny chord and a bulge
 * near pi, and is long.
 */
export function shortestWallOf(problem: ClusterProblem, cache: Float64Array, targets: Float64Array): number {
  let wall = 0;
  let chord = Infinity;
  for (let k = 0; k < problem.walls; k++) {
    const c = relativeLengthOf(problem, cache, targets, k);
    if (c < chord) {
      chord = c;
      wall = k;
    }
  }
  return wall;
}

/**
 * The watch for a collapse during a descent (descent.ts), one per descent: the wall watched (-1 for
 * none), the steps it has been watched, and its relative length and the merit's gradient when the watch
 * began.
 */
export interface CollapseWatch {
  wall: number;
  steps: number;
  chord: number;
  gradient: number;
}

/** A watch that watches no wall yet. */
export function collapseWatch(): CollapseWatch {
  return { wall: -1, steps: 0, chord: Infinity, gradient: Infinity };
}

// A wall below the collapse length counts as collapsing only once the areas are this close to their
// targets (a start may draw small cells with short walls that grow first).
const SETTLED = 0.02;
// Early collapse: below WATCH collapse lengths the shortest wall is watched; when after WATCH_STEPS
// steps its chord is below where it was and the gradient above WATCH_GRADIENT of where it was, it
// counts as collapsing.
const WATCH = 50;
const WATCH_STEPS = 3;
const WATCH_GRADIENT = 0.5;

/**
 * Whether a descent at the records `cache` (perimeterInto), with largest relative area error
 * `violation` and merit gradient `gradient`, is on its way to a wall collapse: its shortest wall is
 * below the collapse length with the areas nearly right, or the same wall has been shrinking step after
 * step while the gradient stays finite. (The perimeter has a kink at a zero-length wall, so a descent
 * towards it keeps a finite gradient, while one towards an equilibrium drives the gradient to zero: a
 * collapse is seen before the wall is that short.) Updates the watch.
 */
export function collapseSeen(
  watch: CollapseWatch, problem: ClusterProblem, cache: Float64Array, targets: Float64Array, violation: number,
  gradient: number, collapseLength: number,
): boolean {
  const wall = shortestWallOf(problem, cache, targets);
  const chord = relativeLengthOf(problem, cache, targets, wall);
  // Is a wall on its way to zero with the areas nearly right? The arrangement wants a T1 swap.
  if (violation <= SETTLED && chord < collapseLength) return true;
  const limit = WATCH * collapseLength;
  if (violation <= SETTLED && chord < limit && wall === watch.wall) {
    watch.steps++;
    if (watch.steps >= WATCH_STEPS && chord < watch.chord && gradient > WATCH_GRADIENT * watch.gradient) return true;
  } else {
    watch.wall = chord < limit ? wall : -1;
    watch.steps = 0;
    watch.chord = chord;
    watch.gradient = gradient;
  }
  return false;
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
 * Name a collapse at state z (cache: its records of perimeterInto): a cell whose walls all shrink together pinches off ('cell-collapse'),
 * otherwise the shortest wall collapses ('wall-collapse', the T1 swap the arrangement wants).
 */
export function collapseOf(
  problem: ClusterProblem, z: Float64Array, cache: Float64Array, targets: Float64Array, collapseLength: number,
): Verdict {
  const cell = pinchedCell(problem, z, targets, COLLAPSE_SPREAD * collapseLength);
  if (cell > 0) return { status: 'cell-collapse', wall: null, cell };
  return { status: 'wall-collapse', wall: shortestWallOf(problem, cache, targets), cell: null };
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
