// The T1 neighbour swap: side counts change as the move requires, and two swaps give the cluster back.
import { describe, expect, it } from 'vitest';
import { enumerateClusters, clusterOf } from '../../src/maps/cluster.ts';
import { t1Swap, t1SwapMap } from '../../src/maps/t1.ts';
import { next } from '../../src/maps/cubic-map.ts';

describe('t1Swap', () => {
  it('t1Swap on an inner wall of the standard triple bubble gives the chain of three; on an outer wall the lens in a wall', () => {
    const all = [...enumerateClusters(3)];
    const byOutside = (k: number) => all.find((c) => c.map.faceSize(0) === k)!;
    const [lensInWall, standard, chain] = [byOutside(2), byOutside(3), byOutside(4)];
    const { map } = standard;
    for (let d = 0; d < map.twins.length; d++) {
      const outer = map.faceOf[d] === 0 || map.faceOf[map.twins[d]] === 0;
      expect(t1Swap(standard, d)!.code).toBe(outer ? lensInWall.code : chain.code);
    }
  });

  it('t1Swap: the faces beside the wall lose a side, the faces at its ends gain one, and a second swap undoes it', () => {
    // the T1 move (common practice, no source): the two cells at the ends of the vanishing wall become neighbours
    for (let n = 3; n <= 6; n++) {
      for (const cluster of enumerateClusters(n)) {
        const { map } = cluster;
        for (let d = 0; d < map.twins.length; d++) {
          if (t1Swap(cluster, d) === null) continue;
          const dt = map.twins[d];
          const expected = [...Array(n + 1).keys()].map((f) => map.faceSize(f));
          for (const f of [map.faceOf[d], map.faceOf[dt]]) expected[f]--;
          for (const f of [map.faceOf[next(d)], map.faceOf[next(dt)]]) expected[f]++;
          const once = t1SwapMap(map, d);
          const after = [...Array(n + 1).keys()].map((f) => once.map.faceSize(f));
          expect(after.sort((p, q) => p - q)).toEqual(expected.sort((p, q) => p - q));
          // twice: back to the start (up to relabelling); follow a dart of the outside off the wall
          const twice = t1SwapMap(once.map, d);
          let x = map.faceDarts[map.faceStarts[0]];
          if (x === d || x === dt) x = map.faceDarts[map.faceStarts[0] + 1];
          const outside = twice.map.faceOf[twice.slot[once.slot[x]]];
          expect(clusterOf(twice.map, outside).code).toBe(cluster.code);
        }
      }
    }
  });
});
