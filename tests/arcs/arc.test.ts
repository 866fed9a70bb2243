import { describe, expect, it } from 'vitest';
import {
  BULGE_FACTORS, CIRCLE_FACTORS, CL, CL_C, CL_CC, CL_CK, CL_K, CL_KK, CS, CS_C, CS_CC, CS_CK, CS_K, CS_KK, G, G1, G2,
  GAP_IN, GAP_OUT, H, H1, H2, NEAR_OFFSET, advanceBulge, advanceCurvature, arcLength, bulgeFactorsInto, bulgeForSegmentFactor,
  bulgeOf, bulgeSine, bulgeThrough, circleFactorsInto, coordinateOfGap, gapOf, segmentFactor,
} from '../../src/arcs/arc.ts';
import {
  ARC_ARGS, ARC_HESSIAN, arcCurvatureInto, arcEndAngleInto, arcLengthInto, arcSegmentAreaInto, arcStartAngleInto, wrapAngle,
} from './reference.ts';

type Primitive = (ax: number, ay: number, bx: number, by: number, t: number, g?: Float64Array, h?: Float64Array) => number;

const PRIMITIVES: [string, Primitive, boolean][] = [
  ['arcLengthInto', arcLengthInto, false],
  ['arcSegmentAreaInto', arcSegmentAreaInto, false],
  ['arcCurvatureInto', arcCurvatureInto, false],
  ['arcStartAngleInto', arcStartAngleInto, true],
  ['arcEndAngleInto', arcEndAngleInto, true],
];

// bulges across the series/closed-form switch at |t| = 1, near zero and on major arcs
const BULGES = [0, 1e-7, -3e-4, 0.2, -0.7, 0.999, 1.001, -1.3, 2.0943951023931953, -2.6, 2.9];
const POINT = [0.3, -0.2, 1.4, 0.5];

describe('arc primitives', () => {
  it('bulgeFactorsInto matches the closed forms of the circular arc away from t = 0', () => {
    // source: the arc and segment of a circle (school geometry, no source): L = c t / sin t, S = (c^2/4)(t - sin t cos t)/sin^2 t
    const f = new Float64Array(BULGE_FACTORS);
    for (const t of [0.05, 0.5, 1.5, -2.5, 3]) {
      bulgeFactorsInto(t, f);
      expect(f[G]).toBeCloseTo(t / Math.sin(t), 12);
      expect(f[H] / ((t - Math.sin(t) * Math.cos(t)) / (4 * Math.sin(t) ** 2))).toBeCloseTo(1, 12);
    }
    // series at 0: t/sin t = 1 + t^2/6 + ..., (t - sin t cos t)/sin^2 t = 2t/3 + ... (Taylor series)
    bulgeFactorsInto(0, f);
    expect([f[G], f[G1], f[G2], f[H], f[H1], f[H2]]).toEqual([1, 0, 1 / 3, 0, 1 / 6, 0]);
  });

  it('bulgeFactorsInto derivatives match central differences', () => {
    // reference: central finite differences, error O(step^2)
    const f = new Float64Array(BULGE_FACTORS);
    const p = new Float64Array(BULGE_FACTORS);
    const m = new Float64Array(BULGE_FACTORS);
    const step = 1e-5;
    for (const t of BULGES) {
      bulgeFactorsInto(t, f);
      bulgeFactorsInto(t + step, p);
      bulgeFactorsInto(t - step, m);
      for (const [v, d] of [[G, G1], [G1, G2], [H, H1], [H1, H2]]) {
        const fd = (p[v] - m[v]) / (2 * step);
        expect(Math.abs(fd - f[d])).toBeLessThan(1e-7 * (1 + Math.abs(f[d])));
      }
    }
  });

  it('a semicircle has length pi c / 2, area pi c^2 / 8, curvature 2 / c', () => {
    // source: circle of radius c/2 (school geometry, no source)
    const c = Math.hypot(1.1, 0.7);
    expect(arcLengthInto(0, 0, 1.1, 0.7, Math.PI / 2)).toBeCloseTo((Math.PI * c) / 2, 14);
    expect(arcSegmentAreaInto(0, 0, 1.1, 0.7, Math.PI / 2)).toBeCloseTo((Math.PI * c * c) / 8, 14);
    expect(arcCurvatureInto(0, 0, 1.1, 0.7, Math.PI / 2)).toBeCloseTo(2 / c, 14);
    // bulging right (negative t) gives the mirror values
    expect(arcSegmentAreaInto(0, 0, 1.1, 0.7, -Math.PI / 2)).toBeCloseTo((-Math.PI * c * c) / 8, 14);
  });

  it('tangent angles turn the chord by +t at the start and point back turned by -t at the end', () => {
    // the project's convention (arcs/arc.ts): t is the angle from the chord to the tangent at a, positive to the left
    expect(arcStartAngleInto(0, 0, 1, 0, 0.4)).toBeCloseTo(0.4, 15);
    expect(arcEndAngleInto(0, 0, 1, 0, 0.4)).toBeCloseTo(wrapAngle(Math.PI - 0.4), 15);
  });

  for (const [name, fn, angle] of PRIMITIVES) {
    it(`${name} gradient and Hessian match central differences`, () => {
      // reference: central finite differences of the value (gradient) and of the gradient (Hessian)
      const grad = new Float64Array(ARC_ARGS);
      const hess = new Float64Array(ARC_HESSIAN);
      const gp = new Float64Array(ARC_ARGS);
      const gm = new Float64Array(ARC_ARGS);
      const step = 1e-6;
      for (const t of BULGES) {
        const x = [...POINT, t];
        const value = fn(x[0], x[1], x[2], x[3], x[4], grad, hess);
        expect(Number.isFinite(value)).toBe(true);
        for (let i = 0; i < ARC_ARGS; i++) {
          const xp = x.slice();
          const xm = x.slice();
          xp[i] += step;
          xm[i] -= step;
          let diff = fn(xp[0], xp[1], xp[2], xp[3], xp[4], gp) - fn(xm[0], xm[1], xm[2], xm[3], xm[4], gm);
          if (angle) diff = wrapAngle(diff);
          const fd = diff / (2 * step);
          expect(Math.abs(fd - grad[i])).toBeLessThan(1e-6 * (1 + Math.abs(grad[i])));
          for (let j = 0; j < ARC_ARGS; j++) {
            const fdh = (gp[j] - gm[j]) / (2 * step);
            expect(Math.abs(fdh - hess[i * 5 + j])).toBeLessThan(2e-5 * (1 + Math.abs(hess[i * 5 + j])));
            expect(hess[i * 5 + j]).toBe(hess[j * 5 + i]);
          }
        }
      }
    });
  }

  it('bulgeThrough recovers the bulge of the arc through its apex', () => {
    // the apex of an arc of bulge t over chord (0,0)-(2,0) is at (1, tan(t/2)) (school geometry, no source)
    for (const t of [0.3, -1.2, 2.5, -2.9]) {
      expect(bulgeThrough(0, 0, 1, Math.tan(t / 2), 2, 0)).toBeCloseTo(t, 12);
    }
    expect(bulgeThrough(0, 0, 1, 0, 2, 0)).toBe(0);
  });
});

describe('segmentFactor', () => {
  it('segmentFactor(t) c^2 equals the classical segment area R^2 (theta - sin theta) / 2, series and closed form alike', () => {
    // reference: circular segment of central angle theta = 2|t| and radius R = c / (2 |sin t|), chord c = 1;
    // evaluated where it is well conditioned, and across the series switch at |t| = 1
    for (const t of [0.02, 0.0100001, 0.0099999, 1.0000001, 0.9999999, 0.3, 1, Math.PI / 2, 2.5, 3.0, -0.7, -2.9]) {
      const r = 1 / (2 * Math.abs(Math.sin(t)));
      const theta = 2 * Math.abs(t);
      const classical = Math.sign(t) * 0.5 * r * r * (theta - Math.sin(theta));
      expect(segmentFactor(t)).toBeCloseTo(classical, 12);
    }
    expect(segmentFactor(0)).toBe(0);
    // near 0: S ~ (2/3) c h with sagitta h ~ c t / 4, the parabolic segment (Archimedes' quadrature of the parabola)
    expect(segmentFactor(1e-7)).toBeCloseTo((2 / 3) * (1e-7 / 4), 20);
  });
});

describe('arcLength', () => {
  it('arcLength is c t / sin t: a semicircle pi c / 2, a straight wall its chord, and the length of arcLengthInto', () => {
    // reference: the arc of a circle (school geometry, no source) and tests/arcs/reference.ts
    expect(arcLength(0, 0, 2, 0, Math.PI / 2)).toBeCloseTo(Math.PI, 14);
    expect(arcLength(0, 0, 3, 4, 0)).toBe(5);
    expect(arcLength(1, 1, 1, 1, 0.5)).toBe(0);
    for (const t of [-2.9, -1, -0.3, 1e-9, 0.999, 1.001, 2.5]) {
      expect(arcLength(0.3, -0.2, 1.1, 0.7, t)).toBe(arcLengthInto(0.3, -0.2, 1.1, 0.7, t));
    }
  });
});

describe('bulge coordinates near a full circle', () => {
  // the gap form of a bulge t = sign (pi - s): |x| = NEAR_OFFSET + 1/s
  const near = (sign: number, gap: number): number => sign * (NEAR_OFFSET + 1 / gap);

  it('the gap form gives g, h and their derivatives as the closed forms in the gap s = pi - |t|, to full relative precision', () => {
    // source: L = c t / sin t and S = (c^2/4)(t - sin t cos t)/sin^2 t with t = pi - s, sin t = sin s,
    // cos t = -cos s (school geometry, no source); the closed forms in s have no cancellation
    const f = new Float64Array(BULGE_FACTORS);
    for (const s of [1e-2, 1e-6, 1e-12, 1e-100]) {
      for (const sign of [1, -1]) {
        bulgeFactorsInto(near(sign, s), f);
        const g = (Math.PI - s) / Math.sin(s);
        const h = (Math.PI - s + Math.sin(s) * Math.cos(s)) / (4 * Math.sin(s) ** 2);
        expect(Math.abs(f[G] / g - 1), String(s)).toBeLessThan(1e-15);
        expect(Math.abs(f[H] / (sign * h) - 1), String(s)).toBeLessThan(1e-15);
        expect(Math.abs(segmentFactor(near(sign, s)) / (sign * h) - 1)).toBeLessThan(1e-15);
        expect(bulgeSine(near(sign, s)) / (sign * Math.sin(s))).toBe(1);
        expect(Math.abs(gapOf(near(sign, s)) / s - 1)).toBeLessThan(1e-15);
        expect(bulgeOf(near(sign, s))).toBe(sign * (Math.PI - gapOf(near(sign, s))));
      }
    }
    // and agrees with the plain bulge where that is still exact enough (gap 0.25: t holds s to 2e-15)
    const plain = new Float64Array(BULGE_FACTORS);
    bulgeFactorsInto(Math.PI - 0.25, plain);
    bulgeFactorsInto(near(1, Math.PI - (Math.PI - 0.25)), f);
    for (const o of [G, G1, G2, H, H1, H2]) expect(Math.abs(f[o] / plain[o] - 1)).toBeLessThan(1e-13);
  });

  it('advanceBulge moves a plain bulge by dt as x + dt, takes the gap form below GAP_IN and leaves it above GAP_OUT', () => {
    // the representation's own contract (arc.ts header): plain arithmetic away from a full circle,
    // the gap carried exactly near one, hysteresis between GAP_IN and GAP_OUT
    expect(advanceBulge(1.25, 0.5)).toBe(1.25 + 0.5);
    expect(advanceBulge(-2.5, -0.25)).toBe(-2.5 - 0.25);
    const x = advanceBulge(Math.PI - 1e-3, 1e-3 - 1e-9);
    expect(Math.abs(x)).toBeGreaterThan(NEAR_OFFSET);
    expect(Math.abs(gapOf(x) / 1e-9 - 1)).toBeLessThan(1e-6);
    // (the gap, 1e-9, from pi - 1e-3 and a step: the plain bulge would hold it to 4e-7 of itself)
    const y = advanceBulge(x, 5e-10);
    expect(Math.abs(gapOf(y) / 5e-10 - 1)).toBeLessThan(2e-6);
    expect(Math.abs(advanceBulge(near(-1, 1e-10), -4e-11))).toBeGreaterThan(NEAR_OFFSET);
    // (t = -(pi - 1e-10) moved by -4e-11: nearer -pi, the gap 6e-11)
    expect(Math.abs(gapOf(advanceBulge(near(-1, 1e-10), -4e-11)) / 6e-11 - 1)).toBeLessThan(1e-14);
    // hysteresis: a gap between GAP_IN and GAP_OUT keeps its form
    const between = 0.5 * (GAP_IN + GAP_OUT);
    expect(Math.abs(advanceBulge(near(1, 0.5 * GAP_IN), 0.5 * GAP_IN - between))).toBeGreaterThan(NEAR_OFFSET);
    expect(Math.abs(advanceBulge(Math.PI - 2 * GAP_OUT, 2 * GAP_OUT - between))).toBeLessThan(Math.PI);
    expect(Math.abs(advanceBulge(near(1, 0.5 * GAP_IN), -2 * GAP_OUT))).toBeLessThan(Math.PI);
    // past a full circle: NaN, never a bulge beyond pi
    expect(advanceBulge(near(1, 1e-9), 2e-9)).toBeNaN();
    expect(advanceBulge(Math.PI - 1e-3, 2e-3)).toBeNaN();
    expect(coordinateOfGap(-1, 0.5)).toBe(-(Math.PI - 0.5));
    expect(coordinateOfGap(1, 1e-8)).toBe(NEAR_OFFSET + 1e8);
  });

  it('bulgeForSegmentFactor inverts segmentFactor near a full circle to full relative precision', () => {
    // h(t) ~ pi / (4 s^2) as s -> 0 (the closed form above): a segment factor of 1e20 is a gap of about 9e-11
    for (const v of [1e3, 1e12, 1e20, -1e40]) {
      const x = bulgeForSegmentFactor(v);
      expect(Math.abs(segmentFactor(x) / v - 1), String(v)).toBeLessThan(1e-14);
    }
    const moderate = bulgeForSegmentFactor(0.3);
    expect(Math.abs(moderate)).toBeLessThan(Math.PI);
    expect(Math.abs(segmentFactor(moderate) / 0.3 - 1)).toBeLessThan(1e-14);
  });

  it('circleFactorsInto: length and segment area in chord and curvature, with their derivatives (central differences)', () => {
    // source: an arc of curvature k on a chord c spans the central angle 2 (pi - asin(c k / 2)) on the
    // major side, L = 2 (pi - s) / k, S = R^2 (theta - sin theta) / 2 (school geometry, no source);
    // derivatives against central differences of those, error O(step^2)
    const value = (c: number, k: number): [number, number] => {
      const s = Math.asin((c * Math.abs(k)) / 2);
      const theta = 2 * (Math.PI - s);
      return [(2 * (Math.PI - s)) / Math.abs(k), (Math.sign(k) * (theta - Math.sin(theta))) / (2 * k * k)];
    };
    const f = new Float64Array(CIRCLE_FACTORS);
    for (const [c, k] of [[0.3, 1.2], [0.05, -2.5], [1e-3, 0.7], [0.9, -1.1]]) {
      const s = Math.asin((c * Math.abs(k)) / 2);
      circleFactorsInto(s, Math.sign(k), c, f);
      const [l, area] = value(c, k);
      expect(Math.abs(f[CL] / l - 1)).toBeLessThan(1e-13);
      expect(Math.abs(f[CS] / area - 1)).toBeLessThan(1e-12);
      const hc = 1e-5 * c;
      const hk = 1e-5 * Math.abs(k);
      const d = (fn: (c: number, k: number) => number, dc: number, dk: number): number => (fn(c + dc, k + dk) - fn(c - dc, k - dk)) / 2;
      const L = (x: number, y: number): number => value(x, y)[0];
      const S = (x: number, y: number): number => value(x, y)[1];
      const first = (fn: typeof L, o: 'c' | 'k'): number => (o === 'c' ? d(fn, hc, 0) / hc : d(fn, 0, hk) / hk);
      const close = (x: number, y: number): void => expect(Math.abs(x - y)).toBeLessThan(1e-6 * (1 + Math.abs(y)));
      close(f[CL_C], first(L, 'c'));
      close(f[CL_K], first(L, 'k'));
      close(f[CS_C], first(S, 'c'));
      close(f[CS_K], first(S, 'k'));
      // second derivatives as differences of the first ones
      const g = new Float64Array(CIRCLE_FACTORS);
      const diff = (o: number, dc: number, dk: number): number => {
        const sp = Math.asin(((c + dc) * Math.abs(k + dk)) / 2);
        circleFactorsInto(sp, Math.sign(k), c + dc, g);
        const up = g[o];
        const sm = Math.asin(((c - dc) * Math.abs(k - dk)) / 2);
        circleFactorsInto(sm, Math.sign(k), c - dc, g);
        return (up - g[o]) / 2;
      };
      close(f[CL_CC], diff(CL_C, hc, 0) / hc);
      close(f[CL_CK], diff(CL_C, 0, hk) / hk);
      close(f[CL_KK], diff(CL_K, 0, hk) / hk);
      close(f[CS_CC], diff(CS_C, hc, 0) / hc);
      close(f[CS_CK], diff(CS_C, 0, hk) / hk);
      close(f[CS_KK], diff(CS_K, 0, hk) / hk);
    }
  });

  it('advanceCurvature keeps the curvature 2 sin t / c through a change of chord and a step', () => {
    // the gap form's curvature step (arc.ts): the new gap is asin(c' k' / 2), k' = k + dk
    const x = NEAR_OFFSET + 1 / 1e-7;
    const c = 2e-7;
    const k = (2 * Math.sin(1e-7)) / c;
    const y = advanceCurvature(x, c, 1.5 * c, 0.25);
    expect(Math.abs((2 * bulgeSine(y)) / (1.5 * c) / (k + 0.25) - 1)).toBeLessThan(1e-15);
    expect(advanceCurvature(x, c, c, -2 * k)).toBeNaN();
  });
});
