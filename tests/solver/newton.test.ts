import { UsageError } from '../../src/errors.ts';
import { describe, expect, it } from 'vitest';
import { relax, relaxFrom } from '../../src/solver/newton.ts';
import { polylineCheck, polylinePasses } from './polyline.ts';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { CubicMap, circleMap, thetaMap } from '../../src/maps/cubic-map.ts';
import type { Equilibrium } from '../../src/solver/result.ts';
import { jacobianInto, problemOf } from './reference.ts';
import { symmetricInertia } from '../linalg/reference.ts';


function sides(map: CubicMap): number[] {
  const out: number[] = [];
  for (let f = 1; f < map.faceCount; f++) out.push(map.faceSize(f));
  return out;
}

function clustersWithSides(n: number, wanted: number[]): CubicMap[] {
  const key = [...wanted].sort().join(',');
  return [...enumerateClusters(n)].map((c) => c.map).filter((m) => [...sides(m)].sort().join(',') === key);
}

function expectCertified(map: CubicMap, areas: Float64Array, r: Equilibrium): void {
  expect(r.status).toBe('ok');
  expect(polylinePasses(polylineCheck(map, areas, r))).toBe(true);
}

describe('relax', () => {
  it('relax(circleMap(), [A]) is the circle of perimeter 2 sqrt(pi A)', () => {
    // source: classical isoperimetric inequality
    for (const a of [1, 7.5]) {
      const r = relax(circleMap(), Float64Array.of(a));
      expect(r.status).toBe('ok');
      expect(r.perimeter).toBeCloseTo(2 * Math.sqrt(Math.PI * a), 12);
      expect(r.pressures[0]).toBeCloseTo(1 / Math.sqrt(a / Math.PI), 12);
    }
  });

  it('relax(thetaMap(), [A, A]) is the standard double bubble with its closed-form perimeter', () => {
    // source: "The standard double soap bubble in R^2 uniquely minimizes perimeter", Pacific J. Math. 159
    // (1993). Derivation: for equal areas the middle wall is straight (symmetry), of length c; at each
    // junction the outer arcs leave at 120 degrees from it, so each meets its chord at bulge t = 2 pi/3,
    // with radius R = c / (2 sin t) = c / sqrt 3. Each outer arc has length c t / sin t = 4 pi R / 3 and
    // encloses the segment area (c^2/4)(t - sin t cos t)/sin^2 t = R^2 (2 pi/3 + sqrt(3)/4) = A, so the
    // perimeter 2 (4 pi R / 3) + sqrt(3) R = (8 pi/3 + sqrt 3) sqrt(A / (2 pi/3 + sqrt(3)/4)).
    const a = 1.7;
    const r = relax(thetaMap(), Float64Array.of(a, a));
    expectCertified(thetaMap(), Float64Array.of(a, a), r);
    const closed = (8 * Math.PI / 3 + Math.sqrt(3)) * Math.sqrt(a / (2 * Math.PI / 3 + Math.sqrt(3) / 4));
    expect(Math.abs(r.perimeter - closed) / closed).toBeLessThan(1e-12);
    expect(Math.min(...Array.from(r.curvatures).map(Math.abs))).toBeLessThan(1e-9);
    expect(r.index).toBe(0);
  });

  it('relax(thetaMap(), unequal areas) has middle curvature = difference of the outer curvatures', () => {
    // source: "The standard double soap bubble in R^2 uniquely minimizes perimeter", Pacific J. Math. 159 (1993)
    const map = thetaMap();
    const areas = Float64Array.of(1, 4.5);
    const r = relax(map, areas);
    expectCertified(map, areas, r);
    // curvature of a wall seen from the cell on its left of the lower dart: k = p_right - p_left
    const walls = map.wallIndex();
    const bySide = new Map<string, number>();
    for (let e = 0; e < 6; e++) {
      if (e > map.twins[e]) continue;
      const pair = [map.faceOf[e], map.faceOf[map.twins[e]]];
      const k = r.curvatures[walls[e]];
      // orient every curvature as seen from the higher-numbered face bulging into the lower
      bySide.set([...pair].sort().join(), pair[0] < pair[1] ? -k : k);
    }
    const outer1 = Math.abs(bySide.get('0,1')!);
    const outer2 = Math.abs(bySide.get('0,2')!);
    expect(Math.abs(bySide.get('1,2')!)).toBeCloseTo(Math.abs(outer1 - outer2), 10);
  });

  it('relax on K4 with three equal cells gives straight inner walls at 120 degrees and the closed form', () => {
    // source: "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004): the
    // standard triple bubble. Derivation: by symmetry the inner walls are straight, of length l, and meet at
    // 120 degrees at the centre; at an outer junction the outer arcs leave at 60 degrees to the outward
    // radius, and the chord between two outer junctions (length l sqrt 3) leaves at 150 degrees to it, so
    // the outer arcs are semicircles (bulge pi/2). Cell area = (sqrt(3)/4) l^2 + (3 pi/8) l^2, perimeter
    // = 3 l + 3 pi (l sqrt 3)/2.
    const [k4] = clustersWithSides(3, [3, 3, 3]);
    const a = 2.2;
    const areas = Float64Array.of(a, a, a);
    const r = relax(k4, areas);
    expectCertified(k4, areas, r);
    const l = Math.sqrt(a / (Math.sqrt(3) / 4 + (3 * Math.PI) / 8));
    const closed = 3 * l + (3 * Math.PI * l * Math.sqrt(3)) / 2;
    expect(Math.abs(r.perimeter - closed) / closed).toBeLessThan(1e-12);
    const straight = Array.from(r.bulges).filter((t) => Math.abs(t) < 1e-9).length;
    const semicircles = Array.from(r.bulges).filter((t) => Math.abs(Math.abs(t) - Math.PI / 2) < 1e-9).length;
    expect([straight, semicircles]).toEqual([3, 3]);
  });

  it('relax at three equal cells: K4 beats the chain and the lens-in-wall arrangement', () => {
    // source: "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004)
    const areas = Float64Array.of(1, 1, 1);
    const results = [...enumerateClusters(3)].map((c) => ({ sides: sides(c.map).sort().join(), r: relax(c.map, areas) }));
    const k4 = results.find((x) => x.sides === '3,3,3')!;
    expect(k4.r.status).toBe('ok');
    expect(results).toHaveLength(3);
    for (const other of results) {
      if (other === k4) continue;
      // a competitor either has no equilibrium (a named failure) or a longer one
      if (other.r.status === 'ok') expect(other.r.perimeter).toBeGreaterThan(k4.r.perimeter + 1e-6);
      else expect(['wall-collapse', 'cell-collapse', 'walls-cross', 'fold']).toContain(other.r.status);
    }
    // the chain (a four-sided cell between two lenses) exists and its lenses slide: one zero mode
    const chain = results.find((x) => x.sides === '2,2,4')!;
    expect(chain.r.status).toBe('ok');
    expect(chain.r.zeroModes).toBe(1);
  });

  it('relax at random areas: K4 is never beaten by the other two arrangements', () => {
    // source: "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004)
    let seed = 7;
    const random = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    const maps = [...enumerateClusters(3)].map((c) => c.map);
    for (let trial = 0; trial < 8; trial++) {
      const areas = Float64Array.from([0, 0, 0], () => 1 + 9 * random());
      const rs = maps.map((m) => ({ k4: sides(m).join() === '3,3,3', r: relax(m, areas) }));
      const best = rs.find((x) => x.k4)!.r;
      expect(best.status).toBe('ok');
      for (const x of rs) if (!x.k4 && x.r.status === 'ok') expect(x.r.perimeter).toBeGreaterThan(best.perimeter);
    }
  });

  it('relax scales: areas times s give perimeter times sqrt(s) (s = 1e-3, 1e3)', () => {
    // source: dimensional analysis, length scales as the square root of area (common practice, no source)
    const [k4] = clustersWithSides(3, [3, 3, 3]);
    const areas = Float64Array.of(1, 2, 3.5);
    const base = relax(k4, areas);
    for (const s of [1e-3, 1e3]) {
      const scaled = Float64Array.from(areas, (a) => a * s);
      const r = relax(k4, scaled);
      expectCertified(k4, scaled, r);
      expect(Math.abs(r.perimeter / (base.perimeter * Math.sqrt(s)) - 1)).toBeLessThan(1e-11);
    }
  });

  it('relax at four equal cells: the arrangement with a central wall wins, straight, two cells convex', () => {
    // source: four equal cells, "Calc. Var. PDE 59 (2020)": the standard 4-cluster with a central wall,
    // which is straight, two of its cells convex and two not; every other arrangement loses.
    const areas = Float64Array.of(1, 1, 1, 1);
    let best: { map: CubicMap; r: Equilibrium } | null = null;
    for (const c of enumerateClusters(4)) {
      const r = relax(c.map, areas);
      if (r.status === 'ok' && (!best || r.perimeter < best.r.perimeter)) best = { map: c.map, r };
    }
    expect(best).not.toBeNull();
    const { map, r } = best!;
    expect(sides(map).sort().join()).toBe('3,3,4,4');
    // the central wall separates the two four-sided cells
    const walls = map.wallIndex();
    let central = -1;
    for (let e = 0; e < map.twins.length; e++) {
      const f = map.faceOf[e];
      const g = map.faceOf[map.twins[e]];
      if (f > 0 && g > 0 && map.faceSize(f) === 4 && map.faceSize(g) === 4) central = walls[e];
    }
    expect(central).toBeGreaterThanOrEqual(0);
    expect(Math.abs(r.curvatures[central])).toBeLessThan(1e-9);
    // a cell is convex when every wall bulges out of it or is straight (its corners are 120 degrees)
    let convex = 0;
    for (let f = 1; f <= 4; f++) {
      let out = true;
      for (let i = map.faceStarts[f]; i < map.faceStarts[f + 1]; i++) {
        const e = map.faceDarts[i];
        const t = e < map.twins[e] ? r.bulges[walls[e]] : -r.bulges[walls[e]];
        // the face lies left of its darts; a wall bulging left of the dart bulges into the cell
        if (t > 1e-9) out = false;
      }
      if (out) convex++;
    }
    expect(convex).toBe(2);
  });

  it('relaxFrom(previous answer) converges in a few iterations at nearby areas', () => {
    // warm start: Newton's method converges quadratically from a nearby solution (common practice, no source)
    const [k4] = clustersWithSides(3, [3, 3, 3]);
    const first = relax(k4, Float64Array.of(1, 1, 1));
    const areas = Float64Array.of(1.05, 0.98, 1);
    const next = relaxFrom(k4, areas, first);
    expectCertified(k4, areas, next);
    expect(next.iterations).toBeLessThanOrEqual(5);
    expect(next.perimeter).toBeCloseTo(relax(k4, areas).perimeter, 10);
  });

  it('relax rejects bad areas with UsageError', () => {
    for (const bad of [Float64Array.of(1), Float64Array.of(1, 0), Float64Array.of(1, -1), Float64Array.of(1, NaN)]) {
      expect(() => relax(thetaMap(), bad)).toThrow(UsageError);
    }
    expect(() => relax(thetaMap(), Float64Array.of(1, 1), { maxIterations: 0 })).toThrow(UsageError);
  });

  it('relax ends every arrangement with n <= 6 at equal areas certified or with a named failure, winners at the known perimeters', () => {
    // the robustness requirement: no 'no-convergence' (the previous relaxer left 39% of n <= 7 so);
    // winners: n = 4, 5, 6 unit cells 11.187802198, 13.558108409, 15.776751153, stated in the relaxer's
    // brief as computed independently of this project (they agree, from memory, with the best-known
    // perimeters of "Minimal perimeter for N identical bubbles in two dimensions: calculations and
    // simulations", Philosophical Magazine 83 (2003))
    const known: Record<number, number> = { 4: 11.187802198, 5: 13.558108409, 6: 15.776751153 };
    for (let n = 2; n <= 6; n++) {
      const areas = new Float64Array(n).fill(1);
      let best = Infinity;
      for (const c of enumerateClusters(n)) {
        const r = relax(c.map, areas);
        expect(r.status, c.code).not.toBe('no-convergence');
        if (r.status === 'ok') {
          expect(polylinePasses(polylineCheck(c.map, areas, r)), c.code).toBe(true);
          best = Math.min(best, r.perimeter);
        } else if (r.status === 'wall-collapse') expect(r.collapsingWall).not.toBeNull();
        else if (r.status === 'cell-collapse') expect(r.collapsingCell).not.toBeNull();
      }
      if (known[n]) expect(Math.abs(best - known[n])).toBeLessThan(1e-8);
    }
  });

  it('relax reports the index and zero modes of the full KKT matrix, unclamped', () => {
    // reference: the inertia of the full bordered Jacobian (jacobianInto, symmetricInertia), by the law of inertia
    // and the Schur complement ("Matrix Computations", 4th ed., 2013, §4.4):
    // index = negative eigenvalues - (n area constraints + 3 rigid motions), zero modes = zero eigenvalues
    let seed = 3;
    const random = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    let checked = 0;
    for (let n = 3; n <= 5; n++) {
      for (const c of enumerateClusters(n)) {
        const areas = Float64Array.from({ length: n }, () => 1 + 4 * random());
        const r = relax(c.map, areas);
        if (r.status !== 'ok') continue;
        const p = problemOf(c.map);
        const unit = Math.sqrt(areas.reduce((x, y) => x + y, 0) / n);
        const z = new Float64Array(p.size);
        for (let i = 0; i < 2 * p.junctions; i++) z[i] = r.coords[i] / unit;
        z.set(r.bulges, 2 * p.junctions);
        for (let f = 0; f < n; f++) z[2 * p.junctions + p.walls + f] = r.pressures[f] * unit;
        const jac = new Float64Array(p.order * p.order);
        jacobianInto(p, z, jac);
        const inertia = symmetricInertia(jac, p.order, 1e-8);
        expect(r.index, c.code).toBe(inertia.negative - (n + 3));
        expect(r.zeroModes, c.code).toBe(inertia.zero);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(10);
  });

  it('relax takes the same path at every scale: areas times 1e-3 and 1e3 end alike', () => {
    // scaling the areas scales the cluster (dimensional analysis); the relaxer works in units of sqrt(mean area),
    // so the verdicts must not depend on the scale (common practice, no source)
    const base = [1, 2, 3, 4];
    for (const c of [...enumerateClusters(4)].slice(0, 6)) {
      for (let shift = 0; shift < 4; shift++) {
        const areas = Float64Array.from(base, (_, i) => base[(i + shift) % 4]);
        const r = relax(c.map, areas);
        for (const s of [1e-3, 1e3]) {
          const q = relax(c.map, Float64Array.from(areas, (a) => a * s));
          expect(q.status, c.code).toBe(r.status);
          if (r.status === 'ok') expect(Math.abs(q.perimeter / (Math.sqrt(s) * r.perimeter) - 1)).toBeLessThan(1e-11);
        }
      }
    }
  });

  it('relax at random areas with ratios up to 1:50 (n = 3..5) never ends without a verdict', () => {
    // the robustness requirement at unequal areas; every 'ok' answer re-checked by the certificate
    let seed = 11;
    const random = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    for (let n = 3; n <= 5; n++) {
      const maps = [...enumerateClusters(n)];
      for (let t = 0; t < (n === 5 ? 2 : 5); t++) {
        const areas = Float64Array.from({ length: n }, () => Math.exp(Math.log(50) * random()));
        for (const c of maps) {
          const r = relax(c.map, areas);
          expect(r.status, `${c.code} ${Array.from(areas)}`).not.toBe('no-convergence');
          if (r.status === 'ok') expect(polylinePasses(polylineCheck(c.map, areas, r))).toBe(true);
        }
      }
    }
  });
});
