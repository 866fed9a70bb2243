import { describe, expect, it } from 'vitest';
import { resolveArrangement } from '../../src/maps/resolve.ts';
import { relax } from '../../src/solver/newton.ts';
import { problemOf } from '../../src/solver/problem.ts';
import { checkEquilibrium, certificatePasses } from '../../src/solver/certificate.ts';
import { lensHostOf, lensRangeOf, slideLensInto } from '../../src/solver/family.ts';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { WALL_STRIDE, perimeterInto } from '../../src/solver/wall-terms.ts';

describe('lens families', () => {
  it('3.2 at equal areas is a family: its lens slides along its wall at constant perimeter and areas (to 1e-10)', () => {
    // a lens on a wall of constant curvature slides along that wall's circle with perimeter and areas
    // unchanged (common practice, no source; design.md §7)
    const cluster = resolveArrangement('3.2');
    const areas = Float64Array.of(1, 1, 1);
    const e = relax(cluster.map, areas);
    expect(e.status).toBe('ok');
    expect(e.zeroModes).toBeGreaterThanOrEqual(1);
    const p = problemOf(cluster.map);
    const t0 = 2 * p.junctions;
    let host = null;
    for (let k = 0; k < p.walls && host === null; k++) host = lensHostOf(p, k);
    expect(host).not.toBeNull();
    const base = new Float64Array(p.size);
    base.set(e.coords);
    base.set(e.bulges, t0);
    base.set(e.pressures, t0 + p.walls);
    const range = lensRangeOf(p, base, host!);
    const shortest = Math.min(...[host!.ka, host!.kb].map((k) => {
      const z = base;
      const a = 2 * p.starts[k];
      const b = 2 * p.ends[k];
      const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
      return (c * z[t0 + k]) / Math.sin(z[t0 + k]);
    }));
    expect(range).toBeGreaterThan(0);
    const cache = new Float64Array(p.walls * WALL_STRIDE);
    const achieved = new Float64Array(3);
    for (const f of [-0.9, -0.5, 0.3, 0.8]) {
      const z = Float64Array.from(base);
      expect(slideLensInto(p, z, host!, f * shortest)).toBe(true);
      const perimeter = perimeterInto(p, z, cache, achieved);
      expect(Math.abs(perimeter / e.perimeter - 1), String(f)).toBeLessThan(1e-10);
      for (let i = 0; i < 3; i++) expect(Math.abs(achieved[i] - 1), String(f)).toBeLessThan(1e-10);
      // still an equilibrium: the independent certificate
      const c = checkEquilibrium(cluster.map, areas, { coords: z.subarray(0, t0), bulges: z.subarray(t0, t0 + p.walls), pressures: e.pressures });
      expect(certificatePasses(c, 1e-10), String(f)).toBe(true);
    }
  });

  it('relax keeps the lens families at equal areas n <= 7: arrangements once called collapses are certified families', () => {
    // the single descent called these wall-collapse (its lens slid to the end of its range); each has a
    // stable equilibrium with a lens free to slide (common practice, no source), which relax certifies
    // (the independent certificate) with index 0 and at least one zero mode
    const families = ['5:....7.hd..nm', '6:..4......g.tmps', '6:..4....d.nj..ts', '7:..4.......ts.wv.zy', '7:..4..a....j.tp..zy'];
    const clusters = [...enumerateClusters(5), ...enumerateClusters(6), ...enumerateClusters(7)];
    const byCode = new Map(clusters.map((c) => [c.code, c]));
    for (const code of families) {
      const c = byCode.get(code)!;
      const n = c.map.faceCount - 1;
      const e = relax(c.map, new Float64Array(n).fill(1));
      expect([e.status, e.index], code).toEqual(['ok', 0]);
      expect(e.zeroModes, code).toBeGreaterThanOrEqual(1);
    }
  });
});
