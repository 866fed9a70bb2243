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
// S is the signed area between the chord and the arc, positive when the arc lies left of a->b. The
// solver's per-wall kernel (solver/wall-terms.ts) derives a wall's derivatives from g, h and their
// derivatives in t (bulgeFactorsInto); the tests check it against the arc's own gradient and Hessian
// in (ax, ay, bx, by, t) (tests/arcs/reference.ts).
//
//            tangent at a (angle of a->b plus t)
//           ^      .-~~~-.
//           |   .-'       '-.      arc bulging left of a->b: t > 0
//           a ------------------> b
//                  chord c

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
 * The length factor g(t) = t / sin t: a wall's length over its chord, L = c g(t); bulgeFactorsInto's G
 * alone, to the last bit (g(0) = 1).
 */
export function lengthFactor(t: number): number {
  return Math.abs(t) < SERIES_LIMIT ? 1 / horner(SINC, t * t) : t / Math.sin(t);
}

/** Length L = c g(t) of the arc from a to b with bulge t (0 for a zero chord). */
export function arcLength(ax: number, ay: number, bx: number, by: number, t: number): number {
  const c = Math.hypot(bx - ax, by - ay);
  return c === 0 ? 0 : c * lengthFactor(t);
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

/**
 * The bulge t in (-pi, pi) whose segment factor h(t) (segmentFactor) is `value`: h is odd and increasing
 * from -infinity to infinity, so bisection on t down to adjacent doubles (a nearly full circle, t within
 * 1e-6 of pi, keeps every digit t can hold).
 */
export function bulgeForSegmentFactor(value: number): number {
  const v = Math.abs(value);
  let lo = 0;
  let hi = Math.PI;
  for (let i = 0; i < 80; i++) {
    const mid = 0.5 * (lo + hi);
    if (mid === lo || mid === hi) break;
    if (segmentFactor(mid) < v) lo = mid;
    else hi = mid;
  }
  return value < 0 ? -lo : lo;
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
