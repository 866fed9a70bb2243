// linear algebra: symmetric indefinite LDL^T factorisation of a dense matrix, its solve and its inertia.
//
// Diagonal pivoting with 1x1 and 2x2 pivots chosen by the partial pivoting test with
// alpha = (1 + sqrt 17) / 8, which bounds element growth ("Matrix Computations", 4th ed., 2013, §4.4;
// "Some stable methods for calculating inertia and solving symmetric linear systems", Math. Comp. 31
// (1977)). P A P^T = L D L^T with L unit lower triangular (identity on each 2x2 block) and D block
// diagonal; by the law of inertia A has the inertia of D: a 1x1 pivot counts by its sign, a 2x2 pivot
// (chosen only when its determinant is negative) by the signs of its two eigenvalues, and a pivot
// eigenvalue within the zero threshold counts as zero.

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

/** Scratch of the factorisations, owned by the caller: two columns of at least the matrix's order. */
export interface LdltScratch {
  /** A column of the trailing matrix (the plain factorisation's row of L D). */
  column: Float64Array;
  /** The second column of a 2x2 pivot. */
  column2: Float64Array;
}

/** Scratch for matrices of order up to `order`. */
export function ldltScratch(order: number): LdltScratch {
  return { column: new Float64Array(order), column2: new Float64Array(order) };
}

// The plain factorisation gives up for diagonal pivoting when a pivot is below PLAIN_PIVOT of the largest
// |entry| or an entry l_ij^2 |d_j| of L D L^T's factors exceeds PLAIN_GROWTH times it (for a positive
// definite matrix it never exceeds 1: l_ij^2 d_j <= a_ii).
const PLAIN_PIVOT = 1e-12;
const PLAIN_GROWTH = 1e4;

// (row by row: dot products with the rows above)
/**
 * L D L^T of the symmetric n x n row-major matrix `a` (lower triangle read) without pivoting, in place as
 * pivotedFactorInto leaves it (no swaps), with its inertia in `out`. Returns false, leaving `a` partly
 * overwritten, when the order needs pivoting: a pivot below PLAIN_PIVOT of the largest |entry|, or an
 * entry l_ij^2 |d_j| above PLAIN_GROWTH times it.
 */
export function plainFactorInto(
  a: Float64Array, n: number, pivots: Int32Array, zeroTolerance: number, out: Inertia, scratch: LdltScratch,
): boolean {
  const scale = lowerScale(a, n);
  if (!Number.isFinite(scale)) return false;
  const least = PLAIN_PIVOT * scale;
  const growthLimit = PLAIN_GROWTH * scale;
  const zeroLevel = zeroTolerance * scale;
  const w = scratch.column;
  let negative = 0;
  let zero = 0;
  let positive = 0;
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    // l_ij = (a_ij - sum_k l_ik d_k l_jk) / d_j, keeping w_k = l_ik d_k
    for (let j = 0; j < i; j++) {
      const rj = j * n;
      let s = a[ri + j];
      let k = 0;
      for (; k + 3 < j; k += 4) s -= w[k] * a[rj + k] + w[k + 1] * a[rj + k + 1] + w[k + 2] * a[rj + k + 2] + w[k + 3] * a[rj + k + 3];
      for (; k < j; k++) s -= w[k] * a[rj + k];
      w[j] = s;
      const dj = a[rj + j];
      const l = s / dj;
      // Is L D^(1/2) growing (a small earlier pivot)? Then the order needs pivoting.
      if (!(l * s <= growthLimit && l * s >= -growthLimit)) return false;
      a[ri + j] = l;
    }
    let d = a[ri + i];
    for (let k = 0; k < i; k++) d -= w[k] * a[ri + k];
    if (!(Math.abs(d) >= least)) return false;
    a[ri + i] = d;
    pivots[i] = i;
    if (Math.abs(d) <= zeroLevel) zero++;
    else if (d < 0) negative++;
    else positive++;
  }
  out.negative = negative;
  out.zero = zero;
  out.positive = positive;
  return true;
}

/**
 * Factor the symmetric n x n row-major matrix `a` with the 1x1 and 2x2 diagonal pivots of the file
 * header, in place, reading and writing only its lower triangle (the upper one is left as it was):
 * afterwards the strict lower triangle holds L and the diagonal, with the first subdiagonal entry of
 * each 2x2 block, holds D. pivots[k] records the step: for a 1x1 pivot the row swapped into k (k itself
 * when none), for a 2x2 pivot on k, k + 1: pivots[k] = -1 and pivots[k + 1] the row swapped into k + 1.
 * A pivot eigenvalue whose magnitude is at most `zeroTolerance` times the largest |entry| counts as
 * zero. Writes the inertia into `out`.
 */
export function pivotedFactorInto(
  a: Float64Array, n: number, pivots: Int32Array, zeroTolerance: number, out: Inertia, scratch: LdltScratch,
): Inertia {
  const col = scratch.column;
  const col2 = scratch.column2;
  const scale = lowerScale(a, n);
  const zeroLevel = zeroTolerance * scale;
  let negative = 0;
  let zero = 0;
  let positive = 0;
  let k = 0;
  while (k < n) {
    // find the largest entry of column k below the diagonal
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
    let size = 1;
    let swapWith = k;
    if (colmax > 0 && akk < ALPHA * colmax) {
      // largest entry of row r of the trailing matrix, off its diagonal
      let rowmax = 0;
      const rr = r * n;
      for (let j = k; j < r; j++) {
        const v = Math.abs(a[rr + j]);
        if (v > rowmax) rowmax = v;
      }
      for (let j = r + 1; j < n; j++) {
        const v = Math.abs(a[j * n + r]);
        if (v > rowmax) rowmax = v;
      }
      if (akk * rowmax >= ALPHA * colmax * colmax) {
        size = 1;
      } else if (Math.abs(a[rr + r]) >= ALPHA * rowmax) {
        swapWith = r;
      } else {
        size = 2;
        swapWith = r;
      }
    }
    if (size === 1) {
      swapLower(a, n, k, swapWith);
      pivots[k] = swapWith;
      const d = a[k * n + k];
      if (Math.abs(d) <= zeroLevel || !Number.isFinite(d)) zero++;
      else if (d < 0) negative++;
      else positive++;
      // Is the pivot zero? Leave its column (the matrix is singular; a solve is meaningless).
      if (d === 0) {
        k++;
        continue;
      }
      for (let i = k + 1; i < n; i++) col[i] = a[i * n + k];
      const inv = 1 / d;
      for (let i = k + 1; i < n; i++) {
        const x = col[i];
        if (x === 0) continue;
        const l = x * inv;
        const ri = i * n;
        let j = k + 1;
        // (unrolled by four: the trailing update is the factorisation's whole cost)
        for (; j + 3 <= i; j += 4) {
          a[ri + j] -= l * col[j];
          a[ri + j + 1] -= l * col[j + 1];
          a[ri + j + 2] -= l * col[j + 2];
          a[ri + j + 3] -= l * col[j + 3];
        }
        for (; j <= i; j++) a[ri + j] -= l * col[j];
        a[ri + k] = l;
      }
      k++;
    } else {
      swapLower(a, n, k + 1, swapWith);
      pivots[k] = -1;
      pivots[k + 1] = swapWith;
      const k1 = k + 1;
      const d11 = a[k * n + k];
      const d21 = a[k1 * n + k];
      const d22 = a[k1 * n + k1];
      // eigenvalues of the 2x2 pivot block
      const mean = 0.5 * (d11 + d22);
      const rad = Math.hypot(0.5 * (d11 - d22), d21);
      const low = mean - rad;
      const high = mean + rad;
      if (Math.abs(low) <= zeroLevel || !Number.isFinite(low)) zero++;
      else if (low < 0) negative++;
      else positive++;
      if (Math.abs(high) <= zeroLevel || !Number.isFinite(high)) zero++;
      else if (high < 0) negative++;
      else positive++;
      const det = d11 * d22 - d21 * d21;
      for (let i = k + 2; i < n; i++) {
        col[i] = a[i * n + k];
        col2[i] = a[i * n + k1];
      }
      for (let i = k + 2; i < n; i++) {
        const x = col[i];
        const y = col2[i];
        // [l1 l2] = [x y] D^-1
        const l1 = (x * d22 - y * d21) / det;
        const l2 = (y * d11 - x * d21) / det;
        const ri = i * n;
        for (let j = k + 2; j <= i; j++) a[ri + j] -= l1 * col[j] + l2 * col2[j];
        a[ri + k] = l1;
        a[ri + k1] = l2;
      }
      k += 2;
    }
  }
  out.negative = negative;
  out.zero = zero;
  out.positive = positive;
  return out;
}

/** Solve A x = b in place in b, with `a` and `pivots` from pivotedFactorInto (A nonsingular). */
export function symmetricSolveInto(a: Float64Array, n: number, pivots: Int32Array, b: Float64Array): void {
  // b <- P b
  for (let k = 0; k < n; k++) {
    const p = pivots[k];
    if (p >= 0 && p !== k) {
      const tmp = b[k];
      b[k] = b[p];
      b[p] = tmp;
    }
  }
  // forward substitution with L (unit lower, identity on the 2x2 blocks)
  for (let k = 0; k < n; k++) {
    const two = pivots[k] === -1;
    const x = b[k];
    const y = two ? b[k + 1] : 0;
    const start = two ? k + 2 : k + 1;
    for (let i = start; i < n; i++) {
      const ri = i * n;
      b[i] -= a[ri + k] * x + (two ? a[ri + k + 1] * y : 0);
    }
    if (two) k++;
  }
  // the block diagonal D
  for (let k = 0; k < n; k++) {
    if (pivots[k] === -1) {
      const d11 = a[k * n + k];
      const d21 = a[(k + 1) * n + k];
      const d22 = a[(k + 1) * n + k + 1];
      const det = d11 * d22 - d21 * d21;
      const x = b[k];
      const y = b[k + 1];
      b[k] = (x * d22 - y * d21) / det;
      b[k + 1] = (y * d11 - x * d21) / det;
      k++;
    } else {
      b[k] /= a[k * n + k];
    }
  }
  // back substitution with L^T
  for (let k = n - 1; k >= 0; k--) {
    const second = k > 0 && pivots[k - 1] === -1;
    const first = second ? k - 1 : k;
    const start = k + 1;
    let s0 = b[first];
    let s1 = second ? b[k] : 0;
    for (let i = start; i < n; i++) {
      const ri = i * n;
      s0 -= a[ri + first] * b[i];
      if (second) s1 -= a[ri + k] * b[i];
    }
    b[first] = s0;
    if (second) {
      b[k] = s1;
      k--;
    }
  }
  // x <- P^T b, undoing the swaps in reverse order
  for (let k = n - 1; k >= 0; k--) {
    const p = pivots[k];
    if (p >= 0 && p !== k) {
      const tmp = b[k];
      b[k] = b[p];
      b[p] = tmp;
    }
  }
}

/** Solve A x = b in place in b, with `a` from a successful plainFactorInto (no pivoting). */
export function plainSolveInto(a: Float64Array, n: number, b: Float64Array): void {
  for (let i = 1; i < n; i++) {
    const ri = i * n;
    let s = b[i];
    for (let k = 0; k < i; k++) s -= a[ri + k] * b[k];
    b[i] = s;
  }
  for (let i = 0; i < n; i++) b[i] /= a[i * n + i];
  for (let k = n - 1; k > 0; k--) {
    const rk = k * n;
    const x = b[k];
    if (x === 0) continue;
    for (let i = 0; i < k; i++) b[i] -= a[rk + i] * x;
  }
}

// The largest |entry| of the lower triangle of the n x n row-major matrix a (NaN when one is NaN).
function lowerScale(a: Float64Array, n: number): number {
  let scale = 0;
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    for (let j = 0; j <= i; j++) {
      const v = Math.abs(a[ri + j]);
      if (!(v <= scale)) scale = v;
    }
  }
  return scale;
}

// Symmetric permutation of rows and columns i < j, in lower-triangle storage.
function swapLower(a: Float64Array, n: number, i: number, j: number): void {
  if (i === j) return;
  const ri = i * n;
  const rj = j * n;
  // the rows left of column i
  for (let c = 0; c < i; c++) {
    const tmp = a[ri + c];
    a[ri + c] = a[rj + c];
    a[rj + c] = tmp;
  }
  // column i between the two rows against row j left of column j
  for (let r = i + 1; r < j; r++) {
    const tmp = a[r * n + i];
    a[r * n + i] = a[rj + r];
    a[rj + r] = tmp;
  }
  // the columns below row j
  for (let r = j + 1; r < n; r++) {
    const rr = r * n;
    const tmp = a[rr + i];
    a[rr + i] = a[rr + j];
    a[rr + j] = tmp;
  }
  const tmp = a[ri + i];
  a[ri + i] = a[rj + j];
  a[rj + j] = tmp;
}
