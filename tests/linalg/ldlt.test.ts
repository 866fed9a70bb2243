import { describe, expect, it } from 'vitest';
import {
  type Inertia, ldltScratch, pivotedFactorInto, plainFactorInto, plainSolveInto, symmetricSolveInto,
} from '../../src/linalg/ldlt.ts';
import { mulberry32 } from '../../src/random.ts';
import { symmetricFactorInto, symmetricWithEigenvalues } from './reference.ts';

// seeded draws (src/random.ts)
const random = mulberry32(4242);


const fresh = (): Inertia => ({ negative: 0, zero: 0, positive: 0 });

function residual(a: Float64Array, n: number, x: Float64Array, b: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < n; i++) {
    let s = -b[i];
    for (let j = 0; j < n; j++) s += a[i * n + j] * x[j];
    worst = Math.max(worst, Math.abs(s));
  }
  return worst;
}

describe('symmetric LDL^T', () => {
  it('symmetricFactorInto and symmetricSolveInto solve indefinite systems and count their eigenvalues', () => {
    // reference: eigenvalues fixed by construction (law of inertia); the backward error A x - b
    for (let trial = 0; trial < 40; trial++) {
      const n = 2 + (trial % 25);
      const eig = Array.from({ length: n }, (_, i) => (i % 3 === 0 ? -1 : 1) * (0.1 + 3 * random()));
      const a = symmetricWithEigenvalues(eig, random);
      const f = a.slice();
      const piv = new Int32Array(n);
      const inertia = symmetricFactorInto(f, n, piv, 1e-12, fresh());
      expect(inertia).toEqual({ negative: eig.filter((x) => x < 0).length, zero: 0, positive: eig.filter((x) => x > 0).length });
      const b = Float64Array.from({ length: n }, () => random() - 0.5);
      const x = b.slice();
      symmetricSolveInto(f, n, piv, x);
      expect(residual(a, n, x, b)).toBeLessThan(1e-11);
    }
  });

  it('pivotedFactorInto handles a zero diagonal (a saddle-point matrix) that plainFactorInto refuses', () => {
    // [[0, 1], [1, 0]] has eigenvalues -1 and 1: no 1x1 pivot exists, a 2x2 one does
    // ("Matrix Computations", 4th ed., 2013, §4.4)
    expect(plainFactorInto(Float64Array.of(0, 1, 1, 0), 2, new Int32Array(2), 0, fresh(), ldltScratch(2))).toBe(false);
    const f = Float64Array.of(0, 1, 1, 0);
    const piv = new Int32Array(2);
    expect(pivotedFactorInto(f, 2, piv, 0, fresh(), ldltScratch(2))).toEqual({ negative: 1, zero: 0, positive: 1 });
    const x = Float64Array.of(2, 3);
    symmetricSolveInto(f, 2, piv, x);
    expect(Array.from(x)).toEqual([3, 2]);
  });

  it('plainFactorInto and pivotedFactorInto agree on a KKT matrix, and plainSolveInto solves it', () => {
    // a KKT matrix [[H, B^T], [B, 0]] with H positive definite (5 x 5) and B of full rank 2 has inertia
    // (5, 2 negative) ("Numerical Optimization", 2nd ed., 2006, §16.1)
    const n = 7;
    const h = symmetricWithEigenvalues([1, 2, 3, 4, 5], random);
    const a = new Float64Array(n * n);
    for (let i = 0; i < 5; i++) for (let j = 0; j < 5; j++) a[i * n + j] = h[i * 5 + j];
    for (let r = 5; r < 7; r++) {
      for (let j = 0; j < 5; j++) {
        const v = random() - 0.5;
        a[r * n + j] = v;
        a[j * n + r] = v;
      }
    }
    const plain = a.slice();
    expect(plainFactorInto(plain, n, new Int32Array(n), 0, fresh(), ldltScratch(n))).toBe(true);
    const pivoted = a.slice();
    const inertia = pivotedFactorInto(pivoted, n, new Int32Array(n), 0, fresh(), ldltScratch(n));
    expect(inertia).toEqual({ negative: 2, zero: 0, positive: 5 });
    const check = fresh();
    plainFactorInto(a.slice(), n, new Int32Array(n), 0, check, ldltScratch(n));
    expect(check).toEqual(inertia);
    const b = Float64Array.from({ length: n }, () => random() - 0.5);
    const x = b.slice();
    plainSolveInto(plain, n, x);
    expect(residual(a, n, x, b)).toBeLessThan(1e-12);
  });

  it('symmetricFactorInto counts the zero eigenvalues of a singular matrix', () => {
    // reference: eigenvalues fixed by construction, two of them exactly zero
    const a = symmetricWithEigenvalues([2, -1, 0, 3, 0, -4], random);
    expect(symmetricFactorInto(a, 6, new Int32Array(6), 1e-10, fresh())).toEqual({ negative: 2, zero: 2, positive: 2 });
  });

  it('plainFactorInto factors a positive definite matrix of order 80 without giving up', () => {
    // regression: the plain factorisation read a module scratch column of 64 numbers that only the
    // pivoted one grew, so in a fresh process (this file runs in its own) an order above 64 read
    // undefined entries, failed its growth test and fell back to pivoting. A positive definite matrix
    // never needs pivoting: every l_ij^2 d_j <= a_ii ("Matrix Computations", 4th ed., 2013, §4.2).
    const n = 80;
    const eig = Array.from({ length: n }, () => 0.5 + 2 * random());
    const a = symmetricWithEigenvalues(eig, random);
    const f = a.slice();
    const inertia = fresh();
    expect(plainFactorInto(f, n, new Int32Array(n), 1e-12, inertia, ldltScratch(n))).toBe(true);
    expect(inertia).toEqual({ negative: 0, zero: 0, positive: n });
    const b = Float64Array.from({ length: n }, () => random() - 0.5);
    const x = b.slice();
    plainSolveInto(f, n, x);
    expect(residual(a, n, x, b)).toBeLessThan(1e-11);
  });
});
