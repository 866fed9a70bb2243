import { describe, expect, it } from 'vitest';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { embedCluster } from '../../src/arcs/embed.ts';
import { factorStepInto, kktWorkspace, rigidInto, solveStepInto, stepCurvature } from '../../src/solver/kkt.ts';
import { luFactorInto, luSolveInto, symmetricInertia } from '../linalg/reference.ts';
import { penaltyGradientInto } from '../../src/solver/penalty.ts';
import { WALL_STRIDE, perimeterInto } from '../../src/solver/wall-terms.ts';
import { jacobianInto, problemOf, residualInto } from './reference.ts';

// a few arrangements of 3 to 5 cells, each at its barycentric drawing with made-up pressures: a state
// far from equilibrium, where every term of the step matters (drawings with a cell below a tenth of the
// mean are left out: there the pressures are ill-determined and two solves may differ in them)
function states() {
  const out = [];
  for (let n = 3; n <= 5; n++) {
    let k = 0;
    for (const c of enumerateClusters(n)) {
      if (k++ % 2 !== 0) continue;
      const p = problemOf(c.map);
      const d = embedCluster(c.map, n);
      const z = new Float64Array(p.size);
      z.set(d.coords);
      z.set(d.bulges, 2 * p.junctions);
      const drawn = new Float64Array(n);
      perimeterInto(p, z, new Float64Array(p.walls * WALL_STRIDE), drawn);
      if (Math.min(...drawn) < 0.1) continue;
      for (let f = 0; f < n; f++) z[2 * p.junctions + p.walls + f] = 0.8 + 0.3 * f;
      const targets = Float64Array.from({ length: n }, (_, f) => 0.5 + 0.25 * f);
      out.push({ code: c.code, map: c.map, p, z, targets });
    }
  }
  return out;
}

describe('factorStepInto', () => {
  it('factorStepInto/solveStepInto without a shift give the step of the full bordered KKT system', () => {
    expect(states().length).toBeGreaterThan(5);
    // reference: the same Newton step solved on the full system of jacobianInto/residualInto (every
    // unknown kept, rigid motions by the same border) with the dense LU of lu.ts ("Matrix Computations",
    // 4th ed., 2013, §3.4); eliminating the bulges is exact algebra (Schur complement)
    for (const { code, p, z, targets } of states()) {
      const n = p.cells;
      const t0 = 2 * p.junctions;
      const p0 = t0 + p.walls;
      const cache = new Float64Array(p.walls * WALL_STRIDE);
      const areas = new Float64Array(n);
      perimeterInto(p, z, cache, areas);
      const pressures = z.subarray(p0, p0 + n);
      const mu = new Float64Array(n);
      const grad = new Float64Array(p0);
      const lengthGrad = new Float64Array(p0);
      penaltyGradientInto(p, z, targets, pressures, 0, cache, areas, mu, grad, lengthGrad);
      const rigid = new Float64Array(3 * t0);
      rigidInto(z, p.junctions, rigid);
      const change = Float64Array.from(targets, (t, f) => t - areas[f]);
      const kw = kktWorkspace(p);
      const order = factorStepInto(p, z, cache, pressures, 0, new Float64Array(p0), lengthGrad, change, rigid, kw, 0);
      const d = new Float64Array(p0);
      const lambda = new Float64Array(n);
      solveStepInto(p, kw, order, d, lambda);
      // the full system: K [d, dp, nu] = -[residual, 0]
      const jac = new Float64Array(p.order * p.order);
      jacobianInto(p, z, jac);
      const r = new Float64Array(p.size);
      residualInto(p, z, targets, r);
      const step = new Float64Array(p.order);
      for (let i = 0; i < p.size; i++) step[i] = -r[i];
      const full = jac.slice();
      const piv = new Int32Array(p.order);
      expect(luFactorInto(full, p.order, piv), code).toBeGreaterThan(0);
      luSolveInto(full, p.order, piv, step);
      let scale = 0;
      for (let i = 0; i < p0; i++) scale = Math.max(scale, Math.abs(step[i]));
      for (let i = 0; i < p0; i++) expect(Math.abs(d[i] - step[i]), `${code} unknown ${i}`).toBeLessThan(1e-9 * (1 + scale));
      for (let f = 0; f < n; f++) {
        expect(Math.abs(lambda[f] - (pressures[f] + step[p0 + f])), `${code} pressure ${f}`).toBeLessThan(1e-9 * (1 + scale));
      }
      // Haynsworth: the reduced matrix with the eliminated pivots has the full matrix's inertia
      const inertia = symmetricInertia(jac.slice(), p.order, 0);
      expect(kw.inertia.negative, code).toBe(inertia.negative);
      // the step's curvature d^T H d, wall by wall, against the full matrix's geometry block
      let dhd = 0;
      for (let i = 0; i < p0; i++) for (let j = 0; j < p0; j++) dhd += d[i] * jac[i * p.order + j] * d[j];
      const curvature = stepCurvature(p, cache, pressures, 0, new Float64Array(p0), d);
      expect(Math.abs(curvature - dhd), code).toBeLessThan(1e-9 * (1 + Math.abs(dhd)));
    }
  });

  it('factorStepInto with a shift and no rigid rows steps like the full system with the shift on its diagonal', () => {
    // reference: the full system of jacobianInto without its rigid border, tau S added to its geometry
    // diagonal (the shift makes it definite on the translations), solved by the dense LU of lu.ts
    for (const { code, p, z, targets } of states().slice(0, 4)) {
      const n = p.cells;
      const t0 = 2 * p.junctions;
      const p0 = t0 + p.walls;
      const cache = new Float64Array(p.walls * WALL_STRIDE);
      const areas = new Float64Array(n);
      perimeterInto(p, z, cache, areas);
      const pressures = z.subarray(p0, p0 + n);
      const lengthGrad = new Float64Array(p0);
      penaltyGradientInto(p, z, targets, pressures, 0, cache, areas, new Float64Array(n), new Float64Array(p0), lengthGrad);
      const rigid = new Float64Array(3 * t0);
      rigidInto(z, p.junctions, rigid);
      const change = Float64Array.from(targets, (t, f) => t - areas[f]);
      const tau = 0.3;
      const shift = Float64Array.from({ length: p0 }, (_, i) => 1 + (i % 5));
      for (let v = 0; v < p.junctions; v++) shift[2 * v + 1] = shift[2 * v];
      const kw = kktWorkspace(p);
      const order = factorStepInto(p, z, cache, pressures, tau, shift, lengthGrad, change, rigid, kw, 0);
      expect(kw.rigidRows).toBe(0);
      const d = new Float64Array(p0);
      solveStepInto(p, kw, order, d, new Float64Array(n));
      const jac = new Float64Array(p.order * p.order);
      jacobianInto(p, z, jac);
      for (let i = 0; i < p0; i++) jac[i * p.order + i] += tau * shift[i];
      const m = p.size;
      const full = new Float64Array(m * m);
      for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) full[i * m + j] = jac[i * p.order + j];
      const r = new Float64Array(p.size);
      residualInto(p, z, targets, r);
      const step = Float64Array.from(r, (x) => -x);
      const piv = new Int32Array(m);
      expect(luFactorInto(full, m, piv), code).toBeGreaterThan(0);
      luSolveInto(full, m, piv, step);
      let scale = 0;
      for (let i = 0; i < p0; i++) scale = Math.max(scale, Math.abs(step[i]));
      for (let i = 0; i < p0; i++) expect(Math.abs(d[i] - step[i]), `${code} unknown ${i}`).toBeLessThan(1e-9 * (1 + scale));
    }
  });
});
