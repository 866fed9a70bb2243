// solver stage: the relaxation, a descent on the augmented penalty energy by constrained Newton steps.
//
// Each step minimises the quadratic model of the Lagrangian (Hessian B = H(mu) + tau S, kkt.ts)
// subject to the linearised area constraints J d = r, which also gives new pressures lambda
// (sequential quadratic programming, "Numerical Optimization", 2nd ed., 2006, §18.1). The shift tau is
// raised until B is positive definite on the constraints' null space (the inertia of the step's
// matrix says when), so every step goes downhill in the shape space of the target areas: the descent
// finds stable equilibria and walls on their way to zero, never a saddle. The step is judged on a real
// energy, Phi(.; lambda) = perimeter - sum lambda_f (A_f - T_f) + (kappa/2) sum (A_f - T_f)^2 / T_f
// (penalty.ts): it is a descent direction of Phi once kappa is large enough (slope = -d^T B d - kappa
// sum (T_f - A_f) r_f / T_f), kappa is raised when it is not, and tau is adapted like a trust region:
// raised when a step is refused or predicts badly, lowered when the model predicts well, down to a
// vanishing TAU_MIN near a stable equilibrium, where the steps are Newton's on the equilibrium
// equations and converge quadratically (a shift that never quite vanishes keeps the step defined at a
// zero mode, a lens sliding along its wall). Keeping the areas right while the shape relaxes matters: a
// shape relaxed at wrong areas can slide away from a delicate equilibrium.
//
// A cell drawn far too small asks for at most GROW times its area per step, so it grows in a few steps
// rather than one wild one; the pressures in the Hessian are kept to a physical bound for the same
// reason. A step may not shrink any chord below SHRINK times its length, so a wall on its way to zero
// is seen going there (the T1 collapse the arrangement wants) instead of being jumped across, nor any
// wall's gap to a full circle below SHRINK times its gap (a relative bound, good at every scale).

import { factorStepInto, removeRigidInto, rigidInto, solveStepInto, stepCurvature } from './kkt.ts';
import { bulgeSine } from '../arcs/arc.ts';
import type { ResolvedNewtonOptions } from './options.ts';
import { fitPressuresInto, meritOf, penaltyGradientInto, scaledGradientMax } from './penalty.ts';
import type { ClusterProblem } from './problem.ts';
import { type CollapseWatch, collapseSeen, collapseWatch, relativeLengthOf, shortestWallOf, tangentResidualOf } from './verdict.ts';
import * as terms from './wall-terms.ts';
import { advanceInto, gapsHold, perimeterInto, wallTurn } from './wall-terms.ts';
import type { Workspace } from './workspace.ts';

/** Why a descent stopped ('settled': at an equilibrium to within the tolerances, or at the rounding floor). */
export type DescentEnd = 'settled' | 'collapse' | 'max-iterations' | 'non-finite' | 'stalled';

/** The outcome of descend(): how it ended, Newton iterations used, and the shortest wall at the end. */
export interface DescentReport {
  /** How the descent ended. */
  end: DescentEnd;
  /** Newton iterations. */
  iterations: number;
  /** The wall of smallest relative chord at the end. */
  wall: number;
  /** Its chord relative to sqrt of the smaller target area of its two sides. */
  chord: number;
}

// The per-wall records (local copies: under some loaders, tsx, every use of an import is a getter call).
const { WALL_STRIDE, W_C, W_G1, W_H, W_H2, W_LTT, W_LXX, W_LYY, jumpOf } = terms;
// Weight of the elastic area term of the merit at the start and its ceiling (normalised units: mean
// cell area 1).
const KAPPA_FIRST = 10;
const KAPPA_MAX = 1e8;
// A descent this close to an equilibrium (gradient, relative area error) that stalls, or does not halve
// its gradient in FLOOR_STEPS steps, is at the rounding floor: settled (the certificate judges it).
const CLOSE = 1e-9;
const FLOOR_STEPS = 3;
// The rounding floor of the gradient can lie far above CLOSE: a wall near a full circle (the outer wall
// of a large cell beside a tiny one) has its bulge t near pi, where a rounding of t (one ulp of pi)
// moves the length's gradient by g'(t) ulp, with g'(t) ~ pi / (pi - |t|)^2, while the geometry it
// describes is as good as ever. When FLOOR_ULPS eps max|g'| is above CLOSE (walls within about 0.01 of
// a full circle), a descent with the areas within CLOSE is judged by the geometry instead, whatever its
// gradient: it has settled when the unit tangents at every junction sum to at most
// TANGENT_SETTLED (Plateau's law, a well-conditioned test; the certificate judges the rest).
const FLOOR_ULPS = 1e2;
const TANGENT_SETTLED = 1e-11;
// Close enough for Newton's own steps: gradient and area error below ENDGAME.
const ENDGAME = 1e-2;
// Below this area error the Hessian takes the last step's pressures instead of fitting them.
const FIT_BELOW = 0.1;
// Most growth (or shrinkage) of a cell's area asked for in one step: GROW at first, doubled (up to
// GROW_MAX) after each step the model predicted well, halved (down to GROW) after each it did not.
const GROW = 2;
const GROW_MAX = 16;
const GROW_UP = 2;
// Pressures in the Hessian are kept below PRESSURE_CAP times (n times the largest wall curvature + 1):
// at equilibrium a pressure is a sum of at most n curvature jumps on a path to the outside.
const PRESSURE_CAP = 4;
// Smallest factor by which one step may shrink a chord.
const SHRINK = 0.1;
// Shift control: factorisations tried per step; the smallest shift and the first one tried after a
// refusal; the shift's scale on a variable is at least DIAGONAL_FLOOR of the largest. A step is taken
// when Phi falls by at least ACCEPT of the model's prediction (or both are below ROUNDING of Phi); the
// shift is lowered (by LOWER) above GOOD, unless it had to be raised in the same step, and raised below
// POOR.
const MAX_ATTEMPTS = 40;
const TAU_MIN = 1e-8;
const TAU_FIRST = 1e-4;
// The shift of a cold start's first step: a far start is first relaxed cautiously, close to the
// steepest descent of the shape (a warm start begins with Newton's step).
const TAU_START = 1;
const DIAGONAL_FLOOR = 1e-6;
const ACCEPT = 1e-4;
const ROUNDING = 1e-13;
const GOOD = 0.75;
const LOWER = 0.5;
const POOR = 0.25;

/**
 * The state of one descent: the iterate z (and the trial state of a step, the two swapped when a step
 * is taken) with its perimeter, merit, gradient and area error; the step control (the merit's weight
 * kappa, the shift tau, the area growth allowed per step, and within a step the cut of the step length
 * and whether the shift had to be raised); the pressure bound of the step; and the watch of the
 * rounding floor.
 */
export interface DescentState {
  /** The iterate (geometry, then pressure estimates), and the trial state of a step. */
  z: Float64Array;
  trial: Float64Array;
  /** The wall records (perimeterInto) of z: what the step's matrix and the collapse watch read. */
  cache: Float64Array;
  /** The wall records of the trial state (swapped with cache when a step is taken). */
  trialCache: Float64Array;
  perimeter: number;
  phi: number;
  gmax: number;
  violation: number;
  /** Perimeter and merit at the trial state of the last step tried. */
  perimeterTrial: number;
  phiTrial: number;
  kappa: number;
  tau: number;
  grow: number;
  cut: number;
  raised: boolean;
  /** Pressures (in the Hessian and of the step) are kept within +-cap. */
  cap: number;
  floorBest: number;
  floorSteps: number;
  iterations: number;
}

/**
 * Descend from the geometry in ws.z towards ws.targets with at most `budget` Newton iterations, the
 * merit's multipliers starting at 0 (or at the pressures in ws.z when `warm`, a previous equilibrium's).
 * On return ws.z holds the last accepted geometry and its pressure estimates, and ws.cache its wall
 * records.
 */
export function descend(
  problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, budget: number, warm: boolean,
): DescentReport {
  const { cells, junctions, walls } = problem;
  const dim = 2 * junctions + walls;
  const s = startDescent(problem, ws, warm);
  const watch = collapseWatch();
  let end: DescentEnd;
  for (;;) {
    const here = endHere(problem, ws, opt, s, watch);
    if (here !== null) {
      end = here;
      break;
    }
    if (s.iterations >= budget) {
      end = 'max-iterations';
      break;
    }
    s.iterations++;
    prepareStep(problem, ws, s);
    const outcome = tryStep(problem, ws, opt, s);
    if (outcome !== 'accepted') {
      // stop: no admissible step lowers Phi (the gradient again, at the last kappa)
      const { targets, mult, areas, mu, grad, lengthGrad } = ws;
      s.gmax = penaltyGradientInto(problem, s.z, targets, mult, s.kappa, s.cache, areas, mu, grad, lengthGrad);
      end = outcome === 'failed' ? 'non-finite' : atFloor(problem, ws, s) ? 'settled' : 'stalled';
      break;
    }
    takeStep(problem, ws, s);
  }
  if (s.z !== ws.z) ws.z.set(s.z.subarray(0, dim));
  if (s.cache !== ws.cache) ws.cache.set(s.cache);
  for (let f = 0; f < cells; f++) ws.z[dim + f] = ws.mu[f];
  const wall = shortestWallOf(problem, ws.cache, ws.targets);
  return { end, iterations: s.iterations, wall, chord: relativeLengthOf(problem, ws.cache, ws.targets, wall) };
}

/** The state at the start of a descent from ws.z (records, merit and gradient at ws.z). */
export function startDescent(problem: ClusterProblem, ws: Workspace, warm: boolean): DescentState {
  const { cells, junctions, walls } = problem;
  const dim = 2 * junctions + walls;
  const { z, targets, mult, mu, areas, grad, lengthGrad, cache, chords } = ws;
  for (let f = 0; f < cells; f++) mult[f] = warm ? z[dim + f] : 0;
  const kappa = KAPPA_FIRST;
  const perimeter = perimeterInto(problem, z, cache, areas);
  const phi = meritOf(perimeter, areas, targets, mult, kappa, cells);
  const gmax = penaltyGradientInto(problem, z, targets, mult, kappa, cache, areas, mu, grad, lengthGrad);
  for (let k = 0; k < walls; k++) chords[k] = cache[k * WALL_STRIDE + W_C];
  return {
    z, trial: ws.trial, cache, trialCache: ws.trialCache, perimeter, phi, gmax, violation: violationOf(areas, targets, cells), perimeterTrial: perimeter,
    phiTrial: phi, kappa, tau: warm ? TAU_MIN : TAU_START, grow: GROW, cut: 1, raised: false, cap: Infinity,
    floorBest: Infinity, floorSteps: 0, iterations: 0,
  };
}

// How the descent ends at its present iterate, or null when it goes on.
function endHere(
  problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, s: DescentState, watch: CollapseWatch,
): DescentEnd | null {
  const { mu, grad, targets } = ws;
  const { cache, gmax, violation } = s;
  if (!Number.isFinite(s.phi) || !Number.isFinite(gmax)) return 'non-finite';
  if (gmax <= opt.tolerance && violation <= opt.tolerance && scaledGradientMax(problem, cache, mu, grad) <= opt.tolerance) {
    return 'settled';
  }
  // Is the descent within CLOSE of an equilibrium without getting closer? It is at the rounding floor.
  if (gmax <= CLOSE && violation <= CLOSE) {
    if (gmax < 0.5 * s.floorBest) {
      s.floorBest = gmax;
      s.floorSteps = 0;
    } else if (++s.floorSteps >= FLOOR_STEPS && scaledGradientMax(problem, cache, mu, grad) <= CLOSE) {
      return 'settled';
    }
  }
  // Is a wall near a full circle, the gradient at its floor, and the geometry at an equilibrium?
  if (violation <= CLOSE && nearFullCircle(cache, problem.walls) && tangentResidualOf(problem, s.z) <= TANGENT_SETTLED) {
    return 'settled';
  }
  // Is a wall on its way to zero with the areas nearly right? The arrangement wants a T1 swap.
  if (collapseSeen(watch, problem, cache, targets, violation, gmax, opt.collapseLength)) return 'collapse';
  return null;
}

// Whether the records at z (just restored) put the descent within CLOSE of an equilibrium.
function atFloor(problem: ClusterProblem, ws: Workspace, s: DescentState): boolean {
  return s.gmax <= CLOSE && s.violation <= CLOSE && scaledGradientMax(problem, s.cache, ws.mu, ws.grad) <= CLOSE;
}

/**
 * The step's ingredients at s.z: rigid motions, shift scales, the pressure bound, the Hessian's
 * pressures and the area changes asked for; the least shift near an equilibrium.
 */
export function prepareStep(problem: ClusterProblem, ws: Workspace, s: DescentState): void {
  const { cells, junctions, walls } = problem;
  const t0 = 2 * junctions;
  const { z, cache, gmax, violation } = s;
  const { targets, mult, mu, areas, rigid, shift, lengthGrad, hessianPressures, change } = ws;
  rigidInto(z, junctions, rigid);
  shiftScalesInto(problem, cache, mu, shift);
  let curvatureMax = 0;
  for (let k = 0; k < walls; k++) {
    const c = cache[k * WALL_STRIDE + W_C];
    const v = c > 0 ? Math.abs(2 * bulgeSine(z[t0 + k])) / c : 0;
    if (v > curvatureMax) curvatureMax = v;
  }
  const cap = PRESSURE_CAP * (cells * curvatureMax + 1);
  s.cap = cap;
  // the Hessian's pressures: those that best explain the present shape (least squares), which stay
  // physical far from the targets, where the step's own multipliers can be anything
  const fitted = (violation > FIT_BELOW || s.iterations === 1) && fitPressuresInto(problem, z, cache, lengthGrad, hessianPressures, ws.cellGrad, ws.normal, ws.pivots, ws.row);
  for (let f = 0; f < cells; f++) {
    const m = fitted ? hessianPressures[f] : violation > FIT_BELOW ? mu[f] : mult[f];
    hessianPressures[f] = m > cap ? cap : m < -cap ? -cap : m;
    change[f] = aimOf(targets[f], areas[f], s.grow) - areas[f];
  }
  // Near an equilibrium? Newton's own step (the least shift) converges quadratically from here.
  if (gmax < ENDGAME && violation < ENDGAME) s.tau = TAU_MIN;
  s.cut = 1;
  s.raised = false;
}

// Factor, solve and judge steps from z, the shift raised and the step cut after each refusal, until one
// is accepted (its state in s.trial and ws.trialAreas) or MAX_ATTEMPTS are spent ('refused'), or the
// step is not finite ('failed').
function tryStep(
  problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, s: DescentState,
): 'accepted' | 'refused' | 'failed' {
  for (let attempt = 0; attempt < MAX_ATTEMPTS; attempt++) {
    const outcome = attemptStep(problem, ws, opt, s);
    if (outcome === 'accepted' || outcome === 'failed') return outcome;
  }
  return 'refused';
}

/**
 * One attempt at a step from s.z at the present shift s.tau (after prepareStep): factor, solve, and judge
 * the trial state on the merit. 'accepted': the trial (s.trial, ws.trialAreas) lowers the merit enough;
 * 'raised': no trial was made (the step's matrix has the wrong inertia, or the step is not downhill) and
 * the shift was raised; 'cut': the trial was refused, the shift raised and the step cut; 'failed': the
 * step is not finite.
 */
export function attemptStep(
  problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, s: DescentState,
): 'accepted' | 'raised' | 'cut' | 'failed' {
  const { cells, junctions, walls } = problem;
  const t0 = 2 * junctions;
  const dim = t0 + walls;
  const { z, trial, cache, trialCache, cap } = s;
  const {
    targets, lambda, areas, trialAreas, shift, direction, chords, rigid, change, hessianPressures, lengthGrad, kkt,
  } = ws;
  const order = factorStepInto(problem, z, cache, hessianPressures, s.tau, shift, lengthGrad, change, rigid, kkt, 0);
  if (kkt.inertia.negative !== cells + kkt.rigidRows) {
    s.raised = true;
    s.tau = raise(s.tau);
    return 'raised';
  }
  solveStepInto(problem, kkt, order, direction, lambda);
  // without rigid rows the step may carry a rigid motion (large where the shift is small): take it out
  if (kkt.rigidRows === 0) removeRigidInto(direction, rigid, junctions);
  // the merit's multipliers: the new pressures, kept within the physical bound
  for (let f = 0; f < cells; f++) {
    const l = lambda[f];
    lambda[f] = l > cap ? cap : l < -cap ? -cap : l;
  }
  // slope and curvature of Phi(.; lambda) along d, from the step's equations (J d = r)
  let gd = 0;
  let dd = 0;
  for (let i = 0; i < dim; i++) {
    gd += lengthGrad[i] * direction[i];
    dd += shift[i] * direction[i] * direction[i];
  }
  let lr = 0;
  let q = 0;
  let rr = 0;
  for (let f = 0; f < cells; f++) {
    const r = change[f];
    lr += lambda[f] * r;
    q += ((targets[f] - areas[f]) * r) / targets[f];
    rr += (r * r) / targets[f];
  }
  // slope = grad P . d - lambda . J d - kappa sum (T - A) J d / T with J d = r; d^T B d = -grad P . d
  // + (unclamped lambda) . r, which the curvature approximates with the clamped one
  const dbd = kkt.rigidRows === 0 ? stepCurvature(problem, cache, hessianPressures, s.tau, shift, direction) : -gd + lr;
  // Is d not downhill on Phi(.; lambda)? Weigh the areas more (q > 0 whenever r is not 0).
  if (gd - lr - s.kappa * q >= 0 && q > ROUNDING && s.kappa < KAPPA_MAX) {
    s.kappa = Math.min(KAPPA_MAX, Math.max(2 * s.kappa, (2 * (gd - lr)) / q));
  }
  const { kappa, tau } = s;
  const slope = gd - lr - kappa * q;
  const curvature = dbd - tau * dd + kappa * rr;
  const phiHere = meritOf(s.perimeter, areas, targets, lambda, kappa, cells);
  const alpha = stepLength(problem, opt, z, direction) * s.cut;
  if (!Number.isFinite(alpha) || !Number.isFinite(slope)) return 'failed';
  const noise = ROUNDING * (Math.abs(phiHere) + 1);
  // Is the model flat to the rounding of Phi? Then Phi cannot judge the step: Newton's step is
  // taken as it is (it only polishes the last digits of an equilibrium).
  const flat = Math.abs(slope) <= noise && Math.abs(curvature) <= noise;
  if (!(slope < 0) && !flat) {
    s.tau = raise(tau);
    return 'raised';
  }
  const predicted = alpha * slope + 0.5 * alpha * alpha * curvature;
  advanceInto(problem, z, alpha, direction, trial);
  if (admissible(problem, z, trial, chords)) {
    s.perimeterTrial = perimeterInto(problem, trial, trialCache, trialAreas);
    s.phiTrial = meritOf(s.perimeterTrial, trialAreas, targets, lambda, kappa, cells);
    const change = s.phiTrial - phiHere;
    const rho = predicted < 0 ? change / predicted : 0;
    if (flat || (change < 0 && rho >= ACCEPT) || (-predicted <= noise && change <= noise)) {
      if ((flat || rho > GOOD) && s.cut === 1 && !s.raised) {
        s.tau = Math.max(TAU_MIN, tau * LOWER);
        s.grow = Math.min(GROW_MAX, s.grow * GROW_UP);
      } else if (rho < POOR) {
        s.tau = raise(tau);
        s.grow = Math.max(GROW, s.grow / GROW_UP);
      }
      return 'accepted';
    }
  }
  s.tau = raise(tau);
  s.grow = Math.max(GROW, s.grow / GROW_UP);
  s.cut *= 0.5;
  return 'cut';
}

// The longest step along d the caps allow: bulges by maxBulgeStep, junction moves by maxMoveStep.
function stepLength(problem: ClusterProblem, opt: ResolvedNewtonOptions, z: Float64Array, direction: Float64Array): number {
  const { junctions, walls } = problem;
  const t0 = 2 * junctions;
  let alpha = 1;
  let dt = 0;
  for (let k = 0; k < walls; k++) {
    const v = wallTurn(problem, z, k, direction[t0 + k]);
    if (v > dt) dt = v;
  }
  if (dt > opt.maxBulgeStep) alpha = opt.maxBulgeStep / dt;
  let move = 0;
  for (let v = 0; v < junctions; v++) {
    const m = direction[2 * v] * direction[2 * v] + direction[2 * v + 1] * direction[2 * v + 1];
    if (m > move) move = m;
  }
  move = Math.sqrt(move);
  if (move * alpha > opt.maxMoveStep) alpha = opt.maxMoveStep / move;
  return alpha;
}

/** Take the accepted step: the trial becomes the iterate, the step's pressures the merit's multipliers. */
export function takeStep(problem: ClusterProblem, ws: Workspace, s: DescentState): void {
  const { cells, walls } = problem;
  const { targets, mult, lambda, areas, trialAreas, mu, grad, lengthGrad, chords } = ws;
  for (let f = 0; f < cells; f++) {
    mult[f] = lambda[f];
    areas[f] = trialAreas[f];
  }
  const swap = s.z;
  s.z = s.trial;
  s.trial = swap;
  const records = s.cache;
  s.cache = s.trialCache;
  s.trialCache = records;
  s.perimeter = s.perimeterTrial;
  s.phi = s.phiTrial;
  s.gmax = penaltyGradientInto(problem, s.z, targets, mult, s.kappa, s.cache, areas, mu, grad, lengthGrad);
  s.violation = violationOf(areas, targets, cells);
  for (let k = 0; k < walls; k++) chords[k] = s.cache[k * WALL_STRIDE + W_C];
}

// Whether the gradient's rounding floor at the state of the cache lies above CLOSE (see FLOOR_ULPS).
function nearFullCircle(cache: Float64Array, walls: number): boolean {
  let most = 0;
  for (let k = 0; k < walls; k++) {
    const v = Math.abs(cache[k * WALL_STRIDE + W_G1]);
    if (v > most) most = v;
  }
  return FLOOR_ULPS * Number.EPSILON * most > CLOSE;
}

// The next shift after a refusal.
function raise(tau: number): number {
  return tau < TAU_FIRST ? TAU_FIRST : 4 * tau;
}

// The area a step aims at: the target, or at most GROW times (at least 1/GROW of) the present area.
function aimOf(target: number, area: number, grow: number): number {
  if (!(area > 0)) return target;
  if (target > grow * area) return grow * area;
  if (target * grow < area) return area / grow;
  return target;
}

// Shift scales: per junction the larger diagonal entry of its two coordinates in H (both coordinates
// alike, so a step of a symmetric drawing is as symmetric as the drawing), per bulge its own; at least
// DIAGONAL_FLOOR of the largest.
function shiftScalesInto(problem: ClusterProblem, cache: Float64Array, mu: Float64Array, shift: Float64Array): void {
  const { junctions, walls, starts, ends } = problem;
  const t0 = 2 * junctions;
  shift.fill(0, 0, t0);
  for (let k = 0; k < walls; k++) {
    const d = jumpOf(problem, k, mu);
    // the diagonal of the wall's Hessian block (wall-terms.ts) with this pressure jump
    const w = k * WALL_STRIDE;
    const c = cache[w + W_C];
    const h = cache[w + W_H];
    const s = Math.max(Math.abs(cache[w + W_LXX] + 2 * d * h), Math.abs(cache[w + W_LYY] + 2 * d * h));
    shift[2 * starts[k]] += s;
    shift[2 * ends[k]] += s;
    shift[t0 + k] = Math.abs(cache[w + W_LTT] + d * c * c * cache[w + W_H2]);
  }
  let most = 0;
  for (let i = 0; i < t0 + walls; i++) if (shift[i] > most) most = shift[i];
  const floor = DIAGONAL_FLOOR * most;
  for (let v = 0; v < junctions; v++) {
    const s = Math.max(shift[2 * v], floor);
    shift[2 * v] = s;
    shift[2 * v + 1] = s;
  }
  for (let k = 0; k < walls; k++) if (shift[t0 + k] < floor) shift[t0 + k] = floor;
}

// Largest relative area error.
export function violationOf(areas: Float64Array, targets: Float64Array, cells: number): number {
  let worst = 0;
  for (let f = 0; f < cells; f++) {
    const v = Math.abs(areas[f] - targets[f]) / targets[f];
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  return worst;
}

function admissible(problem: ClusterProblem, z: Float64Array, trial: Float64Array, chords: Float64Array): boolean {
  const { walls, starts, ends } = problem;
  if (!gapsHold(problem, z, trial, SHRINK)) return false;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const dx = trial[b] - trial[a];
    const dy = trial[b + 1] - trial[a + 1];
    const floor = SHRINK * chords[k];
    if (dx * dx + dy * dy < floor * floor) return false;
  }
  return true;
}
