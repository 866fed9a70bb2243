// Counting checks of the enumerator against open data (design §2).
import { describe, expect, it } from 'vitest';
import counts from '../fixtures/oeis-counts.json' with { type: 'json' };
import { countArrangements, rootedMapCount } from '../../src/maps/count.ts';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { enumerateMaps } from '../../src/maps/enumerate.ts';

function oeis(name: keyof typeof counts, index: number): number {
  const entry = counts[name];
  return entry.values[index - entry.offset];
}

describe('rootedMapCount', () => {
  it('rootedMapCount(m) matches the first terms listed for OEIS A000309', () => {
    for (let m = 0; m < counts.A000309.values.length; m++) {
      expect(rootedMapCount(m)).toBe(BigInt(oeis('A000309', m)));
    }
  });
});

describe('countArrangements', () => {
  // a missing or duplicated map changes these sums by at least one rooting
  for (let n = 2; n <= 9; n++) {
    it(`countArrangements(${n}) satisfies the rooting identities of OEIS A000309`, () => {
      const c = countArrangements(n);
      const a = BigInt(oeis('A000309', n - 1));
      expect(c.mapRootings).toBe(a); // sum over maps of 4E/|Aut(M)|
      expect(c.orientedRootings).toBe(a); // sum over oriented maps of 2E/|Aut+(M)|
      expect(c.clusterRootings).toBe(BigInt(n + 1) * a); // sum over clusters of 4E/|Aut(M,f)|
      if (n >= 3) {
        expect(c.threeConnectedMaps).toBe(oeis('A000109', n + 1)); // OEIS A000109, k = n + 1 faces
        expect(c.threeConnectedClusters).toBe(oeis('A005027', n)); // OEIS A005027
        // the split by cells on the outside (the rows of OEIS A169808) adds up to A005027
        expect(c.threeConnectedByOutside.reduce((p, q) => p + q, 0)).toBe(oeis('A005027', n));
      }
      if (n + 1 <= 10 && n >= 3) expect(c.threeConnectedMapsChiral).toBe(oeis('A253882', n + 1)); // OEIS A253882 (from memory)
    });
  }

  it('countArrangements(1) is the circle alone', () => {
    const maps = [...enumerateMaps(1)];
    expect(maps).toHaveLength(1);
    expect(maps[0].map.junctionCount).toBe(0);
    expect([...enumerateClusters(1)].map((c) => c.code)).toEqual(['1:']);
  });
});

describe('enumerateClusters', () => {
  it('enumerateClusters(n) yields as many clusters as countArrangements counts, all codes distinct', () => {
    for (let n = 2; n <= 7; n++) {
      const codes = [...enumerateClusters(n)].map((c) => c.code);
      expect(new Set(codes).size).toBe(codes.length);
      expect(codes.length).toBe(countArrangements(n).clusters);
    }
  });

  it('enumerateClusters(n) is deterministic', () => {
    const a = [...enumerateClusters(6)].map((c) => c.code);
    const b = [...enumerateClusters(6)].map((c) => c.code);
    expect(b).toEqual(a);
  });

  it('enumerateClusters(n, { shard }) gives disjoint parts whose union is the whole', () => {
    for (const n of [4, 6, 8]) {
      const whole = [...enumerateClusters(n)].map((c) => c.code);
      const parts: string[] = [];
      for (let i = 0; i < 3; i++) parts.push(...[...enumerateClusters(n, { shard: { index: i, count: 3 } })].map((c) => c.code));
      expect(parts.length).toBe(whole.length);
      expect(new Set(parts)).toEqual(new Set(whole));
    }
  });
});
