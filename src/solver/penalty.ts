// solver stage: the augmented penalty energy of a cluster drawing and its gradient.
//
// Over the geometry unknowns y = (junction coordinates, bulges) (the first 2V + E entries of the state
// z of residual.ts), with fixed multipliers m_f, a penalty weight kappa and targets T_f:
//
//   Phi(y) = sum_k L_k - sum_f m_f (A_f - T_f) + (kappa / 2) sum_f (A_f - T_f)^2 / T_f.
//
// Its gradient is that of the Lagrangian with the pressure estimates mu_f = m_f - kappa (A_f - T_f) / T_f,
//   grad Phi = sum_k grad L_k - sum_f mu_f grad A_f,
// (the augmented Lagrangian of "Numerical Optimization", 2nd ed., 2006, §17.3). Phi is a real energy
// (perimeter plus an elastic area term), so a descent on it cannot stall at a non-minimising point
// the way a residual norm can.
//
// Per wall k from a to b with bulge t (arcs/arc.ts): L = c g(t), and the area it adds to its left cell
// is Q = (a x b)/2 - c^2 h(t) (residual.ts). The perimeter pass caches per-wall values (stride
// WALL_STRIDE) that the gradient pass and the step's assembly (kkt.ts) reuse.

import * as arc from '../arcs/arc.ts';
import { choleskyInto, choleskySolveInto } from '../linalg/cholesky.ts';
import type { ClusterProblem } from './residual.ts';

/** Offsets of the per-wall cache filled by penaltyEnergyInto. */
const W_DX = 0;
const W_DY = 1;
const W_C = 2;
const W_G = 3;
const W_G1 = 4;
const W_G2 = 5;
const W_H = 6;
const W_H1 = 7;
const W_H2 = 8;
/** Length of one wall's record in the cache buffer of penaltyEnergyInto. */
export const WALL_STRIDE = 9;

// NOTE: an imported binding is read through a getter at every use under some loaders (tsx); the hot
// per-wall code reads these local copies instead.
const factorsInto = arc.bulgeFactorsInto;
const G = arc.G;
const G1 = arc.G1;
const G2 = arc.G2;
const H = arc.H;
const H1 = arc.H1;
const H2 = arc.H2;
const FACTORS = new Float64Array(arc.BULGE_FACTORS);

/**
 * The perimeter at the geometry of z (normalised units); fills `cache` (WALL_STRIDE per wall) and
 * `areas` (n cell areas). NaN or Infinity when the state is not finite.
 */
export function perimeterInto(problem: ClusterProblem, z: Float64Array, cache: Float64Array, areas: Float64Array): number {
  const { walls, starts, ends, lefts, rights, cells, junctions } = problem;
  const t0 = 2 * junctions;
  const f = FACTORS;
  areas.fill(0, 0, cells);
  let length = 0;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const ax = z[a];
    const ay = z[a + 1];
    const bx = z[b];
    const by = z[b + 1];
    const dx = bx - ax;
    const dy = by - ay;
    const c2 = dx * dx + dy * dy;
    const c = Math.sqrt(c2);
    factorsInto(z[t0 + k], f);
    const w = k * WALL_STRIDE;
    cache[w + W_DX] = dx;
    cache[w + W_DY] = dy;
    cache[w + W_C] = c;
    cache[w + W_G] = f[G];
    cache[w + W_G1] = f[G1];
    cache[w + W_G2] = f[G2];
    cache[w + W_H] = f[H];
    cache[w + W_H1] = f[H1];
    cache[w + W_H2] = f[H2];
    length += c * f[G];
    const q = 0.5 * (ax * by - ay * bx) - c2 * f[H];
    const l = lefts[k];
    const r = rights[k];
    if (l >= 0) areas[l] += q;
    if (r >= 0) areas[r] -= q;
  }
  return length;
}

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
 * the perimeter's gradient into lengthGrad, from the cache and areas of the last penaltyEnergyInto at z.
 * Returns the largest |entry| of grad Phi.
 */
export function penaltyGradientInto(
  problem: ClusterProblem, z: Float64Array, targets: Float64Array, mult: Float64Array, kappa: number,
  cache: Float64Array, areas: Float64Array, mu: Float64Array, grad: Float64Array, lengthGrad: Float64Array,
): number {
  const { walls, starts, ends, lefts, rights, cells, junctions } = problem;
  const t0 = 2 * junctions;
  for (let i = 0; i < cells; i++) mu[i] = mult[i] - (kappa * (areas[i] - targets[i])) / targets[i];
  grad.fill(0, 0, t0 + walls);
  lengthGrad.fill(0, 0, t0 + walls);
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const w = k * WALL_STRIDE;
    const dx = cache[w + W_DX];
    const dy = cache[w + W_DY];
    const c = cache[w + W_C];
    const h = cache[w + W_H];
    const l = lefts[k];
    const r = rights[k];
    const d = (l >= 0 ? mu[l] : 0) - (r >= 0 ? mu[r] : 0);
    // Is the chord zero? Its direction is undefined; the length gradient is taken as zero.
    const gc = c > 0 ? cache[w + W_G] / c : 0;
    const lx = gc * dx;
    const ly = gc * dy;
    const lt = c * cache[w + W_G1];
    lengthGrad[a] -= lx;
    lengthGrad[a + 1] -= ly;
    lengthGrad[b] += lx;
    lengthGrad[b + 1] += ly;
    lengthGrad[t0 + k] = lt;
    grad[a] += -lx - d * (0.5 * z[b + 1] + 2 * h * dx);
    grad[a + 1] += -ly - d * (-0.5 * z[b] + 2 * h * dy);
    grad[b] += lx - d * (-0.5 * z[a + 1] - 2 * h * dx);
    grad[b + 1] += ly - d * (0.5 * z[a] - 2 * h * dy);
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
 * The largest entry of the last penaltyGradientInto's gradient in residualInto's scaling: junction rows
 * as they are (at Laplace-Young balance they are sums of unit tangents), bulge rows as the relative
 * Laplace-Young error |kappa - (p_r - p_l)| / (1 + |p_l - p_r|) (they are c^2 h' times the curvature
 * error, which the raw gradient of a short wall would hide).
 */
export function scaledGradientMax(problem: ClusterProblem, cache: Float64Array, mu: Float64Array, grad: Float64Array): number {
  const { walls, lefts, rights, junctions } = problem;
  const t0 = 2 * junctions;
  let worst = 0;
  for (let i = 0; i < t0; i++) {
    const v = Math.abs(grad[i]);
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  for (let k = 0; k < walls; k++) {
    const w = k * WALL_STRIDE;
    const c = cache[w + W_C];
    const l = lefts[k];
    const r = rights[k];
    const d = (l >= 0 ? mu[l] : 0) - (r >= 0 ? mu[r] : 0);
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
    const w = k * WALL_STRIDE;
    const dx = cache[w + W_DX];
    const dy = cache[w + W_DY];
    const c = cache[w + W_C];
    const h = cache[w + W_H];
    const qax = 0.5 * z[b + 1] + 2 * h * dx;
    const qay = -0.5 * z[b] + 2 * h * dy;
    const qbx = -0.5 * z[a + 1] - 2 * h * dx;
    const qby = 0.5 * z[a] - 2 * h * dy;
    const qt = -c * c * cache[w + W_H1];
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
