// Canonical codes, symmetry and decoding of clusters, with brute-force oracles at small n.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CubicMap, next, prev } from '../../src/maps/cubic-map.ts';
import { type Cluster, cellPermutations, clusterFromCode, clusterOf, enumerateClusters } from '../../src/maps/cluster.ts';
import { summarizeCluster } from '../../src/maps/describe.ts';
import { validateCluster } from '../../src/maps/validate.ts';

/** Relabel darts: junction v becomes perm[v], its darts rotated by shift[v] (rotation order kept). */
function relabel(map: CubicMap, perm: number[], shift: number[]): { map: CubicMap; image: (e: number) => number } {
  const image = (e: number) => 3 * perm[(e / 3) | 0] + ((e % 3) + shift[(e / 3) | 0]) % 3;
  const twins = new Int32Array(map.twins.length);
  for (let e = 0; e < twins.length; e++) twins[image(e)] = image(map.twins[e]);
  return { map: new CubicMap(twins), image };
}

/** Mirror image: reverse the rotation at every junction (swap darts 3v+1 and 3v+2). */
function mirror(map: CubicMap): { map: CubicMap; image: (e: number) => number } {
  const image = (e: number) => (e % 3 === 0 ? e : e % 3 === 1 ? e + 1 : e - 1);
  const twins = new Int32Array(map.twins.length);
  for (let e = 0; e < twins.length; e++) twins[image(e)] = image(map.twins[e]);
  return { map: new CubicMap(twins), image };
}

const small: Cluster[] = [];
for (let n = 2; n <= 6; n++) small.push(...enumerateClusters(n));

describe('clusterOf', () => {
  it('clusterOf(relabelled map) keeps the canonical code (fast-check, random relabellings)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: small.length - 1 }), fc.integer(), (k, seed) => {
        const c = small[k];
        const V = c.map.junctionCount;
        let s = seed >>> 0;
        const rand = () => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 2 ** 32);
        const perm = [...Array(V).keys()];
        for (let i = V - 1; i > 0; i--) {
          const j = Math.floor(rand() * (i + 1));
          [perm[i], perm[j]] = [perm[j], perm[i]];
        }
        const shift = perm.map(() => Math.floor(rand() * 3));
        const { map, image } = relabel(c.map, perm, shift);
        // the outside is the face of dart 0 in c.map, so of image(0) in the relabelled one
        expect(clusterOf(map, map.faceOf[image(0)]).code).toBe(c.code);
      }),
      { numRuns: 300 },
    );
  });

  it('clusterOf(mirror image) keeps the canonical code', () => {
    for (const c of small) {
      const { map, image } = mirror(c.map);
      // the mirror's face on the left of image(next(0)) is the original face on the left of 0
      expect(clusterOf(map, map.faceOf[image(next(0))]).code).toBe(c.code);
    }
  });

  it('clusterFromCode(code) decodes to an admissible cluster with the same code', () => {
    for (const c of small) {
      expect(() => validateCluster(c.map, c.cells)).not.toThrow();
      expect(clusterFromCode(c.code).code).toBe(c.code);
    }
  });
});

describe('cellPermutations', () => {
  it('cellPermutations(cluster) has |symmetry| rows, each a permutation preserving side counts and contacts', () => {
    for (const c of small) {
      const rows = cellPermutations(c);
      expect(rows).toHaveLength(c.symmetry);
      const s = summarizeCluster(c);
      const key = (pairs: [number, number][]) => pairs.map(([a, b]) => `${Math.min(a, b)}-${Math.max(a, b)}`).sort().join(' ');
      for (const row of rows) {
        expect([...row].sort((a, b) => a - b)).toEqual([...Array(c.cells).keys()].map((i) => i + 1));
        for (let i = 0; i < c.cells; i++) expect(s.sides[row[i] - 1]).toBe(s.sides[i]);
        const moved = s.contacts.map(([a, b]) => [a === 0 ? 0 : row[a - 1], b === 0 ? 0 : row[b - 1]] as [number, number]);
        expect(key(moved)).toBe(key(s.contacts));
      }
    }
  });
});

describe('enumerateClusters, against brute force', () => {
  // oracle: every single-wall insertion into every face of every map of n - 1 cells, deduplicated by a
  // global table of canonical codes, must give exactly the enumerator's set (design §3: every map
  // arises from one with a face fewer by inserting a wall)
  function insertAll(map: CubicMap): CubicMap[] {
    const out: CubicMap[] = [];
    const V = map.junctionCount;
    for (let f = 0; f < map.faceCount; f++) {
      const darts = [...map.faceDarts.subarray(map.faceStarts[f], map.faceStarts[f + 1])];
      for (let i = 0; i < darts.length; i++) {
        for (let j = i; j < darts.length; j++) {
          const x = darts[i];
          const y = darts[j];
          const t = new Int32Array(3 * V + 6);
          t.set(map.twins);
          const a = 3 * V;
          const b = a + 3;
          const xt = map.twins[x];
          const pair = (p: number, q: number) => ((t[p] = q), (t[q] = p));
          if (x === y) {
            pair(x, a + 2); pair(a, b + 2); pair(b, xt);
          } else {
            const yt = map.twins[y];
            pair(x, a + 2); pair(a, xt); pair(y, b + 2); pair(b, yt);
          }
          pair(a + 1, b + 1);
          out.push(new CubicMap(t));
        }
      }
    }
    return out;
  }

  it('enumerateClusters(n) equals the brute-force set for n = 3..7', () => {
    let maps: CubicMap[] = [[...enumerateClusters(2)][0].map];
    for (let n = 3; n <= 7; n++) {
      const codes = new Set<string>();
      const mapCodes = new Map<string, CubicMap>();
      for (const parent of maps) {
        for (const child of insertAll(parent)) {
          for (let f = 0; f < child.faceCount; f++) {
            const c = clusterOf(child, f);
            codes.add(c.code);
            mapCodes.set(clusterOf(child, 0).code, child);
          }
        }
      }
      // one representative map per isomorphism class is enough to continue
      const reps = new Map<string, CubicMap>();
      for (const child of mapCodes.values()) {
        const key = [...Array(child.faceCount).keys()].map((f) => clusterOf(child, f).code).sort()[0];
        reps.set(key, child);
      }
      maps = [...reps.values()];
      const listed = [...enumerateClusters(n)].map((c) => c.code);
      expect(new Set(listed)).toEqual(codes);
    }
  });
});

describe('known small cases (design §1)', () => {
  it('enumerateClusters(2) is the double bubble: two 2-sided cells, symmetry 4', () => {
    const all = [...enumerateClusters(2)].map(summarizeCluster);
    expect(all).toHaveLength(1);
    expect(all[0].sides).toEqual([2, 2]);
    expect(all[0].outsideSides).toBe(2);
    expect(all[0].symmetry).toBe(4); // two mirror lines (common practice, no source)
  });

  it('enumerateClusters(3) is the standard triple, the chain of three and the lens in a wall', () => {
    const all = [...enumerateClusters(3)].map(summarizeCluster);
    expect(all).toHaveLength(3);
    const shape = (s: ReturnType<typeof summarizeCluster>) => `${[...s.sides].sort().join('')}|${s.outsideSides}`;
    const shapes = all.map(shape).sort();
    // standard: three 3-sided cells on K4, all touching the outside (a triangle of walls)
    // chain: two 2-sided end cells and a 4-sided middle cell that meets the outside twice
    // lens in the middle wall of a double bubble: cells 4, 4 and a lens 2; the outside is 2-sided
    expect(shapes).toEqual(['224|4', '244|2', '333|3']);
    const standard = all.find((s) => s.outsideSides === 3)!;
    expect(standard.threeConnected).toBe(true);
    expect(standard.symmetry).toBe(6);
    const chain = all.find((s) => s.outsideSides === 4)!;
    expect(chain.contacts.filter(([a, b]) => a === 0 && chain.sides[b - 1] === 4)).toHaveLength(2);
  });
});
