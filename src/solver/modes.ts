// solver stage: saddles by eigenvector following (mode following) from a known equilibrium.
//
// At a stable equilibrium every direction tangent to the area constraints (less the rigid motions)
// curves up. Walking uphill along the lowest such direction while minimising along all the others
// leads over the lowest pass out of the basin, to an index-1 saddle; walking uphill along two of them
// leads to index-2 saddles. Each step ("eigenvector following" of "Walking on potential energy
// surfaces", J. Chem. Phys. 79 (1983), and the partitioned rational-function step of "An algorithm for
// the location of transition states", J. Comput. Chem. 7 (1986)):
//
// - the Hessian H of the Lagrangian P - p . A in the geometry y (junctions, bulges) at the least-squares
//   pressures p, by central differences of its exact gradient (penalty.ts);
// - Q an orthonormal basis of the area gradients and the rigid motions; on the tangent space the
//   eigenpairs of P H P (P = I - Q^T Q), found as those of P H P + sigma Q^T Q with sigma above the
//   whole spectrum, so that the tangent ones come first (linalg/symmetric-eigen.ts, Jacobi);
// - the followed modes (at the first step the asked ones, then the eigenvectors most parallel to the
//   last followed ones) get the uphill step -g_i / (lambda_i - l_p), l_p = lambda_i / 2 +
//   sqrt(lambda_i^2 / 4 + g_i^2), the others the Newton step -g_i / |lambda_i| (zero modes none: a lens
//   slides at constant perimeter), the whole cut to a trust radius;
// - then the areas put back along the area gradients (the least-norm step for the linearised errors).
//
// It ends when the tangent gradient is small and the curvature shows as many negative directions as
// modes followed; the caller polishes with Newton's method (roots.ts) and certifies (newton.ts).

import { gapOf } from '../arcs/arc.ts';
import { choleskySolveInto } from '../linalg/cholesky.ts';
import { symmetricEigenInto } from '../linalg/symmetric-eigen.ts';
import { rigidInto } from './kkt.ts';
import { fitPressuresInto, penaltyGradientInto } from './penalty.ts';
import type { ClusterProblem } from './problem.ts';
import { ordersHold } from './verdict.ts';
import { advanceInto, advanceWall, perimeterInto } from './wall-terms.ts';
import type { Workspace } from './workspace.ts';

/** How a mode following ended. */
export interface ModeReport {
  /** The tangent gradient fell below HANDOVER with the asked number of negative curvatures. */
  converged: boolean;
  /** Steps taken. */
  iterations: number;
}

// Curvatures below FLOOR of the largest are taken as FLOOR of it in the Newton step of the others.
const FLOOR = 1e-3;
// A path on which a wall's chord falls below COLLAPSING (normalised units) is given up.
const COLLAPSING = 1e-2;
// Central-difference step of the Hessian (normalised units).
const DIFFERENCE = 1e-5;
// Largest step (normalised units: lengths by sqrt(mean area)), and its least before giving up.
const TRUST = 0.08;
const LEAST_TRUST = 1e-4;
// Tangent curvatures at most ZERO_CURVATURE of the largest count as zero (not followed, not stepped).
const ZERO_CURVATURE = 1e-6;
// Tangent gradient at which Newton's method takes over, and area error (relative) asked with it.
const HANDOVER = 1e-3;
const AREA_HANDOVER = 1e-6;
// No chord may shrink below SHRINK of its length in one step; bulges stay BULGE_MARGIN inside +-pi (a
// wall's gap to a full circle, arcs/arc.ts gapOf, at least BULGE_MARGIN).
const SHRINK = 0.5;
const BULGE_MARGIN = 1e-3;

interface Scratch {
  dim: number;
  hessian: Float64Array;
  matrix: Float64Array;
  values: Float64Array;
  vectors: Float64Array;
  basis: Float64Array;
  gradient: Float64Array;
  plus: Float64Array;
  step: Float64Array;
  followed: Float64Array;
  row: Float64Array;
  base: Float64Array;
  errors: Float64Array;
}
const SCRATCH = new Map<string, Scratch>();

function scratchFor(dim: number, cells: number): Scratch {
  const key = `${dim}/${cells}`;
  let s = SCRATCH.get(key);
  if (!s) {
    s = {
      dim,
      hessian: new Float64Array(dim * dim),
      matrix: new Float64Array(dim * dim),
      values: new Float64Array(dim),
      vectors: new Float64Array(dim * dim),
      basis: new Float64Array((cells + 3) * dim),
      gradient: new Float64Array(dim),
      plus: new Float64Array(dim),
      step: new Float64Array(dim),
      followed: new Float64Array(2 * dim),
      row: new Float64Array(dim),
      base: new Float64Array(dim + cells),
      errors: new Float64Array(cells),
    };
    SCRATCH.set(key, s);
  }
  return s;
}

/**
 * Follow the tangent modes `modes` (positions among the non-zero tangent curvatures in ascending order,
 * one or two of them) uphill in the directions `signs` (+1 or -1 each) from the equilibrium in ws.z
 * (normalised units, as relax leaves it), minimising along the others, for at most `budget` steps. On
 * return ws.z holds the last state with its least-squares pressures. Uses the workspace's scratch
 * (cache, areas, mult, mu, grad, lengthGrad, cellGrad, normal, pivots, row, rigid).
 */
export function followModes(
  problem: ClusterProblem, ws: Workspace, modes: readonly number[], signs: readonly number[], budget: number,
  project: ((z: Float64Array) => void) | null = null,
): ModeReport {
  const { cells, junctions, walls } = problem;
  const t0 = 2 * junctions;
  const dim = t0 + walls;
  const s = scratchFor(dim, cells);
  const { z } = ws;
  let trust = TRUST;
  let iterations = 0;
  for (; iterations < budget; iterations++) {
    // pressures, the Lagrangian's gradient, the area gradients (ws.cellGrad) and their normal equations
    perimeterInto(problem, z, ws.cache, ws.areas);
    penaltyGradientInto(problem, z, ws.targets, ws.mult.fill(0), 0, ws.cache, ws.areas, ws.mu, ws.grad, ws.lengthGrad);
    if (!fitPressuresInto(problem, z, ws.cache, ws.lengthGrad, ws.mu, ws.cellGrad, ws.normal, ws.pivots, ws.row)) break;
    for (let f = 0; f < cells; f++) {
      z[dim + f] = ws.mu[f];
      ws.mult[f] = ws.mu[f];
      s.errors[f] = ws.targets[f] - ws.areas[f];
    }
    penaltyGradientInto(problem, z, ws.targets, ws.mult, 0, ws.cache, ws.areas, ws.mu, ws.grad, ws.lengthGrad);
    s.gradient.set(ws.grad.subarray(0, dim));
    const rank = normalBasisInto(problem, ws, s);
    hessianInto(problem, ws, s);
    // (the difference quotients overwrote the cache: back to z's terms, which the area step reads)
    perimeterInto(problem, z, ws.cache, ws.areas);
    const tangent = tangentSpectrumInto(s, rank);
    if (tangent <= 0) break;
    let largest = 0;
    for (let i = 0; i < tangent; i++) largest = Math.max(largest, Math.abs(s.values[i]));
    const zero = ZERO_CURVATURE * largest;
    // the tangent gradient and the curvature's negative directions
    let tangentGradient = 0;
    let negative = 0;
    for (let i = 0; i < tangent; i++) {
      tangentGradient = Math.max(tangentGradient, Math.abs(dot(s.vectors, i * dim, s.gradient, dim)));
      if (s.values[i] < -zero) negative++;
    }
    let areaError = 0;
    for (let f = 0; f < cells; f++) areaError = Math.max(areaError, Math.abs(s.errors[f]) / ws.targets[f]);
    if (iterations > 0 && negative >= modes.length && tangentGradient <= HANDOVER && areaError <= AREA_HANDOVER) {
      return { converged: true, iterations };
    }
    // the followed eigenvectors: at first the asked modes, then the most parallel to the last ones
    const picked = [-1, -1];
    for (let m = 0; m < modes.length; m++) {
      let best = -1;
      let bestValue = -1;
      if (iterations === 0) {
        let seen = 0;
        for (let i = 0; i < tangent && best < 0; i++) {
          if (Math.abs(s.values[i]) <= zero) continue;
          if (seen++ === modes[m]) best = i;
        }
        if (best < 0) return { converged: false, iterations };
      } else {
        for (let i = 0; i < tangent; i++) {
          if (i === picked[0] || Math.abs(s.values[i]) <= zero) continue;
          const o = Math.abs(dot(s.vectors, i * dim, s.followed.subarray(m * dim), dim));
          if (o > bestValue) {
            bestValue = o;
            best = i;
          }
        }
      }
      picked[m] = best;
      // keep the followed direction's sign: the asked one at first, then along the last one
      const o = best * dim;
      const sign = iterations === 0 ? signs[m] : Math.sign(dot(s.vectors, o, s.followed.subarray(m * dim), dim)) || 1;
      for (let i = 0; i < dim; i++) s.followed[m * dim + i] = sign * s.vectors[o + i];
    }
    // the step in the eigenbasis
    s.step.fill(0);
    for (let i = 0; i < tangent; i++) {
      const lambda = s.values[i];
      const g = dot(s.vectors, i * dim, s.gradient, dim);
      const m = i === picked[0] ? 0 : i === picked[1] ? 1 : -1;
      if (m >= 0) {
        const along = dot(s.followed, m * dim, s.gradient, dim);
        const lp = 0.5 * lambda + Math.sqrt(0.25 * lambda * lambda + along * along);
        // uphill along the followed direction (a full trust step where the slope is still nil)
        const up = Math.abs(along) > 1e-12 * (1 + Math.abs(lambda)) ? -along / (lambda - lp) : trust;
        for (let j = 0; j < dim; j++) s.step[j] += up * s.followed[m * dim + j];
        continue;
      }
      // (a zero curvature's direction, a sliding lens's, gets the step of the least curvature kept)
      const c = -g / Math.max(Math.abs(lambda), FLOOR * largest);
      for (let j = 0; j < dim; j++) s.step[j] += c * s.vectors[i * dim + j];
    }
    let norm = 0;
    for (let j = 0; j < dim; j++) norm += s.step[j] * s.step[j];
    norm = Math.sqrt(norm);
    if (!(norm > 0)) break;
    // the step within the trust radius, its areas restored; halved until it leaves a drawing
    s.base.set(z.subarray(0, dim + cells));
    let accepted = false;
    for (; trust >= LEAST_TRUST && !accepted; ) {
      const scale = Math.min(1, trust / norm);
      advanceInto(problem, s.base, scale, s.step, z);
      if (project !== null) project(z);
      restoreAreas(problem, ws, s);
      if (drawn(problem, z, s.base)) accepted = true;
      else trust *= 0.5;
    }
    if (!accepted) {
        z.set(s.base);
      break;
    }
    trust = Math.min(TRUST, 2 * trust);
  }
  return { converged: false, iterations };
}

function dot(a: Float64Array, o: number, b: Float64Array, n: number): number {
  let sum = 0;
  for (let i = 0; i < n; i++) sum += a[o + i] * b[i];
  return sum;
}

// An orthonormal basis (rows of s.basis) of the area gradients (ws.cellGrad) and the rigid motions,
// by modified Gram-Schmidt done twice; returns its size.
function normalBasisInto(problem: ClusterProblem, ws: Workspace, s: Scratch): number {
  const { cells, junctions } = problem;
  const t0 = 2 * junctions;
  const dim = s.dim;
  rigidInto(ws.z, junctions, ws.rigid);
  let rank = 0;
  for (let r = 0; r < cells + 3; r++) {
    const o = rank * dim;
    if (r < cells) s.basis.set(ws.cellGrad.subarray(r * dim, r * dim + dim), o);
    else {
      s.basis.fill(0, o, o + dim);
      s.basis.set(ws.rigid.subarray((r - cells) * t0, (r - cells + 1) * t0), o);
    }
    let before = 0;
    for (let i = 0; i < dim; i++) before += s.basis[o + i] ** 2;
    for (let pass = 0; pass < 2; pass++) {
      for (let q = 0; q < rank; q++) {
        let d = 0;
        for (let i = 0; i < dim; i++) d += s.basis[q * dim + i] * s.basis[o + i];
        for (let i = 0; i < dim; i++) s.basis[o + i] -= d * s.basis[q * dim + i];
      }
    }
    let after = 0;
    for (let i = 0; i < dim; i++) after += s.basis[o + i] ** 2;
    if (!(after > 1e-20 * before)) continue;
    const inv = 1 / Math.sqrt(after);
    for (let i = 0; i < dim; i++) s.basis[o + i] *= inv;
    rank++;
  }
  return rank;
}

// The Hessian of the Lagrangian at the pressures ws.mult, by central differences of its gradient,
// symmetrised, into s.hessian (z restored).
function hessianInto(problem: ClusterProblem, ws: Workspace, s: Scratch): void {
  const dim = s.dim;
  const { hessian } = s;
  const { z } = ws;
  for (let j = 0; j < dim; j++) {
    const kept = z[j];
    const wall = j - 2 * problem.junctions;
    z[j] = wall >= 0 ? advanceWall(problem, z, wall, DIFFERENCE) : kept + DIFFERENCE;
    perimeterInto(problem, z, ws.cache, ws.areas);
    penaltyGradientInto(problem, z, ws.targets, ws.mult, 0, ws.cache, ws.areas, ws.mu, ws.grad, ws.lengthGrad);
    s.plus.set(ws.grad.subarray(0, dim));
    z[j] = kept;
    z[j] = wall >= 0 ? advanceWall(problem, z, wall, -DIFFERENCE) : kept - DIFFERENCE;
    perimeterInto(problem, z, ws.cache, ws.areas);
    penaltyGradientInto(problem, z, ws.targets, ws.mult, 0, ws.cache, ws.areas, ws.mu, ws.grad, ws.lengthGrad);
    z[j] = kept;
    for (let i = 0; i < dim; i++) hessian[i * dim + j] = (s.plus[i] - ws.grad[i]) / (2 * DIFFERENCE);
  }
  for (let i = 0; i < dim; i++) {
    for (let j = 0; j < i; j++) {
      const v = 0.5 * (hessian[i * dim + j] + hessian[j * dim + i]);
      hessian[i * dim + j] = v;
      hessian[j * dim + i] = v;
    }
  }
}

// The eigenpairs of P H P + sigma Q^T Q (Q the `rank` rows of s.basis) into s.values (ascending) and
// s.vectors (rows); returns how many come first as the tangent ones (dim - rank), or -1 on failure.
function tangentSpectrumInto(s: Scratch, rank: number): number {
  const { dim, hessian, matrix, basis, row } = s;
  // M = H P: H - (H Q^T) Q, row by row
  let size = 0;
  for (let i = 0; i < dim * dim; i++) size += hessian[i] * hessian[i];
  const sigma = 2 * Math.sqrt(size) + 1;
  for (let i = 0; i < dim; i++) {
    const ri = i * dim;
    row.set(hessian.subarray(ri, ri + dim));
    for (let q = 0; q < rank; q++) {
      let d = 0;
      for (let j = 0; j < dim; j++) d += hessian[ri + j] * basis[q * dim + j];
      for (let j = 0; j < dim; j++) row[j] -= d * basis[q * dim + j];
    }
    matrix.set(row, ri);
  }
  // P (H P) column by column, plus sigma Q^T Q
  for (let j = 0; j < dim; j++) {
    for (let q = 0; q < rank; q++) {
      let d = 0;
      for (let i = 0; i < dim; i++) d += basis[q * dim + i] * matrix[i * dim + j];
      for (let i = 0; i < dim; i++) matrix[i * dim + j] -= basis[q * dim + i] * d;
    }
  }
  for (let q = 0; q < rank; q++) {
    for (let i = 0; i < dim; i++) {
      const bi = sigma * basis[q * dim + i];
      for (let j = 0; j < dim; j++) matrix[i * dim + j] += bi * basis[q * dim + j];
    }
  }
  for (let i = 0; i < dim; i++) {
    for (let j = 0; j < i; j++) {
      const v = 0.5 * (matrix[i * dim + j] + matrix[j * dim + i]);
      matrix[i * dim + j] = v;
      matrix[j * dim + i] = v;
    }
  }
  if (!symmetricEigenInto(matrix, dim, s.values, s.vectors, row)) return -1;
  return dim - rank;
}

// Move the geometry in ws.z along the area gradients at the step's start (ws.cellGrad, its normal
// equations factored in ws.normal) so that the areas meet their targets to first order: two corrections.
function restoreAreas(problem: ClusterProblem, ws: Workspace, s: Scratch): void {
  const { cells } = problem;
  const dim = s.dim;
  const { z } = ws;
  for (let pass = 0; pass < 2; pass++) {
    perimeterInto(problem, z, ws.cache, ws.areas);
    for (let f = 0; f < cells; f++) s.errors[f] = ws.targets[f] - ws.areas[f];
    if (!s.errors.every(Number.isFinite)) return;
    choleskySolveInto(ws.normal, cells, ws.pivots, s.errors);
    for (let f = 0; f < cells; f++) {
      const w = s.errors[f];
      const o = f * dim;
      advanceInto(problem, z, w, ws.cellGrad, z, o);
    }
  }
}

// Is z still a drawing of the arrangement: finite, bulges inside +-(pi - BULGE_MARGIN), no chord
// shrunk below SHRINK of its length at `base`, the junctions in order?
function drawn(problem: ClusterProblem, z: Float64Array, base: Float64Array): boolean {
  const { walls, starts, ends, junctions } = problem;
  const t0 = 2 * junctions;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const now = (z[b] - z[a]) ** 2 + (z[b + 1] - z[a + 1]) ** 2;
    const was = (base[b] - base[a]) ** 2 + (base[b + 1] - base[a + 1]) ** 2;
    if (!(gapOf(z[t0 + k]) > BULGE_MARGIN) || !(now >= SHRINK * SHRINK * was)) return false;
  }
  return ordersHold(problem, z);
}

// The shortest chord of z's walls.
function shortestChord(problem: ClusterProblem, z: Float64Array): number {
  const { walls, starts, ends } = problem;
  let least = Infinity;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    least = Math.min(least, Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]));
  }
  return least;
}
