// solver stage: relax a cluster to its equilibrium by damped Newton's method on the KKT system.
//
// Pipeline of one call (design.md §5):
//   1. normalise: lengths in units of sqrt(mean target area), so the mean cell area is 1;
//   2. start from the barycentric drawing (arcs/embed.ts) or from a previous answer (relaxFrom), with
//      pressures fitted to the Laplace-Young law by least squares;
//   3. damped Newton: solve K d = -r with the bordered Jacobian K (rigid motions removed by three
//      constraint rows), regularised by mu I on the geometry block with mu = min(MU_MAX, |r|), which
//      vanishes at convergence and keeps the step defined at a real zero mode (a lens sliding along its
//      wall); steps are capped, then backtracked until the residual's 2-norm falls (Armijo test);
//   4. when that fails, continue in the areas from the start's own areas to the targets (geometric
//      interpolation), each step Newton-solved, halving a step that fails;
//   5. classify and certify with the independent checkEquilibrium; the inertia of K gives the index.

import type { CubicMap } from '../maps/cubic-map.ts';
import { embedCluster } from '../arcs/embed.ts';
import { BULGE_FACTORS, G, bulgeFactorsInto } from '../arcs/arc.ts';
import { type Certificate, certificatePasses, checkEquilibrium } from './certificate.ts';
import { symmetricInertia } from './ldlt.ts';
import { luFactorInto, luSolveInto } from './lu.ts';
import { type NewtonOptions, type ResolvedNewtonOptions, resolveOptions } from './options.ts';
import { type ClusterProblem, cellAreasInto, jacobianInto, problemOf, residualInto } from './residual.ts';
import type { Equilibrium, EquilibriumStatus } from './result.ts';

/** A previous answer's geometry, the start of relaxFrom (caller's units). */
export interface EquilibriumStart {
  /** Junction coordinates, length 2V. */
  coords: Float64Array;
  /** Wall bulges, length E. */
  bulges: Float64Array;
  /** Cell pressures, length n. */
  pressures: Float64Array;
}

// Largest and smallest regularisation added to the geometry block of K. The floor keeps K + mu I
// conditioned at a zero mode (an error of eps/mu along it costs (eps/mu)^2 in the residual) and slows
// the other directions only by a factor mu / |eigenvalue|.
const MU_MAX = 1e-3;
const MU_MIN = 1e-9;
// Smallest LU pivot ratio accepted before the regularisation is raised.
const PIVOT_RATIO = 1e-15;
// Backtracking halvings per Newton step.
const LINE_SEARCH = 30;
// Bulges are kept inside (-pi, pi) by this margin.
const BULGE_LIMIT = Math.PI - 1e-6;
// A stalled solve whose residual is this small is at the rounding floor: accept it for certification.
const FLOOR = 1e-10;
// Convergence of an intermediate continuation solve (plain largest residual entry).
const PATH_TOLERANCE = 1e-8;
// Stall test: every STALL_WINDOW iterations the residual's 2-norm must have fallen below STALL_RATIO
// times its value STALL_WINDOW iterations before.
const STALL_WINDOW = 6;
const STALL_RATIO = 0.9;
// A cell pinches off when all its walls are below this many collapse lengths while one collapses.
const COLLAPSE_SPREAD = 10;
// Smallest continuation step (fraction of the path) before the continuation gives up.
const MIN_CONTINUATION_STEP = 1 / 512;

/** Working arrays for one problem size; allocated once per junction count and reused. */
interface Workspace {
  z: Float64Array;
  trial: Float64Array;
  saved: Float64Array;
  initial: Float64Array;
  offset: Float64Array;
  r: Float64Array;
  rTrial: Float64Array;
  step: Float64Array;
  jac: Float64Array;
  pivots: Int32Array;
  targets: Float64Array;
  startAreas: Float64Array;
  goal: Float64Array;
  normal: Float64Array;
}

const WORKSPACES = new Map<number, Workspace>();

function workspaceFor(problem: ClusterProblem): Workspace {
  const key = problem.junctions;
  let ws = WORKSPACES.get(key);
  if (!ws) {
    const { size, order, cells } = problem;
    ws = {
      z: new Float64Array(size),
      trial: new Float64Array(size),
      saved: new Float64Array(size),
      initial: new Float64Array(size),
      offset: new Float64Array(size),
      r: new Float64Array(size),
      rTrial: new Float64Array(size),
      step: new Float64Array(order),
      jac: new Float64Array(order * order),
      pivots: new Int32Array(order),
      targets: new Float64Array(cells),
      startAreas: new Float64Array(cells),
      goal: new Float64Array(cells),
      normal: new Float64Array(cells * cells + cells),
    };
    WORKSPACES.set(key, ws);
  }
  return ws;
}

/** Why one Newton solve stopped ('collapse': a wall's chord fell below the collapse length). */
type SolveEnd = 'converged' | 'stalled' | 'max-iterations' | 'non-finite' | 'collapse';

interface SolveReport {
  end: SolveEnd;
  iterations: number;
}

function norm2(v: Float64Array, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += v[i] * v[i];
  return Math.sqrt(s);
}

// Residual of the homotopy at z: the KKT residual less `weight` times the start's residual on the
// geometry rows (weight 0: the true residual). Returns the convergence measure: residualInto's scaled
// maximum for weight 0, the plain maximum otherwise.
function homotopyInto(
  problem: ClusterProblem, z: Float64Array, targets: Float64Array, offset: Float64Array, weight: number,
  out: Float64Array,
): number {
  const worst = residualInto(problem, z, targets, out);
  if (weight === 0) return worst;
  const geometry = 2 * problem.junctions + problem.walls;
  let m = 0;
  for (let i = 0; i < geometry; i++) {
    out[i] -= weight * offset[i];
    const a = Math.abs(out[i]);
    if (!(a <= m)) m = Number.isNaN(a) ? Infinity : a;
  }
  for (let i = geometry; i < problem.size; i++) {
    const a = Math.abs(out[i]);
    if (!(a <= m)) m = Number.isNaN(a) ? Infinity : a;
  }
  return m;
}

// Newton's method from ws.z towards the normalised targets (with the homotopy offset times `weight`
// on the geometry rows); ws.z holds the last accepted state.
function solve(
  problem: ClusterProblem, ws: Workspace, targets: Float64Array, weight: number, opt: ResolvedNewtonOptions,
): SolveReport {
  const { size, order, junctions, walls } = problem;
  const geometry = 2 * junctions + walls;
  const t0 = 2 * junctions;
  const tolerance = weight === 0 ? opt.tolerance : PATH_TOLERANCE;
  let { z, trial, r, rTrial } = ws;
  const { step, jac, pivots, offset } = ws;
  let worst = homotopyInto(problem, z, targets, offset, weight, r);
  let merit = norm2(r, size);
  let iterations = 0;
  let end: SolveEnd = 'max-iterations';
  let before = Infinity; // merit STALL_WINDOW iterations ago
  while (iterations < opt.maxIterations) {
    if (!Number.isFinite(merit)) {
      end = 'non-finite';
      break;
    }
    if (worst <= tolerance) {
      end = 'converged';
      break;
    }
    if (shortestWall(problem, z, targets).chord < opt.collapseLength) {
      end = 'collapse';
      break;
    }
    if (iterations % STALL_WINDOW === 0) {
      // Has the residual barely moved over the last few iterations? Newton has stalled.
      if (merit > STALL_RATIO * before) {
        end = 'stalled';
        break;
      }
      before = merit;
    }
    iterations++;
    // factor K + mu I (geometry block), raising mu when K is numerically singular
    let mu = Math.min(MU_MAX, Math.max(MU_MIN, worst));
    let factored = false;
    for (let attempt = 0; attempt < 4 && !factored; attempt++, mu *= 100) {
      jacobianInto(problem, z, jac);
      for (let i = 0; i < geometry; i++) jac[i * order + i] += mu;
      factored = luFactorInto(jac, order, pivots) > PIVOT_RATIO;
    }
    if (!factored) {
      end = 'stalled';
      break;
    }
    for (let i = 0; i < size; i++) step[i] = -r[i];
    step[size] = step[size + 1] = step[size + 2] = 0;
    luSolveInto(jac, order, pivots, step);
    // cap the step: bulges by maxBulgeStep, junction moves by maxMoveStep
    let scale = 1;
    let dt = 0;
    for (let i = t0; i < geometry; i++) dt = Math.max(dt, Math.abs(step[i]));
    if (dt * scale > opt.maxBulgeStep) scale = opt.maxBulgeStep / dt;
    let move = 0;
    for (let v = 0; v < junctions; v++) move = Math.max(move, Math.hypot(step[2 * v], step[2 * v + 1]));
    if (move * scale > opt.maxMoveStep) scale = opt.maxMoveStep / move;
    if (!Number.isFinite(scale)) {
      end = 'non-finite';
      break;
    }
    // backtrack until the residual's 2-norm falls enough
    let alpha = scale;
    let accepted = false;
    // Is the residual already at the rounding floor? Then only a full step may still help.
    const tries = worst <= FLOOR ? 1 : LINE_SEARCH;
    for (let ls = 0; ls < tries; ls++, alpha *= 0.5) {
      let inside = true;
      for (let i = 0; i < size; i++) trial[i] = z[i] + alpha * step[i];
      for (let k = 0; k < walls; k++) if (!(Math.abs(trial[t0 + k]) < BULGE_LIMIT)) inside = false;
      if (!inside) continue;
      const trialWorst = homotopyInto(problem, trial, targets, offset, weight, rTrial);
      const trialMerit = norm2(rTrial, size);
      if (trialMerit <= (1 - 1e-4 * alpha) * merit) {
        accepted = true;
        worst = trialWorst;
        merit = trialMerit;
        break;
      }
    }
    if (!accepted) {
      end = worst <= FLOOR ? 'converged' : 'stalled';
      break;
    }
    const zs = z;
    z = trial;
    trial = zs;
    const rs = r;
    r = rTrial;
    rTrial = rs;
  }
  if (end === 'max-iterations' && worst <= tolerance) end = 'converged';
  // keep the accepted state in ws.z whichever buffer it ended in
  if (z !== ws.z) {
    ws.z.set(z);
    ws.r.set(r);
  }
  return { end, iterations };
}

// Fit the pressures of state z to the Laplace-Young law (curvature = p_right - p_left) by least squares.
function fitPressures(problem: ClusterProblem, ws: Workspace): void {
  const { cells, walls, junctions, starts, ends, lefts, rights } = problem;
  const { z, normal, pivots } = ws;
  const m = normal;
  const rhs = normal.subarray(cells * cells);
  m.fill(0);
  const t0 = 2 * junctions;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
    const kappa = c > 0 ? (2 * Math.sin(z[t0 + k])) / c : 0;
    const l = lefts[k];
    const r = rights[k];
    // row: p_r - p_l = kappa
    if (r >= 0) {
      m[r * cells + r] += 1;
      rhs[r] += kappa;
    }
    if (l >= 0) {
      m[l * cells + l] += 1;
      rhs[l] -= kappa;
    }
    if (l >= 0 && r >= 0) {
      m[l * cells + r] -= 1;
      m[r * cells + l] -= 1;
    }
  }
  const p0 = t0 + walls;
  if (luFactorInto(m, cells, pivots) > 0) {
    luSolveInto(m, cells, pivots, rhs);
    for (let f = 0; f < cells; f++) z[p0 + f] = Number.isFinite(rhs[f]) ? rhs[f] : 0;
  } else {
    for (let f = 0; f < cells; f++) z[p0 + f] = 0;
  }
}

// Whether the walls at every junction of state z leave it in the map's counter-clockwise order.
function ordersHold(problem: ClusterProblem, z: Float64Array): boolean {
  const { junctions, twins, wallOf } = problem;
  const t0 = 2 * junctions;
  const TAU = 2 * Math.PI;
  for (let v = 0; v < junctions; v++) {
    let first = 0;
    let d1 = 0;
    for (let i = 0; i < 3; i++) {
      const e = 3 * v + i;
      const w = (twins[e] / 3) | 0;
      const t = e < twins[e] ? z[t0 + wallOf[e]] : -z[t0 + wallOf[e]];
      const angle = Math.atan2(z[2 * w + 1] - z[2 * v + 1], z[2 * w] - z[2 * v]) + t;
      if (i === 0) {
        first = angle;
        continue;
      }
      const d = (((angle - first) % TAU) + TAU) % TAU;
      if (i === 1) d1 = d;
      else if (!(d1 > 0 && d > d1)) return false;
    }
  }
  return true;
}

// The wall of smallest chord relative to its size scale, sqrt of the smaller target area of the
// cells on its two sides, and that relative chord.
function shortestWall(problem: ClusterProblem, z: Float64Array, targets: Float64Array): { wall: number; chord: number } {
  const { walls, starts, ends, lefts, rights } = problem;
  let wall = 0;
  let chord = Infinity;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const l = lefts[k];
    const r = rights[k];
    const area = Math.min(l >= 0 ? targets[l] : Infinity, r >= 0 ? targets[r] : Infinity);
    const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]) / Math.sqrt(area);
    if (c < chord) {
      chord = c;
      wall = k;
    }
  }
  return { wall, chord };
}

// A cell all of whose walls are shorter than `limit` times sqrt(its target area), as a cell number, or 0.
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

interface Verdict {
  status: EquilibriumStatus;
  wall: number | null;
  cell: number | null;
}

// Name the failure of a solve that did not end at a valid drawing, from the state it reached.
function failureOf(
  problem: ClusterProblem, z: Float64Array, targets: Float64Array, opt: ResolvedNewtonOptions, end: SolveEnd,
): Verdict {
  const { wall, chord } = shortestWall(problem, z, targets);
  const collapsing = end === 'collapse' || chord < opt.collapseLength;
  if (collapsing) {
    const cell = pinchedCell(problem, z, targets, COLLAPSE_SPREAD * opt.collapseLength);
    if (cell > 0) return { status: 'cell-collapse', wall: null, cell };
    return { status: 'wall-collapse', wall, cell: null };
  }
  if (end === 'converged') return { status: 'walls-cross', wall: null, cell: null };
  return { status: 'no-convergence', wall: null, cell: null };
}

interface Attempt {
  ok: boolean;
  verdict: Verdict;
  iterations: number;
  solves: number;
}

const OK: Verdict = { status: 'ok', wall: null, cell: null };

// One solve to the targets from ws.z, judged: converged with every junction in order.
function direct(problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions): Attempt {
  const report = solve(problem, ws, ws.targets, 0, opt);
  const ok = report.end === 'converged' && ordersHold(problem, ws.z);
  const verdict = ok ? OK : failureOf(problem, ws.z, ws.targets, opt, report.end);
  return { ok, verdict, iterations: report.iterations, solves: 1 };
}

// Follow a path from ws.z (a solution at s = 0) to s = 1 by Newton-solved steps, halving a step that
// fails and doubling after a success. Phase 'forces': at the start's own areas, the geometry rows
// offset by (1 - s) times the start's residual (a Newton homotopy: the start solves it exactly at
// s = 0). Phase 'areas': no offset, areas startAreas^(1-s) targets^s (the equilibrium branch).
function follow(
  problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, phase: 'forces' | 'areas', budget: number,
): Attempt {
  const { cells, size } = problem;
  const { startAreas, targets, goal, saved } = ws;
  if (phase === 'forces') residualInto(problem, ws.z, startAreas, ws.offset);
  let s = 0;
  let h = 1 / opt.continuationSteps;
  let iterations = 0;
  let solves = 0;
  let verdict: Verdict = { status: 'no-convergence', wall: null, cell: null };
  saved.set(ws.z.subarray(0, size));
  while (solves < budget) {
    const next = Math.min(1, s + h);
    if (phase === 'areas') {
      for (let f = 0; f < cells; f++) goal[f] = startAreas[f] ** (1 - next) * targets[f] ** next;
    }
    const report = solve(
      problem, ws, phase === 'areas' ? (next === 1 ? targets : goal) : startAreas,
      phase === 'areas' ? 0 : 1 - next, opt,
    );
    iterations += report.iterations;
    solves++;
    if (report.end === 'converged' && ordersHold(problem, ws.z)) {
      saved.set(ws.z.subarray(0, size));
      s = next;
      if (s >= 1) return { ok: true, verdict: OK, iterations, solves };
      h = Math.min(2 * h, 1 - s);
      continue;
    }
    const aim = phase === 'areas' ? goal : startAreas;
    verdict = failureOf(problem, ws.z, aim, opt, report.end);
    ws.z.set(saved.subarray(0, size));
    // Was the last good state already near the collapse? Then smaller steps only creep towards it.
    const near = shortestWall(problem, ws.z, aim);
    if (near.chord < COLLAPSE_SPREAD * opt.collapseLength) {
      if (verdict.status === 'no-convergence') verdict = failureOf(problem, ws.z, aim, opt, 'collapse');
      if (verdict.status === 'wall-collapse' || verdict.status === 'cell-collapse') break;
    }
    h *= 0.5;
    if (h < MIN_CONTINUATION_STEP) break;
  }
  // Did the area path stall with no collapse in sight? Its equilibrium branch folds back.
  if (phase === 'areas' && verdict.status === 'no-convergence' && solves < budget) {
    verdict = { status: 'fold', wall: null, cell: null };
  }
  // give up at the last good state, naming what went wrong at the last step that failed
  return { ok: false, verdict, iterations, solves };
}

// Continuation: first relax the start at its own areas (phase 'forces'), then follow its equilibrium
// to the targets (phase 'areas').
function continuation(problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions): Attempt {
  const first = follow(problem, ws, opt, 'forces', opt.maxContinuationSolves);
  if (!first.ok) return first;
  cellAreasInto(problem, ws.z, ws.startAreas);
  const second = follow(problem, ws, opt, 'areas', opt.maxContinuationSolves - first.solves);
  return { ...second, iterations: first.iterations + second.iterations, solves: first.solves + second.solves };
}

// The answer for the circle (one cell): perimeter 2 sqrt(pi A), pressure 1/R (isoperimetric inequality).
function circleAnswer(map: CubicMap, areas: Float64Array): Equilibrium {
  const area = areas[0];
  const radius = Math.sqrt(area / Math.PI);
  const result: Equilibrium = {
    status: 'ok',
    perimeter: 2 * Math.PI * radius,
    pressures: Float64Array.of(1 / radius),
    coords: new Float64Array(0),
    bulges: new Float64Array(0),
    curvatures: new Float64Array(0),
    areas: Float64Array.of(area),
    iterations: 0,
    continuationSolves: 0,
    certificate: undefined as unknown as Certificate,
    index: 0,
    zeroModes: 0,
    collapsingWall: null,
    collapsingCell: null,
  };
  result.certificate = checkEquilibrium(map, areas, result);
  return result;
}

// Check the map and the areas at the public boundary.
function checkInput(map: CubicMap, areas: Float64Array): void {
  const cells = map.faceCount - 1;
  if (areas.length !== cells) {
    throw new RangeError(`Got ${areas.length} areas when expected ${cells}, one per cell.`);
  }
  for (let i = 0; i < cells; i++) {
    if (!(areas[i] > 0) || !Number.isFinite(areas[i])) {
      throw new RangeError(`Area of cell ${i + 1} is ${areas[i]} when expected a positive finite number.`);
    }
  }
}

function normaliseTargets(problem: ClusterProblem, ws: Workspace, areas: Float64Array): number {
  let total = 0;
  for (let f = 0; f < problem.cells; f++) total += areas[f];
  const unit = Math.sqrt(total / problem.cells);
  for (let f = 0; f < problem.cells; f++) ws.targets[f] = areas[f] / (unit * unit);
  return unit;
}

/**
 * Relax the cluster `map` (face 0 = outside, faces 1..n = cells) to an equilibrium with cell i + 1 of
 * area areas[i], from the barycentric drawing. Never throws for a numerical failure: the status names it.
 * @throws RangeError when the number of areas is not n or an area is not positive and finite, or an
 *   option is out of range.
 */
export function relax(map: CubicMap, areas: Float64Array, options?: NewtonOptions): Equilibrium {
  const opt = resolveOptions(options);
  checkInput(map, areas);
  if (map.junctionCount === 0) return circleAnswer(map, areas);
  const problem = problemOf(map);
  const ws = workspaceFor(problem);
  const unit = normaliseTargets(problem, ws, areas);
  const drawing = embedCluster(map, problem.cells);
  const t0 = 2 * problem.junctions;
  ws.z.set(drawing.coords, 0);
  ws.z.set(drawing.bulges, t0);
  fitPressures(problem, ws);
  cellAreasInto(problem, ws.z, ws.startAreas);
  return finish(map, problem, ws, areas, unit, opt);
}

/**
 * Relax from a previous answer's geometry `start` (for instance at nearby areas), in the caller's
 * units; falls back to the area continuation from the start's own areas, then to a cold relax().
 * @throws RangeError as relax() does, or when start's arrays do not fit the map.
 */
export function relaxFrom(
  map: CubicMap, areas: Float64Array, start: EquilibriumStart, options?: NewtonOptions,
): Equilibrium {
  const opt = resolveOptions(options);
  checkInput(map, areas);
  if (map.junctionCount === 0) return circleAnswer(map, areas);
  const problem = problemOf(map);
  const { junctions, walls, cells } = problem;
  if (start.coords.length !== 2 * junctions || start.bulges.length !== walls || start.pressures.length !== cells) {
    throw new RangeError(
      `Start has ${start.coords.length} coordinates, ${start.bulges.length} bulges and ${start.pressures.length} ` +
        `pressures when expected ${2 * junctions}, ${walls} and ${cells}.`,
    );
  }
  const ws = workspaceFor(problem);
  const unit = normaliseTargets(problem, ws, areas);
  const t0 = 2 * junctions;
  const p0 = t0 + walls;
  for (let i = 0; i < 2 * junctions; i++) ws.z[i] = start.coords[i] / unit;
  for (let k = 0; k < walls; k++) ws.z[t0 + k] = start.bulges[k];
  for (let f = 0; f < cells; f++) ws.z[p0 + f] = start.pressures[f] * unit;
  cellAreasInto(problem, ws.z, ws.startAreas);
  let valid = ordersHold(problem, ws.z);
  for (let f = 0; f < cells; f++) if (!(ws.startAreas[f] > 0)) valid = false;
  if (!valid) return relax(map, areas, options);
  const answer = finish(map, problem, ws, areas, unit, opt);
  if (answer.status === 'ok') return answer;
  const cold = relax(map, areas, options);
  cold.iterations += answer.iterations;
  cold.continuationSolves += answer.continuationSolves;
  return cold.status === 'ok' ? cold : answer;
}

// Solve directly, then by continuation; certify, classify and scale back.
function finish(
  map: CubicMap, problem: ClusterProblem, ws: Workspace, areas: Float64Array, unit: number,
  opt: ResolvedNewtonOptions,
): Equilibrium {
  // keep the start: the continuation begins there, not where the direct solve gave up
  ws.initial.set(ws.z);
  let attempt = direct(problem, ws, opt);
  let iterations = attempt.iterations;
  let continuationSolves = 0;
  if (!attempt.ok) {
    ws.z.set(ws.initial);
    let positive = true;
    for (let f = 0; f < problem.cells; f++) if (!(ws.startAreas[f] > 0)) positive = false;
    if (positive) {
      const cont = continuation(problem, ws, opt);
      iterations += cont.iterations;
      continuationSolves = cont.solves;
      // the continuation's verdict names what happens on the way; keep the direct one only when the
      // continuation found nothing more specific
      if (cont.ok || cont.verdict.status !== 'no-convergence') attempt = cont;
      else attempt = { ...cont, verdict: attempt.verdict };
    }
  }
  return answerOf(map, problem, ws, areas, unit, opt, attempt, iterations, continuationSolves);
}

const FACTORS = new Float64Array(BULGE_FACTORS);

function answerOf(
  map: CubicMap, problem: ClusterProblem, ws: Workspace, areas: Float64Array, unit: number,
  opt: ResolvedNewtonOptions, attempt: Attempt, iterations: number, continuationSolves: number,
): Equilibrium {
  const { junctions, walls, cells, starts, ends, order } = problem;
  const z = ws.z;
  const t0 = 2 * junctions;
  const p0 = t0 + walls;
  const coords = new Float64Array(2 * junctions);
  for (let i = 0; i < 2 * junctions; i++) coords[i] = z[i] * unit;
  const bulges = z.slice(t0, p0);
  const pressures = new Float64Array(cells);
  for (let f = 0; f < cells; f++) pressures[f] = z[p0 + f] / unit;
  const curvatures = new Float64Array(walls);
  let perimeter = 0;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
    bulgeFactorsInto(z[t0 + k], FACTORS);
    perimeter += c * FACTORS[G] * unit;
    curvatures[k] = c > 0 ? (2 * Math.sin(z[t0 + k])) / (c * unit) : 0;
  }
  const achieved = new Float64Array(cells);
  cellAreasInto(problem, z, achieved);
  for (let f = 0; f < cells; f++) achieved[f] *= unit * unit;
  const answer: Equilibrium = {
    status: attempt.verdict.status,
    perimeter,
    pressures,
    coords,
    bulges,
    curvatures,
    areas: achieved,
    iterations,
    continuationSolves,
    certificate: checkEquilibrium(map, areas, { coords, bulges, pressures }),
    index: null,
    zeroModes: null,
    collapsingWall: attempt.verdict.wall,
    collapsingCell: attempt.verdict.cell,
  };
  if (answer.status === 'ok') {
    const c = answer.certificate;
    if (certificatePasses(c, opt.certificateTolerance)) {
      jacobianInto(problem, z, ws.jac);
      const inertia = symmetricInertia(ws.jac, order, opt.zeroTolerance);
      answer.index = Math.max(0, inertia.negative - (cells + 3));
      answer.zeroModes = inertia.zero;
    } else if (c.crossings > 0 || c.misorderedJunctions > 0 || !(c.minCellArea > 0)) {
      answer.status = 'walls-cross';
    } else {
      answer.status = 'no-convergence';
    }
  }
  // never NaN: a non-finite number anywhere means the state is unusable
  if (!Number.isFinite(answer.perimeter)) answer.perimeter = 0;
  for (const arr of [coords, bulges, pressures, curvatures, achieved]) {
    for (let i = 0; i < arr.length; i++) if (!Number.isFinite(arr[i])) arr[i] = 0;
  }
  return answer;
}
