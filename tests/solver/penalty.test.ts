import { describe, expect, it } from 'vitest';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { embedCluster } from '../../src/arcs/embed.ts';
import { fitPressuresInto, meritOf, penaltyGradientInto } from '../../src/solver/penalty.ts';
import { WALL_STRIDE, perimeterInto } from '../../src/solver/wall-terms.ts';
import { problemOf } from '../../src/solver/problem.ts';
import { relax } from '../../src/solver/newton.ts';

describe('penalty energy', () => {
  it('penaltyGradientInto is the gradient of the merit and of the perimeter (central differences)', () => {
    // reference: central finite differences, error O(step^2)
    const maps = [...enumerateClusters(4)].map((c) => c.map).slice(0, 5);
    for (const map of maps) {
      const p = problemOf(map);
      const n = p.cells;
      const dim = 2 * p.junctions + p.walls;
      const d = embedCluster(map, n);
      const z = new Float64Array(p.size);
      z.set(d.coords);
      z.set(d.bulges, 2 * p.junctions);
      const targets = Float64Array.from({ length: n }, (_, f) => 0.6 + 0.3 * f);
      const mult = Float64Array.from({ length: n }, (_, f) => 1.2 - 0.2 * f);
      const kappa = 7;
      const cache = new Float64Array(p.walls * WALL_STRIDE);
      const areas = new Float64Array(n);
      const merit = (): number => meritOf(perimeterInto(p, z, cache, areas), areas, targets, mult, kappa, n);
      merit();
      const grad = new Float64Array(dim);
      const lengthGrad = new Float64Array(dim);
      penaltyGradientInto(p, z, targets, mult, kappa, cache, areas, new Float64Array(n), grad, lengthGrad);
      const step = 1e-6;
      for (let i = 0; i < dim; i++) {
        const keep = z[i];
        z[i] = keep + step;
        const up = merit();
        const upLength = perimeterInto(p, z, cache, areas);
        z[i] = keep - step;
        const down = merit();
        const downLength = perimeterInto(p, z, cache, areas);
        z[i] = keep;
        expect(Math.abs((up - down) / (2 * step) - grad[i])).toBeLessThan(1e-6 * (1 + Math.abs(grad[i])));
        expect(Math.abs((upLength - downLength) / (2 * step) - lengthGrad[i])).toBeLessThan(1e-6 * (1 + Math.abs(lengthGrad[i])));
      }
    }
  });

  it('fitPressuresInto gives back the pressures of a certified equilibrium', () => {
    // at an equilibrium grad P = sum p_f grad A_f exactly (the Lagrange condition of the area-constrained perimeter), so the least-squares fit of the
    // pressures to the shape is exact; the answers' pressures come from the relaxer's own steps
    let checked = 0;
    for (const c of [...enumerateClusters(4)]) {
      const areas = Float64Array.of(1, 2, 1.5, 0.7);
      const r = relax(c.map, areas);
      if (r.status !== 'ok') continue;
      checked++;
      const p = problemOf(c.map);
      const n = p.cells;
      const unit = Math.sqrt((1 + 2 + 1.5 + 0.7) / 4);
      const z = new Float64Array(p.size);
      for (let i = 0; i < 2 * p.junctions; i++) z[i] = r.coords[i] / unit;
      z.set(r.bulges, 2 * p.junctions);
      const dim = 2 * p.junctions + p.walls;
      const cache = new Float64Array(p.walls * WALL_STRIDE);
      perimeterInto(p, z, cache, new Float64Array(n));
      const lengthGrad = new Float64Array(dim);
      penaltyGradientInto(p, z, areas, new Float64Array(n), 0, cache, new Float64Array(n), new Float64Array(n), new Float64Array(dim), lengthGrad);
      const mu = new Float64Array(n);
      expect(fitPressuresInto(p, z, cache, lengthGrad, mu, new Float64Array(n * dim), new Float64Array(n * n), new Float64Array(n), new Float64Array(n))).toBe(true);
      for (let f = 0; f < n; f++) expect(mu[f] / unit).toBeCloseTo(r.pressures[f], 9);
    }
    expect(checked).toBeGreaterThan(2);
  });
});
