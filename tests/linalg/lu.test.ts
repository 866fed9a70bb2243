import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../src/random.ts';
import { luFactorInto, luSolveInto, symmetricInertia, symmetricWithEigenvalues } from './reference.ts';

// seeded draws (src/random.ts)
const random = mulberry32(12345);


describe('dense factorisations', () => {
  it('luSolveInto solves a random system to rounding accuracy', () => {
    // reference: the residual A x - b of the computed solution (backward error, common practice)
    const n = 30;
    const a = Float64Array.from({ length: n * n }, () => random() - 0.5);
    const b = Float64Array.from({ length: n }, () => random());
    const lu = a.slice();
    const piv = new Int32Array(n);
    expect(luFactorInto(lu, n, piv)).toBeGreaterThan(0);
    const x = b.slice();
    luSolveInto(lu, n, piv, x);
    for (let i = 0; i < n; i++) {
      let s = -b[i];
      for (let j = 0; j < n; j++) s += a[i * n + j] * x[j];
      expect(Math.abs(s)).toBeLessThan(1e-12);
    }
  });

  it('luFactorInto reports a singular matrix as 0', () => {
    expect(luFactorInto(Float64Array.of(1, 2, 2, 4), 2, new Int32Array(2))).toBe(0);
  });

  it('symmetricInertia counts the signs of known eigenvalues, zeros included', () => {
    // reference: eigenvalues fixed by construction; the law of inertia
    const cases = [
      [3, -1, 2, -0.5, 0, 4, -2, 1e-3],
      [-1, -2, -3, 0, 0, 5],
      [1e-4, -1e-4, 2, -2, 7, 0.5],
    ];
    for (const eig of cases) {
      const a = symmetricWithEigenvalues(eig, random);
      const inertia = symmetricInertia(a, eig.length, 1e-10);
      expect(inertia).toEqual({
        negative: eig.filter((x) => x < 0).length,
        zero: eig.filter((x) => x === 0).length,
        positive: eig.filter((x) => x > 0).length,
      });
    }
    // a saddle-point (KKT) matrix [[H, B^T], [B, 0]] with H = I (2x2), B = [1 1]: inertia (2, 0, 1)
    expect(symmetricInertia(Float64Array.of(1, 0, 1, 0, 1, 1, 1, 1, 0), 3, 1e-12)).toEqual({
      negative: 1, zero: 0, positive: 2,
    });
  });
});
