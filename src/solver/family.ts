// solver stage: lens families. A lens (a 2-sided cell) set in a wall between two cells X and Y slides
// along that wall's circle (rotates about its centre, or moves along it when the wall is straight) at
// constant perimeter and areas: the two pieces of the host wall on either side of the lens lie on one
// circle, and sliding lengthens one piece as it shortens the other (design.md §7, a one-parameter family
// of equilibria, a zero mode). A descent may drift along that neutral direction until a piece shrinks to
// nothing, which is not evidence that the arrangement cannot exist: the family's middle member, with the
// two pieces equally long, has every wall of positive length.
//
//      a' ---- ka ---- a ( lens ) b ---- kb ---- b'       ka, kb: the host pieces, one circle
//
// centreLensInto moves the lens whose host piece is the given wall to the middle of its range: the
// lens's junctions a, b are rotated about the circle's centre (or moved along the line) by the angle (or
// distance) that makes ka and kb equally long; the lens's own walls keep their bulges (a rigid motion
// keeps the angle between chord and tangent), and the host pieces take the bulges of the arcs of the
// same circle between their new ends.
//
// A bead is the same with more inside: a part of the cluster joined to the rest only through two walls
// ka, kb between the same two regions (a cut of two walls); rotating the whole part about the circle
// of ka and kb slides it as a lens slides (beadHostOf; the part's every junction moves, its walls keep
// their bulges). The outside with two sides is such a cut too: its two walls slide along the circle of
// the two walls between the cells inside them.

import { bulgeOf, bulgeSine } from '../arcs/arc.ts';
import type { ClusterProblem } from './problem.ts';

// A wall with |bulge| below STRAIGHT is a segment.
const STRAIGHT = 1e-9;

/**
 * A lens, or a bead, and its host pieces: the junctions a, b where it meets its host wall, the host walls
 * ka (at a) and kb (at b), and the junctions that move when it slides.
 */
export interface LensHost {
  /** The lens cell (0-based) found by lensHostOf; -1 for a bead, and for every host of slidingHostsOf. */
  cell: number;
  a: number;
  b: number;
  ka: number;
  kb: number;
  /** The junctions that slide: the lens's a and b, or every junction of the bead (a and b among them). */
  moving: number[];
}

/** The lens whose host piece is wall k (its two junctions a and b, the pieces ka at a and kb at b), or null. */
export function lensHostOf(problem: ClusterProblem, k: number): LensHost | null {
  const { walls, lefts, rights, starts, ends, wallOf } = problem;
  for (const end of [starts[k], ends[k]]) {
    // is a lens at this end of wall k? its other two walls at the junction both bound one 2-sided cell
    const others: number[] = [];
    for (let i = 0; i < 3; i++) {
      const w = wallOf[3 * end + i];
      if (w !== k) others.push(w);
    }
    if (others.length !== 2) continue;
    const [k1, k2] = others;
    const shared = [lefts[k1], rights[k1]].find((f) => f >= 0 && (f === lefts[k2] || f === rights[k2]));
    if (shared === undefined) continue;
    let sides = 0;
    for (let w = 0; w < walls; w++) if (lefts[w] === shared || rights[w] === shared) sides++;
    if (sides !== 2) continue;
    // the lens's other junction and its host piece there
    const other = starts[k1] === end ? ends[k1] : starts[k1];
    let kb = -1;
    for (let i = 0; i < 3; i++) {
      const w = wallOf[3 * other + i];
      if (w !== k1 && w !== k2) kb = w;
    }
    if (kb < 0 || kb === k) continue;
    return { cell: shared, a: end, b: other, ka: k, kb, moving: [end, other] };
  }
  return null;
}

/**
 * The bead whose host piece is wall k, or null: a part of the cluster that meets the rest only at the
 * two ends a, b of its host pieces ka = k and kb, two walls between the same two regions (in the plane,
 * two walls whose removal disconnects the cluster's graph lie on the same two faces). Like a lens, a
 * bead set in one wall slides along the host circle at constant perimeter and areas (a rotation about
 * the circle's centre keeps the host pieces on the circle and the bead's own walls as they are): a zero
 * mode. Of the two sides of the cut the smaller one (fewer junctions) is the bead (either side sliding is
 * the same motion up to a rigid motion of the whole); of several cuts through k, the one with the
 * smallest bead. (A side of two junctions is a lens, or the outside when it has two sides: the two
 * outer walls then slide along the circle of two walls between the same two cells.)
 */
export function beadHostOf(problem: ClusterProblem, k: number): LensHost | null {
  let best: LensHost | null = null;
  for (let kb = 0; kb < problem.walls; kb++) {
    const host = kb === k ? null : cutHostOf(problem, k, kb);
    if (host !== null && (best === null || host.moving.length < best.moving.length)) best = host;
  }
  return best;
}

/** The lens (lensHostOf) or else the bead (beadHostOf) whose host piece is wall k, or null. */
export function slidingHostOf(problem: ClusterProblem, k: number): LensHost | null {
  return lensHostOf(problem, k) ?? beadHostOf(problem, k);
}

/**
 * Every lens and bead of the cluster, once each: for every cut of two walls ka < kb between the same two
 * regions, its smaller side with those walls as host pieces (`cell` -1: a lens is found here as a side of
 * two junctions). The same array on every call for a topology: not to be changed.
 */
export function slidingHostsOf(problem: ClusterProblem): LensHost[] {
  // (topology only: kept per topology, the wallOf array that a problem and its copies with tensions share)
  const cached = SLIDING_HOSTS.get(problem.wallOf);
  if (cached !== undefined) return cached;
  const hosts: LensHost[] = [];
  for (let ka = 0; ka < problem.walls; ka++) {
    for (let kb = ka + 1; kb < problem.walls; kb++) {
      const host = cutHostOf(problem, ka, kb);
      if (host !== null) hosts.push(host);
    }
  }
  SLIDING_HOSTS.set(problem.wallOf, hosts);
  return hosts;
}
const SLIDING_HOSTS = new WeakMap<Int32Array, LensHost[]>();

// The smaller side of the cut of walls k and kb (k's end on that side a, kb's b), with k and kb as its
// host pieces, or null when the two walls do not lie between the same two regions or are no cut.
function cutHostOf(problem: ClusterProblem, k: number, kb: number): LensHost | null {
  const { junctions, lefts, rights, starts, ends, wallOf } = problem;
  if (Math.min(lefts[kb], rights[kb]) !== Math.min(lefts[k], rights[k])) return null;
  if (Math.max(lefts[kb], rights[kb]) !== Math.max(lefts[k], rights[k])) return null;
  // the junctions joined to k's start without walls k and kb (a walk with an explicit stack, at most
  // one entry per junction)
  const seen = new Uint8Array(junctions);
  const stack = new Int32Array(junctions);
  let top = 0;
  let count = 1;
  seen[starts[k]] = 1;
  stack[top++] = starts[k];
  while (top > 0) {
    const v = stack[--top];
    for (let i = 0; i < 3; i++) {
      const w = wallOf[3 * v + i];
      if (w === k || w === kb) continue;
      const u = starts[w] === v ? ends[w] : starts[w];
      if (seen[u] === 0) {
        seen[u] = 1;
        count++;
        stack[top++] = u;
      }
    }
  }
  // Are k and kb no cut? (k's end is reached the other way round)
  if (seen[ends[k]] === 1) return null;
  // the smaller side slides: the seen one (k's start's side) or the rest (k's end's side)
  const side = 2 * count <= junctions ? 1 : 0;
  const a = side === 1 ? starts[k] : ends[k];
  const b = seen[starts[kb]] === side ? starts[kb] : ends[kb];
  if (a === b) return null;
  const moving: number[] = [];
  for (let v = 0; v < junctions; v++) if (seen[v] === side) moving.push(v);
  return { cell: -1, a, b, ka: k, kb, moving };
}

// Centre (cx, cy) and radius of wall k's circle at state z, or null for a straight wall.
function circleOf(problem: ClusterProblem, z: Float64Array, k: number): Circle | null {
  const x = z[2 * problem.junctions + k];
  const t = bulgeOf(x);
  if (Math.abs(t) < STRAIGHT) return null;
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  const dx = z[b] - z[a];
  const dy = z[b + 1] - z[a + 1];
  const cot = Math.cos(t) / bulgeSine(x);
  const cx = z[a] + 0.5 * dx + 0.5 * cot * dy;
  const cy = z[a + 1] + 0.5 * dy - 0.5 * cot * dx;
  return { cx, cy, r: Math.hypot(z[a] - cx, z[a + 1] - cy) };
}

function distance(z: Float64Array, u: number, v: number): number {
  return Math.hypot(z[2 * v] - z[2 * u], z[2 * v + 1] - z[2 * u + 1]);
}

// The circle through junctions u, v, w of state z, or null when they are in line (within STRAIGHT of
// their spread).
function circleThrough(z: Float64Array, u: number, v: number, w: number): Circle | null {
  const ax = z[2 * u];
  const ay = z[2 * u + 1];
  const bx = z[2 * v] - ax;
  const by = z[2 * v + 1] - ay;
  const cx = z[2 * w] - ax;
  const cy = z[2 * w + 1] - ay;
  const d = 2 * (bx * cy - by * cx);
  const spread = Math.max(bx * bx + by * by, cx * cx + cy * cy);
  if (!(Math.abs(d) > 1e-7 * spread)) return null;
  const b2 = bx * bx + by * by;
  const c2 = cx * cx + cy * cy;
  const ox = (cy * b2 - by * c2) / d;
  const oy = (bx * c2 - cx * b2) / d;
  return { cx: ax + ox, cy: ay + oy, r: Math.hypot(ox, oy) };
}

// Arc length of wall k at state z.
function lengthOf(problem: ClusterProblem, z: Float64Array, k: number): number {
  const x = z[2 * problem.junctions + k];
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
  return Math.abs(x) < STRAIGHT ? c : (c * bulgeOf(x)) / bulgeSine(x);
}

type Circle = { cx: number; cy: number; r: number };

// The host circle of a lens at state z: in the family the pieces' outer ends a', b' and the lens's
// junctions a, b lie on one circle; it is taken through a', b' and whichever lens junction is farther
// from both (a piece near the end of its range is too short to define its own circle). null for a line;
// undefined when the pieces do not separate the same two cells (the lens is not set in one wall).
function hostCircleOf(problem: ClusterProblem, z: Float64Array, host: LensHost): Circle | null | undefined {
  const { a, b, ka, kb } = host;
  const { lefts, rights, starts, ends } = problem;
  const pair = (k: number): string => [lefts[k], rights[k]].sort((x, y) => x - y).join();
  if (pair(ka) !== pair(kb)) return undefined;
  const a1 = starts[ka] === a ? ends[ka] : starts[ka];
  const b1 = starts[kb] === b ? ends[kb] : starts[kb];
  const far = (v: number): number => Math.min(distance(z, v, a1), distance(z, v, b1));
  return circleThrough(z, a1, far(a) > far(b) ? a : b, b1);
}

/**
 * The range of the lens of `host` at state z: the arc length it can slide over, the sum of its two
 * host pieces' lengths (each piece alone is how far it can slide that way).
 */
export function lensRangeOf(problem: ClusterProblem, z: Float64Array, host: LensHost): number {
  return lengthOf(problem, z, host.ka) + lengthOf(problem, z, host.kb);
}

/**
 * Slide the lens of `host` in state z by arc length s along its host circle (the sign picks the
 * direction), its host pieces taking the arcs of that circle between their new ends. Returns false, leaving z unchanged, when the lens is not set in one wall.
 */
export function slideLensInto(problem: ClusterProblem, z: Float64Array, host: LensHost, s: number): boolean {
  const circle = hostCircleOf(problem, z, host);
  if (circle === undefined) return false;
  moveLensInto(problem, z, host, circle, s);
  return true;
}

/**
 * Move the lens of `host` in state z (normalised units) to the middle of its range along its host
 * circle, where its two host pieces are equally long, in place (`trial` is scratch of z's length).
 * Returns false, leaving z unchanged, when the lens is not set in one wall.
 */
export function centreLensInto(problem: ClusterProblem, z: Float64Array, host: LensHost, trial: Float64Array): boolean {
  return placeLensInto(problem, z, host, 0.5, trial);
}

/**
 * Move the lens (or bead) of `host` in state z (normalised units) along its host circle to where its
 * piece ka is `share` (0..1) of the two host pieces' length, in place (`trial` is scratch of z's
 * length). Returns false, leaving z unchanged, when the lens is not set in one wall.
 */
export function placeLensInto(problem: ClusterProblem, z: Float64Array, host: LensHost, share: number, trial: Float64Array): boolean {
  const { ka, kb } = host;
  const circle = hostCircleOf(problem, z, host);
  if (circle === undefined) return false;
  // the move that gives the pieces their shares, in the direction (tried both ways) that does (at share
  // 1/2 half the difference of their lengths: each product by 1/2 is exact)
  const shift = share * lengthOf(problem, z, kb) - (1 - share) * lengthOf(problem, z, ka);
  let sign = 1;
  let best = Infinity;
  for (const trySign of [1, -1]) {
    trial.set(z);
    moveLensInto(problem, trial, host, circle, trySign * shift);
    const d = Math.abs((1 - share) * lengthOf(problem, trial, ka) - share * lengthOf(problem, trial, kb));
    if (d < best) {
      best = d;
      sign = trySign;
    }
  }
  moveLensInto(problem, z, host, circle, sign * shift);
  return true;
}

// Slide the lens's junctions by arc length s along the host circle (or line), and give the host pieces
// the bulges of their new arcs on the same circle.
function moveLensInto(
  problem: ClusterProblem, z: Float64Array, host: LensHost, circle: Circle | null, s: number,
): void {
  const { a, b, ka, kb } = host;
  if (circle === null) {
    const ux = z[2 * b] - z[2 * a];
    const uy = z[2 * b + 1] - z[2 * a + 1];
    const u = Math.hypot(ux, uy);
    for (const v of host.moving) {
      z[2 * v] += (s * ux) / u;
      z[2 * v + 1] += (s * uy) / u;
    }
    return;
  }
  const phi = s / circle.r;
  const cos = Math.cos(phi);
  const sin = Math.sin(phi);
  for (const v of host.moving) {
    const x = z[2 * v] - circle.cx;
    const y = z[2 * v + 1] - circle.cy;
    z[2 * v] = circle.cx + cos * x - sin * y;
    z[2 * v + 1] = circle.cy + sin * x + cos * y;
  }
  for (const k of [ka, kb]) z[2 * problem.junctions + k] = bulgeOnCircle(problem, z, k, circle);
}

// The bulge of wall k's chord as an arc of `circle`, on the side of its present bulge: the signed half
// central angle, the one of the two whose circle's centre is `circle`'s.
function bulgeOnCircle(problem: ClusterProblem, z: Float64Array, k: number, circle: Circle): number {
  const t0 = 2 * problem.junctions;
  const old = z[t0 + k];
  const was = bulgeOf(old);
  const a = 2 * problem.starts[k];
  const b = 2 * problem.ends[k];
  const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
  const half = Math.asin(Math.min(1, c / (2 * circle.r)));
  let best = old;
  let error = Infinity;
  for (const t of [half, Math.PI - half, -half, -(Math.PI - half)]) {
    z[t0 + k] = t;
    const o = circleOf(problem, z, k);
    const e = o === null ? Infinity : Math.hypot(o.cx - circle.cx, o.cy - circle.cy) + Math.abs(t - was) * 1e-3 * circle.r;
    if (e < error) {
      error = e;
      best = t;
    }
  }
  z[t0 + k] = old;
  return best;
}

/**
 * Where the lens of `host` sits on its host wall at state z, as shares of the host wall's length (ka,
 * the lens's span along the host circle, kb): `at` the share on ka's side, and the least (0, ka gone)
 * and largest (kb gone) it reaches while sliding. null when the lens is not set in one wall.
 */
export function lensSharesOf(problem: ClusterProblem, z: Float64Array, host: LensHost): { at: number; from: number; to: number } | null {
  // (the shares are ratios of lengths: at lengths far from 1, 1e150 at areas 1e300, squares overflow,
  // so the junctions are first divided by the power of two nearest the lens's chord, which is exact)
  const shift = Math.round(Math.log2(distance(z, host.a, host.b)));
  if (shift !== 0 && Number.isFinite(shift)) {
    const scaled = Float64Array.from(z);
    for (let i = 0; i < 2 * problem.junctions; i++) scaled[i] *= 2 ** -shift;
    return lensSharesOf(problem, scaled, host);
  }
  const circle = hostCircleOf(problem, z, host);
  if (circle === undefined) return null;
  const chord = distance(z, host.a, host.b);
  // the lens's span along the host circle: the arc between its junctions (the shorter one: the pieces
  // continue the circle on either side)
  const span = circle === null ? chord : 2 * circle.r * Math.asin(Math.min(1, chord / (2 * circle.r)));
  const la = lengthOf(problem, z, host.ka);
  const lb = lengthOf(problem, z, host.kb);
  const total = Math.abs(la) + span + Math.abs(lb);
  if (!(total > 0)) return null;
  return { at: Math.abs(la) / total, from: 0, to: (Math.abs(la) + Math.abs(lb)) / total };
}
