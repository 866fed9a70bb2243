// arcs stage: scalar primitives of one circular arc given by its chord end points and its bulge angle.
//
// An arc runs from a = (ax, ay) to b = (bx, by). Its bulge t in (-pi, pi) is the angle from the chord
// direction a->b to the arc's tangent at a. POSITIVE t bulges to the LEFT of a->b (the tangent at a is
// the chord direction turned counter-clockwise by t). With chord length c = |b - a| (circular arcs, school geometry):
//
//   length        L = c t / sin t                      = c g(t),   g = t / sin t
//   segment area  S = (c^2/4) (t - sin t cos t)/sin^2 t = c^2 h(t), h = (t - sin t cos t) / (4 sin^2 t)
//   curvature     k = 2 sin t / c   (positive when the arc bulges to the left)
//
// S is the signed area between the chord and the arc, positive when the arc lies left of a->b.
// Derivatives are taken with respect to the argument vector (ax, ay, bx, by, t), in that order: a
// gradient buffer holds 5 numbers, a Hessian buffer 25 (row-major, symmetric).
//
//            tangent at a (angle of a->b plus t)
//           ^      .-~~~-.
//           |   .-'       '-.      arc bulging left of a->b: t > 0
//           a ------------------> b
//                  chord c

/** Number of arguments of an arc primitive, (ax, ay, bx, by, t): the gradient length. */
export const ARC_ARGS = 5;
/** Length of a Hessian buffer of an arc primitive (5 x 5, row-major). */
export const ARC_HESSIAN = 25;

/** Offsets in a bulge-factor buffer filled by bulgeFactorsInto. */
export const G = 0;
/** Offset of g'(t) in a bulge-factor buffer. */
export const G1 = 1;
/** Offset of g''(t) in a bulge-factor buffer. */
export const G2 = 2;
/** Offset of h(t) in a bulge-factor buffer. */
export const H = 3;
/** Offset of h'(t) in a bulge-factor buffer. */
export const H1 = 4;
/** Offset of h''(t) in a bulge-factor buffer. */
export const H2 = 5;
/** Length of a bulge-factor buffer. */
export const BULGE_FACTORS = 6;

// Below |t| = SERIES_LIMIT the cancelling numerators are summed as power series in t^2; above it the
// closed forms lose at most a few bits. 13 terms: the k-th term of the fastest series is below
// 4^k / (2k+1)!, which for k = 13 and |t| < 1 is under 1e-18 of the leading term.
const SERIES_LIMIT = 1;
const SERIES_TERMS = 13;

// Coefficients (in powers of t^2) of, with s = sin t, w = s - t cos t, u = t - s cos t,
// z = t s^2 - 2 w cos t, y = t s^2 - 3 w cos t (Taylor series of sin and cos, collected by hand):
//   s/t   = sum_{k>=0} (-1)^k t^2k / (2k+1)!
//   w/t^3 = sum_{k>=1} (-1)^(k+1) 2k t^(2k-2) / (2k+1)!
//   u/t^3 = sum_{k>=1} (-1)^(k+1) 4^k t^(2k-2) / (2k+1)!
//   z/t^3 = sum_{k>=1} (-1)^k (2k-3) 2^(2k-1) t^(2k-2) / (2k+1)!
//   y/t^5 = sum_{k>=2} (-1)^k (k-1) 2^(2k+1) t^(2k-4) / (2k+1)!
const SINC = new Float64Array(SERIES_TERMS);
const W3 = new Float64Array(SERIES_TERMS);
const U3 = new Float64Array(SERIES_TERMS);
const Z3 = new Float64Array(SERIES_TERMS);
const Y5 = new Float64Array(SERIES_TERMS);
{
  const factorial = (m: number): number => {
    let f = 1;
    for (let i = 2; i <= m; i++) f *= i;
    return f;
  };
  for (let j = 0; j < SERIES_TERMS; j++) {
    SINC[j] = (j % 2 === 0 ? 1 : -1) / factorial(2 * j + 1);
    const k = j + 1; // W3, U3, Z3 start at k = 1
    const sk = k % 2 === 0 ? 1 : -1;
    W3[j] = (-sk * 2 * k) / factorial(2 * k + 1);
    U3[j] = (-sk * 4 ** k) / factorial(2 * k + 1);
    Z3[j] = (sk * (2 * k - 3) * 2 ** (2 * k - 1)) / factorial(2 * k + 1);
    const q = j + 2; // Y5 starts at k = 2
    Y5[j] = ((q % 2 === 0 ? 1 : -1) * (q - 1) * 2 ** (2 * q + 1)) / factorial(2 * q + 1);
  }
}

function horner(c: Float64Array, x: number): number {
  let s = 0;
  for (let j = SERIES_TERMS - 1; j >= 0; j--) s = s * x + c[j];
  return s;
}

/**
 * Write g, g', g'', h, h', h'' at bulge t into out (offsets G..H2), where L = c g(t) and S = c^2 h(t).
 * Exact at t = 0 (g = 1, h = 0, g' = 0, g'' = 1/3, h' = 1/6, h'' = 0); finite for every |t| < pi.
 */
export function bulgeFactorsInto(t: number, out: Float64Array): void {
  // Is the bulge small? Use the series forms, all divided by the powers of t they carry.
  if (Math.abs(t) < SERIES_LIMIT) {
    const t2 = t * t;
    const sinc = horner(SINC, t2);
    const w = horner(W3, t2);
    const u = horner(U3, t2);
    const z = horner(Z3, t2);
    const y = horner(Y5, t2);
    const s2 = sinc * sinc;
    out[G] = 1 / sinc;
    out[G1] = (t * w) / s2;
    out[G2] = z / (s2 * sinc);
    out[H] = (t * u) / (4 * s2);
    out[H1] = w / (2 * s2 * sinc);
    out[H2] = (t * y) / (2 * s2 * s2);
    return;
  }
  // closed forms (major arcs included: sin t only vanishes at the excluded |t| = pi)
  const s = Math.sin(t);
  const co = Math.cos(t);
  const s2 = s * s;
  const w = s - t * co;
  out[G] = t / s;
  out[G1] = w / s2;
  out[G2] = (t * s2 - 2 * w * co) / (s2 * s);
  out[H] = (t - s * co) / (4 * s2);
  out[H1] = w / (2 * s2 * s);
  out[H2] = (t * s2 - 3 * w * co) / (2 * s2 * s2);
}

/**
 * The segment factor h(t) = (t - sin t cos t) / (4 sin^2 t): a wall's signed segment area over its chord
 * squared, S = c^2 h(t); bulgeFactorsInto's H alone, to the last bit. Odd and increasing on (-pi, pi),
 * h(t) = t/6 + ... near 0 (series below |t| = 1, as there).
 */
export function segmentFactor(t: number): number {
  if (Math.abs(t) < SERIES_LIMIT) {
    const t2 = t * t;
    const sinc = horner(SINC, t2);
    return (t * horner(U3, t2)) / (4 * (sinc * sinc));
  }
  const s = Math.sin(t);
  return (t - s * Math.cos(t)) / (4 * (s * s));
}

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

/**
 * Bulge of the circular arc from a through m to b (positive when m lies left of a->b): pi minus the
 * angle a-m-b, signed (the tangent-chord angle equals the inscribed angle on the other side; school geometry, no source). A point m on the chord gives 0;
 * a point beyond the chord's ends is clamped to just inside (-pi, pi).
 */
export function bulgeThrough(ax: number, ay: number, mx: number, my: number, bx: number, by: number): number {
  const px = ax - mx;
  const py = ay - my;
  const qx = bx - mx;
  const qy = by - my;
  const theta = Math.atan2(px * qy - py * qx, px * qx + py * qy);
  const t = (theta >= 0 ? Math.PI : -Math.PI) - theta;
  const limit = Math.PI - 1e-6;
  return t > limit ? limit : t < -limit ? -limit : t;
}
