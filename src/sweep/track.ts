// sweep stage: relax one candidate at new areas, warm from its own nearby equilibrium, and tell whether it stayed on that branch.
//
// The perimeter's derivative along a path comes free with an equilibrium: at a constrained minimum
// the Lagrange multiplier of a constraint is the sensitivity of the optimum to it, so
// dP/dA_i = p_i (the pressure of cell i; for one circle dP/dA = sqrt(pi/A) = 1/R) and
// dP/ds = sum_i p_i dA_i/ds for any parameter s of the areas.

import { relax, relaxFrom } from '../solver/newton.ts';
import type { NewtonOptions } from '../solver/options.ts';
import type { Equilibrium } from '../solver/result.ts';

/** Largest change of any wall's bulge (radians) between a start and its warm answer on the same branch. */
export const BRANCH_BULGE = 0.5;
/** Perimeter mismatch (relative) against the pressure prediction below which an answer is on the same branch. */
export const BRANCH_PERIMETER = 1e-6;

/** Relaxation counts of a sweep, by kind. */
export interface RelaxCounts {
  /** Starts with no state of the candidate's own: the barycentric drawing or another assignment's equilibrium of the same arrangement. */
  cold: number;
  /** Warm starts at sample points. */
  warm: number;
  /** Warm starts while locating a transition or a boundary. */
  probe: number;
}

/** A fresh zeroed RelaxCounts. */
export function emptyCounts(): RelaxCounts {
  return { cold: 0, warm: 0, probe: 0 };
}

/** A relaxer answer together with the areas it was asked for (caller's units). */
export interface TrackedState {
  readonly areas: Float64Array;
  readonly equilibrium: Equilibrium;
}

/**
 * Predicted perimeter at areas `to` from an equilibrium at areas `from` and one at `to` (trapezoid
 * rule on dP/dA_i = p_i; exact to second order in the area change).
 */
export function predictedPerimeter(start: TrackedState, pressuresTo: Float64Array, to: Float64Array): number {
  const { areas, equilibrium } = start;
  let p = equilibrium.energy;
  for (let i = 0; i < to.length; i++) p += 0.5 * (equilibrium.pressures[i] + pressuresTo[i]) * (to[i] - areas[i]);
  return p;
}

/**
 * Whether `answer` (certified, at areas `to`) continues the branch of `start`: every bulge moved by
 * less than BRANCH_BULGE, or the perimeter is what the pressures predict (a zero mode, such as a lens
 * sliding along its wall, may move bulges without leaving the branch).
 */
export function sameBranch(start: TrackedState, answer: Equilibrium, to: Float64Array): boolean {
  const a = start.equilibrium.bulges;
  const b = answer.bulges;
  let move = 0;
  for (let k = 0; k < a.length; k++) move = Math.max(move, Math.abs(a[k] - b[k]));
  if (move < BRANCH_BULGE) return true;
  const predicted = predictedPerimeter(start, answer.pressures, to);
  return Math.abs(answer.energy - predicted) <= BRANCH_PERIMETER * answer.energy;
}

/** The outcome of one tracked relaxation. */
export interface StepResult {
  readonly equilibrium: Equilibrium;
  /** Certified and on the start's branch (always false for a cold start that failed). */
  readonly continued: boolean;
  /** Certified (on any branch). */
  readonly ok: boolean;
}

/**
 * Relax `map` at `areas`: warm from `start` when given (relaxFrom, which itself falls back to a cold
 * relax), else cold. `kind` says which counter to bump.
 */
export function trackStep(
  map: Parameters<typeof relax>[0], areas: Float64Array, start: TrackedState | null, options: NewtonOptions | undefined,
  counts: RelaxCounts, kind: keyof RelaxCounts,
): StepResult {
  counts[kind]++;
  if (start === null) {
    const eq = relax(map, areas, options);
    return { equilibrium: eq, continued: false, ok: eq.status === 'ok' };
  }
  const eq = relaxFrom(map, areas, start.equilibrium, options);
  const ok = eq.status === 'ok';
  return { equilibrium: eq, ok, continued: ok && sameBranch(start, eq, areas) };
}

/** dP/ds along a parameter: sum over cells of pressure times the cell area's derivative. */
export function perimeterSlope(equilibrium: Equilibrium, areaSlopes: Float64Array): number {
  let d = 0;
  for (let i = 0; i < areaSlopes.length; i++) d += equilibrium.pressures[i] * areaSlopes[i];
  return d;
}
