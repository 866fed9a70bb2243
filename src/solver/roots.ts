// solver stage: Newton's method on the full equilibrium (KKT) system, as root finding: it converges to
// the equilibrium nearest its start whatever its index (a saddle as well as a minimum), where the
// descent (descent.ts) can only go downhill.
//
// The system is F(y, p) = (grad P(y) - J(y)^T p, T - A(y)) = 0 in the geometry y (junctions, bulges)
// and the pressures p; Newton's step solves F' (d, p' - p) = -F, which is the step system of kkt.ts
// with no shift, the Hessian at the present pressures, the area changes T - A asked for and the rigid
// motions bordered out (its solution's multipliers are the new pressures p'). No convexification: the
// step is taken whatever the inertia. It is judged on the merit |F|^2, along which Newton's direction
// always descends (slope -2 |F|^2), by backtracking ("Numerical Optimization", 2nd ed., 2006, §11.2,
// line-search Newton methods for nonlinear equations). Where the matrix is singular (a lens family's
// zero mode) a small positive shift keeps the step defined, and the step's rigid part is taken out.

import { factorStepInto, removeRigidInto, rigidInto, solveStepInto } from './kkt.ts';
import type { ResolvedNewtonOptions } from './options.ts';
import { fitPressuresInto, penaltyGradientInto, scaledGradientMax } from './penalty.ts';
import type { ClusterProblem } from './problem.ts';
import { ordersHold } from './verdict.ts';
import { advanceInto, gapsHold, perimeterInto, wallTurn } from './wall-terms.ts';
import type { Workspace } from './workspace.ts';

/** How a root search ended: converged (the equations hold to the tolerance or at the rounding floor) or not. */
export interface RootReport {
  converged: boolean;
  /** Newton iterations. */
  iterations: number;
  /** Negative eigenvalues of the last step's matrix less the n + 3 of the constraints (the index there). */
  index: number;
}

// Pivots at most ZERO_PIVOT of the matrix's scale count as zero; then the step is taken with the shift
// REGULAR on every unknown.
const ZERO_PIVOT = 1e-8;
const REGULAR = 1e-9;
// Sufficient decrease of the merit (a fraction of the predicted one) and the most halvings of a step.
const ARMIJO = 1e-4;
const HALVINGS = 30;
// A step may not shrink any chord below SHRINK of its length, nor any wall's gap to a full circle below
// SHRINK of its gap (the drawing would cease to be one of this arrangement).
const SHRINK = 0.1;
// Equations within CLOSE that stop improving for FLOOR_STEPS steps are at the rounding floor.
const CLOSE = 1e-9;
const FLOOR_STEPS = 3;

/**
 * Newton's method on the equilibrium equations from the state ws.z (normalised units, pressures in
 * z's last n entries) towards ws.targets, with at most `budget` iterations; on return ws.z holds the last
 * accepted state. Uses the workspace's scratch (cache, areas, trialAreas, mult, mu, grad, lengthGrad,
 * shift, direction, lambda, change, rigid, chords, trial, kkt).
 */
export function findRootFrom(problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, budget: number): RootReport {
  const { cells, junctions, walls, starts, ends } = problem;
  const t0 = 2 * junctions;
  const dim = t0 + walls;
  const { z, trial, targets, mult, lambda, direction, change, rigid, shift, chords, cache, kkt } = ws;
  // the start's pressures: those that best explain its shape (a drawing's or a descent's estimates
  // may be far off, and Newton's method takes the Hessian at them)
  perimeterInto(problem, z, cache, ws.areas);
  penaltyGradientInto(problem, z, targets, mult.fill(0), 0, cache, ws.areas, ws.mu, ws.grad, ws.lengthGrad);
  if (fitPressuresInto(problem, z, cache, ws.lengthGrad, ws.mu, ws.cellGrad, ws.normal, ws.pivots, ws.row)) {
    for (let f = 0; f < cells; f++) z[dim + f] = ws.mu[f];
  }
  let merit = meritAt(problem, ws, z);
  let iterations = 0;
  let index = -1;
  let floorBest = Infinity;
  let floorSteps = 0;
  for (;;) {
    if (!Number.isFinite(merit)) return { converged: false, iterations, index };
    const { gradient, violation } = LAST;
    if (gradient <= opt.tolerance && violation <= opt.tolerance && scaledGradientMax(problem, cache, ws.mu, ws.grad) <= opt.tolerance) {
      return { converged: true, iterations, index };
    }
    if (gradient <= CLOSE && violation <= CLOSE) {
      if (merit < 0.25 * floorBest) {
        floorBest = merit;
        floorSteps = 0;
      } else if (++floorSteps >= FLOOR_STEPS) return { converged: true, iterations, index };
    }
    if (iterations >= budget) return { converged: false, iterations, index };
    iterations++;
    // Newton's step: the Hessian at the present pressures, the area errors asked back
    for (let f = 0; f < cells; f++) {
      mult[f] = z[dim + f];
      change[f] = targets[f] - ws.areas[f];
    }
    rigidInto(z, junctions, rigid);
    let order = factorStepInto(problem, z, cache, mult, 0, shift, ws.lengthGrad, change, rigid, kkt, ZERO_PIVOT);
    index = kkt.inertia.negative - cells - 3;
    if (kkt.inertia.zero > 0) {
      shift.fill(1, 0, dim);
      order = factorStepInto(problem, z, cache, mult, REGULAR, shift, ws.lengthGrad, change, rigid, kkt, 0);
    }
    solveStepInto(problem, kkt, order, direction, lambda);
    if (kkt.rigidRows === 0) removeRigidInto(direction, rigid, junctions);
    // the first trial: the whole step, cut to the relaxer's largest moves
    let largestMove = 0;
    let largestTurn = 0;
    for (let i = 0; i < t0; i++) largestMove = Math.max(largestMove, Math.abs(direction[i]));
    for (let k = 0; k < walls; k++) largestTurn = Math.max(largestTurn, wallTurn(problem, z, k, direction[t0 + k]));
    let alpha = Math.min(1, opt.maxMoveStep / largestMove, opt.maxBulgeStep / largestTurn);
    if (!(alpha > 0)) return { converged: false, iterations, index };
    for (let k = 0; k < walls; k++) {
      const a = 2 * starts[k];
      const b = 2 * ends[k];
      chords[k] = (SHRINK * SHRINK) * ((z[b] - z[a]) ** 2 + (z[b + 1] - z[a + 1]) ** 2);
    }
    // (a start out of order at some junction, a descent's point, may come back in order: only a state in
    // order is kept so)
    const inOrder = ordersHold(problem, z);
    let accepted = false;
    for (let h = 0; h < HALVINGS && !accepted; h++, alpha *= 0.5) {
      advanceInto(problem, z, alpha, direction, trial);
      for (let f = 0; f < cells; f++) trial[dim + f] = z[dim + f] + alpha * (lambda[f] - z[dim + f]);
      if (!stillDrawn(problem, z, trial, chords, inOrder)) continue;
      const next = meritAt(problem, ws, trial);
      if (next <= (1 - 2 * ARMIJO * alpha) * merit || (next <= merit && merit <= CLOSE * CLOSE)) {
        z.set(trial);
        accepted = true;
      }
    }
    // (the scratch holds the last trial's terms: recompute them at z)
    merit = meritAt(problem, ws, z);
    if (!accepted) {
      // no step along Newton's direction lowers the residual: converged only at the rounding floor
      return { converged: LAST.gradient <= CLOSE && LAST.violation <= CLOSE, iterations, index };
    }
  }
}

// The largest |entry| of the gradient of the Lagrangian and the largest relative area error of the last
// meritAt.
const LAST = { gradient: 0, violation: 0 };

// |F|^2 at state s (gradient of the Lagrangian at s's pressures, area errors), leaving the perimeter
// pass's records in ws.cache, the areas in ws.areas, the gradient in ws.grad and its largest entry and
// the largest relative area error in LAST.
function meritAt(problem: ClusterProblem, ws: Workspace, s: Float64Array): number {
  const { cells, junctions, walls } = problem;
  const dim = 2 * junctions + walls;
  const { grad, areas, targets } = ws;
  perimeterInto(problem, s, ws.cache, areas);
  for (let f = 0; f < cells; f++) ws.mult[f] = s[dim + f];
  LAST.gradient = penaltyGradientInto(problem, s, targets, ws.mult, 0, ws.cache, areas, ws.mu, grad, ws.lengthGrad);
  let sum = 0;
  for (let i = 0; i < dim; i++) sum += grad[i] * grad[i];
  let worst = 0;
  for (let f = 0; f < cells; f++) {
    const e = areas[f] - targets[f];
    sum += e * e;
    worst = Math.max(worst, Math.abs(e) / targets[f]);
  }
  LAST.violation = Number.isNaN(sum) ? Infinity : worst;
  return Number.isNaN(sum) ? Infinity : sum;
}

// Is the trial state s still a drawing of the arrangement: no wall's gap to a full circle below SHRINK
// of its gap at the step's start z, no chord shrunk below SHRINK of its length (floors: SHRINK^2
// chord^2 at the step's start), the junctions in order (when `order`)?
function stillDrawn(problem: ClusterProblem, z: Float64Array, s: Float64Array, floors: Float64Array, order: boolean): boolean {
  const { walls, starts, ends } = problem;
  if (!gapsHold(problem, z, s, SHRINK)) return false;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    if ((s[b] - s[a]) ** 2 + (s[b + 1] - s[a + 1]) ** 2 < floors[k]) return false;
  }
  return !order || ordersHold(problem, s);
}
