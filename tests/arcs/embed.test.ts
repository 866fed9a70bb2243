import { describe, expect, it } from 'vitest';
import { embedCluster } from '../../src/arcs/embed.ts';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { thetaMap } from '../../src/maps/cubic-map.ts';
import { checkEquilibrium } from '../../src/solver/certificate.ts';

describe('embedCluster', () => {
  it('embedCluster(thetaMap()) draws the circle split by a straight diameter', () => {
    // the barycentric drawing of the theta graph is symmetric: two semicircles and the diameter
    const d = embedCluster(thetaMap(), Math.PI);
    const straight = Array.from(d.bulges).filter((t) => Math.abs(t) < 1e-12).length;
    const half = Array.from(d.bulges).filter((t) => Math.abs(Math.abs(t) - Math.PI / 2) < 1e-12).length;
    expect([straight, half]).toEqual([1, 2]);
  });

  it('embedCluster draws every cluster with n <= 5 as a valid drawing of the requested total area', () => {
    // property of barycentric drawings of triangulated discs ("One-to-one piecewise linear mappings
    // over triangulations", Math. Comp. 72 (2003)): no crossings, orders kept, cells positive
    for (let n = 2; n <= 5; n++) {
      for (const cluster of enumerateClusters(n)) {
        const d = embedCluster(cluster.map, 2 * n);
        const probe = new Float64Array(n).fill(2);
        const c = checkEquilibrium(cluster.map, probe, { ...d, pressures: new Float64Array(n) });
        expect(c.misorderedJunctions, cluster.code).toBe(0);
        expect(c.crossings, cluster.code).toBe(0);
        expect(c.minCellArea, cluster.code).toBeGreaterThan(0);
        expect(c.minWallLength, cluster.code).toBeGreaterThan(0);
      }
    }
  });
});
