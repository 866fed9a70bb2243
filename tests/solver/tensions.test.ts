import { describe, expect, it } from 'vitest';
import { UsageError } from '../../src/errors.ts';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { type CubicMap, circleMap, thetaMap } from '../../src/maps/cubic-map.ts';
import { certificatePasses, checkEquilibrium } from '../../src/solver/certificate.ts';
import { relax } from '../../src/solver/newton.ts';
import { findEquilibria } from '../../src/solver/equilibria.ts';
import type { Equilibrium } from '../../src/solver/result.ts';

// The wall of each dart and the wall between the two cells of the theta graph.
function wallsOf(map: CubicMap): Int32Array {
  return map.wallIndex();
}

// The tensions of a map's walls from a function of the two faces each wall separates (face 0 outside).
function tensionsBy(map: CubicMap, of: (f: number, g: number) => number): Float64Array {
  const { twins, faceOf } = map;
  const wallOf = wallsOf(map);
  const out = new Float64Array(twins.length / 2);
  for (let e = 0; e < twins.length; e++) if (e < twins[e]) out[wallOf[e]] = of(faceOf[e], faceOf[twins[e]]);
  return out;
}

// The unit tangent of dart e leaving its junction (the chord turned by the dart's bulge).
function tangentOf(map: CubicMap, r: Equilibrium, e: number): [number, number] {
  const v = (e / 3) | 0;
  const w = (map.twins[e] / 3) | 0;
  const k = wallsOf(map)[e];
  const t = e < map.twins[e] ? r.bulges[k] : -r.bulges[k];
  const dx = r.coords[2 * w] - r.coords[2 * v];
  const dy = r.coords[2 * w + 1] - r.coords[2 * v + 1];
  const c = Math.hypot(dx, dy);
  return [(dx * Math.cos(t) - dy * Math.sin(t)) / c, (dx * Math.sin(t) + dy * Math.cos(t)) / c];
}

// The angle between the walls of darts e and f at their junction, in degrees.
function angleBetween(map: CubicMap, r: Equilibrium, e: number, f: number): number {
  const [ax, ay] = tangentOf(map, r, e);
  const [bx, by] = tangentOf(map, r, f);
  return (Math.acos(Math.max(-1, Math.min(1, ax * bx + ay * by))) * 180) / Math.PI;
}

// The angle between walls of tensions si and sj at a balanced junction whose third wall has tension sk:
// sk^2 = si^2 + sj^2 + 2 si sj cos(theta) (law of cosines on the force triangle; common practice, no source).
function neumannAngle(si: number, sj: number, sk: number): number {
  return (Math.acos((sk * sk - si * si - sj * sj) / (2 * si * sj)) * 180) / Math.PI;
}

function expectNeumannAngles(map: CubicMap, r: Equilibrium, tensions: Float64Array): void {
  const wallOf = wallsOf(map);
  for (let v = 0; v < map.junctionCount; v++) {
    for (let i = 0; i < 3; i++) {
      const e = 3 * v + i;
      const f = 3 * v + ((i + 1) % 3);
      const g = 3 * v + ((i + 2) % 3);
      const expected = neumannAngle(tensions[wallOf[e]], tensions[wallOf[f]], tensions[wallOf[g]]);
      expect(Math.abs(angleBetween(map, r, e, f) - expected)).toBeLessThan(1e-7);
    }
  }
}

// The double bubble of two equal areas A, unit outer tension and tension s on the shared wall (derived
// here; the symmetry makes the shared wall straight). A junction balances when the shared wall's pull s
// along it equals the outer arcs' pulls along it, 2 cos(beta) = s, beta = arccos(s/2) the angle between
// each outer arc and the shared wall's extension (Neumann triangle). Each outer arc lies on a circle of
// radius R whose centre is R cos(beta) from the shared wall, so the chord (the shared wall, length
// 2 R sin(beta)) cuts off a minor segment R^2 (beta - sin beta cos beta) and the cell's area is
// A = R^2 (pi - beta + sin beta cos beta); the outer arc is R (2 pi - 2 beta) long, and
// energy = 2 R (2 pi - 2 beta) + s 2 R sin(beta).
function doubleBubbleEnergy(area: number, s: number): { energy: number; perimeter: number; beta: number } {
  const beta = Math.acos(s / 2);
  const radius = Math.sqrt(area / (Math.PI - beta + Math.sin(beta) * Math.cos(beta)));
  const outer = 2 * radius * (2 * Math.PI - 2 * beta);
  const shared = 2 * radius * Math.sin(beta);
  return { energy: outer + s * shared, perimeter: outer + shared, beta };
}

// The standard triple bubble's arrangement (on K4: three cells of three sides each).
function standardTriple(): CubicMap {
  return [...enumerateClusters(3)].map((c) => c.map).find((m) => {
    for (let f = 1; f < m.faceCount; f++) if (m.faceSize(f) !== 3) return false;
    return true;
  }) as CubicMap;
}

describe('relax with wall tensions', () => {
  it('relax(thetaMap(), [A, A], {tensions}) with tension s on the shared wall is the closed-form double bubble', () => {
    // source: derived in doubleBubbleEnergy above (s = 1: "The standard double soap bubble in R^2 uniquely
    // minimizes perimeter", Pacific J. Math. 159 (1993), perimeter (8 pi/3 + sqrt 3) sqrt(A / (2 pi/3 + sqrt(3)/4)))
    const map = thetaMap();
    for (const s of [0.3, 0.8, 1, 1.4, 1.9]) {
      for (const area of [1, 5]) {
        const tensions = tensionsBy(map, (f, g) => (f > 0 && g > 0 ? s : 1));
        const r = relax(map, Float64Array.of(area, area), { tensions });
        expect(r.status).toBe('ok');
        expect(certificatePasses(r.certificate, 1e-10)).toBe(true);
        const want = doubleBubbleEnergy(area, s);
        expect(Math.abs(r.energy - want.energy)).toBeLessThan(1e-9 * want.energy);
        expect(Math.abs(r.perimeter - want.perimeter)).toBeLessThan(1e-9 * want.perimeter);
        // the shared wall is straight and meets each outer arc at arccos(s/2) from its extension
        const wallOf = wallsOf(map);
        for (let e = 0; e < map.twins.length; e++) {
          const f = map.faceOf[e];
          const g = map.faceOf[map.twins[e]];
          if (f === 0 || g === 0) continue;
          expect(Math.abs(r.bulges[wallOf[e]])).toBeLessThan(1e-9);
          const v = (e / 3) | 0;
          const [ux, uy] = tangentOf(map, r, e);
          for (let i = 0; i < 3; i++) {
            const d = 3 * v + i;
            if (d === e) continue;
            const [ox, oy] = tangentOf(map, r, d);
            const fromExtension = Math.acos(-(ux * ox + uy * oy));
            expect(Math.abs(fromExtension - want.beta)).toBeLessThan(1e-8);
          }
        }
        if (s === 1) expect(r.energy).toBe(r.perimeter);
      }
    }
  });

  it('checkEquilibrium re-checks the Neumann triangle and Laplace-Young with the tensions it is given', () => {
    // source: design.md §8 (with tensions the junction and wall laws change; unit-tension laws fail there)
    const map = standardTriple();
    const tensions = tensionsBy(map, (f, g) => (f === 0 || g === 0 ? 1 : 1.5));
    const areas = Float64Array.of(1, 1.5, 2);
    const r = relax(map, areas, { tensions });
    expect(certificatePasses(checkEquilibrium(map, areas, r, tensions), 1e-10)).toBe(true);
    const unit = checkEquilibrium(map, areas, r);
    expect(unit.tangentResidual).toBeGreaterThan(1e-3);
    expect(unit.curvatureResidual).toBeGreaterThan(1e-3);
  });

  it('tensions (1, 1, sqrt 2) at a junction give angles 90, 135, 135 degrees', () => {
    // source: law of cosines on the force triangle (common practice, no source)
    expect(neumannAngle(1, 1, Math.SQRT2)).toBeCloseTo(90, 12);
    expect(neumannAngle(1, Math.SQRT2, 1)).toBeCloseTo(135, 12);
    const map = thetaMap();
    const tensions = tensionsBy(map, (f, g) => (f > 0 && g > 0 ? Math.SQRT2 : 1));
    const r = relax(map, Float64Array.of(1, 2.5), { tensions });
    expect(r.status).toBe('ok');
    expectNeumannAngles(map, r, tensions);
  });

  it('relax(K4 cluster, areas, {tensions}) balances the Neumann triangle at every junction for tensions by cell pair', () => {
    // source: law of cosines on the force triangle (common practice, no source); Laplace-Young law with
    // tension (design.md §8) checked by the certificate
    const k4 = standardTriple();
    const pair = [[0, 1.2, 0.9, 1.1], [1.2, 0, 0.7, 1.3], [0.9, 0.7, 0, 0.8], [1.1, 1.3, 0.8, 0]];
    const tensions = tensionsBy(k4, (f, g) => pair[f][g]);
    const r = relax(k4, Float64Array.of(1, 1.5, 2), { tensions });
    expect(r.status).toBe('ok');
    expect(certificatePasses(r.certificate, 1e-10)).toBe(true);
    expectNeumannAngles(k4, r, tensions);
    let energy = 0;
    const wallOf = wallsOf(k4);
    for (let e = 0; e < k4.twins.length; e++) {
      if (e > k4.twins[e]) continue;
      const k = wallOf[e];
      const c = Math.hypot(r.coords[2 * ((k4.twins[e] / 3) | 0)] - r.coords[2 * ((e / 3) | 0)],
        r.coords[2 * ((k4.twins[e] / 3) | 0) + 1] - r.coords[2 * ((e / 3) | 0) + 1]);
      const t = r.bulges[k];
      energy += tensions[k] * (Math.abs(t) < 1e-12 ? c : (c * t) / Math.sin(t));
    }
    expect(Math.abs(r.energy - energy)).toBeLessThan(1e-12 * energy);
  });

  it('relax scales: all tensions c multiply the energy and pressures by c; areas times s multiply the energy by sqrt(s)', () => {
    // source: design.md §8 (scaling the tensions scales the energy, shapes unchanged) and §4 (lengths scale
    // with the square root of the areas)
    const k4 = standardTriple();
    const areas = Float64Array.of(1, 2, 3);
    const base = relax(k4, areas, { tensions: new Float64Array(k4.twins.length / 2).fill(1.3) });
    const unit = relax(k4, areas);
    expect(base.status).toBe('ok');
    expect(Math.abs(base.energy - 1.3 * unit.energy)).toBeLessThan(1e-10 * base.energy);
    expect(Math.abs(base.perimeter - unit.perimeter)).toBeLessThan(1e-10 * base.perimeter);
    for (let f = 0; f < 3; f++) expect(Math.abs(base.pressures[f] - 1.3 * unit.pressures[f])).toBeLessThan(1e-8);
    const tensions = tensionsBy(k4, (f, g) => 1 + 0.1 * (f + g));
    const small = relax(k4, areas, { tensions });
    const large = relax(k4, areas.map((a) => 4 * a), { tensions });
    expect(small.status).toBe('ok');
    expect(large.status).toBe('ok');
    expect(Math.abs(large.energy - 2 * small.energy)).toBeLessThan(1e-10 * large.energy);
  });

  it("relax names a junction whose tensions violate the triangle inequality 'junction-unbalanced'", () => {
    // source: the Neumann triangle exists only if each tension is less than the sum of the other two
    // (design.md §8): two cells whose shared wall costs at least both outer walls together separate
    const map = thetaMap();
    for (const s of [2, 2.5]) {
      const tensions = tensionsBy(map, (f, g) => (f > 0 && g > 0 ? s : 1));
      const r = relax(map, Float64Array.of(1, 1), { tensions });
      expect(r.status).toBe('junction-unbalanced');
      expect(r.unbalancedJunction).not.toBeNull();
      expect([...(r.junctionTensions as number[])].sort()).toEqual([1, 1, s]);
      expect(r.index).toBeNull();
      expect(Number.isFinite(r.energy)).toBe(true);
    }
    expect(relax(map, Float64Array.of(1, 1), { tensions: tensionsBy(map, (f, g) => (f > 0 && g > 0 ? 1.99 : 1)) }).status).toBe('ok');
  });

  it('relax refuses tensions that are not one positive finite number per wall (UsageError)', () => {
    const map = thetaMap();
    expect(() => relax(map, Float64Array.of(1, 1), { tensions: Float64Array.of(1, 1) })).toThrow(UsageError);
    expect(() => relax(map, Float64Array.of(1, 1), { tensions: Float64Array.of(1, 0, 1) })).toThrow(UsageError);
    expect(() => relax(map, Float64Array.of(1, 1), { tensions: Float64Array.of(1, Number.NaN, 1) })).toThrow(UsageError);
  });

  it('findEquilibria with tensions: every start and every saddle found is an equilibrium of the weighted walls', () => {
    // source: the certificate's Neumann triangle and Laplace-Young law with tension (design.md §8)
    const map = [...enumerateClusters(4)].map((c) => c.map).find((m) => [1, 2, 3, 4].every((f) => m.faceSize(f) >= 3)) as CubicMap;
    const tensions = tensionsBy(map, (f, g) => (f === 0 || g === 0 ? 1 : 0.8 + 0.1 * (f + g)));
    const areas = Float64Array.of(1, 1.5, 2, 2.5);
    const search = findEquilibria(map, areas, { tensions, starts: 3, unstable: true });
    expect(search.tried).toBe(3);
    for (const { equilibrium } of search.found) {
      expect(certificatePasses(checkEquilibrium(map, areas, equilibrium, tensions), 1e-10)).toBe(true);
    }
    const unbalanced = tensionsBy(map, (f, g) => (f === 0 || g === 0 ? 1 : 3));
    const none = findEquilibria(map, areas, { tensions: unbalanced, starts: 3, unstable: true });
    expect(none.found).toHaveLength(0);
    expect(none.failure?.status).toBe('junction-unbalanced');
  });

  it('relax(circleMap(), [A], {tensions: [s]}): the one wall of tension s, energy s 2 sqrt(pi A), pressure s / R', () => {
    // source: classical isoperimetric inequality (the shape) and Laplace-Young with tension (design.md §8)
    const r = relax(circleMap(), Float64Array.of(3), { tensions: Float64Array.of(1.7) });
    expect(r.status).toBe('ok');
    expect(r.energy).toBeCloseTo(1.7 * 2 * Math.sqrt(Math.PI * 3), 12);
    expect(r.perimeter).toBeCloseTo(2 * Math.sqrt(Math.PI * 3), 12);
    expect(r.pressures[0]).toBeCloseTo(1.7 / Math.sqrt(3 / Math.PI), 12);
    expect(certificatePasses(r.certificate, 1e-12)).toBe(true);
  });
});
