// render stage: scalar primitives on one circular wall (a -> b, bulge t) that drawings need.
//
// Conventions (see types.ts): t is the angle from the chord a -> b to the tangent at a, positive
// to the LEFT (a y-up frame); the wall is an arc of radius R = c / (2 |sin t|) and central angle 2|t|.
// Local frame of a wall: m = (a + b) / 2, u = (b - a) / c along the chord, n = (-u_y, u_x) its left
// normal. The circle's centre is m - n (c/2) cot t, and the arc is traversed clockwise when t > 0.
//
//            arc (t > 0)
//          .-~~~~~-.        n
//        /     |h    \      ^
//   a  *-------m------*  b   -> u
//
// NOTE: these are drawing-grade helpers (label placement, view boxes); the solver's arc geometry
// with derivatives lives in the arcs stage.

import { segmentFactor } from '../arcs/arc.ts';
import { ZERO_BULGE } from './path.ts';

/** Below this |t| the series of segmentMomentFactor is used (radians). */
const SERIES_MOMENT = 1e-1;
/** Below this |t| distances are measured to the chord: the arc is then within c |t| / 4 of it. */
const STRAIGHT_DISTANCE = 1e-6;

/**
 * q(t) such that the segment's first moment about the chord midpoint, along n, is (c^3 / 12) q(t).
 * About the circle's centre the moment of a segment is (2/3) R^3 sin^3(theta / 2) = c^3 / 12
 * (segment centroid at 4 R sin^3(theta/2) / (3 (theta - sin theta)) from the centre, a standard
 * table entry, e.g. "CRC Standard Mathematical Tables", section on plane areas); moving to the chord
 * gives q = 1 - 6 h(t) cot t (h the segment factor of arcs/arc.ts, S = c^2 h), with series t^2/5 + t^4/21 + 2 t^6/225 + t^8/693 near 0 (q -> 0: a
 * flat segment's centroid sits on its chord).
 */
export function segmentMomentFactor(t: number): number {
  if (Math.abs(t) < SERIES_MOMENT) {
    const t2 = t * t;
    return t2 * (1 / 5 + t2 * (1 / 21 + t2 * (2 / 225 + t2 / 693)));
  }
  return 1 - 6 * segmentFactor(t) * (Math.cos(t) / Math.sin(t));
}

/**
 * Grow box = [minX, minY, maxX, maxY] to hold the wall a -> b with bulge t exactly: its end points
 * and each axis-extreme point of its circle that lies on the arc.
 */
export function arcBoundsInto(ax: number, ay: number, bx: number, by: number, t: number, box: Float64Array): void {
  grow(box, ax, ay);
  grow(box, bx, by);
  const dx = bx - ax;
  const dy = by - ay;
  const c = Math.hypot(dx, dy);
  // Is it straight (or a point)? The end points are the whole box.
  if (Math.abs(t) < ZERO_BULGE || c === 0) return;
  const r = c / (2 * Math.abs(Math.sin(t)));
  // radial unit vector from the centre to a: the tangent at a turned a quarter towards the outside
  const ux = dx / c;
  const uy = dy / c;
  const cos = Math.cos(t);
  const sin = Math.sin(t);
  const tx = ux * cos - uy * sin;
  const ty = ux * sin + uy * cos;
  const side = t > 0 ? 1 : -1;
  const rx = -side * ty;
  const ry = side * tx;
  const start = Math.atan2(ry, rx);
  const span = 2 * Math.abs(t);
  // each quarter-turn direction psi is on the arc when it is within span of start, going the arc's way
  for (let q = 0; q < 4; q++) {
    const psi = (q * Math.PI) / 2;
    const offset = modTau(t > 0 ? start - psi : psi - start);
    if (offset <= span) {
      const ex = q === 0 ? 1 : q === 2 ? -1 : 0;
      const ey = q === 1 ? 1 : q === 3 ? -1 : 0;
      grow(box, ax + r * (ex - rx), ay + r * (ey - ry));
    }
  }
}

/** A fresh empty box [+inf, +inf, -inf, -inf] for arcBoundsInto. */
export function emptyBox(): Float64Array {
  return Float64Array.of(Infinity, Infinity, -Infinity, -Infinity);
}

function grow(box: Float64Array, x: number, y: number): void {
  if (x < box[0]) box[0] = x;
  if (y < box[1]) box[1] = y;
  if (x > box[2]) box[2] = x;
  if (y > box[3]) box[3] = y;
}

function modTau(angle: number): number {
  const tau = 2 * Math.PI;
  const r = angle % tau;
  return r < 0 ? r + tau : r;
}

/**
 * Winding contribution of the closed loop "arc a -> b, then chord b -> a" about (px, py):
 * -1 inside a left-bulging segment (that loop runs clockwise), +1 inside a right-bulging one, else 0.
 * Added to the winding number of the junction polygon it gives the cell's winding number.
 * Test: the segment is the disc cut by the chord line, on the arc's side; the disc condition
 * |p - centre|^2 < R^2 is multiplied by sin t to stay finite as t -> 0.
 */
export function segmentWinding(px: number, py: number, ax: number, ay: number, bx: number, by: number, t: number): number {
  if (Math.abs(t) < ZERO_BULGE) return 0;
  const dx = bx - ax;
  const dy = by - ay;
  const c = Math.hypot(dx, dy);
  if (c === 0) return 0;
  const qx = px - 0.5 * (ax + bx);
  const qy = py - 0.5 * (ay + by);
  const xi = (qx * dx + qy * dy) / c;
  const eta = (-qx * dy + qy * dx) / c;
  const g = (xi * xi + eta * eta - 0.25 * c * c) * Math.sin(t) + eta * c * Math.cos(t);
  if (t > 0) return eta > 0 && g < 0 ? -1 : 0;
  return eta < 0 && g > 0 ? 1 : 0;
}

/** Distance from (px, py) to the wall a -> b with bulge t (to its arc, not its circle). */
export function wallDistance(px: number, py: number, ax: number, ay: number, bx: number, by: number, t: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const c = Math.hypot(dx, dy);
  if (Math.abs(t) < STRAIGHT_DISTANCE || c === 0) {
    // Is it (nearly) straight? Distance to the chord segment.
    const s = c === 0 ? 0 : Math.min(1, Math.max(0, ((px - ax) * dx + (py - ay) * dy) / (c * c)));
    return Math.hypot(px - ax - s * dx, py - ay - s * dy);
  }
  const r = c / (2 * Math.abs(Math.sin(t)));
  const k = (0.5 * c * Math.cos(t)) / Math.sin(t);
  // centre = m - n k with n = (-dy, dx) / c
  const ox = 0.5 * (ax + bx) + (k * dy) / c;
  const oy = 0.5 * (ay + by) - (k * dx) / c;
  const start = Math.atan2(ay - oy, ax - ox);
  const angle = Math.atan2(py - oy, px - ox);
  const offset = modTau(t > 0 ? start - angle : angle - start);
  if (offset <= 2 * Math.abs(t)) return Math.abs(Math.hypot(px - ox, py - oy) - r);
  return Math.min(Math.hypot(px - ax, py - ay), Math.hypot(px - bx, py - by));
}
