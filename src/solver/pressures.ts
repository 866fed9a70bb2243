// solver stage: the pressures that best explain the walls' curvatures (the Laplace-Young law in the
// least-squares sense), the pressures of an answer.
//
// At an equilibrium every wall's tension times its curvature 2 sin t / c equals the pressure jump
// p_r - p_l across it (design.md §5 and §8), so the pressures can be read off the geometry. The descent's own estimates come from
// the gradient of the Lagrangian, whose rounding floor lies far above the curvatures' when a wall is
// near a full circle (the outer wall of a large cell beside a tiny one: descent.ts); read from the
// curvatures, the pressures are as good as the geometry. Each wall's equation is weighted by
// 1 / (|curvature| + 1/sqrt(A))^2, A the smaller target area of its two sides, as the certificate
// measures it (so the walls of tiny cells are weighed at their own scale, and the normal equations keep
// the conditioning of each scale apart), and the normal equations
// (n x n, positive definite: every cell is connected to the outside through walls) are solved by
// Cholesky's method.

import { bulgeSine } from '../arcs/arc.ts';
import { choleskyInto, choleskySolveInto } from '../linalg/cholesky.ts';
import type { ClusterProblem } from './problem.ts';

/**
 * Write into `pressures` (length n) the least-squares pressures of the curvatures of state z
 * (normalised units, targets the normalised target areas); `normal` (n^2), `pivots`, `row` and `rhs` (n) are scratch. Returns false,
 * leaving `pressures` untouched, when the normal equations are not positive definite or not finite.
 */
export function curvaturePressuresInto(
  problem: ClusterProblem, z: Float64Array, targets: Float64Array, pressures: Float64Array, normal: Float64Array, pivots: Float64Array,
  row: Float64Array, rhs: Float64Array,
): boolean {
  const { cells, junctions, walls, starts, ends, lefts, rights, tensions } = problem;
  const t0 = 2 * junctions;
  normal.fill(0, 0, cells * cells);
  rhs.fill(0, 0, cells);
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
    // s kappa = p_r - p_l (s the wall's tension)
    const s = tensions === null ? 1 : tensions[k];
    const kappa = (s * (2 * bulgeSine(z[t0 + k]))) / c;
    const l = lefts[k];
    const r = rights[k];
    const local = Math.min(l >= 0 ? targets[l] : Infinity, r >= 0 ? targets[r] : Infinity);
    const w = 1 / (Math.abs(kappa) + s / Math.sqrt(local)) ** 2;
    if (r >= 0) {
      normal[r * cells + r] += w;
      rhs[r] += w * kappa;
    }
    if (l >= 0) {
      normal[l * cells + l] += w;
      rhs[l] -= w * kappa;
    }
    if (l >= 0 && r >= 0) {
      normal[Math.max(l, r) * cells + Math.min(l, r)] -= w;
    }
  }
  if (!choleskyInto(normal, cells, pivots, row, 1e-14)) return false;
  choleskySolveInto(normal, cells, pivots, rhs);
  for (let f = 0; f < cells; f++) if (!Number.isFinite(rhs[f])) return false;
  pressures.set(rhs.subarray(0, cells));
  return true;
}
