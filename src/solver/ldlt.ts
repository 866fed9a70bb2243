// solver stage: inertia of a dense symmetric matrix by a symmetric indefinite LDL^T factorisation.
//
// Diagonal pivoting with 1x1 and 2x2 pivots chosen by the partial pivoting test with
// alpha = (1 + sqrt 17) / 8, which bounds element growth ("Matrix Computations", 4th ed., 2013, §4.4;
// "Some stable methods for calculating inertia and solving symmetric linear systems", Math. Comp. 31
// (1977)). By the law of inertia, P A P^T = L D L^T has the inertia of D:
// a 1x1 pivot counts by its sign, a 2x2 pivot (chosen only when its determinant is negative) counts
// one positive and one negative eigenvalue unless one of them is below the zero threshold.

const ALPHA = (1 + Math.sqrt(17)) / 8;

/** Counts of negative, zero and positive eigenvalues. */
export interface Inertia {
  /** Number of negative eigenvalues. */
  negative: number;
  /** Number of eigenvalues within the zero threshold. */
  zero: number;
  /** Number of positive eigenvalues. */
  positive: number;
}

/**
 * Inertia of the symmetric n x n row-major matrix `a`, which is overwritten. A pivot eigenvalue whose
 * magnitude is at most `zeroTolerance` times the largest |entry| of `a` counts as zero.
 */
export function symmetricInertia(a: Float64Array, n: number, zeroTolerance: number): Inertia {
  let scale = 0;
  for (let i = 0, m = n * n; i < m; i++) scale = Math.max(scale, Math.abs(a[i]));
  const zeroLevel = zeroTolerance * scale;
  let negative = 0;
  let zero = 0;
  let positive = 0;
  const count = (d: number): void => {
    if (Math.abs(d) <= zeroLevel || !Number.isFinite(d)) zero++;
    else if (d < 0) negative++;
    else positive++;
  };
  const swap = (i: number, j: number): void => {
    // symmetric permutation: swap rows i and j, then columns i and j
    if (i === j) return;
    for (let c = 0; c < n; c++) {
      const tmp = a[i * n + c];
      a[i * n + c] = a[j * n + c];
      a[j * n + c] = tmp;
    }
    for (let r = 0; r < n; r++) {
      const tmp = a[r * n + i];
      a[r * n + i] = a[r * n + j];
      a[r * n + j] = tmp;
    }
  };
  let k = 0;
  while (k < n) {
    // find the largest off-diagonal entry of column k below the diagonal
    const akk = Math.abs(a[k * n + k]);
    let r = k;
    let colmax = 0;
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(a[i * n + k]);
      if (v > colmax) {
        colmax = v;
        r = i;
      }
    }
    // Is the column already zero? Then the pivot is a (zero or not) 1x1 pivot with nothing to eliminate.
    if (colmax === 0) {
      count(a[k * n + k]);
      k++;
      continue;
    }
    let size = 1;
    if (akk < ALPHA * colmax) {
      let rowmax = 0;
      for (let j = k; j < n; j++) if (j !== r) rowmax = Math.max(rowmax, Math.abs(a[r * n + j]));
      if (akk * rowmax >= ALPHA * colmax * colmax) {
        size = 1;
      } else if (Math.abs(a[r * n + r]) >= ALPHA * rowmax) {
        swap(k, r);
      } else {
        swap(k + 1, r);
        size = 2;
      }
    }
    if (size === 1) {
      const d = a[k * n + k];
      count(d);
      for (let i = k + 1; i < n; i++) {
        const l = a[i * n + k] / d;
        if (l === 0) continue;
        for (let j = k + 1; j < n; j++) a[i * n + j] -= l * a[k * n + j];
      }
      k++;
    } else {
      const d11 = a[k * n + k];
      const d21 = a[(k + 1) * n + k];
      const d22 = a[(k + 1) * n + k + 1];
      // eigenvalues of the 2x2 pivot block
      const mean = 0.5 * (d11 + d22);
      const rad = Math.hypot(0.5 * (d11 - d22), d21);
      count(mean - rad);
      count(mean + rad);
      const det = d11 * d22 - d21 * d21;
      for (let i = k + 2; i < n; i++) {
        const x = a[i * n + k];
        const y = a[i * n + k + 1];
        // [l1 l2] = [x y] D^-1
        const l1 = (x * d22 - y * d21) / det;
        const l2 = (y * d11 - x * d21) / det;
        for (let j = k + 2; j < n; j++) a[i * n + j] -= l1 * a[k * n + j] + l2 * a[(k + 1) * n + j];
      }
      k += 2;
    }
  }
  return { negative, zero, positive };
}
