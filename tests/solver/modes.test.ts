import { describe, expect, it } from 'vitest';
import { clusterFromCode, enumerateClusters } from '../../src/maps/cluster.ts';
import { certificatePasses, checkEquilibrium } from '../../src/solver/certificate.ts';
import { followModes } from '../../src/solver/modes.ts';
import { answerAtState, drawingState, relax } from '../../src/solver/newton.ts';
import { resolveOptions } from '../../src/solver/options.ts';
import { findRootFrom } from '../../src/solver/roots.ts';
import { cyclicGroupOf, stateSymmetriesOf, symmetriseInto } from '../../src/solver/symmetry.ts';
import { perimeterInto } from '../../src/solver/wall-terms.ts';

const OPT = resolveOptions({});

describe('the symmetries of an arrangement acting on states (symmetry.ts)', () => {
  it('n = 5: one symmetry per automorphism, cyclic groups whose orders divide the group order', () => {
    // the order of a subgroup divides the order of the group (Lagrange's theorem); the symmetries of a
    // cluster are counted by maps/canonical.ts (the catalogue's symmetry column)
    for (const c of enumerateClusters(5)) {
      const symmetries = stateSymmetriesOf(c.map);
      expect(symmetries.length).toBe(c.symmetry);
      for (const g of symmetries) {
        // bijections on junctions and walls
        expect(new Set(g.junction).size).toBe(g.junction.length);
        expect(new Set(g.wall).size).toBe(g.wall.length);
        expect(c.symmetry % cyclicGroupOf(g).length).toBe(0);
      }
    }
  });

  it('a symmetric arrangement\'s strict minimum at equal areas is a fixed point of the symmetrisation', () => {
    // at equal areas the equations are invariant under the arrangement's symmetries, so an isolated
    // minimum's images are minima too; the two below (index 0, no zero mode) are their arrangements'
    // only certified equilibria at equal areas (catalogues/equal-5), hence symmetric (common practice, no source)
    for (const code of ['5:.....h.kd.nm', '5:...b...k.gnm']) {
      const c = clusterFromCode(code);
      const areas = new Float64Array(5).fill(1);
      const eq = relax(c.map, areas);
      expect(eq.status).toBe('ok');
      expect([eq.index, eq.zeroModes]).toEqual([0, 0]);
      const state = drawingState(c.map, areas, { drawing: eq, seed: null, amplitude: 0 });
      if (state === null) throw new Error('no state');
      const { problem, ws } = state;
      const before = Float64Array.from(ws.z);
      symmetriseInto(problem, stateSymmetriesOf(c.map), ws.z, new Float64Array(problem.size));
      for (let i = 0; i < 2 * problem.junctions + problem.walls; i++) expect(Math.abs(ws.z[i] - before[i])).toBeLessThan(1e-8);
    }
  });
});

describe('mode following (modes.ts)', () => {
  it('walks uphill from a stable equilibrium along its lowest mode, keeping the areas', () => {
    // the index's definition: at a strict minimum every tangent direction raises the perimeter to second
    // order, so a path leaving along the lowest mode climbs (second-order sufficient condition, common
    // practice, no source)
    const c = clusterFromCode('5:...b...k.gnm');
    const areas = new Float64Array(5).fill(1);
    const eq = relax(c.map, areas);
    for (const sign of [1, -1]) {
      const state = drawingState(c.map, areas, { drawing: eq, seed: null, amplitude: 0 });
      if (state === null) throw new Error('no state');
      const { problem, ws } = state;
      const p0 = perimeterInto(problem, ws.z, ws.cache, ws.areas);
      const report = followModes(problem, ws, [0], [sign], 5);
      expect(report.iterations).toBe(5);
      const p1 = perimeterInto(problem, ws.z, ws.cache, ws.areas);
      expect(p1).toBeGreaterThan(p0 + 1e-4);
      for (let f = 0; f < 5; f++) expect(Math.abs(ws.areas[f] - ws.targets[f])).toBeLessThan(1e-6);
    }
  });

  it('with no mode followed, returns to a perturbed stable equilibrium (Newton steps on the tangent space)', () => {
    const c = clusterFromCode('5:.....h.kd.nm');
    const areas = new Float64Array(5).fill(1);
    const eq = relax(c.map, areas);
    const state = drawingState(c.map, areas, { drawing: eq, seed: 3, amplitude: 0.1 });
    if (state === null) throw new Error('no state');
    const { problem, ws } = state;
    const report = followModes(problem, ws, [], [], 60);
    expect(report.converged).toBe(true);
    expect(findRootFrom(problem, ws, OPT, 40).converged).toBe(true);
    const back = answerAtState(c.map, areas, ws.z, 0);
    expect(back.status).toBe('ok');
    expect(certificatePasses(checkEquilibrium(c.map, areas, back), 1e-10)).toBe(true);
    expect(Math.abs((back.perimeter as number) - eq.perimeter) / eq.perimeter).toBeLessThan(1e-9);
  });
});
