// Reference for the tests: the gradient and Hessian of one arc's length, segment area, curvature and
// tangent angles in its argument vector (ax, ay, bx, by, t), in that order: a gradient buffer holds 5
// numbers, a Hessian buffer 25 (row-major, symmetric). Conventions of src/arcs/arc.ts. The solver
// derives the same derivatives per wall (src/solver/wall-terms.ts); tests/solver/wall-terms.test.ts
// checks it against these, and tests/arcs/arc.test.ts checks these against central differences.

import { BULGE_FACTORS, G, G1, G2, H, H1, H2, bulgeFactorsInto } from '../../src/arcs/arc.ts';

/** Number of arguments of an arc primitive, (ax, ay, bx, by, t): the gradient length. */
export const ARC_ARGS = 5;
/** Length of a Hessian buffer of an arc primitive (5 x 5, row-major). */
export const ARC_HESSIAN = 25;

const FACTORS = new Float64Array(BULGE_FACTORS);

// Write the gradient and Hessian of a function F(d, t) of the chord d = b - a and the bulge into the
// (ax, ay, bx, by, t) layout: dF/da = -dF/dd, dF/db = dF/dd, and the Hessian blocks follow.
function chordFunctionInto(
  fx: number, fy: number, ft: number,
  fxx: number, fxy: number, fyy: number, fxt: number, fyt: number, ftt: number,
  grad: Float64Array | undefined, hess: Float64Array | undefined,
): void {
  if (grad) {
    grad[0] = -fx;
    grad[1] = -fy;
    grad[2] = fx;
    grad[3] = fy;
    grad[4] = ft;
  }
  if (hess) {
    const dd = [fxx, fxy, fxy, fyy];
    for (let i = 0; i < 2; i++) {
      for (let j = 0; j < 2; j++) {
        const v = dd[2 * i + j];
        hess[i * 5 + j] = v;
        hess[(i + 2) * 5 + j + 2] = v;
        hess[i * 5 + j + 2] = -v;
        hess[(i + 2) * 5 + j] = -v;
      }
    }
    hess[0 * 5 + 4] = hess[4 * 5 + 0] = -fxt;
    hess[1 * 5 + 4] = hess[4 * 5 + 1] = -fyt;
    hess[2 * 5 + 4] = hess[4 * 5 + 2] = fxt;
    hess[3 * 5 + 4] = hess[4 * 5 + 3] = fyt;
    hess[24] = ftt;
  }
}

/**
 * Arc length L = c t / sin t; writes dL and d2L (optional) into caller buffers.
 * Degenerate case: a zero chord has length 0 and its derivatives are written as 0.
 */
export function arcLengthInto(
  ax: number, ay: number, bx: number, by: number, t: number,
  grad?: Float64Array, hess?: Float64Array,
): number {
  const dx = bx - ax;
  const dy = by - ay;
  const c = Math.hypot(dx, dy);
  bulgeFactorsInto(t, FACTORS);
  const g = FACTORS[G];
  // Is the chord zero? |d| has no derivative there; report zeros.
  if (c === 0) {
    chordFunctionInto(0, 0, 0, 0, 0, 0, 0, 0, 0, grad, hess);
    return 0;
  }
  const ux = dx / c;
  const uy = dy / c;
  const g1 = FACTORS[G1];
  chordFunctionInto(
    g * ux, g * uy, c * g1,
    (g * (1 - ux * ux)) / c, (-g * ux * uy) / c, (g * (1 - uy * uy)) / c,
    g1 * ux, g1 * uy, c * FACTORS[G2],
    grad, hess,
  );
  return c * g;
}

/** Signed segment area S = (c^2/4)(t - sin t cos t)/sin^2 t between chord and arc (positive: arc left of a->b). */
export function arcSegmentAreaInto(
  ax: number, ay: number, bx: number, by: number, t: number,
  grad?: Float64Array, hess?: Float64Array,
): number {
  const dx = bx - ax;
  const dy = by - ay;
  const c2 = dx * dx + dy * dy;
  bulgeFactorsInto(t, FACTORS);
  const h = FACTORS[H];
  const h1 = FACTORS[H1];
  chordFunctionInto(
    2 * h * dx, 2 * h * dy, c2 * h1,
    2 * h, 0, 2 * h,
    2 * h1 * dx, 2 * h1 * dy, c2 * FACTORS[H2],
    grad, hess,
  );
  return c2 * h;
}

/**
 * Signed curvature k = 2 sin t / c (positive: the arc bulges left of a->b, its centre lies to the right).
 * Degenerate case: a zero chord returns 0 with zero derivatives (the caller treats it as a collapsed wall).
 */
export function arcCurvatureInto(
  ax: number, ay: number, bx: number, by: number, t: number,
  grad?: Float64Array, hess?: Float64Array,
): number {
  const dx = bx - ax;
  const dy = by - ay;
  const c = Math.hypot(dx, dy);
  if (c === 0) {
    chordFunctionInto(0, 0, 0, 0, 0, 0, 0, 0, 0, grad, hess);
    return 0;
  }
  const s = Math.sin(t);
  const co = Math.cos(t);
  const c2 = c * c;
  const c3 = c2 * c;
  const ux = dx / c;
  const uy = dy / c;
  // d(1/c)/dd = -u/c^2, d2(1/c)/dd2 = (3 u u^T - I)/c^3
  chordFunctionInto(
    (-2 * s * ux) / c2, (-2 * s * uy) / c2, (2 * co) / c,
    (2 * s * (3 * ux * ux - 1)) / c3, (6 * s * ux * uy) / c3, (2 * s * (3 * uy * uy - 1)) / c3,
    (-2 * co * ux) / c2, (-2 * co * uy) / c2, (-2 * s) / c,
    grad, hess,
  );
  return (2 * s) / c;
}

// Derivatives of the chord direction phi = atan2(dy, dx), shared by both tangent angles.
function chordAngleInto(
  dx: number, dy: number, ft: number, grad: Float64Array | undefined, hess: Float64Array | undefined,
): void {
  const c2 = dx * dx + dy * dy;
  // Is the chord zero? Its direction is undefined; report zero derivatives.
  if (c2 === 0) {
    chordFunctionInto(0, 0, ft, 0, 0, 0, 0, 0, 0, grad, hess);
    return;
  }
  const c4 = c2 * c2;
  chordFunctionInto(
    -dy / c2, dx / c2, ft,
    (2 * dx * dy) / c4, (dy * dy - dx * dx) / c4, (-2 * dx * dy) / c4,
    0, 0, 0,
    grad, hess,
  );
}

/** Wrap an angle into (-pi, pi]. */
export function wrapAngle(angle: number): number {
  let a = angle % (2 * Math.PI);
  if (a > Math.PI) a -= 2 * Math.PI;
  else if (a <= -Math.PI) a += 2 * Math.PI;
  return a;
}

/** Direction angle in (-pi, pi] of the tangent at a, pointing into the arc: atan2(b - a) + t. */
export function arcStartAngleInto(
  ax: number, ay: number, bx: number, by: number, t: number,
  grad?: Float64Array, hess?: Float64Array,
): number {
  const dx = bx - ax;
  const dy = by - ay;
  chordAngleInto(dx, dy, 1, grad, hess);
  return wrapAngle(Math.atan2(dy, dx) + t);
}

/** Direction angle in (-pi, pi] of the tangent at b, pointing back into the arc: atan2(a - b) - t. */
export function arcEndAngleInto(
  ax: number, ay: number, bx: number, by: number, t: number,
  grad?: Float64Array, hess?: Float64Array,
): number {
  const dx = bx - ax;
  const dy = by - ay;
  chordAngleInto(dx, dy, -1, grad, hess);
  return wrapAngle(Math.atan2(-dy, -dx) - t);
}

