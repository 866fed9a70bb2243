import { describe, expect, it } from 'vitest';
import { symmetricEigenInto, tridiagonalEigenvaluesInto, tridiagonaliseInto } from '../../src/linalg/symmetric-eigen.ts';

function eigenvalues(a: Float64Array, n: number): number[] {
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  tridiagonaliseInto(a, n, d, e, new Float64Array(2 * n));
  expect(tridiagonalEigenvaluesInto(d, e, n)).toBe(true);
  return Array.from(d).sort((x, y) => x - y);
}

// Q diag(lambda) Q^T for Q a product of three reflections I - 2 v v^T with seeded random unit v
function similarTo(lambda: number[], seed0: number): Float64Array {
  let seed = seed0;
  const random = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647) - 0.5;
  const n = lambda.length;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) a[i * n + i] = lambda[i];
  for (let r = 0; r < 3; r++) {
    // A <- (I - 2 v v^T) A (I - 2 v v^T) with |v| = 1
    const v = Array.from({ length: n }, random);
    const norm = Math.hypot(...v);
    for (let i = 0; i < n; i++) v[i] /= norm;
    const av = Array.from({ length: n }, (_, i) => v.reduce((s, vj, j) => s + a[i * n + j] * vj, 0));
    const vav = v.reduce((s, vi, i) => s + vi * av[i], 0);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) a[i * n + j] += -2 * v[i] * av[j] - 2 * av[i] * v[j] + 4 * vav * v[i] * v[j];
  }
  return a;
}

// The second-difference matrix of order n (2 on the diagonal, -1 beside it), row-major.
function secondDifference(n: number): Float64Array {
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    a[i * n + i] = 2;
    if (i + 1 < n) {
      a[i * n + i + 1] = -1;
      a[(i + 1) * n + i] = -1;
    }
  }
  return a;
}

describe('symmetric eigenvalues', () => {
  it('the second-difference matrix of order n has eigenvalues 2 - 2 cos(k pi / (n + 1))', () => {
    // the spectrum of the second-difference matrix (2 on the diagonal, -1 beside it) (common practice, no source)
    for (const n of [1, 2, 5, 17, 40]) {
      const a = secondDifference(n);
      const got = eigenvalues(a, n);
      const want = Array.from({ length: n }, (_, k) => 2 - 2 * Math.cos(((k + 1) * Math.PI) / (n + 1))).sort((x, y) => x - y);
      for (let k = 0; k < n; k++) expect(Math.abs(got[k] - want[k])).toBeLessThan(1e-13);
    }
  });

  it('Q diag(lambda) Q^T, Q a product of reflections, gives back lambda (zeros and negatives included)', () => {
    // orthogonal similarity keeps the spectrum (common practice, no source)
    for (const n of [3, 8, 25]) {
      const lambda = Array.from({ length: n }, (_, i) => (i % 5 === 0 ? 0 : i % 3 === 0 ? -(i + 1) : 1e-3 * (i + 1)));
      const a = similarTo(lambda, 7 + n);
      const got = eigenvalues(a, n);
      const want = [...lambda].sort((x, y) => x - y);
      for (let k = 0; k < n; k++) expect(Math.abs(got[k] - want[k])).toBeLessThan(1e-12 * n);
    }
  });

  it('the Jacobi method gives the second-difference matrix its eigenpairs 2 - 2 cos(k pi / (n + 1)), sin(j k pi / (n + 1))', () => {
    // the spectrum and the eigenvectors of the second-difference matrix (2 on the diagonal, -1 beside it) (common practice, no source)
    for (const n of [1, 2, 7, 30]) {
      const a = secondDifference(n);
      const values = new Float64Array(n);
      const vectors = new Float64Array(n * n);
      expect(symmetricEigenInto(a, n, values, vectors, new Float64Array(n))).toBe(true);
      for (let k = 0; k < n; k++) {
        // ascending: the k-th is 2 - 2 cos((k + 1) pi / (n + 1))
        expect(Math.abs(values[k] - (2 - 2 * Math.cos(((k + 1) * Math.PI) / (n + 1))))).toBeLessThan(1e-13);
        const want = Array.from({ length: n }, (_, j) => Math.sin(((j + 1) * (k + 1) * Math.PI) / (n + 1)));
        const norm = Math.hypot(...want);
        const sign = Math.sign(vectors[k * n] * want[0]);
        for (let j = 0; j < n; j++) expect(Math.abs(vectors[k * n + j] - (sign * want[j]) / norm)).toBeLessThan(1e-12);
      }
    }
  });

  it('the Jacobi method: Q diag(lambda) Q^T gives back lambda in ascending order and A v = lambda v', () => {
    // orthogonal similarity keeps the spectrum (common practice, no source)
    for (const n of [3, 12, 40]) {
      const lambda = Array.from({ length: n }, (_, i) => (i % 4 === 0 ? 0 : i % 3 === 0 ? -(i + 1) : 0.5 * (i + 1)));
      const a = similarTo(lambda, 11 + n);
      const kept = Float64Array.from(a);
      const values = new Float64Array(n);
      const vectors = new Float64Array(n * n);
      expect(symmetricEigenInto(a, n, values, vectors, new Float64Array(n))).toBe(true);
      const want = [...lambda].sort((x, y) => x - y);
      for (let k = 0; k < n; k++) {
        expect(Math.abs(values[k] - want[k])).toBeLessThan(1e-12 * n);
        for (let i = 0; i < n; i++) {
          let av = 0;
          for (let j = 0; j < n; j++) av += kept[i * n + j] * vectors[k * n + j];
          expect(Math.abs(av - values[k] * vectors[k * n + i])).toBeLessThan(1e-11 * n);
        }
      }
    }
  });
});
