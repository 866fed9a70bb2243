// sweep stage: where the winner changes between two samples, located by a safeguarded Newton iteration on the perimeter difference.
//
// d(p) = P_A(p) - P_B(p) for the winner A below and B above. Its derivative is free: dP/dp =
// sum_i p_i dA_i/dp (track.ts), so Newton's method converges quadratically; a step that leaves the
// bracket falls back to the secant through the bracket ends (regula falsi), and to bisection when
// the bracket stops shrinking or when one of the two does not exist at a probe (d = +-infinity: the
// change is then where that equilibrium stops existing). A third candidate beating both at the
// located point splits the interval in two and each half is located again.

import {
  type KnownState, type PathContext, extrapolatedPerimeter, nearest, probe, slopeAt,
} from './probe.ts';
import type { Transition } from './types.ts';

/** A parameter value with the certified states known there, by candidate. */
export interface PathPoint {
  readonly p: number;
  readonly known: ReadonlyMap<number, KnownState>;
}

/** Most nested splits when third candidates win inside one sample interval. */
const MAX_DEPTH = 4;
/**
 * Newton step, as a multiple of sqrt(tolerance), below which the step's end is taken as the crossing:
 * Newton's error after a step h is about |d''/(2 d')| h^2, so a step of 1e-2 sqrt(tolerance) leaves an
 * error near 1e-4 tolerance. The crossing itself is then never probed, which matters at a symmetric
 * point (equal areas), where a nearly straight wall can fail the certificate.
 */
const NEWTON_STOP = 1e-2;
/** Offsets (multiples of the bracket width) tried when a probe fails for no collapse inside a bracket where both exist at the ends. */
const RETRY_OFFSETS = [1e-3, -1e-3, 1e-2, -1e-2];
/** Relative perimeter margin by which a third candidate must beat both to split the interval. */
const THIRD_MARGIN = 1e-9;
/** Iterations allowed for one crossing (bisection alone needs about 60 for 1e-6 of a range of 1e12). */
const MAX_ITERATIONS = 100;

interface Evaluation {
  /** Where d was evaluated (a failed probe may move it a little). */
  p: number;
  d: number;
  a: KnownState | null;
  b: KnownState | null;
}

/**
 * Locate every change of winner between `left` (won by candidate `from`) and `right` (won by `to`),
 * to ctx.tolerance. `others` are candidates certified at either point that might win in between.
 */
export function locateTransitions(
  ctx: PathContext, left: PathPoint, right: PathPoint, from: number, to: number, others: readonly number[], depth = 0,
): Transition[] {
  const seed = (c: number): KnownState[] => [left.known.get(c), right.known.get(c)].filter((k): k is KnownState => k !== undefined);
  const listA = seed(from);
  const listB = seed(to);
  const known = (list: KnownState[], p: number): KnownState | null => list.find((k) => k.p === p) ?? null;
  const at1 = (list: KnownState[], c: number, p: number): KnownState | null | 'glitch' => {
    const hit = known(list, p);
    if (hit !== null) return hit;
    if (list.length === 0) return null;
    const r = probe(ctx, c, p, list);
    if (r.known !== null) return r.known;
    // a failure with no collapse between two certified states is the relaxer's, not the branch's; and
    // no convergence never says the branch has ended (existence unknown)
    const status = r.equilibrium.status;
    const both = list.some((k) => k.p < p) && list.some((k) => k.p > p);
    return status === 'no-convergence' || (both && status === 'walls-cross') ? 'glitch' : null;
  };
  const evaluate = (p0: number, lo: number, hi: number): Evaluation => {
    const offsets = [0, ...RETRY_OFFSETS];
    let a: KnownState | null = null;
    let b: KnownState | null = null;
    let p = p0;
    let settled = false;
    for (const f of offsets) {
      p = p0 + f * (hi - lo);
      if (f !== 0 && !(p > lo && p < hi)) continue;
      const ra = at1(listA, from, p);
      const rb = at1(listB, to, p);
      if (ra === 'glitch' || rb === 'glitch') continue;
      a = ra;
      b = rb;
      settled = true;
      break;
    }
    // Did every probe end without convergence? d is unknown there (NaN): the bracket is not narrowed.
    if (!settled) return { p, d: NaN, a: null, b: null };
    if (a !== null && b !== null) return { p, d: a.state.equilibrium.energy - b.state.equilibrium.energy, a, b };
    // only one exists: it wins; neither: the one below has ended (treated as the one above winning)
    return { p, d: a !== null && b === null ? -Infinity : Infinity, a, b };
  };
  let lo = left.p;
  let hi = right.p;
  let eLo = evaluate(lo, lo, hi);
  let eHi = evaluate(hi, lo, hi);
  let at = NaN;
  let error = NaN;
  let width = hi - lo;
  let stale = 0;
  for (let iteration = 0; iteration < MAX_ITERATIONS && hi - lo > ctx.tolerance; iteration++) {
    let p = 0.5 * (lo + hi);
    const finite = Number.isFinite(eLo.d) && Number.isFinite(eHi.d);
    if (finite && stale < 2) {
      // Newton from the end nearer the crossing, then regula falsi if that leaves the bracket
      const end = Math.abs(eLo.d) <= Math.abs(eHi.d) ? eLo : eHi;
      const pe = end === eLo ? lo : hi;
      const slope = slopeAt(ctx, from, end.a as KnownState) - slopeAt(ctx, to, end.b as KnownState);
      const newton = pe - end.d / slope;
      const h = Math.abs(newton - pe);
      if (Number.isFinite(newton) && h <= NEWTON_STOP * Math.sqrt(ctx.tolerance)) {
        at = newton;
        // Newton's error ~ |d''/(2 d')| h^2, with d'' from the slopes at the bracket ends
        const other = end === eLo ? eHi : eLo;
        const slopeOther = slopeAt(ctx, from, other.a as KnownState) - slopeAt(ctx, to, other.b as KnownState);
        const curvature = Math.abs(slopeOther - slope) / Math.max(hi - lo, Number.EPSILON);
        error = Math.max((curvature / (2 * Math.abs(slope))) * h * h, 4 * Number.EPSILON * (1 + Math.abs(at)));
        break;
      }
      p = newton > lo && newton < hi ? newton : lo + ((hi - lo) * eLo.d) / (eLo.d - eHi.d);
      if (!(p > lo && p < hi)) p = 0.5 * (lo + hi);
    }
    const e = evaluate(p, lo, hi);
    if (Number.isNaN(e.d)) break;
    if (e.d <= 0) {
      lo = e.p;
      eLo = e;
    } else {
      hi = e.p;
      eHi = e;
    }
    // has the bracket stopped halving? bisect next time
    if (hi - lo > 0.5 * width) stale++;
    else {
      stale = 0;
      width = hi - lo;
    }
  }
  const crossing = Number.isFinite(eLo.d) && Number.isFinite(eHi.d);
  if (Number.isNaN(at)) {
    at = crossing && eLo.d !== eHi.d ? lo + ((hi - lo) * eLo.d) / (eLo.d - eHi.d) : 0.5 * (lo + hi);
    error = Math.max(at - lo, hi - at);
  }
  const kA = nearest(listA, at) as KnownState;
  const kB = nearest(listB, at) as KnownState;
  const perimeters: [number, number] = [extrapolatedPerimeter(ctx, from, kA, at), extrapolatedPerimeter(ctx, to, kB, at)];
  const found: Transition = {
    at, bracket: [at - error, at + error], from, to, kind: crossing ? 'crossing' : 'existence', perimeters,
  };
  if (depth >= MAX_DEPTH) return [found];

  // does a third candidate beat both at the located point? then split there
  const best = Math.min(...perimeters);
  let third = -1;
  let thirdPerimeter = best * (1 - THIRD_MARGIN);
  const middle = new Map<number, KnownState>();
  for (const c of others) {
    if (c === from || c === to) continue;
    const list = seed(c);
    if (list.length === 0) continue;
    const r = probe(ctx, c, at, list);
    if (r.known === null) continue;
    middle.set(c, r.known);
    if (r.known.state.equilibrium.energy < thirdPerimeter) {
      third = c;
      thirdPerimeter = r.known.state.equilibrium.energy;
    }
  }
  if (third < 0) return [found];
  for (const [c, list] of [[from, listA], [to, listB]] as const) {
    const k = known(list, at) ?? probe(ctx, c, at, list).known;
    if (k !== null) middle.set(c, k);
  }
  const point: PathPoint = { p: at, known: middle };
  return [
    ...locateTransitions(ctx, left, point, from, third, others, depth + 1),
    ...locateTransitions(ctx, point, right, third, to, others, depth + 1),
  ];
}
