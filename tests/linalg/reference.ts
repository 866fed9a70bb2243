// Reference linear algebra for the tests: what only tests call (the solver factors its own systems with
// src/linalg). The dense LU of lu.ts solves unsymmetric systems; symmetricFactorInto is the plain
// LDL^T with its growth test, falling back to diagonal pivoting, and symmetricInertia its inertia.

import {
  type Inertia, ldltScratch, pivotedFactorInto, plainFactorInto,
} from '../../src/linalg/ldlt.ts';

export { luFactorInto, luSolveInto } from './lu.ts';

/**
 * LDL^T of the symmetric n x n row-major matrix `a` in place: first without pivoting, and when that
 * needs pivoting, from the original matrix with diagonal pivoting; as pivotedFactorInto leaves it,
 * with the inertia in `out` (solve with symmetricSolveInto).
 */
export function symmetricFactorInto(
  a: Float64Array, n: number, pivots: Int32Array, zeroTolerance: number, out: Inertia,
): Inertia {
  const saved = a.slice(0, n * n);
  const scratch = ldltScratch(n);
  if (plainFactorInto(a, n, pivots, zeroTolerance, out, scratch)) {
    // the plain factorisation swaps nothing: the pivots name each row itself
    return out;
  }
  a.set(saved);
  return pivotedFactorInto(a, n, pivots, zeroTolerance, out, scratch);
}

/**
 * Inertia of the symmetric n x n row-major matrix `a`, which is overwritten. A pivot eigenvalue whose
 * magnitude is at most `zeroTolerance` times the largest |entry| of `a` counts as zero.
 */
export function symmetricInertia(a: Float64Array, n: number, zeroTolerance: number): Inertia {
  return symmetricFactorInto(a, n, new Int32Array(n), zeroTolerance, { negative: 0, zero: 0, positive: 0 });
}

/**
 * Q diag(eigenvalues) Q^T with Q a product of three random Householder reflections (draws from `random`):
 * a symmetric matrix whose eigenvalues, and so inertia, are known by construction (reference values
 * independent of any factorisation).
 */
export function symmetricWithEigenvalues(eigenvalues: number[], random: () => number): Float64Array {
  const n = eigenvalues.length;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) a[i * n + i] = eigenvalues[i];
  for (let h = 0; h < 3; h++) {
    const v = Array.from({ length: n }, () => random() - 0.5);
    const vv = v.reduce((s, x) => s + x * x, 0);
    // a <- (I - 2 v v^T / vv) a (I - 2 v v^T / vv)
    for (let side = 0; side < 2; side++) {
      for (let c = 0; c < n; c++) {
        let dot = 0;
        for (let i = 0; i < n; i++) dot += v[i] * (side === 0 ? a[i * n + c] : a[c * n + i]);
        for (let i = 0; i < n; i++) {
          if (side === 0) a[i * n + c] -= (2 * v[i] * dot) / vv;
          else a[c * n + i] -= (2 * v[i] * dot) / vv;
        }
      }
    }
  }
  return a;
}
