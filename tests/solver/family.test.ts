import { describe, expect, it } from 'vitest';
import { resolveArrangement } from '../../src/maps/resolve.ts';
import { relax } from '../../src/solver/newton.ts';
import { problemOf } from '../../src/solver/problem.ts';
import { checkEquilibrium, certificatePasses } from '../../src/solver/certificate.ts';
import { beadHostOf, lensHostOf, lensRangeOf, slideLensInto, slidingHostsOf } from '../../src/solver/family.ts';
import { clusterFromCode, enumerateClusters } from '../../src/maps/cluster.ts';
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
  it('5:...b7...g.nm at areas 5,3,4,1,2 is a family of two: its lens and its bead of two cells slide at constant perimeter and areas', () => {
    // A part of a cluster joined to the rest only at the two ends of walls ka, kb between the same two
    // cells slides along their common circle (a rotation about its centre keeps ka and kb on the circle
    // and the part's own walls as they are) at constant perimeter and areas: a zero mode, as a lens's
    // (design.md §7; derived here for a part of several cells). This candidate was called a wall
    // collapse at these areas (its bead slid to the end of its range) and certified at the same areas
    // times 1e-6: relax must certify it with both zero modes.
    const { map } = clusterFromCode('5:...b7...g.nm');
    const areas = Float64Array.of(5, 3, 4, 1, 2);
    const e = relax(map, areas);
    expect([e.status, e.index, e.zeroModes]).toEqual(['ok', 0, 2]);
    const p = problemOf(map);
    const t0 = 2 * p.junctions;
    // the bead: cells 4 and 5 (0-based 3, 4; 5 is the lens), between cells 1 and 3 on walls 5 and 6
    const bead = beadHostOf(p, 5)!;
    expect(bead).not.toBeNull();
    expect([bead.ka, bead.kb]).toEqual([5, 6]);
    expect(bead.moving.length).toBe(4);
    expect(lensHostOf(p, 5)).toBeNull();
    // every lens and bead once: the lens (walls 7, 9) and the bead (walls 5, 6)
    expect(slidingHostsOf(p).map((h) => [h.ka, h.kb])).toEqual([[5, 6], [7, 9]]);
    const base = new Float64Array(p.size);
    base.set(e.coords);
    base.set(e.bulges, t0);
    base.set(e.pressures, t0 + p.walls);
    // (each host piece's arc length: the bead slides at most that far towards it)
    const shortest = Math.min(...[bead.ka, bead.kb].map((k) => {
      const c = Math.hypot(base[2 * p.ends[k]] - base[2 * p.starts[k]], base[2 * p.ends[k] + 1] - base[2 * p.starts[k] + 1]);
      return (c * base[t0 + k]) / Math.sin(base[t0 + k]);
    }));
    const cache = new Float64Array(p.walls * WALL_STRIDE);
    const achieved = new Float64Array(5);
    for (const f of [-0.9, -0.5, 0.5, 0.9]) {
      const z = Float64Array.from(base);
      expect(slideLensInto(p, z, bead, f * shortest)).toBe(true);
      const perimeter = perimeterInto(p, z, cache, achieved);
      expect(Math.abs(perimeter / e.perimeter - 1), String(f)).toBeLessThan(1e-10);
      for (let i = 0; i < 5; i++) expect(Math.abs(achieved[i] / areas[i] - 1), String(f)).toBeLessThan(1e-10);
      const c = checkEquilibrium(map, areas, { coords: z.subarray(0, t0), bulges: z.subarray(t0, t0 + p.walls), pressures: e.pressures });
      expect(certificatePasses(c, 1e-10), String(f)).toBe(true);
    }
  });

  it('relax certifies families whose descent ended at a collapse of a bead or of a two-sided outside, or with a lens slid into another wall', () => {
    // each was called wall-collapse or walls-cross at these areas and certified (index 0, zero modes from
    // sliding parts, design.md §7) at the same areas scaled by 1e-6 or from another first drawing
    // (perimeter 25.6051334453 for the first, from the scaled run)
    const cases: [string, number[], number][] = [
      ['5:...b7...g.nm', [5, 3, 4, 1, 2], 2], // a bead's host piece collapsed
      ['5:.5......nmkj', [5, 4, 2, 1, 3], 3], // the outside has two sides: its walls' ends slide
      ['5:.5...a..g.nm', [4, 2, 1, 3, 5], 3], // the lens slid out of its ring cell
      ['5:.5...a..g.nm', [3, 5, 2, 1, 4], 3], // only a lens and a bead placed together clear every wall
    ];
    for (const [code, areas, zeroModes] of cases) {
      const { map } = clusterFromCode(code);
      const e = relax(map, Float64Array.from(areas));
      expect([e.status, e.index, e.zeroModes, certificatePasses(e.certificate, 1e-10)], `${code} ${areas}`).toEqual(['ok', 0, zeroModes, true]);
    }
    expect(Math.abs(relax(clusterFromCode('5:...b7...g.nm').map, Float64Array.of(5, 3, 4, 1, 2)).perimeter / 25.6051334453 - 1)).toBeLessThan(1e-10);
  });
});
