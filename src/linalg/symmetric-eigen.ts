// linear algebra: the eigenvalues of a dense symmetric matrix (Householder tridiagonalisation, then
// implicit QL steps with Wilkinson's shift; "Matrix Computations", 4th ed., 2013, §8.3).

// Most QL sweeps allowed per eigenvalue (two or three are typical: the iteration converges cubically).
const MAX_SWEEPS = 60;

/**
 * Reduce the symmetric n x n row-major matrix `a` (both triangles filled) to tridiagonal form by
 * Householder reflections, overwriting it, and write the diagonal into `diagonal` and the subdiagonal
 * into `offDiagonal` (offDiagonal[i] couples i and i + 1; offDiagonal[n - 1] = 0). The eigenvalues of
 * the tridiagonal matrix are those of `a` (an orthogonal similarity).
 */
export function tridiagonaliseInto(a: Float64Array, n: number, diagonal: Float64Array, offDiagonal: Float64Array, scratch: Float64Array): void {
  const v = scratch.subarray(0, n);
  const w = scratch.subarray(n, 2 * n);
  for (let k = 0; k + 2 < n; k++) {
    // the reflection that maps column k below the diagonal onto its first entry
    let tail = 0;
    for (let i = k + 2; i < n; i++) tail += a[i * n + k] * a[i * n + k];
    // Is the column already zero below the subdiagonal? Nothing to reflect.
    if (tail === 0) continue;
    const x0 = a[(k + 1) * n + k];
    const norm = Math.sqrt(tail + x0 * x0);
    const alpha = x0 > 0 ? -norm : norm;
    let vv = 0;
    for (let i = k + 1; i < n; i++) {
      v[i] = a[i * n + k];
      if (i === k + 1) v[i] -= alpha;
      vv += v[i] * v[i];
    }
    const beta = 2 / vv;
    // p = beta A22 v, then w = p - (beta/2)(v . p) v; A22 -= v w^T + w v^T
    let vp = 0;
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      let s = 0;
      for (let j = k + 1; j < n; j++) s += a[ri + j] * v[j];
      w[i] = beta * s;
      vp += v[i] * w[i];
    }
    const half = 0.5 * beta * vp;
    for (let i = k + 1; i < n; i++) w[i] -= half * v[i];
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const vi = v[i];
      const wi = w[i];
      for (let j = k + 1; j < n; j++) a[ri + j] -= vi * w[j] + wi * v[j];
    }
    a[(k + 1) * n + k] = alpha;
    a[k * n + k + 1] = alpha;
    for (let i = k + 2; i < n; i++) {
      a[i * n + k] = 0;
      a[k * n + i] = 0;
    }
  }
  for (let i = 0; i < n; i++) {
    diagonal[i] = a[i * n + i];
    offDiagonal[i] = i + 1 < n ? a[(i + 1) * n + i] : 0;
  }
}

/**
 * The eigenvalues of the symmetric tridiagonal matrix (diagonal, offDiagonal as tridiagonaliseInto
 * leaves them), written into `diagonal` in no particular order; offDiagonal is overwritten. Returns
 * false when an eigenvalue did not converge in MAX_SWEEPS sweeps (never seen for finite input).
 */
export function tridiagonalEigenvaluesInto(diagonal: Float64Array, offDiagonal: Float64Array, n: number): boolean {
  const d = diagonal;
  const e = offDiagonal;
  for (let l = 0; l < n; l++) {
    let sweeps = 0;
    for (;;) {
      // look for a negligible subdiagonal entry: the matrix splits there
      let m = l;
      for (; m < n - 1; m++) {
        const dd = Math.abs(d[m]) + Math.abs(d[m + 1]);
        if (Math.abs(e[m]) <= Number.EPSILON * dd) break;
      }
      if (m === l) break;
      if (++sweeps > MAX_SWEEPS) return false;
      // Wilkinson's shift from the leading 2x2 block, then one implicit QL sweep from m up to l
      let g = (d[l + 1] - d[l]) / (2 * e[l]);
      let r = Math.hypot(g, 1);
      g = d[m] - d[l] + e[l] / (g + (g >= 0 ? r : -r));
      let s = 1;
      let c = 1;
      let p = 0;
      let i = m - 1;
      let underflow = false;
      for (; i >= l; i--) {
        const f = s * e[i];
        const b = c * e[i];
        r = Math.hypot(f, g);
        e[i + 1] = r;
        // Did the rotation vanish? The matrix has split above: deflate and sweep again.
        if (r === 0) {
          d[i + 1] -= p;
          e[m] = 0;
          underflow = true;
          break;
        }
        s = f / r;
        c = g / r;
        g = d[i + 1] - p;
        r = (d[i] - g) * s + 2 * c * b;
        p = s * r;
        d[i + 1] = g + p;
        g = c * r - b;
      }
      if (underflow) continue;
      d[l] -= p;
      e[l] = g;
      e[m] = 0;
    }
  }
  return true;
}
