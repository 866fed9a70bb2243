// Reference for the tests: the residual and the Jacobian of the full equilibrium (KKT) system, every
// unknown kept, built on the solver's per-wall kernel (src/solver/wall-terms.ts). The relaxer itself
// never forms them (it eliminates the bulges, kkt.ts); the tests check its steps and its inertia
// against them, and the kernel's derivatives against their central differences.
//
// Unknowns: the state z of src/solver/problem.ts. Lagrangian (design, section 5 of the mathematics):
// F = sum_k L_k - sum_f p_f (A_f - T_f). The residual is the gradient of F,
//   out[z-part] = dF/d(x, t),   out[2V + E + f - 1] = dF/dp_f = T_f - A_f,
// and the Jacobian is F's Hessian [[H, -J^T], [-J, 0]], bordered by three rows fixing the rigid motions
// of the step (two translations and the rotation about the centroid, kkt.ts rigidInto): it is
// symmetric, of order size + 3. dphi/dt = 0 is the Laplace-Young law 2 sin t / c = p_r - p_l; dF/dx = 0
// then is Plateau's tangent balance (the end terms of the area variation cancel around each face).

import { rigidInto } from '../../src/solver/kkt.ts';
import type { ClusterProblem } from '../../src/solver/problem.ts';
import {
  AREA_BLOCK, HESSIAN_BLOCK, M_TT, M_XT, M_XX, M_XY, M_YT, M_YY, Q_AX, Q_AY, Q_BX, Q_BY, Q_T, WALL_STRIDE, W_C, W_H1,
  W_LT, W_LX, W_LY, W_Q, areaGradientInto, perimeterInto, wallHessianInto,
} from '../../src/solver/wall-terms.ts';

export { problemOf } from '../../src/solver/problem.ts';

function jump(problem: ClusterProblem, z: Float64Array, k: number): number {
  const p0 = 2 * problem.junctions + problem.walls;
  const l = problem.lefts[k];
  const r = problem.rights[k];
  return (l >= 0 ? z[p0 + l] : 0) - (r >= 0 ? z[p0 + r] : 0);
}

/**
 * Write the residual (gradient of the Lagrangian) at z for normalised targets into out[0..size).
 * Returns the largest scaled entry (Infinity when a value is not finite): junction rows as they are
 * (at Laplace-Young balance they are the sums of unit tangents), bulge rows as the relative
 * Laplace-Young error |kappa - (p_r - p_l)| / (1 + |p_l - p_r|), area rows relative to the target.
 */
export function residualInto(problem: ClusterProblem, z: Float64Array, targets: Float64Array, out: Float64Array): number {
  const { walls, starts, ends, cells, junctions, size } = problem;
  const t0 = 2 * junctions;
  const p0 = t0 + walls;
  const cache = new Float64Array(walls * WALL_STRIDE);
  const areas = new Float64Array(cells);
  perimeterInto(problem, z, cache, areas);
  out.fill(0, 0, size);
  let worst = 0;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const d = jump(problem, z, k);
    // grad phi = grad L - D grad Q, from the wall's record
    const w = k * WALL_STRIDE;
    const q = w + W_Q;
    out[a] += -cache[w + W_LX] - d * cache[q + Q_AX];
    out[a + 1] += -cache[w + W_LY] - d * cache[q + Q_AY];
    out[b] += cache[w + W_LX] - d * cache[q + Q_BX];
    out[b + 1] += cache[w + W_LY] - d * cache[q + Q_BY];
    const rt = cache[w + W_LT] - d * cache[q + Q_T];
    out[t0 + k] = rt;
    // dphi/dt = c^2 h' (kappa - (p_r - p_l)): its scaled form is the relative Laplace-Young error
    const c = cache[w + W_C];
    const ly = Math.abs(rt) / (c * c * cache[w + W_H1] * (1 + Math.abs(d)));
    if (!(ly <= worst)) worst = Number.isNaN(ly) ? Infinity : ly;
  }
  for (let f = 0; f < cells; f++) out[p0 + f] = targets[f] - areas[f];
  for (let i = 0; i < t0; i++) {
    const v = Math.abs(out[i]);
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  for (let f = 0; f < cells; f++) {
    const v = Math.abs(out[p0 + f]) / targets[f];
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  return worst;
}

/**
 * Write the bordered Jacobian (order size + 3, row-major) of the residual at z into jac. Rows and
 * columns size..size+2 hold the unit-norm rigid-motion constraints on a step: sum of x moves, sum of
 * y moves, and the infinitesimal rotation about the junctions' centroid.
 */
export function jacobianInto(problem: ClusterProblem, z: Float64Array, jac: Float64Array): void {
  const { walls, starts, ends, lefts, rights, junctions, cells, size, order } = problem;
  const t0 = 2 * junctions;
  const p0 = t0 + walls;
  jac.fill(0, 0, order * order);
  const cache = new Float64Array(walls * WALL_STRIDE);
  perimeterInto(problem, z, cache, new Float64Array(cells));
  const h = new Float64Array(HESSIAN_BLOCK);
  const q = new Float64Array(AREA_BLOCK);
  const m = new Float64Array(25);
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const d = jump(problem, z, k);
    wallHessianInto(cache, k, d, h);
    const mxx = h[M_XX];
    const mxy = h[M_XY];
    const myy = h[M_YY];
    const mxt = h[M_XT];
    const myt = h[M_YT];
    // local layout (ax, ay, bx, by, t)
    m.set([
      mxx, mxy, -mxx, -mxy, -mxt,
      mxy, myy, -mxy, -myy, -myt,
      -mxx, -mxy, mxx, mxy, mxt,
      -mxy, -myy, mxy, myy, myt,
      -mxt, -myt, mxt, myt, h[M_TT],
    ]);
    // cross-product term -D X: d2X/(dax dby) = 1/2, d2X/(day dbx) = -1/2
    m[3] -= 0.5 * d; m[15] -= 0.5 * d;
    m[7] += 0.5 * d; m[11] += 0.5 * d;
    const index = [a, a + 1, b, b + 1, t0 + k];
    for (let i = 0; i < 5; i++) {
      const row = index[i] * order;
      for (let j = 0; j < 5; j++) jac[row + index[j]] += m[i * 5 + j];
    }
    // mixed with pressures: d2F/(dz dp_l) = -dQ/dz, d2F/(dz dp_r) = +dQ/dz
    areaGradientInto(cache, k, z, a, b, q);
    const dq = [q[Q_AX], q[Q_AY], q[Q_BX], q[Q_BY], q[Q_T]];
    for (let side = 0; side < 2; side++) {
      const f = side === 0 ? lefts[k] : rights[k];
      if (f < 0) continue;
      const s = side === 0 ? -1 : 1;
      const col = p0 + f;
      for (let i = 0; i < 5; i++) {
        jac[index[i] * order + col] += s * dq[i];
        jac[col * order + index[i]] += s * dq[i];
      }
    }
  }
  // rigid-motion border: translations and rotation about the centroid, each of unit norm
  const rigid = new Float64Array(3 * t0);
  rigidInto(z, junctions, rigid);
  for (let r = 0; r < 3; r++) {
    for (let i = 0; i < t0; i++) {
      const v = rigid[r * t0 + i];
      if (v === 0) continue;
      jac[(size + r) * order + i] = v;
      jac[i * order + size + r] = v;
    }
  }
}
