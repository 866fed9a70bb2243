import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { relax } from '../../src/solver/newton.ts';
import { certificatePasses, checkEquilibrium } from '../../src/solver/certificate.ts';
import { polylineCheck, polylinePasses } from './polyline.ts';
import { thetaMap } from '../../src/maps/cubic-map.ts';

// a few maps per size n = 2..7 (the first ones the enumerator yields, which include lenses and rings)
const MAPS = (() => {
  const out = [];
  for (let n = 2; n <= 7; n++) {
    let k = 0;
    for (const c of enumerateClusters(n)) {
      out.push(c);
      if (++k === 3) break;
    }
  }
  return out;
})();

describe('checkEquilibrium', () => {
  it('every ok answer at random areas with ratios up to 1:50 (n = 2..7) passes the polyline measurement', () => {
    // property: an 'ok' answer must survive an independent recomputation (tests/solver/polyline.ts)
    let oks = 0;
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: MAPS.length - 1 }),
        fc.array(fc.double({ min: 1, max: 50, noNaN: true }), { minLength: 7, maxLength: 7 }),
        (which, raw) => {
          const cluster = MAPS[which];
          const areas = Float64Array.from(raw.slice(0, cluster.cells));
          const r = relax(cluster.map, areas);
          for (const v of [r.perimeter, ...r.coords, ...r.bulges, ...r.pressures, ...r.curvatures, ...r.areas]) {
            expect(Number.isFinite(v)).toBe(true);
          }
          if (r.status !== 'ok') return;
          oks++;
          // the relaxer gives 'ok' only when its certificate passes; measure the answer independently
          const c = polylineCheck(cluster.map, areas, r);
          expect(polylinePasses(c), `${cluster.code} ${JSON.stringify(c)}`).toBe(true);
          expect(r.index).not.toBeNull();
        },
      ),
      { numRuns: 120, seed: 20261201 },
    );
    // the property must have been exercised on real equilibria
    expect(oks).toBeGreaterThan(20);
  });

  it('checkEquilibrium rejects a perturbed equilibrium', () => {
    // the checker must be able to fail: move one junction of the double bubble
    const areas = Float64Array.of(1, 1);
    const r = relax(thetaMap(), areas);
    const moved = { ...r, coords: r.coords.slice() };
    moved.coords[0] += 1e-6;
    expect(certificatePasses(checkEquilibrium(thetaMap(), areas, r), 1e-10)).toBe(true);
    expect(certificatePasses(checkEquilibrium(thetaMap(), areas, moved), 1e-10)).toBe(false);
    // and so must the tests' own measurement
    expect(polylinePasses(polylineCheck(thetaMap(), areas, r))).toBe(true);
    expect(polylinePasses(polylineCheck(thetaMap(), areas, moved))).toBe(false);
    // a drawing with crossings: on K4, pull the centre junction (where three straight walls meet) far
    // beyond an outer junction, so its straight walls cut the outer arcs
    const k4 = MAPS.find((c) => c.cells === 3 && c.map.faceSize(1) === 3 && c.map.faceSize(2) === 3)!.map;
    const eq = relax(k4, Float64Array.of(1, 1, 1));
    const walls = k4.wallIndex();
    let centre = -1;
    for (let v = 0; v < k4.junctionCount; v++) {
      if ([0, 1, 2].every((i) => Math.abs(eq.bulges[walls[3 * v + i]]) < 1e-9)) centre = v;
    }
    const outer = (centre + 1) % k4.junctionCount;
    const pulled = { ...eq, coords: eq.coords.slice() };
    pulled.coords[2 * centre] = 3 * eq.coords[2 * outer] - 2 * eq.coords[2 * centre];
    pulled.coords[2 * centre + 1] = 3 * eq.coords[2 * outer + 1] - 2 * eq.coords[2 * centre + 1];
    expect(checkEquilibrium(k4, Float64Array.of(1, 1, 1), eq).crossings).toBe(0);
    expect(checkEquilibrium(k4, Float64Array.of(1, 1, 1), pulled).crossings).toBeGreaterThan(0);
  });
});
