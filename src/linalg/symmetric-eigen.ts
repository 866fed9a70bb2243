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

// Most cyclic sweeps of the Jacobi method (it converges quadratically; six to ten are typical).
const JACOBI_SWEEPS = 50;
// The sweeps stop when the off-diagonal part's squared norm is at most JACOBI_OFF of the whole's (its
// norm 1e-14 of the matrix's: the rounding level, below which rotations only move rounding errors).
const JACOBI_OFF = 1e-28;

/**
 * Eigenvalues and eigenvectors of the symmetric n x n row-major matrix `a` (both triangles filled;
 * overwritten) by the cyclic Jacobi method ("Matrix Computations", 4th ed., 2013, §8.5.3): `values` in
 * ascending order and `vectors` row i the unit eigenvector of values[i]. `scratch` holds n numbers. Returns
 * false when the off-diagonal part did not vanish in JACOBI_SWEEPS sweeps (never seen for finite input).
 */
export function symmetricEigenInto(a: Float64Array, n: number, values: Float64Array, vectors: Float64Array, scratch: Float64Array): boolean {
  const v = vectors;
  v.fill(0, 0, n * n);
  for (let i = 0; i < n; i++) v[i * n + i] = 1;
  let converged = false;
  for (let sweep = 0; sweep < JACOBI_SWEEPS && !converged; sweep++) {
    let off = 0;
    let all = 0;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const x = a[i * n + j] * a[i * n + j];
        all += x;
        if (i !== j) off += x;
      }
    }
    if (!(off > JACOBI_OFF * all)) {
      converged = Number.isFinite(all);
      break;
    }
    for (let p = 0; p + 1 < n; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = a[p * n + q];
        if (apq === 0) continue;
        // the rotation that zeroes a_pq (the smaller angle)
        const theta = (a[q * n + q] - a[p * n + p]) / (2 * apq);
        const t = (theta >= 0 ? 1 : -1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k * n + p];
          const akq = a[k * n + q];
          a[k * n + p] = c * akp - s * akq;
          a[k * n + q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p * n + k];
          const aqk = a[q * n + k];
          a[p * n + k] = c * apk - s * aqk;
          a[q * n + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vpk = v[p * n + k];
          const vqk = v[q * n + k];
          v[p * n + k] = c * vpk - s * vqk;
          v[q * n + k] = s * vpk + c * vqk;
        }
      }
    }
  }
  if (!converged) return false;
  // ascending order: a selection sort moving each value's row of `vectors` with it (n is small)
  for (let i = 0; i < n; i++) values[i] = a[i * n + i];
  for (let i = 0; i + 1 < n; i++) {
    let least = i;
    for (let j = i + 1; j < n; j++) if (values[j] < values[least]) least = j;
    if (least === i) continue;
    const x = values[i];
    values[i] = values[least];
    values[least] = x;
    scratch.set(v.subarray(i * n, i * n + n));
    v.copyWithin(i * n, least * n, least * n + n);
    v.set(scratch.subarray(0, n), least * n);
  }
  return true;
}
