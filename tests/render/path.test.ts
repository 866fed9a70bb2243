// render tests: SVG path data, arc flags and the straight-wall degenerate case.

import { UsageError } from '../../src/errors.ts';
import { describe, expect, it } from 'vitest';
import { SvgPath, ZERO_BULGE, arcFlags, circlePath, wallTo } from '../../src/render/path.ts';
import { fixed } from '../../src/render/format.ts';

/**
 * Endpoint to centre parameterisation of an SVG arc with rx = ry = r and no rotation, transcribed
 * from "Elliptical arc implementation notes", appendix F.6.5, W3C SVG 1.1 Second Edition (2011),
 * steps 1-4 (with the radius correction of F.6.6 when r is too small). Returns the centre, start
 * angle theta1 and signed sweep dtheta in radians.
 */
function svgArcCentre(x1: number, y1: number, x2: number, y2: number, r: number, fa: number, fs: number) {
  const xp = (x1 - x2) / 2;
  const yp = (y1 - y2) / 2;
  const lambda = (xp * xp + yp * yp) / (r * r);
  if (lambda > 1) r *= Math.sqrt(lambda);
  const num = r * r * r * r - r * r * yp * yp - r * r * xp * xp;
  const den = r * r * yp * yp + r * r * xp * xp;
  const sign = fa !== fs ? 1 : -1;
  const k = sign * Math.sqrt(Math.max(0, num / den));
  const cxp = k * yp;
  const cyp = -k * xp;
  const cx = cxp + (x1 + x2) / 2;
  const cy = cyp + (y1 + y2) / 2;
  const angle = (ux: number, uy: number, vx: number, vy: number): number =>
    Math.sign(ux * vy - uy * vx || 1) * Math.acos(Math.max(-1, Math.min(1, (ux * vx + uy * vy) / (Math.hypot(ux, uy) * Math.hypot(vx, vy)))));
  const ux = (xp - cxp) / r;
  const uy = (yp - cyp) / r;
  const theta1 = angle(1, 0, ux, uy);
  let dtheta = angle(ux, uy, (-xp - cxp) / r, (-yp - cyp) / r) % (2 * Math.PI);
  if (fs === 0 && dtheta > 0) dtheta -= 2 * Math.PI;
  if (fs === 1 && dtheta < 0) dtheta += 2 * Math.PI;
  return { cx, cy, r, theta1, dtheta };
}

/** The A command of a one-wall path, parsed. */
function parseArc(d: string): { r: number; fa: number; fs: number; x: number; y: number } {
  const match = /A(\S+) (\S+) 0 ([01]) ([01]) (\S+) (\S+)/.exec(d);
  if (match === null) throw new Error(`No arc in ${d}.`);
  return { r: Number(match[1]), fa: Number(match[3]), fs: Number(match[4]), x: Number(match[5]), y: Number(match[6]) };
}

function wallPath(ax: number, ay: number, bx: number, by: number, t: number, digits = 12): string {
  const path = new SvgPath(digits);
  path.moveTo(ax, ay);
  wallTo(path, ax, ay, bx, by, t);
  return path.toString();
}

describe('arcFlags', () => {
  // hand-computed for a = (0, 0), b = (2, 0) in a y-up frame: a left bulge lies on the +y side and
  // is traversed with decreasing angle (sweep 0 per SVG 1.1 F.6: sweep 1 = "positive-angle" direction);
  // the arc subtends 2|t|, so it is large exactly when |t| > pi/2; R = c / (2 |sin t|)
  const table: [string, number, string][] = [
    ['semicircle, left', Math.PI / 2, 'M0 0 A1 1 0 0 0 2 0'],
    ['minor, left', Math.PI / 3, 'M0 0 A1.155 1.155 0 0 0 2 0'],
    ['minor, right', -Math.PI / 3, 'M0 0 A1.155 1.155 0 0 1 2 0'],
    ['major, left', (2 * Math.PI) / 3, 'M0 0 A1.155 1.155 0 1 0 2 0'],
    ['major, right', (-5 * Math.PI) / 6, 'M0 0 A2 2 0 1 1 2 0'],
  ];
  for (const [name, t, expected] of table) {
    it(`wallTo(SvgPath(3)) writes the hand-computed arc for a ${name} wall`, () => {
      expect(wallPath(0, 0, 2, 0, t, 3)).toBe(expected);
    });
  }

  it('arcFlags(t) matches the table of signs and sizes', () => {
    expect(arcFlags(0.3)).toEqual({ largeArc: false, sweep: false });
    expect(arcFlags(-0.3)).toEqual({ largeArc: false, sweep: true });
    expect(arcFlags(2.5)).toEqual({ largeArc: true, sweep: false });
    expect(arcFlags(-2.5)).toEqual({ largeArc: true, sweep: true });
  });

  it('wallTo arcs, read back with the SVG 1.1 centre conversion, bulge to the stated side by the stated angle', () => {
    // reference: SVG 1.1 F.6.5; the arc's midpoint must sit at the signed sagitta (c/2) tan(t/2) along the
    // left normal (circle geometry: sagitta R (1 - cos(theta/2)) with theta = 2t), and the arc must
    // turn by -2t (clockwise for a left bulge)
    const ends = [
      [0.3, -1.2, 2.1, 0.4],
      [-1, 2, -1, -3],
      [5, 5, 4, 7],
    ];
    for (const [ax, ay, bx, by] of ends) {
      for (const t of [0.01, 0.4, 1.2, Math.PI / 2, 2.0, 2.9, -0.01, -0.7, -1.9, -3.0]) {
        const arc = parseArc(wallPath(ax, ay, bx, by, t));
        const { cx, cy, r, theta1, dtheta } = svgArcCentre(ax, ay, arc.x, arc.y, arc.r, arc.fa, arc.fs);
        // NOTE: a semicircle is ill-conditioned in the F.6.5 conversion (square root of a rounding error), hence 1e-5
        expect(dtheta).toBeCloseTo(-2 * t, 5);
        const mid = theta1 + dtheta / 2;
        const c = Math.hypot(bx - ax, by - ay);
        const h = (c / 2) * Math.tan(t / 2);
        const nx = -(by - ay) / c;
        const ny = (bx - ax) / c;
        expect(cx + r * Math.cos(mid)).toBeCloseTo((ax + bx) / 2 + h * nx, 5);
        expect(cy + r * Math.sin(mid)).toBeCloseTo((ay + by) / 2 + h * ny, 5);
      }
    }
  });
});

describe('wallTo', () => {
  it('wallTo draws a wall of bulge below ZERO_BULGE as a straight segment (documented degenerate case)', () => {
    expect(wallPath(0, 0, 2, 0, 0, 3)).toBe('M0 0 L2 0');
    expect(wallPath(0, 0, 2, 0, ZERO_BULGE / 2, 3)).toBe('M0 0 L2 0');
    expect(wallPath(0, 0, 2, 0, -ZERO_BULGE / 2, 3)).toBe('M0 0 L2 0');
    expect(wallPath(0, 0, 2, 0, 2 * ZERO_BULGE, 3)).toMatch(/^M0 0 A/);
  });
});

describe('SvgPath', () => {
  it('SvgPath(digits) writes fixed digits, no trailing zeros and no negative zero', () => {
    const path = new SvgPath(2);
    path.moveTo(1.005001, -0.0001);
    path.lineTo(3, 2.5);
    path.closePath();
    expect(path.toString()).toBe('M1.01 0 L3 2.5 Z');
    expect(fixed(-0.0004, 3)).toBe('0');
    expect(fixed(123.45678, 0)).toBe('123');
  });

  it('new SvgPath(digits) refuses digits outside 0..15 with a UsageError', () => {
    expect(() => new SvgPath(-1)).toThrow(UsageError);
    expect(() => new SvgPath(2.5)).toThrow(UsageError);
    expect(() => new SvgPath(16)).toThrow(UsageError);
  });

  it('circlePath writes a full circle as two half arcs through the opposite point', () => {
    const path = new SvgPath(3);
    circlePath(path, 1, 2, 0.5);
    expect(path.toString()).toBe('M1.5 2 A0.5 0.5 0 0 1 0.5 2 A0.5 0.5 0 0 1 1.5 2 Z');
  });
});
