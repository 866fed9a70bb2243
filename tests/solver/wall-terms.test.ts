import { describe, expect, it } from 'vitest';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { problemOf, withTensions } from '../../src/solver/problem.ts';
import {
  AREA_BLOCK, HESSIAN_BLOCK, M_TT, M_XT, M_XX, M_XY, M_YT, M_YY, Q_AX, Q_AY, Q_BX, Q_BY, Q_T, W_LT, W_LX, W_LY, W_Q,
  WALL_STRIDE, W_C, W_FORM, W_G, W_LTT, areaGradientInto, perimeterInto, wallHessianInto,
} from '../../src/solver/wall-terms.ts';
import { NEAR_OFFSET } from '../../src/arcs/arc.ts';
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

// wall 0 of `theta` with the state and records of its problem: the problem, the offsets of its bulge
// and its two junctions in z, the state, the records and the cell areas
function thetaWall() {
  const p = theta;
  return {
    p, t0: 2 * p.junctions, a: 2 * p.starts[0], b: 2 * p.ends[0], z: new Float64Array(p.size),
    cache: new Float64Array(p.walls * WALL_STRIDE), areas: new Float64Array(p.cells),
  };
}

// The 5 x 5 Hessian in (ax, ay, bx, by, v) of a wall's block from wallHessianInto (the chord d = b - a)
function blockOf(m: Float64Array): number[][] {
  return [
    [m[M_XX], m[M_XY], -m[M_XX], -m[M_XY], -m[M_XT]],
    [m[M_XY], m[M_YY], -m[M_XY], -m[M_YY], -m[M_YT]],
    [-m[M_XX], -m[M_XY], m[M_XX], m[M_XY], m[M_XT]],
    [-m[M_XY], -m[M_YY], m[M_XY], m[M_YY], m[M_YT]],
    [-m[M_XT], -m[M_YT], m[M_XT], m[M_YT], m[M_TT]],
  ];
}

describe('wall-terms', () => {
  it('the wall records and wallHessianInto give the derivatives of L, Q and phi = L - D Q of the arc primitives', () => {
    // reference: L and the segment area S of tests/arcs/reference.ts, with their gradients and Hessians
    // in (ax, ay, bx, by, t) (checked there against central differences); Q = (a x b)/2 - S
    const { p, t0, a, b, z, cache, areas } = thetaWall();
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
      const block = blockOf(m);
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

describe('wall-terms near a full circle', () => {
  it('a wall in the gap form: its record and wallHessianInto give the derivatives of L, Q and phi in (a, b, curvature)', () => {
    // reference: the arc of chord c and signed curvature k on its major side, gap s = asin(c |k| / 2),
    // L = 2 (pi - s) / |k|, segment S = sign(k) (theta - sin theta) / (2 k^2) with theta = 2 (pi - s)
    // (school geometry, no source), Q = (a x b)/2 - S, differentiated here by central differences
    const { p, t0, a, b, z, cache, areas } = thetaWall();
    const m = new Float64Array(HESSIAN_BLOCK);
    const lengthAndSegment = (v: number[]): [number, number] => {
      const [ax, ay, bx, by, k] = v;
      const c = Math.hypot(bx - ax, by - ay);
      const s = Math.asin((c * Math.abs(k)) / 2);
      const angle = 2 * (Math.PI - s);
      return [(2 * (Math.PI - s)) / Math.abs(k), (Math.sign(k) * (angle - Math.sin(angle))) / (2 * k * k)];
    };
    for (let trial = 0; trial < 40; trial++) {
      for (let i = 0; i < p.size; i++) z[i] = 2 * random() - 1;
      const gap = 0.05 + 0.25 * random();
      const sign = trial % 2 === 0 ? 1 : -1;
      z[t0] = sign * (NEAR_OFFSET + 1 / gap);
      const jump = 3 * (random() - 0.5);
      const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
      const v = [z[a], z[a + 1], z[b], z[b + 1], (sign * 2 * Math.sin(gap)) / c];
      perimeterInto(p, z, cache, areas);
      expect(cache[W_FORM]).toBe(1);
      const L = (u: number[]): number => lengthAndSegment(u)[0];
      const Q = (u: number[]): number => 0.5 * (u[0] * u[3] - u[1] * u[2]) - lengthAndSegment(u)[1];
      const phi = (u: number[]): number => L(u) - jump * Q(u);
      // (steps relative to each variable's scale: the curvature's is its own size)
      const scales = v.map((x, i) => (i === 4 ? Math.abs(x) : 1 + Math.abs(x)));
      const steps = scales.map((x) => 1e-5 * x);
      const moved = (i: number, d: number, j = -1, e = 0): number[] => v.map((x, l) => x + (l === i ? d : 0) + (l === j ? e : 0));
      const grad = (fn: (u: number[]) => number, i: number): number => (fn(moved(i, steps[i])) - fn(moved(i, -steps[i]))) / (2 * steps[i]);
      const close = (x: number, y: number, tol: number): void => expect(Math.abs(x - y)).toBeLessThan(tol * (1 + Math.abs(y)));
      close(cache[W_LX], grad(L, 2), 1e-7);
      close(cache[W_LY], grad(L, 3), 1e-7);
      close(cache[W_LT], grad(L, 4), 1e-7);
      [Q_AX, Q_AY, Q_BX, Q_BY, Q_T].forEach((o, i) => close(cache[W_Q + o], grad(Q, i), 1e-7));
      // the Hessian of phi less its cross-product term, by second differences
      wallHessianInto(cache, 0, jump, m);
      const second = (i: number, j: number): number => {
        const hi = 1e-4 * scales[i];
        const hj = 1e-4 * scales[j];
        const f = (di: number, dj: number): number => {
          const u = moved(i, di, j, dj);
          if (i === j) u[i] = v[i] + di + dj;
          return phi(u) + 0.5 * jump * (u[0] * u[3] - u[1] * u[2]);
        };
        return (f(hi, hj) - f(hi, -hj) - f(-hi, hj) + f(-hi, -hj)) / (4 * hi * hj);
      };
      const block = blockOf(m);
      for (let i = 0; i < 5; i++) {
        for (let j = 0; j < 5; j++) {
          // (differences of a function of size R^2 at steps of the variables' scales: judged against the
          // geometric mean of the two diagonal entries, the scale of a mixed second difference's error)
          const y = second(i, j);
          const scale = 1 + Math.abs(y) + Math.sqrt(Math.abs(second(i, i) * second(j, j)));
          expect(Math.abs(block[i][j] - y), `${i} ${j}`).toBeLessThan(1e-5 * scale);
        }
      }
    }
  });
});
