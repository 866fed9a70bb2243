// The atlas against published theorems (the winner at every sample), against `rank` at the same areas, and
// its design, JSON and schema.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { byRank, locateBoundary, runAtlas, satisfiesClaim } from '../../src/atlas/atlas.ts';
import { DEFAULT_MIN_SHARE, atlasSamples, compactOrder, reachableRatio } from '../../src/atlas/design.ts';
import { atlasJson, readAtlas } from '../../src/atlas/format.ts';
import { rankAreas } from '../../src/catalogue/rank.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { summarizeCluster } from '../../src/maps/describe.ts';
import { CatalogueFormatError, UsageError } from '../../src/errors.ts';

/** The standard four-cell arrangement: sides 4, 3, 4, 3, every cell on the outside (lather list 4: 4.9). */
const STANDARD_FOUR = '4:...b.e.hg';
/** The standard triple bubble: the arrangement on K4 (lather list 3: 3.3). */
const TRIPLE = '3:...b7a';

describe('atlasSamples', () => {
  it('atlasSamples gives areas largest first, summing to n, every share at least the least share, the same for the same seed', () => {
    for (const cells of [2, 4, 7]) {
      const m = 0.01;
      const a = atlasSamples({ cells, samples: 300, seed: 5, minShare: m });
      for (let k = 0; k < 300; k++) {
        const row = [...a.subarray(k * cells, (k + 1) * cells)];
        expect(row.reduce((p, q) => p + q, 0)).toBeCloseTo(cells, 12);
        for (let i = 1; i < cells; i++) expect(row[i]).toBeLessThanOrEqual(row[i - 1]);
        expect(row[cells - 1] / cells).toBeGreaterThanOrEqual(m - 1e-15);
        expect(row[0] / row[cells - 1]).toBeLessThanOrEqual(reachableRatio(cells, m) * (1 + 1e-12));
      }
      expect(atlasSamples({ cells, samples: 300, seed: 5, minShare: m })).toEqual(a);
      expect(atlasSamples({ cells, samples: 300, seed: 6, minShare: m })).not.toEqual(a);
    }
  });

  it('atlasSamples reaches ratios beyond 1:1000 by default and covers the chamber evenly', () => {
    // the issue asks for 1:1 to at least 1:1000 reachable
    for (let cells = 2; cells <= 8; cells++) expect(reachableRatio(cells, DEFAULT_MIN_SHARE)).toBeGreaterThan(1000);
    // uniform on the simplex: the smallest of 4 shares exceeds x with probability (1 - 4x)^3 (spacings of
    // uniform order statistics; common practice, no source); a low-discrepancy design is within a few 1/K
    const K = 4096;
    const a = atlasSamples({ cells: 4, samples: K, seed: 1, minShare: 0 });
    for (const x of [0.02, 0.05, 0.1, 0.2]) {
      let above = 0;
      for (let k = 0; k < K; k++) if (a[4 * k + 3] / 4 > x) above++;
      expect(Math.abs(above / K - (1 - 4 * x) ** 3)).toBeLessThan(0.01);
    }
  });

  it('atlasSamples with types: one type is the untyped chamber; types a,a,b order the a shares only, the b share evenly spread', () => {
    const K = 4096;
    const plain = atlasSamples({ cells: 3, samples: K, seed: 1, minShare: 0 });
    expect(atlasSamples({ cells: 3, samples: K, seed: 1, minShare: 0 }, [1, 1, 1])).toEqual(plain);
    const typed = atlasSamples({ cells: 3, samples: K, seed: 1, minShare: 0 }, [1, 1, 2]);
    // the uniform distribution on the simplex is exchangeable, so the b cell holds the largest of the 3 shares
    // with probability 1/3 and its share exceeds x with probability (1 - x)^2 (a Dirichlet(1, 1, 1)
    // marginal is Beta(1, 2); common practice, no source); a low-discrepancy design is within a few 1/K
    let largest = 0;
    for (let k = 0; k < K; k++) {
      expect(typed[3 * k]).toBeGreaterThanOrEqual(typed[3 * k + 1]);
      expect(typed[3 * k] + typed[3 * k + 1] + typed[3 * k + 2]).toBeCloseTo(3, 12);
      if (typed[3 * k + 2] > typed[3 * k]) largest++;
    }
    expect(Math.abs(largest / K - 1 / 3)).toBeLessThan(0.01);
    for (const x of [0.1, 0.3, 0.6]) {
      let above = 0;
      for (let k = 0; k < K; k++) if (typed[3 * k + 2] / 3 > x) above++;
      expect(Math.abs(above / K - (1 - x) ** 2)).toBeLessThan(0.01);
    }
  });

  it('compactOrder is a permutation', () => {
    const a = atlasSamples({ cells: 4, samples: 100 });
    expect([...compactOrder(a, 4)].sort((p, q) => p - q)).toEqual([...Array(100).keys()]);
  });

  it('atlasSamples refuses bad cells, samples, seeds and a least share that leaves nothing', () => {
    expect(() => atlasSamples({ cells: 1, samples: 5 })).toThrow(UsageError);
    expect(() => atlasSamples({ cells: 9, samples: 5 })).toThrow(UsageError);
    expect(() => atlasSamples({ cells: 4, samples: 0 })).toThrow(UsageError);
    expect(() => atlasSamples({ cells: 4, samples: 1e7 })).toThrow(UsageError);
    expect(() => atlasSamples({ cells: 4, samples: 5, seed: -1 })).toThrow(UsageError);
    expect(() => atlasSamples({ cells: 4, samples: 5, minShare: 0.25 })).toThrow(/Least share is 0.25 when expected/);
  });
});

describe('runAtlas against theorems', () => {
  it('runAtlas(2): the double bubble wins at every sample', async () => {
    // "The standard double soap bubble in R^2 uniquely minimizes perimeter", Pacific J. Math. 159 (1993)
    const a = await runAtlas({ cells: 2, samples: 8 });
    for (const s of a.samples) {
      expect(s.winner?.code).toBe('2:.54'); // the theta graph, the only arrangement of two cells (lather list 2)
      expect(s.winner?.sidesByRank).toEqual([2, 2]);
    }
    expect(a.classes.filter((c) => c.samples > 0)).toHaveLength(1);
  }, 60000);

  it('runAtlas(3): the triple bubble on K4 wins at every sample, with every rank touching the other two and the outside', async () => {
    // "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004)
    const a = await runAtlas({ cells: 3, samples: 12 });
    for (const s of a.samples) {
      expect(s.winner?.code).toBe(TRIPLE);
      expect(s.winner?.sidesByRank).toEqual([3, 3, 3]);
      expect(s.winner?.wallsByRank).toEqual([[0, 1], [0, 2], [0, 3], [1, 2], [1, 3], [2, 3]]);
      expect(s.margin).toBeGreaterThan(0);
    }
    expect(a.changes).toEqual([]);
  }, 60000);

  it('runAtlas(4) near equal areas: the standard arrangement wins at every sample', async () => {
    // four equal cells: the standard arrangement with a central wall is the minimiser, "Calc. Var. PDE 59
    // (2020)" (the title, from memory: "The quadruple planar bubble enclosing equal areas is symmetric"); the
    // perimeters depend continuously on the areas, so the strict gap to the other arrangements persists for
    // areas within about 1% of equal (the samples here)
    const a = await runAtlas({ cells: 4, samples: 6, minShare: 0.2488 });
    for (const s of a.samples) {
      expect(s.winner?.code).toBe(STANDARD_FOUR);
      expect(Math.max(...s.areas) / Math.min(...s.areas)).toBeLessThan(1.03);
    }
  }, 120000);
});

describe('runAtlas against rank', () => {
  it("every sample's winner equals rank's winner at those areas", async () => {
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: 1000 }), async (seed) => {
        const a = await runAtlas({ cells: 4, samples: 3, seed, minShare: 0.01 });
        for (const s of a.samples) {
          const c = await rankAreas(s.areas);
          const best = c.entries[0];
          expect(s.winner?.code).toBe(best.code);
          expect(s.winner?.ranks).toEqual(best.assignment.map((i) => i + 1));
          expect(s.winner?.perimeter).toBeCloseTo(best.perimeter as number, 8);
        }
      }),
      { numRuns: 3, seed: 13 },
    );
  }, 240000);
});

describe('winner by area rank', () => {
  it('byRank and satisfiesClaim read the standard arrangement by rank', () => {
    // cells 1 and 3 of 4.9 are its 4-sided cells and share the central wall (lather list 4)
    const s = summarizeCluster(clusterFromCode(STANDARD_FOUR));
    expect(s.sides).toEqual([4, 3, 4, 3]);
    const r = byRank(s, [0, 2, 1, 3]);
    expect(r.sidesByRank).toEqual([4, 4, 3, 3]);
    expect(r.wallsByRank).toContainEqual([1, 2]);
    expect(satisfiesClaim(s, [0, 2, 1, 3])).toBe(true);
    expect(satisfiesClaim(s, [1, 2, 0, 3])).toBe(true);
    expect(satisfiesClaim(s, [2, 0, 3, 1])).toBe(false); // ranks 2 and 4 on the central wall
    expect(satisfiesClaim(s, [0, 1, 2, 3])).toBe(false); // ranks 1 and 3 on the central wall
    expect(satisfiesClaim(summarizeCluster(clusterFromCode('4:....7.hdg')), [0, 1, 2, 3])).toBe(false);
  });
});

describe('atlas file', () => {
  it('atlasJson: same seed, same bytes, with one worker or two; readAtlas checks it against the schema', async () => {
    const one = atlasJson(await runAtlas({ cells: 3, samples: 40, seed: 7 }));
    const again = atlasJson(await runAtlas({ cells: 3, samples: 40, seed: 7 }));
    const two = atlasJson(await runAtlas({ cells: 3, samples: 40, seed: 7, workers: 2 }));
    expect(again).toBe(one);
    expect(two).toBe(one);
    const doc = readAtlas(one);
    expect((doc.query as { samples: number }).samples).toBe(40);
    expect(() => readAtlas(one.replace('"warmShare"', '"warm"'))).toThrow(CatalogueFormatError);
    expect(() => readAtlas(one.replace('"version": 1', '"version": 2'))).toThrow(/Got v2 atlas/);
    expect(() => readAtlas('{')).toThrow(CatalogueFormatError);
  }, 120000);
});

describe('locateBoundary', () => {
  it('locateBoundary finds the exchange of two areas across the central wall where the two areas are equal', () => {
    // along the segment the areas of index 1 and 2 trade places: at t = 1/2 they are equal and the two
    // assignments are mirror images of each other, so their perimeters are equal there and nowhere else on
    // the segment (symmetry; common practice, no source)
    const x = { index: 0, areas: [1.6, 1.0, 0.8, 0.6], winner: { class: 0 } } as unknown as Parameters<typeof locateBoundary>[0];
    const y = { index: 1, areas: [1.6, 0.8, 1.0, 0.6], winner: { class: 1 } } as unknown as Parameters<typeof locateBoundary>[1];
    const a = { code: STANDARD_FOUR, id: '4.9', assignment: [0, 2, 1, 3], perimeter: 0, index: 0, zeroModes: 0 };
    const b = { code: STANDARD_FOUR, id: '4.9', assignment: [0, 1, 2, 3], perimeter: 0, index: 0, zeroModes: 0 };
    const classOf = new Map([[`${STANDARD_FOUR} 0,2,1,3`, 0], [`${STANDARD_FOUR} 0,1,2,3`, 1]]);
    const found = locateBoundary(x, y, a, b, 1e-6, { cells: 4, samples: 2 }, new Map(), classOf);
    expect(found).not.toBeNull();
    expect(Math.abs((found?.t ?? 0) - 0.5)).toBeLessThan(1e-6);
    const [lo, hi] = found?.bracket ?? [0, 1];
    expect(hi - lo).toBeLessThanOrEqual(1e-6);
    expect(found?.kind).toBe('crossing');
    expect(found?.confirmed).toBe(true);
    expect(found?.perimeters[0]).toBeCloseTo(found?.perimeters[1] as number, 8);
  }, 60000);
});
