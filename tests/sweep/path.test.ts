// sweep stage: sweepPath against the planar double and triple bubble theorems and against direct rankings.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { rankAreas } from '../../src/catalogue/rank.ts';
import { lowerDartOfWall } from '../../src/maps/t1.ts';
import { relaxFrom } from '../../src/solver/newton.ts';
import type { CatalogueEntry } from '../../src/catalogue/types.ts';
import { parseAreaFormulas } from '../../src/sweep/formula.ts';
import { sweepPath } from '../../src/sweep/path.ts';
import type { PathDomain } from '../../src/sweep/domain.ts';
import type { PathSweep } from '../../src/sweep/types.ts';

const path = (from: number, to: number, samples: number, log = true): PathDomain => ({ kind: 'path', parameter: { name: 't', from, to }, samples, log });
const sweep = (areas: string, domain: PathDomain) => sweepPath(parseAreaFormulas(areas, ['t']), domain);

/** Cell side counts with their areas, sorted: the same for every labelling of one candidate. */
function signature(sides: readonly number[], areas: readonly number[]): string {
  return sides.map((s, i) => `${s}:${areas[i].toPrecision(12)}`).sort().join(' ');
}
function sweepSignature(s: PathSweep, c: number, t: number): string {
  const cand = s.set.candidates[c];
  return signature(cand.sides, cand.slots.map((k) => s.formulas[k].value({ t })));
}
function rankSignature(e: CatalogueEntry): string {
  return signature(e.sides, e.cellAreas);
}
const winnerOf = async (areas: number[]): Promise<CatalogueEntry> => (await rankAreas(areas)).entries[0];

describe('sweepPath', () => {
  it('sweepPath of two cells: the standard double bubble wins everywhere, no transition', () => {
    // "The standard double soap bubble in R^2 uniquely minimizes perimeter", Pacific J. Math. 159 (1993)
    for (const areas of ['1, t', 't, 1 / t']) {
      const s = sweep(areas, path(0.1, 10, 9));
      expect(s.transitions).toEqual([]);
      expect(s.intervals).toHaveLength(1);
      for (const r of s.ranked) expect(s.set.candidates[r[0].candidate].id).toBe('2.1');
    }
  });

  it('sweepPath of three cells: the standard triple bubble wins everywhere, no transition', () => {
    // "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004): the standard
    // cluster (every cell touching the other two and the outside: the 3-connected map, K4) is the minimiser
    const standard = [...enumerateClusters(3)].find((c) => c.threeConnected)!.code;
    for (const areas of ['1, 2, t', '1, t, t^2', '1, 1, t']) {
      const s = sweep(areas, path(0.2, 5, 9));
      expect(s.transitions, areas).toEqual([]);
      for (const r of s.ranked) expect(s.set.candidates[r[0].candidate].code).toBe(standard);
    }
  });

  it('sweepPath transitions agree with direct rankings just below and above, perimeters equal at the crossing', async () => {
    // independent check: rankAreas relaxes every candidate from scratch at the two nearby points;
    // at a crossing the two perimeters are equal by definition (they are located to 1e-6 in t)
    const cases: [string, PathDomain, number][] = [
      ['1, 1, 1, t', path(0.5, 2, 6), 1], // the standard 4-cell cluster: the odd cell moves from a 3- to a 4-sided cell at t = 1
      ['1, 1, 1, 1, t', path(0.045, 0.6, 7), 2], // two changes of arrangement between 5.44 and 5.33
    ];
    for (const [areas, domain, expected] of cases) {
      const s = sweep(areas, domain);
      expect(s.transitions.length, areas).toBeGreaterThanOrEqual(expected);
      for (const t of s.transitions) {
        expect(t.kind).toBe('crossing');
        expect(t.bracket[1] - t.bracket[0]).toBeLessThanOrEqual(2e-6);
        const [pa, pb] = t.perimeters;
        expect(Math.abs(pa - pb) / pa, `${areas} at ${t.at}`).toBeLessThan(1e-9);
        const delta = 1e-4 * t.at;
        for (const [x, c] of [[t.at - delta, t.from], [t.at + delta, t.to]] as const) {
          const values = s.formulas.map((f) => f.value({ t: x }));
          const best = await winnerOf(values);
          expect(best.code, `${areas} at t = ${x}`).toBe(s.set.candidates[c].code);
          expect(rankSignature(best), `${areas} at t = ${x}`).toBe(sweepSignature(s, c, x));
          // the winner's perimeter there is the crossing's, moved by at most |dP/dt| delta (dP/dt < P/t here)
          expect(Math.abs(best.perimeter! - pa)).toBeLessThan((2 * pa * delta) / t.at);
        }
      }
    }
  }, 30000);

  it('sweepPath existence boundaries: the wall vanishes linearly there, and rankAreas beyond names the same T1 neighbour', async () => {
    // a smooth function with a simple zero is linear near it (first-order expansion, common practice, no source): chord(at - h) is
    // proportional to h, so chord(2h) / chord(h) = 2 unless `at` is off by a fraction of h.
    // Beyond the boundary the independent ranking must not certify the candidate, and its failure
    // must name the same arrangement for the T1 swap.
    const s = sweep('1, 1, 1, t', path(0.1, 4, 12));
    const located = s.boundaries.filter((b) => b.status === 'wall-collapse' && b.zeroModes === 0);
    expect(located.length).toBeGreaterThanOrEqual(1);
    for (const b of located) {
      const c = s.set.candidates[b.candidate];
      const map = c.cluster.map;
      const dir = b.exists === 'below' ? -1 : 1;
      const k = [...s.xs.keys()].filter((j) => s.states[b.candidate][j] !== null && (s.xs[j] - b.at) * dir > 0)
        .sort((i, j) => Math.abs(s.xs[i] - b.at) - Math.abs(s.xs[j] - b.at))[0];
      const dart = lowerDartOfWall(map.twins, b.collapsingWall!);
      // walk towards the boundary by warm starts from the sample: 1e-3, 2e-4, 1e-4 before it
      let start = s.states[b.candidate][k]!.equilibrium;
      const chord = (h: number): number => {
        const x = b.at + dir * h;
        const areas = Float64Array.from(c.slots.map((j) => s.formulas[j].value({ t: x })));
        const eq = relaxFrom(map, areas, start, { collapseLength: 1e-7 });
        expect(eq.status).toBe('ok');
        start = eq;
        const u = (dart / 3) | 0;
        const v = map.headOf(dart);
        return Math.hypot(eq.coords[2 * v] - eq.coords[2 * u], eq.coords[2 * v + 1] - eq.coords[2 * u + 1]);
      };
      chord(1e-3);
      expect(chord(2e-4) / chord(1e-4)).toBeCloseTo(2, 2);
      const x = b.at - dir * 1e-2;
      const values = s.formulas.map((f) => f.value({ t: x }));
      const mine = sweepSignature(s, b.candidate, x);
      const entries = (await rankAreas(values)).entries.filter((e) => e.code === c.code && rankSignature(e) === mine);
      expect(entries.length).toBeGreaterThanOrEqual(1);
      for (const e of entries) {
        expect(e.status).toBe('wall-collapse');
        expect(e.becomes?.id).toBe(b.becomes?.id);
      }
    }
  });

  it('sweepPath with constant formulas reproduces rankAreas (winner, its cells, perimeter to 1e-10)', async () => {
    // reference: rankAreas, the catalogue's ranking of the same areas
    for (const areas of [[1, 2, 3, 4], [1, 1, 2.5], [1, 1, 1, 1, 2.5]]) {
      const s = sweep(areas.join(', '), path(0, 1, 3, false));
      const best = await winnerOf(areas);
      for (const r of s.ranked) {
        const c = s.set.candidates[r[0].candidate];
        expect(c.code).toBe(best.code);
        expect(signature(c.sides, c.slots.map((k) => areas[k]))).toBe(rankSignature(best));
        expect(Math.abs(r[0].perimeter - best.perimeter!) / best.perimeter!).toBeLessThan(1e-10);
      }
      expect(s.transitions).toEqual([]);
    }
  }, 20000);

  it('sweepPath winner at every sample equals the winner of rankAreas there (property, random 4-cell paths)', async () => {
    // property check against the independent ranking; few runs (each is one sweep and four rankings)
    await fc.assert(
      fc.asyncProperty(
        fc.double({ min: 0.3, max: 3, noNaN: true }),
        fc.double({ min: 0.3, max: 3, noNaN: true }),
        fc.double({ min: 0.2, max: 1, noNaN: true }),
        fc.double({ min: 1.5, max: 5, noNaN: true }),
        async (a, b, from, to) => {
          const areas = `1, ${a.toPrecision(6)}, ${b.toPrecision(6)} * t, 1 / t`;
          const s = sweep(areas, path(from, to, 4));
          for (let k = 0; k < s.xs.length; k++) {
            const x = s.xs[k];
            const best = await winnerOf(s.formulas.map((f) => f.value({ t: x })));
            const w = s.ranked[k][0];
            expect(s.set.candidates[w.candidate].code, `${areas} at t = ${x}`).toBe(best.code);
            expect(sweepSignature(s, w.candidate, x), `${areas} at t = ${x}`).toBe(rankSignature(best));
            expect(Math.abs(w.perimeter - best.perimeter!) / best.perimeter!).toBeLessThan(1e-9);
          }
        },
      ),
      { numRuns: 3, seed: 5 },
    );
  }, 30000);
});
