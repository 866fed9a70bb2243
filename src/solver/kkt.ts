// solver stage: the equilibrium (KKT) step with the bulges eliminated wall by wall.
//
// The step (d, lambda, nu) of the relaxer solves
//
//   [ B   -J^T  R^T ] [ d      ]   [ -grad P ]
//   [ -J   0    0   ] [ lambda ] = [ -r      ]      B = H(mu) + tau S,
//   [ R    0    0   ] [ nu     ]   [  0      ]
//
// with H(mu) the Hessian of the Lagrangian sum L_k - sum mu_f (A_f - T_f) at the pressure estimates mu,
// S a diagonal shift scale (the same for both coordinates of a junction), J the area gradients, r the
// area changes asked for and R the three rigid motions (unit translations, rotation about the
// centroid). lambda are the new pressures. A bulge enters only its own wall's terms, so B's bulge block
// is diagonal: each bulge is eliminated by one rank-one update of the rows of its wall's four
// coordinates and its two cells' pressures, leaving an order of 2V + n + 3 plus the
// walls whose bulge pivot is too small to eliminate safely (a semicircle's is 0 at equilibrium). The
// reduced matrix is factored by the symmetric indefinite LDL^T of linalg/ldlt.ts, whose inertia tells whether
// B is positive definite on the null space of the constraints (Haynsworth inertia additivity: the
// eliminated pivots count with their signs; "Matrix Computations", 4th ed., 2013, §4.4 and the Schur
// complement): it is exactly when n + 3 eigenvalues are negative and none is zero. With a shift the
// rigid rows are not needed (the shift is positive on the translations) and are left out.
//
// Layout of the reduced unknowns: coordinates 0 .. 2V, kept bulges 2V .. 2V + K, pressures, then the
// three rigid multipliers when there are rigid rows.

import {
  type Inertia, type LdltScratch, ldltScratch, pivotedFactorInto, plainFactorInto, plainSolveInto, symmetricSolveInto,
} from '../linalg/ldlt.ts';
import { type ClusterProblem, junctionMean } from './problem.ts';
import * as terms from './wall-terms.ts';

// NOTE: local copies of the kernel's bindings (under some loaders, tsx, every use of an import is a
// getter call).
const {
  AREA_BLOCK, HESSIAN_BLOCK, M_TT, M_XT, M_XX, M_XY, M_YT, M_YY, Q_AX, Q_AY, Q_BX, Q_BY, Q_T, WALL_STRIDE, W_C,
  W_H1, areaGradientInto, jumpOf, wallHessianInto,
} = terms;
// One wall's Hessian block and area gradient (wall-terms.ts).
const BLOCK = new Float64Array(HESSIAN_BLOCK);
const AREA = new Float64Array(AREA_BLOCK);

// A bulge is eliminated when its pivot is at least ELIMINATE times the largest entry of its column.
const ELIMINATE = 0.05;
// Per eliminated wall: its pivot, the right-hand side of its row and the six entries of its column
// (ax, ay, bx, by, left pressure, right pressure).
const E_PIVOT = 0;
const E_RHS = 1;
const E_U = 2;
const ELIMINATED_STRIDE = 8;

// Scratch of one elimination: the column entries and their rows.
const U = new Float64Array(6);
const IDS = new Int32Array(6);

/** Buffers of the reduced step, one set per problem size. */
export interface KktWorkspace {
  /** Reduced matrix (lower triangle used), order^2 with order at most 2V + E + n + 3. */
  matrix: Float64Array;
  /** Right-hand side, then solution, of the reduced system. */
  rhs: Float64Array;
  /** Pivots of the factorisation. */
  pivots: Int32Array;
  /** Scratch columns of the factorisation. */
  scratch: LdltScratch;
  /** Slot of wall k's bulge in the reduced system, or -1 when eliminated. */
  slots: Int32Array;
  /** Per-wall elimination data, ELIMINATED_STRIDE numbers per wall. */
  eliminated: Float64Array;
  /** Per-wall Hessian blocks of the last assembly (wall-terms.ts), HESSIAN_BLOCK numbers per wall. */
  blocks: Float64Array;
  /** Inertia of the last factorisation. */
  inertia: Inertia;
  /** Rigid-motion rows of the last factorisation: 3 without a shift, 0 with one. */
  rigidRows: number;
  /** Negative pivots among the eliminated bulges of the last assembly. */
  negativePivots: number;
  /** Whether the last factorisation needed no pivoting. */
  plain: boolean;
}

/** Allocate the buffers for `problem`'s size. */
export function kktWorkspace(problem: ClusterProblem): KktWorkspace {
  const { junctions, walls, cells } = problem;
  const most = 2 * junctions + walls + cells + 3;
  return {
    matrix: new Float64Array(most * most),
    rhs: new Float64Array(most),
    pivots: new Int32Array(most),
    scratch: ldltScratch(most),
    slots: new Int32Array(walls),
    eliminated: new Float64Array(walls * ELIMINATED_STRIDE),
    blocks: new Float64Array(walls * HESSIAN_BLOCK),
    inertia: { negative: 0, zero: 0, positive: 0 },
    rigidRows: 3,
    negativePivots: 0,
    plain: true,
  };
}

/**
 * Assemble and factor the reduced step system at z (cache: the per-wall records of perimeterInto
 * (wall-terms.ts) at z; mu: pressures of the Hessian; lengthGrad: the perimeter's gradient; change: r, the area change
 * asked of each cell; rigid: the three rigid motions, 3 * 2V). Returns the order of the reduced system
 * and leaves its inertia in kw.inertia, counted with the eliminated pivots' signs, so that the step's
 * B is positive definite on the constraints' null space exactly when kw.inertia.negative = n +
 * kw.rigidRows and kw.inertia.zero = 0. The rigid rows are left out when tau > 0: the shift then makes
 * B positive definite on the translations, which the perimeter does not see, and the step's rigid part
 * is an irrelevant motion of the whole drawing.
 */
export function factorStepInto(
  problem: ClusterProblem, z: Float64Array, cache: Float64Array, mu: Float64Array, tau: number,
  shift: Float64Array, lengthGrad: Float64Array, change: Float64Array, rigid: Float64Array, kw: KktWorkspace,
  zeroTolerance: number,
): number {
  // first without pivoting (stable when no pivot is small); else assembled again and pivoted
  let n = assembleStepInto(problem, z, cache, mu, tau, shift, lengthGrad, change, rigid, kw);
  kw.plain = plainFactorInto(kw.matrix, n, kw.pivots, zeroTolerance, kw.inertia, kw.scratch);
  if (!kw.plain) {
    n = assembleStepInto(problem, z, cache, mu, tau, shift, lengthGrad, change, rigid, kw);
    pivotedFactorInto(kw.matrix, n, kw.pivots, zeroTolerance, kw.inertia, kw.scratch);
  }
  kw.inertia.negative += kw.negativePivots;
  return n;
}

/**
 * Assemble the reduced matrix (lower triangle) and right-hand side, as factorStepInto does before
 * factoring; returns the order. The phases: the walls' Hessian blocks and which bulges are eliminated
 * (blocksInto), then per wall its chord block, its area gradient's rows and its bulge (a column kept, or
 * eliminated by a rank-one update), then the shift and the gradient on the coordinates, the area changes
 * and the rigid rows.
 */
export function assembleStepInto(
  problem: ClusterProblem, z: Float64Array, cache: Float64Array, mu: Float64Array, tau: number,
  shift: Float64Array, lengthGrad: Float64Array, change: Float64Array, rigid: Float64Array, kw: KktWorkspace,
): number {
  const { junctions, walls, cells, starts, ends } = problem;
  const t0 = 2 * junctions;
  const { matrix, rhs, slots } = kw;
  const kept = blocksInto(problem, cache, mu, tau, shift, lengthGrad, kw);
  const p0 = t0 + kept;
  // with a shift, B is positive definite on the translations and needs no rigid rows
  const rigidRows = tau === 0 ? 3 : 0;
  const n = p0 + cells + rigidRows;
  kw.rigidRows = rigidRows;
  matrix.fill(0, 0, n * n);
  rhs.fill(0, 0, n);
  let negativePivots = 0;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    addChordBlock(problem, kw, n, k, jumpOf(problem, k, mu));
    // the wall's area gradient: dQ/da, dQ/db (Q added to the left cell, taken from the right one)
    // (at the junctions of z with the records' chords: the records must be z's, as descend keeps them)
    areaGradientInto(cache, k, z, a, b, AREA);
    addAreaRows(problem, matrix, n, p0, k, AREA);
    if (slots[k] >= 0) addKeptBulge(problem, kw, n, p0, k, AREA, tau, shift, lengthGrad);
    else if (eliminateBulge(problem, kw, n, p0, k)) negativePivots++;
  }
  // shift on the coordinates, perimeter gradient, area changes, rigid motions
  for (let i = 0; i < t0; i++) {
    matrix[i * n + i] += tau * shift[i];
    rhs[i] -= lengthGrad[i];
  }
  for (let f = 0; f < cells; f++) rhs[p0 + f] -= change[f];
  for (let m = 0; m < rigidRows; m++) {
    const row = (p0 + cells + m) * n;
    const o = m * t0;
    for (let i = 0; i < t0; i++) matrix[row + i] = rigid[o + i];
  }
  kw.negativePivots = negativePivots;
  return n;
}

// Wall k's chord block (from kw.blocks) at its junctions' rows, with the cross-product terms of its
// area at pressure jump d (the matrix of order n).
function addChordBlock(problem: ClusterProblem, kw: KktWorkspace, n: number, k: number, d: number): void {
  const { matrix, blocks } = kw;
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  const o = k * HESSIAN_BLOCK;
  const mxx = blocks[o + M_XX];
  const mxy = blocks[o + M_XY];
  const myy = blocks[o + M_YY];
  const half = 0.5 * d;
  addLower(matrix, n, a, a, mxx);
  addLower(matrix, n, a + 1, a, mxy);
  addLower(matrix, n, a + 1, a + 1, myy);
  addLower(matrix, n, b, b, mxx);
  addLower(matrix, n, b + 1, b, mxy);
  addLower(matrix, n, b + 1, b + 1, myy);
  addLower(matrix, n, b, a, -mxx);
  addLower(matrix, n, b, a + 1, half - mxy);
  addLower(matrix, n, b + 1, a, -mxy - half);
  addLower(matrix, n, b + 1, a + 1, -myy);
}

// Wall k's area gradient q (an area block) in the pressure rows (from p0) of its two cells: -q in the
// left cell's row, +q in the right one's.
function addAreaRows(problem: ClusterProblem, matrix: Float64Array, n: number, p0: number, k: number, q: Float64Array): void {
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  const l = problem.lefts[k];
  const r = problem.rights[k];
  const qax = q[Q_AX];
  const qay = q[Q_AY];
  const qbx = q[Q_BX];
  const qby = q[Q_BY];
  if (l >= 0) {
    const row = p0 + l;
    addLower(matrix, n, row, a, -qax);
    addLower(matrix, n, row, a + 1, -qay);
    addLower(matrix, n, row, b, -qbx);
    addLower(matrix, n, row, b + 1, -qby);
  }
  if (r >= 0) {
    const row = p0 + r;
    addLower(matrix, n, row, a, qax);
    addLower(matrix, n, row, a + 1, qay);
    addLower(matrix, n, row, b, qbx);
    addLower(matrix, n, row, b + 1, qby);
  }
}

// A kept bulge of wall k: its column as it is (chord terms, its shifted pivot, its cells' area terms
// from the area block q) and its right-hand side.
function addKeptBulge(
  problem: ClusterProblem, kw: KktWorkspace, n: number, p0: number, k: number, q: Float64Array, tau: number,
  shift: Float64Array, lengthGrad: Float64Array,
): void {
  const { matrix, rhs, blocks, slots } = kw;
  const t0 = 2 * problem.junctions;
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  const l = problem.lefts[k];
  const r = problem.rights[k];
  const slot = slots[k];
  const o = k * HESSIAN_BLOCK;
  const mxt = blocks[o + M_XT];
  const myt = blocks[o + M_YT];
  const qt = -q[Q_T];
  addLower(matrix, n, slot, a, -mxt);
  addLower(matrix, n, slot, a + 1, -myt);
  addLower(matrix, n, slot, b, mxt);
  addLower(matrix, n, slot, b + 1, myt);
  addLower(matrix, n, slot, slot, blocks[o + M_TT] + tau * shift[t0 + k]);
  if (l >= 0) addLower(matrix, n, p0 + l, slot, qt);
  if (r >= 0) addLower(matrix, n, p0 + r, slot, -qt);
  rhs[slot] = -lengthGrad[t0 + k];
}

// An eliminated bulge of wall k: subtract u u^T / pivot from its six rows and columns (junction
// coordinates, its cells' pressures) and u rhs_t / pivot from the right-hand side. Returns whether its
// pivot is negative (it counts in the inertia).
function eliminateBulge(problem: ClusterProblem, kw: KktWorkspace, n: number, p0: number, k: number): boolean {
  const { matrix, rhs, eliminated } = kw;
  const l = problem.lefts[k];
  const r = problem.rights[k];
  const e = k * ELIMINATED_STRIDE;
  const pivot = eliminated[e + E_PIVOT];
  const idx0 = 2 * problem.starts[k];
  const idx1 = idx0 + 1;
  const idx2 = 2 * problem.ends[k];
  const idx3 = idx2 + 1;
  const idx4 = l >= 0 ? p0 + l : -1;
  const idx5 = r >= 0 ? p0 + r : -1;
  const u0 = eliminated[e + E_U];
  const u1 = eliminated[e + E_U + 1];
  const u2 = eliminated[e + E_U + 2];
  const u3 = eliminated[e + E_U + 3];
  const u4 = eliminated[e + E_U + 4];
  const u5 = eliminated[e + E_U + 5];
  const inv = 1 / pivot;
  const s = eliminated[e + E_RHS] * inv;
  rhs[idx0] -= u0 * s;
  rhs[idx1] -= u1 * s;
  rhs[idx2] -= u2 * s;
  rhs[idx3] -= u3 * s;
  if (idx4 >= 0) rhs[idx4] -= u4 * s;
  if (idx5 >= 0) rhs[idx5] -= u5 * s;
  const us = U;
  const ids = IDS;
  us[0] = u0; us[1] = u1; us[2] = u2; us[3] = u3; us[4] = u4; us[5] = u5;
  ids[0] = idx0; ids[1] = idx1; ids[2] = idx2; ids[3] = idx3; ids[4] = idx4; ids[5] = idx5;
  for (let i = 0; i < 6; i++) {
    const ii = ids[i];
    if (ii < 0) continue;
    const ui = us[i] * inv;
    for (let j = 0; j <= i; j++) {
      const jj = ids[j];
      if (jj >= 0) addLower(matrix, n, ii, jj, -ui * us[j]);
    }
  }
  return pivot < 0;
}

// The walls' Hessian blocks at pressures mu into kw.blocks, and which bulges stay: those whose pivot
// is small against their column get a slot, the others their elimination data. Returns how many stay.
function blocksInto(
  problem: ClusterProblem, cache: Float64Array, mu: Float64Array, tau: number, shift: Float64Array,
  lengthGrad: Float64Array, kw: KktWorkspace,
): number {
  const { junctions, walls } = problem;
  const t0 = 2 * junctions;
  const { slots, eliminated, blocks } = kw;
  // which bulges stay: those whose pivot is small against their column
  let kept = 0;
  for (let k = 0; k < walls; k++) {
    const o = k * HESSIAN_BLOCK;
    wallHessianInto(cache, k, jumpOf(problem, k, mu), blocks, o);
    const mxt = blocks[o + M_XT];
    const myt = blocks[o + M_YT];
    // -dA_l/dt = c^2 h'
    const c = cache[k * WALL_STRIDE + W_C];
    const qt = c * c * cache[k * WALL_STRIDE + W_H1];
    const pivot = blocks[o + M_TT] + tau * shift[t0 + k];
    const column = Math.max(Math.abs(mxt), Math.abs(myt), Math.abs(qt));
    if (Math.abs(pivot) >= ELIMINATE * column && pivot !== 0) {
      slots[k] = -1;
      const e = k * ELIMINATED_STRIDE;
      eliminated[e + E_PIVOT] = pivot;
      eliminated[e + E_RHS] = -lengthGrad[t0 + k];
      eliminated[e + E_U] = -mxt;
      eliminated[e + E_U + 1] = -myt;
      eliminated[e + E_U + 2] = mxt;
      eliminated[e + E_U + 3] = myt;
      // -dA_l/dt = -(-c^2 h') for the left cell, +(-c^2 h') for the right one
      eliminated[e + E_U + 4] = qt;
      eliminated[e + E_U + 5] = -qt;
    } else {
      slots[k] = t0 + kept++;
    }
  }
  return kept;
}

// Add v at (i, j) of a symmetric n x n matrix kept in its lower triangle.
function addLower(matrix: Float64Array, n: number, i: number, j: number, v: number): void {
  if (i >= j) matrix[i * n + j] += v;
  else matrix[j * n + i] += v;
}

/**
 * Solve the factored reduced system and write the step: d (geometry, 2V + E) and lambda (n new
 * pressures). `order` is factorStepInto's return value.
 */
export function solveStepInto(
  problem: ClusterProblem, kw: KktWorkspace, order: number, d: Float64Array, lambda: Float64Array,
): void {
  const { junctions, walls, cells, starts, ends, lefts, rights } = problem;
  const t0 = 2 * junctions;
  const { matrix, rhs, pivots, slots, eliminated } = kw;
  if (kw.plain) plainSolveInto(matrix, order, rhs);
  else symmetricSolveInto(matrix, order, pivots, rhs);
  const p0 = order - cells - kw.rigidRows;
  for (let i = 0; i < t0; i++) d[i] = rhs[i];
  for (let f = 0; f < cells; f++) lambda[f] = rhs[p0 + f];
  for (let k = 0; k < walls; k++) {
    const slot = slots[k];
    if (slot >= 0) {
      d[t0 + k] = rhs[slot];
      continue;
    }
    // back-substitute: dt = (rhs_t - u . y) / pivot
    const e = k * ELIMINATED_STRIDE;
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const l = lefts[k];
    const r = rights[k];
    let s = eliminated[e + E_RHS];
    s -= eliminated[e + E_U] * rhs[a] + eliminated[e + E_U + 1] * rhs[a + 1];
    s -= eliminated[e + E_U + 2] * rhs[b] + eliminated[e + E_U + 3] * rhs[b + 1];
    if (l >= 0) s -= eliminated[e + E_U + 4] * rhs[p0 + l];
    if (r >= 0) s -= eliminated[e + E_U + 5] * rhs[p0 + r];
    d[t0 + k] = s / eliminated[e + E_PIVOT];
  }
}

/**
 * The rigid motions of the junctions of state z as three orthonormal vectors of length 2V in rigid:
 * the unit translations along x and y and the unit rotation about the junctions' centroid.
 */
export function rigidInto(z: Float64Array, junctions: number, rigid: Float64Array): void {
  const t0 = 2 * junctions;
  const cx = junctionMean(z, junctions, 0);
  const cy = junctionMean(z, junctions, 1);
  let norm = 0;
  for (let v = 0; v < junctions; v++) norm += (z[2 * v] - cx) ** 2 + (z[2 * v + 1] - cy) ** 2;
  const tn = 1 / Math.sqrt(junctions);
  const rn = norm > 0 ? 1 / Math.sqrt(norm) : 0;
  for (let v = 0; v < junctions; v++) {
    rigid[2 * v] = tn;
    rigid[2 * v + 1] = 0;
    rigid[t0 + 2 * v] = 0;
    rigid[t0 + 2 * v + 1] = tn;
    rigid[2 * t0 + 2 * v] = -(z[2 * v + 1] - cy) * rn;
    rigid[2 * t0 + 2 * v + 1] = (z[2 * v] - cx) * rn;
  }
}

/**
 * Take the three rigid motions of `rigid` (rigidInto: orthonormal) out of the junction part of the step
 * d (a step solved without rigid rows may carry one, large where the shift is small).
 */
export function removeRigidInto(d: Float64Array, rigid: Float64Array, junctions: number): void {
  const t0 = 2 * junctions;
  for (let m = 0; m < 3; m++) {
    const o = m * t0;
    let dot = 0;
    for (let i = 0; i < t0; i++) dot += rigid[o + i] * d[i];
    for (let i = 0; i < t0; i++) d[i] -= dot * rigid[o + i];
  }
}

/**
 * d^T B d for B = H(mu) + tau S of factorStepInto at z (cache as there), wall by wall: the curvature of
 * the step's model along d (2V + E numbers).
 */
export function stepCurvature(
  problem: ClusterProblem, cache: Float64Array, mu: Float64Array, tau: number, shift: Float64Array, d: Float64Array,
): number {
  const { junctions, walls, starts, ends } = problem;
  const t0 = 2 * junctions;
  const m = BLOCK;
  let sum = 0;
  for (let i = 0, dim = t0 + walls; i < dim; i++) sum += tau * shift[i] * d[i] * d[i];
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const p = jumpOf(problem, k, mu);
    wallHessianInto(cache, k, p, m);
    const mxx = m[M_XX];
    const mxy = m[M_XY];
    const myy = m[M_YY];
    const mxt = m[M_XT];
    const myt = m[M_YT];
    const mtt = m[M_TT];
    // the chord moves by e = d_b - d_a; the cross-product term couples a and b antisymmetrically
    const ex = d[b] - d[a];
    const ey = d[b + 1] - d[a + 1];
    const dt = d[t0 + k];
    sum += mxx * ex * ex + 2 * mxy * ex * ey + myy * ey * ey + 2 * dt * (mxt * ex + myt * ey) + mtt * dt * dt;
    // -D X with X = (a x b) / 2: d^T (d2X) d = 2 (da_x db_y - da_y db_x) / 2
    sum -= p * (d[a] * d[b + 1] - d[a + 1] * d[b]);
  }
  return sum;
}
