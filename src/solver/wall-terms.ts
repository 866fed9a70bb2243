// solver stage: the per-wall kernel of the relaxer, the one place a wall's length and area terms are
// derived.
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
/** Length of one wall's record. */
export const WALL_STRIDE = 23;

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
    factorsInto(z[t0 + k], f);
    const g = f[G];
    const g1 = f[G1];
    const h = f[H];
    const w = k * WALL_STRIDE;
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
