import { describe, expect, it } from 'vitest';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { thetaMap } from '../../src/maps/cubic-map.ts';
import { relax } from '../../src/solver/newton.ts';
import { rankAreas } from '../../src/catalogue/rank.ts';

describe('index and zero modes at the cluster\'s own scales', () => {
  it('the double bubble at areas (1, r), r down to 1e-6, is stable with no zero mode', () => {
    // "The standard double soap bubble in R^2 uniquely minimizes perimeter", Pacific J. Math. 159 (1993):
    // the unique minimiser, and its shape space modulo rigid motions has no neutral direction
    for (const r of [1, 1e-2, 1e-4, 1e-6]) {
      const e = relax(thetaMap(), Float64Array.of(1, r));
      expect(e.status, String(r)).toBe('ok');
      expect(e.index, String(r)).toBe(0);
      expect(e.zeroModes, String(r)).toBe(0);
    }
  });

  it('relax gives the same status, index and zero modes with every area times 1e-6 and 1e6 (n <= 5)', () => {
    // design.md §4: scaling all areas by s scales the cluster by sqrt(s) and the perimeter by sqrt(s);
    // the second variation scales by a positive factor, so its inertia is unchanged (Sylvester's law)
    for (let n = 2; n <= 5; n++) {
      for (const areasOf of [() => 1, (i: number) => i + 1]) {
        const areas = Float64Array.from({ length: n }, (_, i) => areasOf(i));
        for (const c of enumerateClusters(n)) {
          const r = relax(c.map, areas);
          for (const s of [1e-6, 1e6]) {
            const q = relax(c.map, Float64Array.from(areas, (a) => a * s));
            const what = `${c.code} ${Array.from(areas)} x ${s}`;
            expect(q.status, what).toBe(r.status);
            expect(q.index, what).toBe(r.index);
            expect(q.zeroModes, what).toBe(r.zeroModes);
            if (r.status === 'ok') expect(Math.abs(q.perimeter / (Math.sqrt(s) * r.perimeter) - 1), what).toBeLessThan(1e-10);
          }
        }
      }
    }
  });

  it('rankAreas(1..5 times s): every equilibrium certified at two scales has the same index and zero modes', async () => {
    // as above: the inertia of the second variation does not depend on the scale (design.md §4)
    const base = [1, 2, 3, 4, 5];
    const key = (e: { code: string; assignment: number[] }): string => `${e.code} ${e.assignment.join('.')}`;
    const one = new Map((await rankAreas(base)).entries.map((e) => [key(e), e]));
    let compared = 0;
    for (const s of [1e-6, 1e6]) {
      for (const e of (await rankAreas(base.map((a) => a * s))).entries) {
        const f = one.get(key(e));
        if (!f || f.status !== 'ok' || e.status !== 'ok') continue;
        expect([e.index, e.zeroModes], key(e)).toEqual([f.index, f.zeroModes]);
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(100);
  }, 120_000);
});
