// reference for the tests: dense LU factorisation with partial (row) pivoting, in place on a row-major Float64Array.
//
// Standard Gaussian elimination with partial pivoting ("Matrix Computations", 4th ed., 2013, §3.4).
// The matrix is factored in place as P A = L U (unit lower L below the diagonal, U on and above it);
// solve, never invert.

/**
 * Factor the n x n row-major matrix `a` in place; `pivots[i]` is the row swapped into row i.
 * Returns the smallest |pivot| divided by the largest |entry| of the matrix (0 when singular or
 * non-finite), so callers can tell a numerically singular matrix without a second pass.
 */
export function luFactorInto(a: Float64Array, n: number, pivots: Int32Array): number {
  let scale = 0;
  for (let i = 0, m = n * n; i < m; i++) {
    const v = Math.abs(a[i]);
    if (v > scale) scale = v;
  }
  // Is the matrix zero or non-finite? Nothing to factor.
  if (!(scale > 0) || scale === Infinity) return 0;
  let minPivot = Infinity;
  for (let k = 0; k < n; k++) {
    // find the largest entry of column k on or below the diagonal
    let p = k;
    let best = Math.abs(a[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(a[i * n + k]);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    pivots[k] = p;
    if (!(best > 0)) return 0;
    if (best < minPivot) minPivot = best;
    // swap rows k and p
    if (p !== k) {
      const rk = k * n;
      const rp = p * n;
      for (let j = 0; j < n; j++) {
        const tmp = a[rk + j];
        a[rk + j] = a[rp + j];
        a[rp + j] = tmp;
      }
    }
    // eliminate below the pivot
    const rk = k * n;
    const inv = 1 / a[rk + k];
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const l = a[ri + k] * inv;
      if (l === 0) continue;
      a[ri + k] = l;
      for (let j = k + 1; j < n; j++) a[ri + j] -= l * a[rk + j];
    }
  }
  const ratio = minPivot / scale;
  return Number.isFinite(ratio) ? ratio : 0;
}

/** Solve A x = b in place in `b`, with `a` and `pivots` from luFactorInto. */
export function luSolveInto(a: Float64Array, n: number, pivots: Int32Array, b: Float64Array): void {
  // apply the row swaps, then forward substitution with unit L
  for (let k = 0; k < n; k++) {
    const p = pivots[k];
    if (p !== k) {
      const tmp = b[k];
      b[k] = b[p];
      b[p] = tmp;
    }
  }
  for (let i = 1; i < n; i++) {
    const ri = i * n;
    let s = b[i];
    for (let j = 0; j < i; j++) s -= a[ri + j] * b[j];
    b[i] = s;
  }
  // back substitution with U
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * n;
    let s = b[i];
    for (let j = i + 1; j < n; j++) s -= a[ri + j] * b[j];
    b[i] = s / a[ri + i];
  }
}
