// sweep stage: the perimeter's slope from the pressures, and the same-branch test of warm starts.
import { describe, expect, it } from 'vitest';
import { clusterFromCode, enumerateClusters } from '../../src/maps/cluster.ts';
import { relax } from '../../src/solver/newton.ts';
import { emptyCounts, perimeterSlope, sameBranch, trackStep } from '../../src/sweep/track.ts';

const circle = clusterFromCode('1:');
const [theta] = [...enumerateClusters(2)];

describe('perimeterSlope', () => {
  it('perimeterSlope of one circle is d(2 sqrt(pi A))/dA = sqrt(pi / A) (isoperimetric inequality, closed form)', () => {
    for (const A of [0.3, 1, 7]) {
      const eq = relax(circle.map, Float64Array.of(A));
      expect(perimeterSlope(eq, Float64Array.of(1))).toBeCloseTo(Math.sqrt(Math.PI / A), 12);
    }
  });

  it('perimeterSlope of the double bubble matches a central difference of relaxed perimeters', () => {
    // the Lagrange multiplier of a constraint is the sensitivity of the optimum to it (envelope
    // theorem, common practice, no source): dP/dA_i = p_i
    const areas = (t: number) => Float64Array.of(1, t);
    const t = 2.5;
    const h = 1e-4;
    const slope = perimeterSlope(relax(theta.map, areas(t)), Float64Array.of(0, 1));
    const diff = (relax(theta.map, areas(t + h)).perimeter - relax(theta.map, areas(t - h)).perimeter) / (2 * h);
    expect(Math.abs(slope - diff)).toBeLessThan(1e-7);
  });
});

describe('trackStep', () => {
  it('trackStep from a nearby equilibrium continues its branch and counts one warm start', () => {
    const counts = emptyCounts();
    const a0 = Float64Array.of(1, 2);
    const start = trackStep(theta.map, a0, null, undefined, counts, 'cold');
    expect(start.ok).toBe(true);
    const a1 = Float64Array.of(1, 2.1);
    const next = trackStep(theta.map, a1, { areas: a0, equilibrium: start.equilibrium }, undefined, counts, 'warm');
    expect(next.continued).toBe(true);
    expect(counts).toEqual({ cold: 1, warm: 1, probe: 0 });
    expect(sameBranch({ areas: a0, equilibrium: start.equilibrium }, next.equilibrium, a1)).toBe(true);
  });

  it('sameBranch tells a mirrored double bubble (bulges reversed) from a continuation', () => {
    // the mirror image has every bulge negated; its perimeter is the same, so only the bulge test
    // separates it and the perimeter test accepts it: a mirror image is the same branch of perimeters
    const a0 = Float64Array.of(1, 2);
    const eq = relax(theta.map, a0);
    const mirrored = { ...eq, bulges: eq.bulges.map((t) => -t) };
    expect(sameBranch({ areas: a0, equilibrium: eq }, mirrored, a0)).toBe(true);
    const other = { ...mirrored, perimeter: eq.perimeter * 1.01, energy: eq.energy * 1.01 };
    expect(sameBranch({ areas: a0, equilibrium: eq }, other, a0)).toBe(false);
  });
});
