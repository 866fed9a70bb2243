import { describe, expect, it } from 'vitest';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { embedCluster } from '../../src/arcs/embed.ts';
import { jacobianInto, problemOf, residualInto } from './reference.ts';
import { luFactorInto, luSolveInto } from '../linalg/reference.ts';
import { relax } from '../../src/solver/newton.ts';

function stateOf(map: Parameters<typeof problemOf>[0], coords: Float64Array, bulges: Float64Array, pressures: Float64Array) {
  const p = problemOf(map);
  const z = new Float64Array(p.size);
  z.set(coords);
  z.set(bulges, 2 * p.junctions);
  z.set(pressures, 2 * p.junctions + p.walls);
  return { p, z };
}

describe('residual', () => {
  it('jacobianInto matches central differences of residualInto', () => {
    // reference: central finite differences, error O(step^2)
    const maps = [...enumerateClusters(4)].map((c) => c.map).slice(0, 4);
    for (const map of maps) {
      const n = map.faceCount - 1;
      const d = embedCluster(map, n);
      const pressures = Float64Array.from({ length: n }, (_, i) => 0.7 + 0.3 * i);
      const { p, z } = stateOf(map, d.coords, d.bulges, pressures);
      const targets = new Float64Array(n).fill(1);
      const jac = new Float64Array(p.order * p.order);
      jacobianInto(p, z, jac);
      const rp = new Float64Array(p.size);
      const rm = new Float64Array(p.size);
      const step = 1e-6;
      let worst = 0;
      for (let j = 0; j < p.size; j++) {
        const keep = z[j];
        z[j] = keep + step;
        residualInto(p, z, targets, rp);
        z[j] = keep - step;
        residualInto(p, z, targets, rm);
        z[j] = keep;
        for (let i = 0; i < p.size; i++) {
          const fd = (rp[i] - rm[i]) / (2 * step);
          worst = Math.max(worst, Math.abs(fd - jac[i * p.order + j]) / (1 + Math.abs(fd)));
        }
      }
      expect(worst).toBeLessThan(1e-6);
      // the Jacobian is symmetric (it is the Hessian of the Lagrangian)
      for (let i = 0; i < p.order; i++) for (let j = 0; j < i; j++) expect(jac[i * p.order + j]).toBe(jac[j * p.order + i]);
    }
  });

  it('residualInto falls quadratically under plain Newton steps near the solution', () => {
    // source: Newton's method converges quadratically at a regular root with an exact Jacobian
    // (common practice, no source). K4 at areas 1, 2, 3 has no zero mode.
    const k4 = [...enumerateClusters(3)].map((c) => c.map).find((m) => m.faceSize(1) === 3 && m.faceSize(2) === 3)!;
    const areas = Float64Array.of(1, 2, 3);
    const eq = relax(k4, areas);
    expect(eq.status).toBe('ok');
    const unit = Math.sqrt(2);
    const coords = Float64Array.from(eq.coords, (x, i) => x / unit + 0.02 * Math.sin(i + 1));
    const bulges = Float64Array.from(eq.bulges, (t, i) => t + 0.02 * Math.cos(i));
    const pressures = Float64Array.from(eq.pressures, (x) => x * unit * 1.01);
    const { p, z } = stateOf(k4, coords, bulges, pressures);
    const targets = Float64Array.from(areas, (a) => a / 2);
    const r = new Float64Array(p.size);
    const jac = new Float64Array(p.order * p.order);
    const piv = new Int32Array(p.order);
    const step = new Float64Array(p.order);
    const norms: number[] = [];
    for (let it = 0; it < 6; it++) {
      residualInto(p, z, targets, r);
      norms.push(Math.hypot(...r));
      jacobianInto(p, z, jac);
      luFactorInto(jac, p.order, piv);
      step.fill(0);
      for (let i = 0; i < p.size; i++) step[i] = -r[i];
      luSolveInto(jac, p.order, piv, step);
      for (let i = 0; i < p.size; i++) z[i] += step[i];
    }
    // quadratic: r_{k+1} <= C r_k^2 with a modest C while above the rounding floor
    for (let k = 0; k + 1 < norms.length && norms[k + 1] > 1e-13; k++) {
      expect(norms[k + 1]).toBeLessThan(10 * norms[k] * norms[k]);
    }
    expect(norms[norms.length - 1]).toBeLessThan(1e-12);
    expect(norms[0]).toBeGreaterThan(1e-3);
  });
});
