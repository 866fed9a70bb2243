import { describe, expect, it } from 'vitest';
import {
  BULGE_FACTORS, G, G1, G2, H, H1, H2, arcLength, bulgeFactorsInto, bulgeThrough, segmentFactor,
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
