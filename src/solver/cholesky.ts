// solver stage: Cholesky factorisation L D L^T of a dense symmetric matrix, in place, as a test of
// positive definiteness.
//
// Symmetric Gaussian elimination without pivoting ("Matrix Computations", 4th ed., 2013, §4.2): it
// succeeds exactly when every pivot is positive, that is when the matrix is positive definite. The
// descent uses the failure to raise its diagonal shift.

/**
 * Factor the symmetric n x n row-major matrix `a` (lower triangle read) in place as L D L^T: afterwards
 * its strict lower triangle holds the unit lower L and d[0..n) the pivots. `row` is scratch of n numbers.
 * Returns false (leaving `a` partly overwritten) when a pivot is at most `floor` times the largest
 * diagonal entry, or not finite: the matrix is not (safely) positive definite.
 */
export function choleskyInto(a: Float64Array, n: number, d: Float64Array, row: Float64Array, floor: number): boolean {
  let top = 0;
  for (let i = 0; i < n; i++) {
    const v = a[i * n + i];
    if (!(v > 0)) return false;
    if (v > top) top = v;
  }
  if (!Number.isFinite(top)) return false;
  const least = floor * top;
  for (let j = 0; j < n; j++) {
    const rj = j * n;
    // c_js = l_js d_s is kept in the lower triangle until column j is done
    for (let s = 0; s < j; s++) row[s] = a[rj + s] / d[s];
    let dj = a[rj + j];
    for (let s = 0; s < j; s++) dj -= row[s] * a[rj + s];
    if (!(dj > least)) return false;
    d[j] = dj;
    for (let s = 0; s < j; s++) a[rj + s] = row[s];
    for (let i = j + 1; i < n; i++) {
      const ri = i * n;
      let c = a[ri + j];
      for (let s = 0; s < j; s++) c -= row[s] * a[ri + s];
      a[ri + j] = c;
    }
  }
  return true;
}

/** Solve (L D L^T) x = b in place in b, with `a` and `d` from choleskyInto. */
export function choleskySolveInto(a: Float64Array, n: number, d: Float64Array, b: Float64Array): void {
  // forward substitution with the unit lower L
  for (let i = 1; i < n; i++) {
    const ri = i * n;
    let s = b[i];
    for (let j = 0; j < i; j++) s -= a[ri + j] * b[j];
    b[i] = s;
  }
  for (let i = 0; i < n; i++) b[i] /= d[i];
  // back substitution with L^T, a row of L at a time
  for (let k = n - 1; k > 0; k--) {
    const rk = k * n;
    const x = b[k];
    if (x === 0) continue;
    for (let i = 0; i < k; i++) b[i] -= a[rk + i] * x;
  }
}
