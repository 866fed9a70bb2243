// solver stage: the augmented penalty energy of a cluster drawing and its gradient.
//
// Over the geometry unknowns y = (junction coordinates, bulges) (the first 2V + E entries of the state
// z of problem.ts), with fixed multipliers m_f, a penalty weight kappa and targets T_f:
//
//   Phi(y) = sum_k L_k - sum_f m_f (A_f - T_f) + (kappa / 2) sum_f (A_f - T_f)^2 / T_f.
//
// Its gradient is that of the Lagrangian with the pressure estimates mu_f = m_f - kappa (A_f - T_f) / T_f,
//   grad Phi = sum_k grad L_k - sum_f mu_f grad A_f,
// (the augmented Lagrangian of "Numerical Optimization", 2nd ed., 2006, §17.3). Phi is a real energy
// (perimeter plus an elastic area term), so a descent on it cannot stall at a non-minimising point
// the way a residual norm can.
//
// The per-wall terms come from the records of wall-terms.ts, filled by its perimeterInto once per
// iterate and read again by the step's assembly (kkt.ts).

import { choleskyInto, choleskySolveInto } from '../linalg/cholesky.ts';
import type { ClusterProblem } from './problem.ts';
import * as terms from './wall-terms.ts';

// NOTE: local copies of the kernel's bindings (under some loaders, tsx, every use of an import is a
// getter call).
const { Q_AX, Q_AY, Q_BX, Q_BY, Q_T, WALL_STRIDE, W_C, W_H1, W_LT, W_LX, W_LY, W_Q, jumpOf } = terms;

/** Phi(y; m) from the perimeter and the cell areas of perimeterInto. */
export function meritOf(
  perimeter: number, areas: Float64Array, targets: Float64Array, mult: Float64Array, kappa: number, cells: number,
): number {
  let energy = perimeter;
  for (let i = 0; i < cells; i++) {
    const e = areas[i] - targets[i];
    energy += e * ((0.5 * kappa * e) / targets[i] - mult[i]);
  }
  return energy;
}

/**
 * Pressure estimates mu_f = m_f - kappa (A_f - T_f) / T_f into mu, grad Phi into grad[0 .. 2V + E) and
 * the perimeter's gradient into lengthGrad, from the cache and areas of the last perimeterInto (wall-terms.ts) at z.
 * Returns the largest |entry| of grad Phi.
 */
export function penaltyGradientInto(
  problem: ClusterProblem, z: Float64Array, targets: Float64Array, mult: Float64Array, kappa: number,
  cache: Float64Array, areas: Float64Array, mu: Float64Array, grad: Float64Array, lengthGrad: Float64Array,
): number {
  const { walls, starts, ends, cells, junctions } = problem;
  const t0 = 2 * junctions;
  for (let i = 0; i < cells; i++) mu[i] = mult[i] - (kappa * (areas[i] - targets[i])) / targets[i];
  grad.fill(0, 0, t0 + walls);
  lengthGrad.fill(0, 0, t0 + walls);
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const d = jumpOf(problem, k, mu);
    // grad (L - D Q) of the wall, from its record
    const w = k * WALL_STRIDE;
    const q = w + W_Q;
    const c = cache[w + W_C];
    const lx = cache[w + W_LX];
    const ly = cache[w + W_LY];
    const lt = cache[w + W_LT];
    lengthGrad[a] -= lx;
    lengthGrad[a + 1] -= ly;
    lengthGrad[b] += lx;
    lengthGrad[b + 1] += ly;
    lengthGrad[t0 + k] = lt;
    grad[a] += -lx - d * cache[q + Q_AX];
    grad[a + 1] += -ly - d * cache[q + Q_AY];
    grad[b] += lx - d * cache[q + Q_BX];
    grad[b + 1] += ly - d * cache[q + Q_BY];
    grad[t0 + k] = lt + d * c * c * cache[w + W_H1];
  }
  let worst = 0;
  for (let i = 0, m = t0 + walls; i < m; i++) {
    const v = Math.abs(grad[i]);
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  return worst;
}

/**
 * The largest entry of the last penaltyGradientInto's gradient, scaled as the residual is judged: junction rows
 * as they are (at Laplace-Young balance they are sums of unit tangents), bulge rows as the relative
 * Laplace-Young error |kappa - (p_r - p_l)| / (1 + |p_l - p_r|) (they are c^2 h' times the curvature
 * error, which the raw gradient of a short wall would hide).
 */
export function scaledGradientMax(problem: ClusterProblem, cache: Float64Array, mu: Float64Array, grad: Float64Array): number {
  const { walls, junctions } = problem;
  const t0 = 2 * junctions;
  let worst = 0;
  for (let i = 0; i < t0; i++) {
    const v = Math.abs(grad[i]);
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  for (let k = 0; k < walls; k++) {
    const w = k * WALL_STRIDE;
    const c = cache[w + W_C];
    const d = jumpOf(problem, k, mu);
    const v = Math.abs(grad[t0 + k]) / (c * c * cache[w + W_H1] * (1 + Math.abs(d)));
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  return worst;
}

/**
 * Least-squares pressures at z: the mu minimising |grad P - sum mu_f grad A_f| (the pressures that best
 * explain the present shape; at an equilibrium they are its pressures). Reads the cache of the last
 * perimeterInto at z and the perimeter gradient; `cellGrad` is scratch of n (2V + E), `normal` of n^2,
 * `pivots` and `row` of n. Writes mu; returns false when the area gradients are dependent.
 */
export function fitPressuresInto(
  problem: ClusterProblem, z: Float64Array, cache: Float64Array, lengthGrad: Float64Array, mu: Float64Array,
  cellGrad: Float64Array, normal: Float64Array, pivots: Float64Array, row: Float64Array,
): boolean {
  const { walls, starts, ends, lefts, rights, cells, junctions, cellVarStarts, cellVars } = problem;
  const t0 = 2 * junctions;
  const dim = t0 + walls;
  cellGrad.fill(0, 0, cells * dim);
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const q = k * WALL_STRIDE + W_Q;
    const qax = cache[q + Q_AX];
    const qay = cache[q + Q_AY];
    const qbx = cache[q + Q_BX];
    const qby = cache[q + Q_BY];
    const qt = cache[q + Q_T];
    for (let side = 0; side < 2; side++) {
      const f = side === 0 ? lefts[k] : rights[k];
      if (f < 0) continue;
      const s = side === 0 ? 1 : -1;
      const o = f * dim;
      cellGrad[o + a] += s * qax;
      cellGrad[o + a + 1] += s * qay;
      cellGrad[o + b] += s * qbx;
      cellGrad[o + b + 1] += s * qby;
      cellGrad[o + t0 + k] += s * qt;
    }
  }
  // normal equations (J J^T) mu = J grad P over each cell's own unknowns
  for (let f = 0; f < cells; f++) {
    const o = f * dim;
    let s = 0;
    for (let p = cellVarStarts[f]; p < cellVarStarts[f + 1]; p++) s += cellGrad[o + cellVars[p]] * lengthGrad[cellVars[p]];
    mu[f] = s;
    for (let g = 0; g <= f; g++) {
      const q = g * dim;
      let d = 0;
      for (let p = cellVarStarts[f]; p < cellVarStarts[f + 1]; p++) d += cellGrad[o + cellVars[p]] * cellGrad[q + cellVars[p]];
      normal[f * cells + g] = d;
    }
  }
  if (!choleskyInto(normal, cells, pivots, row, 1e-14)) return false;
  choleskySolveInto(normal, cells, pivots, mu);
  return true;
}
