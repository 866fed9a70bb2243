// Wall deletion: the face-pair test says exactly which walls leave a bridgeless cubic plane map.
import { describe, expect, it } from 'vitest';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { CubicMap } from '../../src/maps/cubic-map.ts';
import { DELETION_RECORD, deleteWallInto, facePairsInto } from '../../src/maps/deletion.ts';
import { validateCluster } from '../../src/maps/validate.ts';

// The map left in `twins` by a deletion (junctions with alive = 1, renumbered in order), or null when
// it is not an admissible cluster of `cells` cells (validateCluster: no loop, no bridge, connected,
// planar, the right face count).
function remaining(twins: Int32Array, alive: Uint8Array, cells: number): CubicMap | null {
  const junctions = alive.length;
  const label = new Int32Array(junctions).fill(-1);
  let v2 = 0;
  for (let v = 0; v < junctions; v++) if (alive[v]) label[v] = v2++;
  const out = new Int32Array(3 * v2);
  for (let e = 0; e < 3 * junctions; e++) {
    const v = (e / 3) | 0;
    if (!alive[v]) continue;
    const t = twins[e];
    out[3 * label[v] + (e % 3)] = 3 * label[(t / 3) | 0] + (t % 3);
  }
  try {
    const map = new CubicMap(out);
    validateCluster(map, cells);
    return map;
  } catch {
    return null;
  }
}

describe('maps/deletion', () => {
  it('facePairsInto + deleteWallInto: a wall is deletable exactly when deleting it and smoothing its ends leaves an admissible map (n = 3..7)', () => {
    // the oracle is the definition (design §3: a bridgeless cubic plane map with one face fewer), checked
    // by validateCluster on the map actually left, for every wall of every cluster
    let deletable = 0;
    let walls = 0;
    for (let n = 3; n <= 7; n++) {
      for (const { map } of enumerateClusters(n)) {
        const darts = map.twins.length;
        const faces = map.faceCount;
        const pairs = new Int32Array(faces * faces);
        let here = 0;
        facePairsInto(map.twins, darts, map.faceOf, faces, pairs, null);
        for (let e = 0; e < darts; e++) {
          const t = map.twins[e];
          if (e > t) continue;
          walls++;
          const says = pairs[map.faceOf[e] * faces + map.faceOf[t]] === 1;
          const twins = Int32Array.from(map.twins);
          const alive = new Uint8Array(darts / 3).fill(1);
          const records = new Int32Array(DELETION_RECORD);
          deleteWallInto(twins, alive, e, records, 0);
          expect(remaining(twins, alive, n - 1) !== null).toBe(says);
          if (says) here++;
        }
        // every map with at least four junctions has a deletable wall (design §3)
        expect(here).toBeGreaterThan(0);
        deletable += here;
      }
    }
    // and some walls are not (the test's both answers are exercised)
    expect(deletable).toBeLessThan(walls);
  });
});
