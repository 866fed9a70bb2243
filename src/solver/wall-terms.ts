// solver stage: the per-wall kernel of the relaxer, the one place a wall's length and area terms are
// derived.
//
// Two forms of wall. A wall's variable (its entry of z, the unknown the steps move) is its bulge t
// (form 0) unless its coordinate in z is in the gap form of arcs/arc.ts (within GAP_IN of a full
// circle, form 1), where it is its signed curvature k = 2 sin t / c: at a fixed bulge a junction's move
// changes a nearly full circle's radius, and so its area, 1/(pi - |t|) times as much as its own size,
// which makes the junctions' equations cancel terms of that size (a rounding of 1e-16 becomes 1e-10 at a
// gap of 1e-6), while at a fixed curvature every term is of the wall's own size. The form is read off
// z (arc.NEAR_OFFSET), so every pass that takes the record's derivatives (penalty.ts, kkt.ts,
// descent.ts, roots.ts, stability.ts, modes.ts) works in the variables of z without knowing; a step is
// applied by advanceInto, the one place that moves a wall's coordinate by its variable. Form 0 is
// below; form 1 (circleRecordInto) fills the same record in its variables, and W_SU, W_SM with the two
// parts of its segment's Hessian that form 0 does not have.
//
// Per wall k from junction a to junction b with bulge t and chord d = b - a, c = |d| (arcs/arc.ts):
//   length           L = c g(t)
//   area to its left Q = (a x b)/2 - c^2 h(t)   (added to the cell on the left of its lower dart,
//                                                taken from the one on its right)
// With D = p_l - p_r the pressure jump across the wall, the wall's part of the Lagrangian
// F = sum_k L_k - sum_f p_f (A_f - T_f) is phi = L - D Q, so every pass of the relaxer combines the
// same two pieces with its own pressure jump: the merit's gradient and the pressure fit (penalty.ts),
// the step's matrix and its curvature (kkt.ts), the shift scales (descent.ts), and the reference
// residual and Jacobian of the tests. perimeterInto fills a record per wall (layout below, declared
// here only) once per iterate: the chord, g and h with their derivatives in t, and the length's
// gradient and Hessian and the area's gradient, kept apart; wallHessianInto combines a record with the
// caller's D.
//
// Hessian of phi in the wall's chord and bulge (the cross-product term of Q couples a and b apart):
//   d2/dd2  = g (I - u u^T) / c + 2 D h I          u = d / c
//   d2/ddt  = g' u + 2 D h' d
//   d2/dt2  = c g'' + D c^2 h''
// and the area gradient dQ/da = (b_y/2 + 2 h d_x, -b_x/2 + 2 h d_y), dQ/db = (-a_y/2 - 2 h d_x,
// a_x/2 - 2 h d_y), dQ/dt = -c^2 h'.
//
// A wall's tension s (problem.tensions, walls of different tension: design.md §8) weighs its length in
// the energy E = sum_k s_k L_k, so the Lagrangian's wall part is phi = s L - D Q: s is one factor on
// the length terms of the record (W_LX .. W_LTT), which perimeterInto writes, and every length term any
// pass uses is read from them, so that is the one place it enters. The arc's own factors (W_G .. W_G2)
// stay unweighted: a wall's length is c g whatever its tension. At the equilibrium this gives the
// Neumann triangle at each junction (sum s_i u_i = 0) and s kappa = D on each wall.

import * as arc from '../arcs/arc.ts';
import type { ClusterProblem } from './problem.ts';

/** Offset of the chord's x component b_x - a_x in a wall record. */
export const W_DX = 0;
/** Offset of the chord's y component. */
export const W_DY = 1;
/** Offset of the chord length c. */
export const W_C = 2;
/** Offset of the length factor g(t) (L = c g). */
export const W_G = 3;
/** Offset of g'(t). */
export const W_G1 = 4;
/** Offset of g''(t). */
export const W_G2 = 5;
/** Offset of the segment factor h(t) (segment area c^2 h). */
export const W_H = 6;
/** Offset of h'(t). */
export const W_H1 = 7;
/** Offset of h''(t). */
export const W_H2 = 8;
/** Offset of the weighted length's gradient d(sL)/db_x = -d(sL)/da_x = s g d_x / c (s the wall's tension). */
export const W_LX = 9;
/** Offset of d(sL)/db_y. */
export const W_LY = 10;
/** Offset of d(sL)/dt = s c g'. */
export const W_LT = 11;
/** Offset of the weighted length's Hessian in the chord, d2(sL)/dd_x^2 = s g (1 - u_x^2) / c. */
export const W_LXX = 12;
/** Offset of d2(sL)/dd_x dd_y = -s g u_x u_y / c. */
export const W_LXY = 13;
/** Offset of d2(sL)/dd_y^2. */
export const W_LYY = 14;
/** Offset of d2(sL)/dd_x dt = s g' u_x. */
export const W_LXT = 15;
/** Offset of d2(sL)/dd_y dt. */
export const W_LYT = 16;
/** Offset of d2(sL)/dt^2 = s c g''. */
export const W_LTT = 17;
/** Offset of the area's gradient (an area block, offsets Q_AX .. Q_T, as areaGradientInto writes it). */
export const W_Q = 18;
/**
 * Offset of the wall's form: 0 when its variable is its bulge t, 1 when it is its signed curvature k (a
 * wall near a full circle, its coordinate in z in the gap form of arcs/arc.ts; see the file header).
 */
export const W_FORM = 23;
/** Offset of d2S/dc2 - (dS/dc)/c (the chord block's part along u of the segment's Hessian; 0 for form 0). */
export const W_SU = 24;
/** Offset of d2S/dc dk (the mixed part of the segment's Hessian of form 1). */
export const W_SM = 25;
/** Length of one wall's record. */
export const WALL_STRIDE = 26;

/** Offset of dQ/da_x = b_y/2 + 2 h d_x in an area block. */
export const Q_AX = 0;
/** Offset of dQ/da_y = -b_x/2 + 2 h d_y. */
export const Q_AY = 1;
/** Offset of dQ/db_x = -a_y/2 - 2 h d_x. */
export const Q_BX = 2;
/** Offset of dQ/db_y = a_x/2 - 2 h d_y. */
export const Q_BY = 3;
/** Offset of dQ/dt = -c^2 h'. */
export const Q_T = 4;
/** Length of an area block. */
export const AREA_BLOCK = 5;

/** Offsets in a Hessian block of wallHessianInto: the chord block, the mixed terms, the bulge term. */
export const M_XX = 0;
/** Offset of d2 phi / dd_x dd_y. */
export const M_XY = 1;
/** Offset of d2 phi / dd_y^2. */
export const M_YY = 2;
/** Offset of d2 phi / dd_x dt. */
export const M_XT = 3;
/** Offset of d2 phi / dd_y dt. */
export const M_YT = 4;
/** Offset of d2 phi / dt^2. */
export const M_TT = 5;
/** Length of a Hessian block. */
export const HESSIAN_BLOCK = 6;

// NOTE: an imported binding is read through a getter at every use under some loaders (tsx); the hot
// per-wall code reads these local copies instead.
const factorsInto = arc.bulgeFactorsInto;
const G = arc.G;
const G1 = arc.G1;
const G2 = arc.G2;
const H = arc.H;
const H1 = arc.H1;
const H2 = arc.H2;
const FACTORS = new Float64Array(arc.BULGE_FACTORS);
const advance = arc.advanceBulge;
const advanceCurvature = arc.advanceCurvature;
const gap = arc.gapOf;
const NEAR = arc.NEAR_OFFSET;
// The largest plain bulge that advanceBulge leaves plain.
const PLAIN = Math.PI - arc.GAP_IN;
const circleInto = arc.circleFactorsInto;
const CIRCLE = new Float64Array(arc.CIRCLE_FACTORS);

/**
 * The one pass per iterate: fills `cache` (WALL_STRIDE numbers per wall) at the geometry of z and the
 * n cell areas into `areas` (signed polygon area of each cell's junctions plus the signed segment areas
 * of its walls); returns the energy sum s_k L_k (normalised units), the perimeter when every tension is
 * 1. NaN or Infinity when the state is not finite.
 */
export function perimeterInto(problem: ClusterProblem, z: Float64Array, cache: Float64Array, areas: Float64Array): number {
  const { walls, starts, ends, lefts, rights, cells, junctions, tensions } = problem;
  const t0 = 2 * junctions;
  const f = FACTORS;
  areas.fill(0, 0, cells);
  let length = 0;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const ax = z[a];
    const ay = z[a + 1];
    const bx = z[b];
    const by = z[b + 1];
    const dx = bx - ax;
    const dy = by - ay;
    const c2 = dx * dx + dy * dy;
    const c = Math.sqrt(c2);
    const w = k * WALL_STRIDE;
    // (a wall near a full circle: its variable is its curvature)
    if (Math.abs(z[t0 + k]) > NEAR && c > 0) {
      length += circleRecordInto(problem, z, k, a, b, c, cache);
      const q = 0.5 * (ax * by - ay * bx) - CIRCLE[arc.CS];
      const l = lefts[k];
      const r = rights[k];
      if (l >= 0) areas[l] += q;
      if (r >= 0) areas[r] -= q;
      continue;
    }
    factorsInto(z[t0 + k], f);
    const g = f[G];
    const g1 = f[G1];
    const h = f[H];
    cache[w + W_FORM] = 0;
    cache[w + W_SU] = 0;
    cache[w + W_SM] = 0;
    cache[w + W_DX] = dx;
    cache[w + W_DY] = dy;
    cache[w + W_C] = c;
    cache[w + W_G] = g;
    cache[w + W_G1] = g1;
    cache[w + W_G2] = f[G2];
    cache[w + W_H] = h;
    cache[w + W_H1] = f[H1];
    cache[w + W_H2] = f[H2];
    // the weighted length's derivatives (Is the chord zero? Its direction is undefined: taken as zero.)
    const s = tensions === null ? 1 : tensions[k];
    const ux = c > 0 ? dx / c : 0;
    const uy = c > 0 ? dy / c : 0;
    const gc = c > 0 ? (s * g) / c : 0;
    const sg1 = s * g1;
    cache[w + W_LX] = gc * dx;
    cache[w + W_LY] = gc * dy;
    cache[w + W_LT] = c * sg1;
    cache[w + W_LXX] = gc * (1 - ux * ux);
    cache[w + W_LXY] = -gc * ux * uy;
    cache[w + W_LYY] = gc * (1 - uy * uy);
    cache[w + W_LXT] = sg1 * ux;
    cache[w + W_LYT] = sg1 * uy;
    cache[w + W_LTT] = s * c * f[G2];
    areaGradientInto(cache, k, z, a, b, cache, w + W_Q);
    length += s * (c * g);
    const q = 0.5 * (ax * by - ay * bx) - c2 * h;
    const l = lefts[k];
    const r = rights[k];
    if (l >= 0) areas[l] += q;
    if (r >= 0) areas[r] -= q;
  }
  return length;
}

/**
 * The state z advanced by alpha d into out over the geometry (2V + E entries, d read from d[o]):
 * junctions moved by alpha d, each wall's variable by alpha d in its form (the record's W_FORM at z):
 * a bulge t by arc.advanceBulge, a curvature (a wall near a full circle) by arc.advanceCurvature at
 * the wall's new chord; a wall carried past a full circle, or out of its form's reach, is NaN. out
 * may be z.
 */
export function advanceInto(
  problem: ClusterProblem, z: Float64Array, alpha: number, d: Float64Array, out: Float64Array, o = 0,
): void {
  const { junctions, walls, starts, ends } = problem;
  const t0 = 2 * junctions;
  // (the walls first, while z's junctions are there to give their chords before and after: out may be z)
  for (let k = 0; k < walls; k++) {
    const x = z[t0 + k];
    const step = alpha * d[o + t0 + k];
    if (!(Math.abs(x) > NEAR)) {
      // (a plain bulge that stays plain: x + dt, as advanceBulge gives it, without the call)
      const y = x + step;
      out[t0 + k] = Math.abs(y) <= PLAIN ? y : advance(x, step);
      continue;
    }
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const dx = z[b] + alpha * d[o + b] - (z[a] + alpha * d[o + a]);
    const dy = z[b + 1] + alpha * d[o + b + 1] - (z[a + 1] + alpha * d[o + a + 1]);
    out[t0 + k] = advanceCurvature(x, Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]), Math.hypot(dx, dy), step);
  }
  for (let i = 0; i < t0; i++) out[i] = z[i] + alpha * d[o + i];
}

/**
 * How far a step dv of wall k's variable at state z turns the wall, for the relaxer's cap on a step
 * (options.maxBulgeStep): |dv| radians for a bulge, |dv| / |k| (a relative change of curvature) for a
 * wall near a full circle, whose curvature k may be of any size.
 */
export function wallTurn(problem: ClusterProblem, z: Float64Array, k: number, dv: number): number {
  const x = z[2 * problem.junctions + k];
  if (!(Math.abs(x) > NEAR)) return Math.abs(dv);
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
  return Math.abs(dv) / ((2 * Math.sin(gap(x))) / c);
}

/** The coordinate of wall k of state z moved by dv in its own variable (its bulge, or its curvature near a full circle), the junctions kept. */
export function advanceWall(problem: ClusterProblem, z: Float64Array, k: number, dv: number): number {
  const x = z[2 * problem.junctions + k];
  if (!(Math.abs(x) > NEAR)) return advance(x, dv);
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
  return advanceCurvature(x, c, c, dv);
}

/**
 * Whether the bulge coordinates of state `trial` keep every wall's gap to a full circle (arc.gapOf) at
 * least SHRINK times its gap in `z`, the state a step starts from: a relative bound, as a step's on a
 * chord, at every scale (a gap of 1e-6 and one of 1e-1 alike), and no wall carried past a full circle.
 */
export function gapsHold(problem: ClusterProblem, z: Float64Array, trial: Float64Array, shrink: number): boolean {
  const t0 = 2 * problem.junctions;
  for (let i = t0, end = t0 + problem.walls; i < end; i++) {
    // (arc.gapOf, its plain case written out: this runs for every wall of every trial)
    const x = Math.abs(trial[i]);
    const w = Math.abs(z[i]);
    const after = x > NEAR ? gap(x) : Math.PI - x;
    const before = w > NEAR ? gap(w) : Math.PI - w;
    if (!(after >= shrink * before)) return false;
  }
  return true;
}

// The record of wall k of form 1 (near a full circle, its variable its signed curvature k; chord c > 0
// from junction offset a to b in z), from arc.circleFactorsInto: the chord terms of the length at a
// fixed curvature, L_c u and L_cc u u^T + (L_c / c) (I - u u^T), and of the segment S: h stands for
// S_c / (2c) (so that the area's gradient in the chord is 2 h d as in form 0), h' for S_k / c^2, h'' for
// S_kk / c^2, with the parts of S's Hessian that form 0 does not have in W_SU and W_SM. Returns the
// wall's weighted length s L; leaves S in CIRCLE.
function circleRecordInto(
  problem: ClusterProblem, z: Float64Array, k: number, a: number, b: number, c: number, cache: Float64Array,
): number {
  const x = z[2 * problem.junctions + k];
  const w = k * WALL_STRIDE;
  const o = CIRCLE;
  circleInto(gap(x), x > 0 ? 1 : -1, c, o);
  const f = FACTORS;
  factorsInto(x, f);
  const dx = z[b] - z[a];
  const dy = z[b + 1] - z[a + 1];
  const ux = dx / c;
  const uy = dy / c;
  const s = problem.tensions === null ? 1 : problem.tensions[k];
  const lc = o[arc.CL_C];
  const lcc = o[arc.CL_CC];
  cache[w + W_DX] = dx;
  cache[w + W_DY] = dy;
  cache[w + W_C] = c;
  cache[w + W_G] = o[arc.CL] / c;
  cache[w + W_G1] = f[G1];
  cache[w + W_G2] = f[G2];
  cache[w + W_H] = o[arc.CS_C] / (2 * c);
  cache[w + W_H1] = o[arc.CS_K] / (c * c);
  cache[w + W_H2] = o[arc.CS_KK] / (c * c);
  cache[w + W_LX] = s * lc * ux;
  cache[w + W_LY] = s * lc * uy;
  cache[w + W_LT] = s * o[arc.CL_K];
  cache[w + W_LXX] = s * (lcc * ux * ux + (lc / c) * (1 - ux * ux));
  cache[w + W_LXY] = s * (lcc - lc / c) * ux * uy;
  cache[w + W_LYY] = s * (lcc * uy * uy + (lc / c) * (1 - uy * uy));
  cache[w + W_LXT] = s * o[arc.CL_CK] * ux;
  cache[w + W_LYT] = s * o[arc.CL_CK] * uy;
  cache[w + W_LTT] = s * o[arc.CL_KK];
  cache[w + W_FORM] = 1;
  cache[w + W_SU] = o[arc.CS_CC] - o[arc.CS_C] / c;
  cache[w + W_SM] = o[arc.CS_CK];
  areaGradientInto(cache, k, z, a, b, cache, w + W_Q);
  return s * o[arc.CL];
}

/** The pressure jump D = p_l - p_r across wall k for cell pressures p (the outside's is 0). */
export function jumpOf(problem: ClusterProblem, k: number, p: Float64Array): number {
  const l = problem.lefts[k];
  const r = problem.rights[k];
  return (l >= 0 ? p[l] : 0) - (r >= 0 ? p[r] : 0);
}

/**
 * The Hessian of phi = L - D Q of wall k in its chord d and bulge t (the block of the file header, the
 * cross-product term of Q left to the caller: -D/2 at (a_x, b_y), +D/2 at (a_y, b_x)) from its record,
 * into out (HESSIAN_BLOCK numbers at o + M_XX .. o + M_TT).
 */
export function wallHessianInto(cache: Float64Array, k: number, jump: number, out: Float64Array, o = 0): void {
  const w = k * WALL_STRIDE;
  const c = cache[w + W_C];
  const h = cache[w + W_H];
  const h1 = cache[w + W_H1];
  out[o + M_XX] = cache[w + W_LXX] + 2 * jump * h;
  out[o + M_XY] = cache[w + W_LXY];
  out[o + M_YY] = cache[w + W_LYY] + 2 * jump * h;
  out[o + M_XT] = cache[w + W_LXT] + 2 * jump * h1 * cache[w + W_DX];
  out[o + M_YT] = cache[w + W_LYT] + 2 * jump * h1 * cache[w + W_DY];
  out[o + M_TT] = cache[w + W_LTT] + jump * c * c * cache[w + W_H2];
  // (form 1: the segment's Hessian in the chord has a part along u, and its mixed part is its own)
  if (cache[w + W_FORM] !== 0) {
    const ux = cache[w + W_DX] / c;
    const uy = cache[w + W_DY] / c;
    const su = jump * cache[w + W_SU];
    const sm = jump * cache[w + W_SM];
    out[o + M_XX] += su * ux * ux;
    out[o + M_XY] += su * ux * uy;
    out[o + M_YY] += su * uy * uy;
    out[o + M_XT] = cache[w + W_LXT] + sm * ux;
    out[o + M_YT] = cache[w + W_LYT] + sm * uy;
  }
}

/**
 * The area gradient of wall k (dQ/da, dQ/db, dQ/dt of the file header) at the junction positions of z
 * with the chord and h of its record, into out[o + Q_AX .. o + Q_T]; a and b are the offsets
 * 2 starts[k], 2 ends[k] of its junctions in z. perimeterInto stores it in the record (at W_Q).
 */
export function areaGradientInto(
  cache: Float64Array, k: number, z: Float64Array, a: number, b: number, out: Float64Array, o = 0,
): void {
  const w = k * WALL_STRIDE;
  const dx = cache[w + W_DX];
  const dy = cache[w + W_DY];
  const c = cache[w + W_C];
  const h = cache[w + W_H];
  out[o + Q_AX] = 0.5 * z[b + 1] + 2 * h * dx;
  out[o + Q_AY] = -0.5 * z[b] + 2 * h * dy;
  out[o + Q_BX] = -0.5 * z[a + 1] - 2 * h * dx;
  out[o + Q_BY] = 0.5 * z[a] - 2 * h * dy;
  out[o + Q_T] = -c * c * cache[w + W_H1];
}
