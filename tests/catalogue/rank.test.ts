// rankAreas against published theorems, closed forms and bounds (design §6), and its own invariants.
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { rankAreas, WORKER_LIMIT } from '../../src/catalogue/rank.ts';
import { CODE_CELL_LIMIT } from '../../src/maps/code.ts';
import { readCatalogue, writeCatalogue } from '../../src/catalogue/format.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { summarizeCluster } from '../../src/maps/describe.ts';
import { UsageError } from '../../src/errors.ts';

const first = (c: Awaited<ReturnType<typeof rankAreas>>) => c.entries.find((e) => e.rank === 1)!;
const summaryOf = (code: string) => summarizeCluster(clusterFromCode(code));

// the honeycomb bounds of design §6 for N unit cells ("The honeycomb conjecture", Discrete Comput. Geom.
// 25 (2001); OEIS A135708 for the least edge count of N hexagons)
const lowerBound = (N: number) => Math.pow(12, 0.25) * N;
const upperBound = (N: number) => (3 * N + Math.ceil(Math.sqrt(12 * N - 3))) * Math.sqrt(2 / (3 * Math.sqrt(3)));

describe('rankAreas', () => {
  it('rankAreas on two cells ranks the standard double bubble first for 100 random area sets', async () => {
    // "The standard double soap bubble in R^2 uniquely minimizes perimeter", Pacific J. Math. 159 (1993)
    await fc.assert(
      fc.asyncProperty(fc.double({ min: 0.02, max: 1, noNaN: true }), async (r) => {
        const c = await rankAreas([1, r]);
        expect(first(c).status).toBe('ok');
        expect(c.counts.arrangements).toBe(1);
      }),
      { numRuns: 100 },
    );
  });

  it('rankAreas on three cells ranks the standard triple bubble (on K4) first for 100 random area sets', async () => {
    // "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004)
    await fc.assert(
      fc.asyncProperty(fc.double({ min: 0.05, max: 1, noNaN: true }), fc.double({ min: 0.05, max: 1, noNaN: true }), async (a, b) => {
        const c = await rankAreas([1, a, b]);
        const best = summaryOf(first(c).code);
        expect(best.threeConnected).toBe(true);
        expect(best.sides).toEqual([3, 3, 3]);
        // nothing listed beats it
        for (const e of c.entries) if (e.perimeter !== null) expect(e.perimeter).toBeGreaterThanOrEqual(first(c).perimeter!);
      }),
      { numRuns: 100 },
    );
  });

  it('rankAreas([1, 1, 1, 1]) ranks the standard arrangement with a central wall first', async () => {
    // "Calc. Var. PDE 59 (2020)": two 4-sided cells share the straight central wall, two 3-sided cells at its ends
    const c = await rankAreas([1, 1, 1, 1]);
    const e = first(c);
    const s = summaryOf(e.code);
    expect([...s.sides].sort()).toEqual([3, 3, 4, 4]);
    expect(s.threeConnected).toBe(true);
    expect(s.touchingOutside).toEqual([1, 2, 3, 4]);
    const four = s.sides.map((k, i) => (k === 4 ? i + 1 : 0)).filter((i) => i > 0);
    expect(s.contacts).toContainEqual([four[0], four[1]]);
    // a straight central wall: its two cells have equal pressures (Laplace-Young law)
    expect(Math.abs(e.pressures![four[0] - 1] - e.pressures![four[1] - 1])).toBeLessThan(1e-9);
    expect(c.entries.filter((x) => x.status === 'ok').every((x) => x.perimeter! >= e.perimeter!)).toBe(true);
  });

  it('rankAreas on equal cells: closed forms for n = 1..3, honeycomb bounds for n = 2..7', async () => {
    // one cell: 2 sqrt(pi A) (classical isoperimetric inequality)
    expect(first(await rankAreas([1])).perimeter).toBeCloseTo(2 * Math.sqrt(Math.PI), 12);
    // two equal cells: (8 pi/3 + sqrt 3) sqrt(A / (2 pi/3 + sqrt(3)/4)) (design §6)
    expect(first(await rankAreas([1, 1])).perimeter).toBeCloseTo((8 * Math.PI / 3 + Math.sqrt(3)) / Math.sqrt(2 * Math.PI / 3 + Math.sqrt(3) / 4), 10);
    // three equal cells: straight inner walls of length L at 120 degrees, outer walls semicircles of
    // radius L sqrt(3)/2 (bulge 90 degrees, derived from the 120-degree law at the outer junctions), so
    // A = L^2 (sqrt(3)/4 + 3 pi/8) and P = L (3 + 3 sqrt(3) pi / 2)
    const L = Math.sqrt(1 / (Math.sqrt(3) / 4 + (3 * Math.PI) / 8));
    expect(first(await rankAreas([1, 1, 1])).perimeter).toBeCloseTo(L * (3 + (3 * Math.sqrt(3) * Math.PI) / 2), 10);
    for (let n = 2; n <= 7; n++) {
      const c = await rankAreas(new Array(n).fill(1));
      const best = first(c).perimeter!;
      expect(best).toBeGreaterThan(lowerBound(n));
      expect(best).toBeLessThanOrEqual(upperBound(n));
      for (const e of c.entries) if (e.perimeter !== null) expect(e.perimeter).toBeGreaterThan(lowerBound(n));
    }
  }, 120_000);

  it('rankAreas: scaling every area by s scales every perimeter by sqrt(s) and keeps the order (design §4)', async () => {
    const areas = [1, 2, 3, 4];
    const base = await rankAreas(areas);
    for (const s of [1e-3, 1e3]) {
      const scaled = await rankAreas(areas.map((a) => a * s));
      const ok = base.entries.filter((e) => e.rank !== null);
      const okScaled = scaled.entries.filter((e) => e.rank !== null);
      expect(okScaled.map((e) => `${e.code}/${e.assignment}`)).toEqual(ok.map((e) => `${e.code}/${e.assignment}`));
      ok.forEach((e, i) => expect(okScaled[i].perimeter! / Math.sqrt(s)).toBeCloseTo(e.perimeter!, 9));
    }
  });

  it('rankAreas keeps the rooting identity of OEIS A000309 over the arrangements it enumerates', async () => {
    for (const n of [2, 4, 6]) {
      const c = await rankAreas(new Array(n).fill(1), { filter: { threeConnected: true } });
      expect(c.counts.rootings.sum).toBe(c.counts.rootings.expected);
    }
  });

  it('rankAreas counts candidates up to symmetry: all-distinct areas give n!/|symmetry| per arrangement', async () => {
    const c = await rankAreas([1, 2, 3]);
    // K4: 3!/6 = 1; chain of three: 3!/2 = 3; lens in a wall: 3!/2 = 3 (symmetry on cells has order 2)
    expect(c.counts.candidates).toBe(7);
    expect(c.counts.tried).toBe(7);
    expect(c.counts.exhaustive).toBe(true);
  });

  it('rankAreas beyond its budget searches, and says it is not exhaustive', async () => {
    // 0.01 s pays for one relaxation per arrangement (about 22 by the estimate, 45 in fact) but not for the 3060 candidates
    const c = await rankAreas([1, 2, 3, 4, 5], { budgetSeconds: 0.01 });
    expect(c.counts.exhaustive).toBe(false);
    expect(c.counts.skipped).toBeGreaterThan(0);
    expect(c.counts.tried + c.counts.skipped).toBe(c.counts.candidates);
  });

  it('rankAreas is deterministic: same input, same bytes; one worker or two, same catalogue', async () => {
    const areas = [1, 1, 2, 2.5, 3];
    const a = writeCatalogue(await rankAreas(areas, { workers: 1 }));
    const b = writeCatalogue(await rankAreas(areas, { workers: 1 }));
    const c = writeCatalogue(await rankAreas(areas, { workers: 2 }));
    expect(b).toBe(a);
    expect(c).toBe(a);
  }, 120_000);

  it('rankAreas refuses bad areas and too many cells with UsageError', async () => {
    for (const bad of [[], [1, 0], [1, -2], [1, NaN], [1, Infinity]]) {
      await expect(rankAreas(bad)).rejects.toThrow(UsageError);
    }
    await expect(rankAreas(new Array(12).fill(1))).rejects.toThrow(/about [0-9]+ (minutes|hours|days)/);
  });

  it('rankAreas refuses a budget below the least work of the query, naming both, before any work', async () => {
    // 10 equal cells: about 1.29e6 arrangements (estimate.ts), each relaxed at least once, is far beyond 1 s
    await expect(rankAreas(new Array(10).fill(1), { large: true, budgetSeconds: 1 })).rejects.toThrow(UsageError);
    await expect(rankAreas(new Array(10).fill(1), { large: true, budgetSeconds: 1 })).rejects.toThrow(/Budget 1 s .* at least [0-9]+ s/);
  });

  it('rankAreas refuses the same budget with one worker or two: the budget is work on one core, the query decides', async () => {
    const messages = await Promise.all([1, 2].map((workers) =>
      rankAreas(new Array(9).fill(1), { budgetSeconds: 60, workers }).then(() => 'ranked', (error: Error) => error.message)));
    expect(messages[0]).toMatch(/^Budget 60 s is below/);
    expect(messages[1]).toBe(messages[0]);
  });

  it('rankAreas refuses more cells than a code holds even when large, and workers beyond WORKER_LIMIT', async () => {
    await expect(rankAreas(new Array(CODE_CELL_LIMIT + 1).fill(1), { large: true })).rejects.toThrow(/above 200/);
    await expect(rankAreas([1, 1], { workers: WORKER_LIMIT + 1 })).rejects.toThrow(UsageError);
    await expect(rankAreas([1, 1], { workers: 1.5 })).rejects.toThrow(UsageError);
    await expect(rankAreas([1, 1, 1], { filter: { minSides: 5, maxSides: 4 } })).rejects.toThrow(/--min-sides 5 is above --max-sides 4/);
  });
});

describe('writeCatalogue', () => {
  it('readCatalogue(writeCatalogue(c)) reads back to the same text', async () => {
    const text = writeCatalogue(await rankAreas([1, 2, 2]));
    expect(writeCatalogue(readCatalogue(text))).toBe(text);
  });

  it('writeCatalogue regenerates catalogues/equal-4.json byte for byte (with the starts it records)', async () => {
    const committed = readFileSync(new URL('../../catalogues/equal-4.json', import.meta.url), 'utf8');
    const { starts } = readCatalogue(committed).query;
    expect(writeCatalogue(await rankAreas([1, 1, 1, 1], { starts, workers: 1 }))).toBe(committed);
  });

  it('the committed equal-area catalogues n = 1..9 are valid, exhaustive, and within the honeycomb bounds', () => {
    for (let n = 1; n <= 9; n++) {
      // n = 9 is the census: compact (certified entries only) and gzip-compressed
      const text = n <= 8
        ? readFileSync(new URL(`../../catalogues/equal-${n}.json`, import.meta.url), 'utf8')
        : gunzipSync(readFileSync(new URL(`../../catalogues/equal-${n}.json.gz`, import.meta.url))).toString('utf8');
      const c = readCatalogue(text);
      if (n === 9) {
        expect(c.compact).toBe(true);
        // 136,478 arrangements of 9 cells; their rooting sum is checked below against (n + 1) A000309(n - 1)
        expect(c.counts.candidates).toBe(136478);
      }
      expect(c.counts.exhaustive).toBe(true);
      expect(c.counts.rootings.sum).toBe(c.counts.rootings.expected);
      const best = c.entries[0].perimeter!;
      if (n >= 2) {
        expect(best).toBeGreaterThan(lowerBound(n));
        expect(best).toBeLessThanOrEqual(upperBound(n));
      }
    }
  });
});
