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
// is seen going there (the T1 collapse the arrangement wants) instead of being jumped across.

import { factorStepInto, rigidInto, solveStepInto, stepCurvature } from './kkt.ts';
import type { ResolvedNewtonOptions } from './options.ts';
import { fitPressuresInto, meritOf, penaltyGradientInto, scaledGradientMax } from './penalty.ts';
import type { ClusterProblem } from './problem.ts';
import { tangentResidualOf } from './verdict.ts';
import * as terms from './wall-terms.ts';
import { perimeterInto } from './wall-terms.ts';
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
const { WALL_STRIDE, W_C, W_G, W_G1, W_H, W_H2, W_LTT, W_LXX, W_LYY, jumpOf } = terms;
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
// A wall below the collapse length counts as collapsing only once the areas are this close to their
// targets (a start may draw small cells with short walls that grow first).
const SETTLED = 0.02;
// Early collapse: below WATCH collapse lengths the shortest wall is watched; when after WATCH_STEPS
// steps its chord is below where it was and the gradient above WATCH_GRADIENT of where it was, it
// counts as collapsing.
const WATCH = 50;
const WATCH_STEPS = 3;
const WATCH_GRADIENT = 0.5;
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
// Bulges are kept inside (-pi, pi) by this margin.
const BULGE_LIMIT = Math.PI - 1e-6;

/**
 * Descend from the geometry in ws.z towards ws.targets with at most `budget` Newton iterations, the
 * merit's multipliers starting at 0 (or at the pressures in ws.z when `warm`, a previous equilibrium's).
 * On return ws.z holds the last accepted geometry and its pressure estimates.
 */
export function descend(
  problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, budget: number, warm: boolean,
): DescentReport {
  const { cells, junctions, walls } = problem;
  const t0 = 2 * junctions;
  const dim = t0 + walls;
  let z = ws.z;
  let trial = ws.trial;
  const {
    targets, mult, mu, lambda, areas, trialAreas, grad, lengthGrad, shift, direction, cache, chords, rigid, change,
    hessianPressures, kkt,
  } = ws;
  for (let f = 0; f < cells; f++) mult[f] = warm ? z[dim + f] : 0;
  let kappa = KAPPA_FIRST;
  let grow = GROW;
  let tau = warm ? TAU_MIN : TAU_START;
  let perimeter = perimeterInto(problem, z, cache, areas);
  let phi = meritOf(perimeter, areas, targets, mult, kappa, cells);
  let gmax = penaltyGradientInto(problem, z, targets, mult, kappa, cache, areas, mu, grad, lengthGrad);
  let violation = violationOf(areas, targets, cells);
  let iterations = 0;
  let end: DescentEnd = 'max-iterations';
  let floorBest = Infinity;
  let floorSteps = 0;
  let watched = -1;
  let watchSteps = 0;
  let watchChord = Infinity;
  let watchGradient = Infinity;
  for (let k = 0; k < walls; k++) chords[k] = cache[k * WALL_STRIDE + W_C];
  for (;;) {
    if (!Number.isFinite(phi) || !Number.isFinite(gmax)) {
      end = 'non-finite';
      break;
    }
    if (gmax <= opt.tolerance && violation <= opt.tolerance && scaledGradientMax(problem, cache, mu, grad) <= opt.tolerance) {
      end = 'settled';
      break;
    }
    // Is the descent within CLOSE of an equilibrium without getting closer? It is at the rounding floor.
    if (gmax <= CLOSE && violation <= CLOSE) {
      if (gmax < 0.5 * floorBest) {
        floorBest = gmax;
        floorSteps = 0;
      } else if (++floorSteps >= FLOOR_STEPS && scaledGradientMax(problem, cache, mu, grad) <= CLOSE) {
        end = 'settled';
        break;
      }
    }
    // Is a wall near a full circle, the gradient at its floor, and the geometry at an equilibrium?
    if (violation <= CLOSE && nearFullCircle(cache, walls) && tangentResidualOf(problem, z) <= TANGENT_SETTLED) {
      end = 'settled';
      break;
    }
    // Is a wall on its way to zero with the areas nearly right? The arrangement wants a T1 swap.
    const shortWall = shortest(problem, cache, targets);
    const shortChord = relativeLength(problem, cache, targets, shortWall);
    if (violation <= SETTLED && shortChord < opt.collapseLength) {
      end = 'collapse';
      break;
    }
    // Is the same wall shrinking step after step while the gradient stays finite? The perimeter has a
    // kink at a zero-length wall, so a descent towards it keeps a finite gradient, while one towards an
    // equilibrium drives the gradient to zero: it is a collapse, seen before the wall is that short.
    const watch = WATCH * opt.collapseLength;
    if (violation <= SETTLED && shortChord < watch && shortWall === watched) {
      watchSteps++;
      if (watchSteps >= WATCH_STEPS && shortChord < watchChord && gmax > WATCH_GRADIENT * watchGradient) {
        end = 'collapse';
        break;
      }
    } else {
      watched = shortChord < watch ? shortWall : -1;
      watchSteps = 0;
      watchChord = shortChord;
      watchGradient = gmax;
    }
    if (iterations >= budget) break;
    iterations++;
    // the step's ingredients: rigid motions, shift scales, Hessian pressures, area changes
    rigidInto(z, junctions, rigid);
    shiftScalesInto(problem, cache, mu, shift);
    let curvatureMax = 0;
    for (let k = 0; k < walls; k++) {
      const c = cache[k * WALL_STRIDE + W_C];
      const v = c > 0 ? Math.abs(2 * Math.sin(z[t0 + k])) / c : 0;
      if (v > curvatureMax) curvatureMax = v;
    }
    const cap = PRESSURE_CAP * (cells * curvatureMax + 1);
    // the Hessian's pressures: those that best explain the present shape (least squares), which stay
    // physical far from the targets, where the step's own multipliers can be anything
    const fitted = (violation > FIT_BELOW || iterations === 1) && fitPressuresInto(problem, z, cache, lengthGrad, hessianPressures, ws.cellGrad, ws.normal, ws.pivots, ws.row);
    for (let f = 0; f < cells; f++) {
      const m = fitted ? hessianPressures[f] : violation > FIT_BELOW ? mu[f] : mult[f];
      hessianPressures[f] = m > cap ? cap : m < -cap ? -cap : m;
      change[f] = aimOf(targets[f], areas[f], grow) - areas[f];
    }
    // Near an equilibrium? Newton's own step (the least shift) converges quadratically from here.
    if (gmax < ENDGAME && violation < ENDGAME) tau = TAU_MIN;
    let accepted = false;
    let failed = false;
    let phiTrial = phi;
    let perimeterTrial = perimeter;
    let cut = 1;
    let raised = false;
    for (let attempt = 0; attempt < MAX_ATTEMPTS; attempt++) {
      const order = factorStepInto(problem, z, cache, hessianPressures, tau, shift, lengthGrad, change, rigid, kkt, 0);
      const inertia = kkt.inertia;
      if (inertia.negative !== cells + kkt.rigidRows) {
        raised = true;
        tau = raise(tau);
        continue;
      }
      solveStepInto(problem, kkt, order, direction, lambda);
      // without rigid rows the step may carry a rigid motion (large where the shift is small): take it out
      if (kkt.rigidRows === 0) {
        for (let m = 0; m < 3; m++) {
          const o = m * t0;
          let dot = 0;
          for (let i = 0; i < t0; i++) dot += rigid[o + i] * direction[i];
          for (let i = 0; i < t0; i++) direction[i] -= dot * rigid[o + i];
        }
      }
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
      const dbd = kkt.rigidRows === 0 ? stepCurvature(problem, cache, hessianPressures, tau, shift, direction) : -gd + lr;
      // Is d not downhill on Phi(.; lambda)? Weigh the areas more (q > 0 whenever r is not 0).
      if (gd - lr - kappa * q >= 0 && q > ROUNDING && kappa < KAPPA_MAX) {
        kappa = Math.min(KAPPA_MAX, Math.max(2 * kappa, (2 * (gd - lr)) / q));
      }
      const slope = gd - lr - kappa * q;
      const curvature = dbd - tau * dd + kappa * rr;
      const phiHere = meritOf(perimeter, areas, targets, lambda, kappa, cells);
      // cap the step: bulges by maxBulgeStep, junction moves by maxMoveStep; cut after each refusal
      let alpha = 1;
      let dt = 0;
      for (let i = t0; i < dim; i++) {
        const v = Math.abs(direction[i]);
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
      alpha *= cut;
      if (!Number.isFinite(alpha) || !Number.isFinite(slope)) {
        failed = true;
        break;
      }
      const noise = ROUNDING * (Math.abs(phiHere) + 1);
      // Is the model flat to the rounding of Phi? Then Phi cannot judge the step: Newton's step is
      // taken as it is (it only polishes the last digits of an equilibrium).
      const flat = Math.abs(slope) <= noise && Math.abs(curvature) <= noise;
      if (!(slope < 0) && !flat) {
        tau = raise(tau);
        continue;
      }
      const predicted = alpha * slope + 0.5 * alpha * alpha * curvature;
      for (let i = 0; i < dim; i++) trial[i] = z[i] + alpha * direction[i];
      if (admissible(problem, trial, chords)) {
        perimeterTrial = perimeterInto(problem, trial, cache, trialAreas);
        phiTrial = meritOf(perimeterTrial, trialAreas, targets, lambda, kappa, cells);
        const change = phiTrial - phiHere;
        const rho = predicted < 0 ? change / predicted : 0;
        if (flat || (change < 0 && rho >= ACCEPT) || (-predicted <= noise && change <= noise)) {
          accepted = true;
          if ((flat || rho > GOOD) && cut === 1 && !raised) {
            tau = Math.max(TAU_MIN, tau * LOWER);
            grow = Math.min(GROW_MAX, grow * GROW_UP);
          } else if (rho < POOR) {
            tau = raise(tau);
            grow = Math.max(GROW, grow / GROW_UP);
          }
          break;
        }
      }
      tau = raise(tau);
      grow = Math.max(GROW, grow / GROW_UP);
      cut *= 0.5;
    }
    if (!accepted) {
      // restore the cache at z and stop: no admissible step lowers Phi
      perimeter = perimeterInto(problem, z, cache, areas);
      gmax = penaltyGradientInto(problem, z, targets, mult, kappa, cache, areas, mu, grad, lengthGrad);
      end = failed ? 'non-finite' : gmax <= CLOSE && violation <= CLOSE && scaledGradientMax(problem, cache, mu, grad) <= CLOSE ? 'settled' : 'stalled';
      break;
    }
    for (let f = 0; f < cells; f++) {
      mult[f] = lambda[f];
      areas[f] = trialAreas[f];
    }
    const swap = z;
    z = trial;
    trial = swap;
    perimeter = perimeterTrial;
    phi = phiTrial;
    gmax = penaltyGradientInto(problem, z, targets, mult, kappa, cache, areas, mu, grad, lengthGrad);
    violation = violationOf(areas, targets, cells);
    for (let k = 0; k < walls; k++) chords[k] = cache[k * WALL_STRIDE + W_C];
  }
  if (z !== ws.z) ws.z.set(z.subarray(0, dim));
  for (let f = 0; f < cells; f++) ws.z[dim + f] = mu[f];
  const wall = shortest(problem, cache, targets);
  return { end, iterations, wall, chord: relativeLength(problem, cache, targets, wall) };
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
function violationOf(areas: Float64Array, targets: Float64Array, cells: number): number {
  let worst = 0;
  for (let f = 0; f < cells; f++) {
    const v = Math.abs(areas[f] - targets[f]) / targets[f];
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  return worst;
}

// The shortest wall, by arc length (from the perimeter pass's records: chord times g(t)) relative to sqrt
// of the smaller target area on its two sides. (By length, not chord: the outer wall of a large cell
// beside a tiny one has a tiny chord and a bulge near pi, and is long.)
function shortest(problem: ClusterProblem, cache: Float64Array, targets: Float64Array): number {
  let wall = 0;
  let chord = Infinity;
  for (let k = 0; k < problem.walls; k++) {
    const c = relativeLength(problem, cache, targets, k);
    if (c < chord) {
      chord = c;
      wall = k;
    }
  }
  return wall;
}

// Wall k's arc length (chord times g(t), from its record) relative to sqrt of the smaller target area on
// its two sides.
function relativeLength(problem: ClusterProblem, cache: Float64Array, targets: Float64Array, k: number): number {
  const l = problem.lefts[k];
  const r = problem.rights[k];
  const area = Math.min(l >= 0 ? targets[l] : Infinity, r >= 0 ? targets[r] : Infinity);
  return (cache[k * WALL_STRIDE + W_C] * cache[k * WALL_STRIDE + W_G]) / Math.sqrt(area);
}

function admissible(problem: ClusterProblem, trial: Float64Array, chords: Float64Array): boolean {
  const { walls, starts, ends, junctions } = problem;
  const t0 = 2 * junctions;
  for (let k = 0; k < walls; k++) {
    if (!(Math.abs(trial[t0 + k]) < BULGE_LIMIT)) return false;
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const dx = trial[b] - trial[a];
    const dy = trial[b + 1] - trial[a + 1];
    const floor = SHRINK * chords[k];
    if (dx * dx + dy * dy < floor * floor) return false;
  }
  return true;
}
