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
// Bulge coordinates. Near a full circle (the outer wall of a large cell round a tiny one) t lies within
// a gap s = pi - |t| of pi, and a double holding t keeps s only to one ulp of pi (4.4e-16) absolute:
// at s = 1e-6 the length c g(t) ~ c pi / s is then off by 4e-10 of itself. Whoever stores a bulge to
// be moved by small steps (the solver's state z) stores its coordinate x instead:
//   |x| < pi                 x = t itself (every plain bulge is its own coordinate),
//   |x| > NEAR_OFFSET        x = sign(t) (NEAR_OFFSET + 1 / s), the gap held to full relative precision.
// advanceBulge moves a coordinate by dt (the bulge t + dt): a plain one stays plain, as x + dt, while
// its gap stays at least GAP_IN, and becomes the gap form below; the gap form stays until the gap
// exceeds GAP_OUT (hysteresis: a wall hovering near GAP_IN does not switch form at every step). Every
// function of this file that takes a bulge takes a coordinate; from the gap form, sin t = sign(t) sin s
// and cos t = -cos s are computed from s without cancellation, and so are g, h and their derivatives.

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

/** A bulge coordinate beyond +-NEAR_OFFSET holds its gap s = pi - |t| as |x| = NEAR_OFFSET + 1/s. */
export const NEAR_OFFSET = 4;
/**
 * A plain coordinate whose gap to a full circle falls below GAP_IN takes the gap form (advanceBulge).
 * Above it a plain bulge keeps the gap to ulp(pi) / GAP_IN = 4e-12 of itself, and the solver's
 * junction equations at a fixed bulge cancel terms at most pi / GAP_IN times their size (rounding
 * 6e-12, under the certificate's 1e-10); lower thresholds (2^-16 and below, measured) leave walls with
 * gaps near 1e-5 to the plain bulge, where a triple bubble at areas 1, 1, 1e10 no longer converged.
 */
export const GAP_IN = 2 ** -13;
/** A gap-form coordinate whose gap grows above GAP_OUT becomes plain again. */
export const GAP_OUT = 2 ** -12;

/** The bulge t in (-pi, pi) of coordinate x (see the file header). */
export function bulgeOf(x: number): number {
  if (!(Math.abs(x) > NEAR_OFFSET)) return x;
  const gap = 1 / (Math.abs(x) - NEAR_OFFSET);
  return x > 0 ? Math.PI - gap : gap - Math.PI;
}

/** The gap s = pi - |t| of coordinate x to a full circle, to full relative precision in the gap form. */
export function gapOf(x: number): number {
  return Math.abs(x) > NEAR_OFFSET ? 1 / (Math.abs(x) - NEAR_OFFSET) : Math.PI - Math.abs(x);
}

/** sin t of coordinate x, to full relative precision near a full circle (sin t = sign(t) sin s). */
export function bulgeSine(x: number): number {
  if (!(Math.abs(x) > NEAR_OFFSET)) return Math.sin(x);
  const gap = 1 / (Math.abs(x) - NEAR_OFFSET);
  return x > 0 ? Math.sin(gap) : -Math.sin(gap);
}

/** The coordinate of a bulge of sign `sign` (+1 or -1) at gap s to a full circle, 0 < s < pi. */
export function coordinateOfGap(sign: number, gap: number): number {
  if (gap >= GAP_IN) return sign * (Math.PI - gap);
  return sign * (NEAR_OFFSET + 1 / gap);
}

/**
 * The coordinate of the bulge t + dt, t the bulge of coordinate x: x + dt while both are plain and the
 * gap stays at least GAP_IN; otherwise from the gap, s' = s - sign(t) dt, without cancellation (the file
 * header's hysteresis). NaN when the bulge would pass a full circle (s' <= 0).
 */
export function advanceBulge(x: number, dt: number): number {
  const ax = Math.abs(x);
  if (!(ax > NEAR_OFFSET)) {
    const y = x + dt;
    if (Math.abs(y) <= Math.PI - GAP_IN) return y;
    // (within GAP_IN of a full circle: from the gap, pi - |x| exact for |x| >= pi/2)
    const sign = y > 0 ? 1 : -1;
    const gap = Math.PI - sign * x - sign * dt;
    if (!(gap > 0)) return NaN;
    return gap < GAP_IN ? sign * (NEAR_OFFSET + 1 / gap) : y;
  }
  const sign = x > 0 ? 1 : -1;
  const gap = 1 / (ax - NEAR_OFFSET) - sign * dt;
  if (!(gap > 0)) return NaN;
  return gap > GAP_OUT ? sign * (Math.PI - gap) : sign * (NEAR_OFFSET + 1 / gap);
}

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

// A wall near a full circle as a function of its chord c and its signed curvature k (k = 2 sin t / c,
// the sign of t): with the gap s = asin(c |k| / 2) and t = sign(k) (pi - s) (circular arcs, school
// geometry; derivatives by hand, every one a sum of terms of one sign):
//   length   L = 2 (pi - s) / |k|                     L_c = -1 / cos s
//   segment  S = sign(k) (pi - s + sin s cos s) / k^2  (= c^2 h(t))
// Near a full circle these are the well-conditioned variables: at a fixed curvature a junction's move
// changes the wall's length and area by its own size, where at a fixed bulge t it changes the circle's
// radius, and so its area, 1/s times as much (the solver's state keeps the gap, arcs of this form step
// in k: solver/wall-terms.ts).

/** Offsets in a circle-factor buffer filled by circleFactorsInto: L and its derivatives in c and k. */
export const CL = 0;
/** Offset of dL/dc at fixed curvature. */
export const CL_C = 1;
/** Offset of dL/dk at fixed chord. */
export const CL_K = 2;
/** Offset of d2L/dc2. */
export const CL_CC = 3;
/** Offset of d2L/dc dk. */
export const CL_CK = 4;
/** Offset of d2L/dk2. */
export const CL_KK = 5;
/** Offset of the signed segment area S (positive when the arc bulges left of its chord). */
export const CS = 6;
/** Offset of dS/dc. */
export const CS_C = 7;
/** Offset of dS/dk. */
export const CS_K = 8;
/** Offset of d2S/dc2. */
export const CS_CC = 9;
/** Offset of d2S/dc dk. */
export const CS_CK = 10;
/** Offset of d2S/dk2. */
export const CS_KK = 11;
/** Length of a circle-factor buffer. */
export const CIRCLE_FACTORS = 12;

/**
 * Write the length L and the segment area S of the arc of chord c > 0 and gap `gap` to a full circle
 * (0 < gap < pi/2, bulge of sign `sign`), with their first and second derivatives in the chord c and
 * the signed curvature k = sign 2 sin(gap) / c, into out (offsets CL .. CS_KK; see above).
 */
export function circleFactorsInto(gap: number, sign: number, c: number, out: Float64Array): void {
  const sn = Math.sin(gap);
  const cs = Math.cos(gap);
  const k = (2 * sn) / c; // |k|
  const k2 = k * k;
  const cs3 = cs * cs * cs;
  const f = Math.PI - gap + sn * cs;
  // length (even in k)
  const rest = Math.PI - gap;
  out[CL] = (2 * rest) / k;
  out[CL_C] = -1 / cs;
  const lk = -(2 * rest) / k2 - c / (k * cs);
  out[CL_K] = sign * lk;
  out[CL_CC] = -(k * sn) / (2 * cs3);
  out[CL_CK] = -sign * (c * sn) / (2 * cs3);
  out[CL_KK] = (4 * rest) / (k2 * k) + (2 * c) / (k2 * cs) - (c * c * sn) / (2 * k * cs3);
  // segment area (odd in k)
  out[CS] = (sign * f) / k2;
  out[CS_C] = -(sign * sn * sn) / (k * cs);
  out[CS_K] = -(2 * f) / (k2 * k) - (c * sn * sn) / (k2 * cs);
  out[CS_CC] = -(sign * sn * (1 + cs * cs)) / (2 * cs3);
  out[CS_CK] = -(c * sn) / (2 * k * cs3);
  out[CS_KK] = sign * ((6 * f) / (k2 * k2) + (4 * c * sn * sn) / (k2 * k * cs) - (c * c * sn * (1 + cs * cs)) / (2 * k2 * cs3));
}

/**
 * The coordinate of a wall in the gap form (x, chord c) after its chord becomes `chord` and its signed
 * curvature k = 2 sin t / c moves by dk: the gap asin(chord |k + dk| / 2) to full relative precision,
 * plain again above GAP_OUT (the file header's hysteresis); NaN when no arc of that chord has that
 * curvature on the same side (|k + dk| chord > 2, or k changes sign).
 */
export function advanceCurvature(x: number, c: number, chord: number, dk: number): number {
  const sign = x > 0 ? 1 : -1;
  const k = (2 * Math.sin(1 / (Math.abs(x) - NEAR_OFFSET))) / c + sign * dk;
  const q = 0.5 * chord * k;
  if (!(q > 0 && q < 1)) return NaN;
  const gap = Math.asin(q);
  return gap > GAP_OUT ? sign * (Math.PI - gap) : sign * (NEAR_OFFSET + 1 / gap);
}

/**
 * Write g, g', g'', h, h', h'' at the bulge t of coordinate x into out (offsets G..H2), where L = c g(t)
 * and S = c^2 h(t), derivatives in t. Exact at t = 0 (g = 1, h = 0, g' = 0, g'' = 1/3, h' = 1/6,
 * h'' = 0); finite for every |t| < pi, to full relative precision near a full circle in the gap form.
 */
export function bulgeFactorsInto(x: number, out: Float64Array): void {
  let t = x;
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
  // closed forms (major arcs included: sin t only vanishes at the excluded |t| = pi); near a full
  // circle every numerator is a sum of terms of one sign once sin t and cos t come from the gap
  let s: number;
  let co: number;
  if (Math.abs(x) > NEAR_OFFSET) {
    const gap = 1 / (Math.abs(x) - NEAR_OFFSET);
    t = x > 0 ? Math.PI - gap : gap - Math.PI;
    s = x > 0 ? Math.sin(gap) : -Math.sin(gap);
    co = -Math.cos(gap);
  } else {
    s = Math.sin(t);
    co = Math.cos(t);
  }
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
 * The length factor g(t) = t / sin t at the bulge of coordinate x: a wall's length over its chord,
 * L = c g(t); bulgeFactorsInto's G alone, to the last bit (g(0) = 1).
 */
export function lengthFactor(x: number): number {
  if (Math.abs(x) < SERIES_LIMIT) return 1 / horner(SINC, x * x);
  return Math.abs(x) > NEAR_OFFSET ? bulgeOf(x) / bulgeSine(x) : x / Math.sin(x);
}

/** Length L = c g(t) of the arc from a to b with bulge t (0 for a zero chord). */
export function arcLength(ax: number, ay: number, bx: number, by: number, t: number): number {
  const c = Math.hypot(bx - ax, by - ay);
  return c === 0 ? 0 : c * lengthFactor(t);
}

/**
 * The segment factor h(t) = (t - sin t cos t) / (4 sin^2 t) at the bulge of coordinate x: a wall's signed
 * segment area over its chord squared, S = c^2 h(t); bulgeFactorsInto's H alone, to the last bit. Odd and increasing on (-pi, pi),
 * h(t) = t/6 + ... near 0 (series below |t| = 1, as there).
 */
export function segmentFactor(x: number): number {
  if (Math.abs(x) < SERIES_LIMIT) {
    const t2 = x * x;
    const sinc = horner(SINC, t2);
    return (x * horner(U3, t2)) / (4 * (sinc * sinc));
  }
  if (Math.abs(x) > NEAR_OFFSET) {
    // (t - sin t cos t) = sign(t) (pi - s + sin s cos s): no cancellation
    const gap = 1 / (Math.abs(x) - NEAR_OFFSET);
    const s = Math.sin(gap);
    const v = (Math.PI - gap + s * Math.cos(gap)) / (4 * (s * s));
    return x > 0 ? v : -v;
  }
  const s = Math.sin(x);
  return (x - s * Math.cos(x)) / (4 * (s * s));
}

/**
 * The coordinate of the bulge t in (-pi, pi) whose segment factor h(t) (segmentFactor) is `value`: h is
 * odd and increasing from -infinity to infinity, so bisection down to adjacent doubles, on t while the
 * gap to a full circle is at least GAP_IN and on the gap below (so a nearly full circle keeps its gap
 * to full relative precision, in the gap form).
 */
export function bulgeForSegmentFactor(value: number): number {
  const v = Math.abs(value);
  const sign = value < 0 ? -1 : 1;
  let lo: number;
  let hi: number;
  if (v <= segmentFactor(Math.PI - GAP_IN)) {
    lo = 0;
    hi = Math.PI - GAP_IN;
    for (let i = 0; i < 80; i++) {
      const mid = 0.5 * (lo + hi);
      if (mid === lo || mid === hi) break;
      if (segmentFactor(mid) < v) lo = mid;
      else hi = mid;
    }
    return sign * lo;
  }
  // on the gap s (h decreases as s grows): first its binary exponent (h at s = 2^-1100 is infinite),
  // then s itself between the two powers found
  lo = -1100;
  hi = Math.log2(GAP_IN);
  while (hi - lo > 1) {
    const mid = Math.floor(0.5 * (lo + hi));
    if (segmentFactor(NEAR_OFFSET + 2 ** -mid) > v) lo = mid;
    else hi = mid;
  }
  lo = 2 ** lo;
  hi = 2 ** hi;
  for (let i = 0; i < 80; i++) {
    const mid = 0.5 * (lo + hi);
    if (mid === lo || mid === hi) break;
    if (segmentFactor(NEAR_OFFSET + 1 / mid) > v) lo = mid;
    else hi = mid;
  }
  return coordinateOfGap(sign, hi);
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
