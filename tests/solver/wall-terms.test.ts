import { describe, expect, it } from 'vitest';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { problemOf, withTensions } from '../../src/solver/problem.ts';
import {
  AREA_BLOCK, HESSIAN_BLOCK, M_TT, M_XT, M_XX, M_XY, M_YT, M_YY, Q_AX, Q_AY, Q_BX, Q_BY, Q_T, W_LT, W_LX, W_LY, W_Q,
  WALL_STRIDE, W_C, W_G, W_LTT, areaGradientInto, perimeterInto, wallHessianInto,
} from '../../src/solver/wall-terms.ts';
import { ARC_ARGS, ARC_HESSIAN, arcLengthInto, arcSegmentAreaInto } from '../arcs/reference.ts';

let seed = 777;
function random(): number {
  // mulberry32 (common practice, no source)
  seed = (seed + 0x6d2b79f5) | 0;
  let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
  t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
  return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
}

// one wall from a = (z[0], z[1]) to b = (z[2], z[3]) with bulge z[4]: a problem of the theta graph
// (n = 2) whose wall 0 is used, the others left where they are
const theta = problemOf([...enumerateClusters(2)][0].map);

describe('wall-terms', () => {
  it('the wall records and wallHessianInto give the derivatives of L, Q and phi = L - D Q of the arc primitives', () => {
    // reference: L and the segment area S of tests/arcs/reference.ts, with their gradients and Hessians
    // in (ax, ay, bx, by, t) (checked there against central differences); Q = (a x b)/2 - S
    const p = theta;
    const t0 = 2 * p.junctions;
    const a = 2 * p.starts[0];
    const b = 2 * p.ends[0];
    const z = new Float64Array(p.size);
    const cache = new Float64Array(p.walls * WALL_STRIDE);
    const areas = new Float64Array(p.cells);
    const gL = new Float64Array(ARC_ARGS);
    const hL = new Float64Array(ARC_HESSIAN);
    const gS = new Float64Array(ARC_ARGS);
    const hS = new Float64Array(ARC_HESSIAN);
    const q = new Float64Array(AREA_BLOCK);
    const m = new Float64Array(HESSIAN_BLOCK);
    for (let trial = 0; trial < 200; trial++) {
      for (let i = 0; i < p.size; i++) z[i] = 2 * random() - 1;
      const t = trial % 4 === 0 ? 1e-3 * (random() - 0.5) : 5.5 * (random() - 0.5);
      z[t0] = t;
      const jump = 3 * (random() - 0.5);
      const [ax, ay, bx, by] = [z[a], z[a + 1], z[b], z[b + 1]];
      const length = arcLengthInto(ax, ay, bx, by, t, gL, hL);
      arcSegmentAreaInto(ax, ay, bx, by, t, gS, hS);
      perimeterInto(p, z, cache, areas);
      areaGradientInto(cache, 0, z, a, b, q);
      wallHessianInto(cache, 0, jump, m);
      const close = (x: number, y: number): void => expect(Math.abs(x - y)).toBeLessThan(1e-12 * (1 + Math.abs(y)));
      // dQ = d(a x b)/2 - dS
      const gX = [0.5 * by, -0.5 * bx, -0.5 * ay, 0.5 * ax, 0];
      const gQ = gX.map((x, i) => x - gS[i]);
      [Q_AX, Q_AY, Q_BX, Q_BY, Q_T].forEach((o, i) => close(q[o], gQ[i]));
      [Q_AX, Q_AY, Q_BX, Q_BY, Q_T].forEach((o, i) => close(cache[W_Q + o], gQ[i]));
      close(cache[W_LX], gL[2]);
      close(cache[W_LY], gL[3]);
      close(cache[W_LT], gL[4]);
      // the Hessian of phi less its cross-product term -D d2(a x b)/2 (left to the caller): H_L + D H_S
      const block = [
        [m[M_XX], m[M_XY], -m[M_XX], -m[M_XY], -m[M_XT]],
        [m[M_XY], m[M_YY], -m[M_XY], -m[M_YY], -m[M_YT]],
        [-m[M_XX], -m[M_XY], m[M_XX], m[M_XY], m[M_XT]],
        [-m[M_XY], -m[M_YY], m[M_XY], m[M_YY], m[M_YT]],
        [-m[M_XT], -m[M_YT], m[M_XT], m[M_YT], m[M_TT]],
      ];
      for (let i = 0; i < 5; i++) {
        for (let j = 0; j < 5; j++) close(block[i][j], hL[i * 5 + j] + jump * hS[i * 5 + j]);
      }
      expect(Math.abs(length)).toBeGreaterThan(0);
    }
  });

  it('perimeterInto gives the sum of the arc lengths', () => {
    // reference: arcLengthInto of tests/arcs/reference.ts, wall by wall
    for (const cluster of enumerateClusters(4)) {
      const p = problemOf(cluster.map);
      const t0 = 2 * p.junctions;
      const z = Float64Array.from({ length: p.size }, (_, i) => (i < t0 ? 3 * (random() - 0.5) : random() - 0.5));
      const perimeter = perimeterInto(p, z, new Float64Array(p.walls * WALL_STRIDE), new Float64Array(p.cells));
      let sum = 0;
      for (let k = 0; k < p.walls; k++) {
        const a = 2 * p.starts[k];
        const b = 2 * p.ends[k];
        sum += arcLengthInto(z[a], z[a + 1], z[b], z[b + 1], z[t0 + k]);
      }
      expect(Math.abs(perimeter - sum)).toBeLessThan(1e-12 * sum);
    }
  });

  it('perimeterInto with wall tensions s: energy sum s_k L_k, every length term of the record times s, the arc factors unchanged', () => {
    // reference: the unweighted records of the same state (design.md §8: the energy's wall part is s L)
    for (const cluster of enumerateClusters(4)) {
      const p = problemOf(cluster.map);
      const t0 = 2 * p.junctions;
      const z = Float64Array.from({ length: p.size }, (_, i) => (i < t0 ? 3 * (random() - 0.5) : random() - 0.5));
      const tensions = Float64Array.from({ length: p.walls }, () => 0.6 + random());
      const plain = new Float64Array(p.walls * WALL_STRIDE);
      const weighted = new Float64Array(p.walls * WALL_STRIDE);
      const perimeter = perimeterInto(p, z, plain, new Float64Array(p.cells));
      const energy = perimeterInto(withTensions(p, tensions), z, weighted, new Float64Array(p.cells));
      let sum = 0;
      for (let k = 0; k < p.walls; k++) {
        const w = k * WALL_STRIDE;
        sum += tensions[k] * plain[w + W_C] * plain[w + W_G];
        for (let o = 0; o < WALL_STRIDE; o++) {
          const lengthTerm = o >= W_LX && o <= W_LTT;
          const want = lengthTerm ? tensions[k] * plain[w + o] : plain[w + o];
          expect(Math.abs(weighted[w + o] - want)).toBeLessThan(1e-14 * (1 + Math.abs(want)));
        }
      }
      expect(Math.abs(energy - sum)).toBeLessThan(1e-12 * sum);
      expect(perimeter).not.toBe(energy);
    }
    // unit tensions are the unweighted problem itself (no copy, no multiplication)
    const p = problemOf([...enumerateClusters(3)][0].map);
    expect(withTensions(p, new Float64Array(p.walls).fill(1))).toBe(p);
  });
});
