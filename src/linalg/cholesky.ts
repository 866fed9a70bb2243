// linear algebra: Cholesky factorisation L D L^T of a dense symmetric matrix, in place, as a test of
// positive definiteness.
//
// Symmetric Gaussian elimination without pivoting ("Matrix Computations", 4th ed., 2013, §4.2): it
// succeeds exactly when every pivot is positive, that is when the matrix is positive definite. The
// pressure fit (solver/penalty.ts) solves with it.

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

/**
 * Cholesky factorisation L L^T of the symmetric n x n row-major matrix `a`, known to be positive
 * definite (lower triangle read), in place in its lower triangle ("Matrix Computations", 4th ed., 2013,
 * §4.2). No test of definiteness: a matrix that is not gives NaN. (The first drawing's Laplacian uses
 * it; choleskyInto's L D L^T would give other last bits, and the relaxer's verdicts on ties between
 * collapsing walls follow them.)
 */
export function choleskyRootInto(a: Float64Array, n: number): void {
  for (let j = 0; j < n; j++) {
    const rj = j * n;
    let d = a[rj + j];
    for (let k = 0; k < j; k++) d -= a[rj + k] * a[rj + k];
    const root = Math.sqrt(d);
    a[rj + j] = root;
    const inv = 1 / root;
    for (let i = j + 1; i < n; i++) {
      const ri = i * n;
      let s = a[ri + j];
      for (let k = 0; k < j; k++) s -= a[ri + k] * a[rj + k];
      a[ri + j] = s * inv;
    }
  }
}

/** Solve L L^T x = b in place in b with the factor of choleskyRootInto. */
export function choleskyRootSolveInto(a: Float64Array, n: number, b: Float64Array): void {
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    let s = b[i];
    for (let k = 0; k < i; k++) s -= a[ri + k] * b[k];
    b[i] = s / a[ri + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i];
    for (let k = i + 1; k < n; k++) s -= a[k * n + i] * b[k];
    b[i] = s / a[i * n + i];
  }
}
