// arcs stage: the search for walls that cross, over a drawing of circular arcs and segments.
//
// Each pair of walls whose bounding boxes overlap is tested exactly: the intersections of their
// supporting circles (or lines), then whether each intersection lies on both walls and away from a
// junction they share (plane geometry, no source).

/** Below this |bulge| a wall is taken as a straight segment: its sagitta is under 2.5e-8 of its chord. */
export const STRAIGHT_BULGE = 1e-7;

// A major arc's missing part lies within its sagitta of the chord line; a point is judged on the
// wall's side of the chord to within at most MISSING_SHARE of that sagitta (a wall near a full circle
// round a small cell has a missing part far thinner than any absolute tolerance).
const MISSING_SHARE = 1e-3;

// The intersections of two supporting curves (at most 2).
const PX = new Float64Array(2);
const PY = new Float64Array(2);

/**
 * Count pairs of walls whose curves meet at a point that is not a junction they share (closer than
 * `near` counts as meeting). Wall k runs along its lower dart lower[k] from junction lower[k] / 3 to
 * twins[lower[k]] / 3 with bulge bulges[k]; unless |bulges[k]| < STRAIGHT_BULGE_BULGE it lies on the circle
 * of centre (cx[k], cy[k]) and radius radius[k]. `box` is scratch of 4 E numbers. A pair whose bounding
 * boxes (grown by `near`) do not overlap cannot meet.
 */
export function countCrossings(
  twins: Int32Array, coords: Float64Array, bulges: Float64Array, lower: Int32Array,
  cx: Float64Array, cy: Float64Array, radius: Float64Array, near: number, box: Float64Array,
): number {
  const walls = twins.length / 2;
  for (let k = 0; k < walls; k++) arcBoxInto(k, coords, bulges, lower, twins, cx, cy, radius, near, box);
  let count = 0;
  for (let k1 = 0; k1 < walls; k1++) {
    const b1 = 4 * k1;
    for (let k2 = k1 + 1; k2 < walls; k2++) {
      const b2 = 4 * k2;
      if (box[b1] > box[b2 + 2] || box[b2] > box[b1 + 2] || box[b1 + 1] > box[b2 + 3] || box[b2 + 1] > box[b1 + 3]) continue;
      const points = meetInto(k1, k2, coords, bulges, lower, twins, cx, cy, radius, PX, PY);
      let crossing = false;
      for (let i = 0; i < points && !crossing; i++) {
        if (onWall(k1, PX[i], PY[i], coords, bulges, lower, twins, near) &&
            onWall(k2, PX[i], PY[i], coords, bulges, lower, twins, near)) {
          crossing = !nearSharedJunction(k1, k2, PX[i], PY[i], coords, lower, twins, near);
        }
      }
      if (crossing) count++;
    }
  }
  return count;
}

// Bounding box (x0, y0, x1, y1) of wall k, grown by `near`: its chord's, widened by the arc's sagitta
// on every side (a safe over-estimate: the arc lies within its sagitta of the chord... for a minor arc;
// a major arc lies in its circle's box).
function arcBoxInto(
  k: number, coords: Float64Array, bulges: Float64Array, lower: Int32Array, twins: Int32Array,
  cx: Float64Array, cy: Float64Array, radius: Float64Array, near: number, box: Float64Array,
): void {
  const a = (lower[k] / 3) | 0;
  const b = (twins[lower[k]] / 3) | 0;
  const ax = coords[2 * a];
  const ay = coords[2 * a + 1];
  const bx = coords[2 * b];
  const by = coords[2 * b + 1];
  let x0 = Math.min(ax, bx);
  let x1 = Math.max(ax, bx);
  let y0 = Math.min(ay, by);
  let y1 = Math.max(ay, by);
  const t = Math.abs(bulges[k]);
  if (t >= STRAIGHT_BULGE) {
    if (t <= Math.PI / 2) {
      // the sagitta of a minor arc: c tan(t / 2) / 2
      const grow = 0.5 * Math.hypot(bx - ax, by - ay) * Math.tan(0.5 * t);
      x0 -= grow;
      y0 -= grow;
      x1 += grow;
      y1 += grow;
    } else {
      x0 = Math.min(x0, cx[k] - radius[k]);
      y0 = Math.min(y0, cy[k] - radius[k]);
      x1 = Math.max(x1, cx[k] + radius[k]);
      y1 = Math.max(y1, cy[k] + radius[k]);
    }
  }
  const o = 4 * k;
  box[o] = x0 - near;
  box[o + 1] = y0 - near;
  box[o + 2] = x1 + near;
  box[o + 3] = y1 + near;
}

// Intersections of the supporting circles or lines of walls k1 and k2 (at most 2), into px, py. Walls
// that share a junction meet there: only their other intersection is returned, computed from the
// junction (the mirror image of the junction in the line of centres, or the other root along the line),
// which stays exact for nearly straight walls, whose huge circles would put a computed intersection
// far from the junction.
function meetInto(
  k1: number, k2: number, coords: Float64Array, bulges: Float64Array, lower: Int32Array, twins: Int32Array,
  cx: Float64Array, cy: Float64Array, radius: Float64Array, px: Float64Array, py: Float64Array,
): number {
  const straight1 = Math.abs(bulges[k1]) < STRAIGHT_BULGE;
  const straight2 = Math.abs(bulges[k2]) < STRAIGHT_BULGE;
  const a1 = (lower[k1] / 3) | 0;
  const b1 = (twins[lower[k1]] / 3) | 0;
  const a2 = (lower[k2] / 3) | 0;
  const b2 = (twins[lower[k2]] / 3) | 0;
  const sharedA = a1 === a2 || a1 === b2;
  const sharedB = b1 === a2 || b1 === b2;
  if (sharedA && sharedB) return 0;
  if (sharedA || sharedB) return otherMeetInto(sharedA ? a1 : b1, k1, k2, straight1, straight2, coords, lower, twins, cx, cy, px, py);
  // Are both straight? Two lines meet at most once.
  if (straight1 && straight2) {
    const a1 = (lower[k1] / 3) | 0;
    const b1 = (twins[lower[k1]] / 3) | 0;
    const a2 = (lower[k2] / 3) | 0;
    const b2 = (twins[lower[k2]] / 3) | 0;
    const ax = coords[2 * a1];
    const ay = coords[2 * a1 + 1];
    const bx = coords[2 * b1];
    const by = coords[2 * b1 + 1];
    const qx = coords[2 * a2];
    const qy = coords[2 * a2 + 1];
    const rx = coords[2 * b2];
    const ry = coords[2 * b2 + 1];
    const d = (bx - ax) * (ry - qy) - (by - ay) * (rx - qx);
    if (d === 0) return 0;
    const s = ((qx - ax) * (ry - qy) - (qy - ay) * (rx - qx)) / d;
    px[0] = ax + s * (bx - ax);
    py[0] = ay + s * (by - ay);
    return 1;
  }
  // Is one straight? Intersect its line with the other's circle.
  if (straight1 || straight2) {
    const line = straight1 ? k1 : k2;
    const circle = straight1 ? k2 : k1;
    const a = (lower[line] / 3) | 0;
    const b = (twins[lower[line]] / 3) | 0;
    const ax = coords[2 * a];
    const ay = coords[2 * a + 1];
    const dx = coords[2 * b] - ax;
    const dy = coords[2 * b + 1] - ay;
    const fx = ax - cx[circle];
    const fy = ay - cy[circle];
    const qa = dx * dx + dy * dy;
    const qb = 2 * (fx * dx + fy * dy);
    const qc = fx * fx + fy * fy - radius[circle] * radius[circle];
    const disc = qb * qb - 4 * qa * qc;
    if (!(disc >= 0) || qa === 0) return 0;
    const root = Math.sqrt(disc);
    for (let i = 0; i < 2; i++) {
      const s = (-qb + (i === 0 ? -root : root)) / (2 * qa);
      px[i] = ax + s * dx;
      py[i] = ay + s * dy;
    }
    return 2;
  }
  // two circles
  const dx = cx[k2] - cx[k1];
  const dy = cy[k2] - cy[k1];
  const d = Math.hypot(dx, dy);
  const r1 = radius[k1];
  const r2 = radius[k2];
  if (d === 0 || d > r1 + r2 || d < Math.abs(r1 - r2)) return 0;
  const along = (r1 * r1 - r2 * r2 + d * d) / (2 * d);
  const h = Math.sqrt(Math.max(0, r1 * r1 - along * along));
  const mx = cx[k1] + (along * dx) / d;
  const my = cy[k1] + (along * dy) / d;
  px[0] = mx - (h * dy) / d;
  py[0] = my + (h * dx) / d;
  px[1] = mx + (h * dy) / d;
  py[1] = my - (h * dx) / d;
  return 2;
}

// The intersection other than their shared junction v of the supporting curves of walls k1 and k2, into
// px[0], py[0]; returns 0 when there is none (two lines, or curves tangent at v).
function otherMeetInto(
  v: number, k1: number, k2: number, straight1: boolean, straight2: boolean, coords: Float64Array,
  lower: Int32Array, twins: Int32Array, cx: Float64Array, cy: Float64Array, px: Float64Array, py: Float64Array,
): number {
  const vx = coords[2 * v];
  const vy = coords[2 * v + 1];
  if (straight1 && straight2) return 0;
  if (straight1 || straight2) {
    // along the line from v, v + s (d), the circle's other point: s = -2 (v - c) . d / |d|^2
    const line = straight1 ? k1 : k2;
    const circle = straight1 ? k2 : k1;
    const a = (lower[line] / 3) | 0;
    const w = a === v ? (twins[lower[line]] / 3) | 0 : a;
    const dx = coords[2 * w] - vx;
    const dy = coords[2 * w + 1] - vy;
    const q = dx * dx + dy * dy;
    if (q === 0) return 0;
    const s = (-2 * ((vx - cx[circle]) * dx + (vy - cy[circle]) * dy)) / q;
    if (s === 0) return 0;
    px[0] = vx + s * dx;
    py[0] = vy + s * dy;
    return 1;
  }
  // the mirror image of v in the line through the two centres
  const ux = cx[k2] - cx[k1];
  const uy = cy[k2] - cy[k1];
  const u2 = ux * ux + uy * uy;
  if (u2 === 0) return 0;
  const wx = vx - cx[k1];
  const wy = vy - cy[k1];
  const along = (wx * ux + wy * uy) / u2;
  px[0] = cx[k1] + 2 * along * ux - wx;
  py[0] = cy[k1] + 2 * along * uy - wy;
  return Math.hypot(px[0] - vx, py[0] - vy) > 0 ? 1 : 0;
}

// Whether a point of wall k's supporting curve lies on the wall itself: strictly on the bulge side of
// the chord for an arc (the arc bulging left of a->b is the part of its circle left of the chord line;
// `near`, or less for a major arc, MISSING_SHARE), between the end points for a segment.
function onWall(
  k: number, x: number, y: number, coords: Float64Array, bulges: Float64Array, lower: Int32Array,
  twins: Int32Array, near: number,
): boolean {
  const a = (lower[k] / 3) | 0;
  const b = (twins[lower[k]] / 3) | 0;
  const ax = coords[2 * a];
  const ay = coords[2 * a + 1];
  const dx = coords[2 * b] - ax;
  const dy = coords[2 * b + 1] - ay;
  const c = Math.hypot(dx, dy);
  const t = bulges[k];
  if (Math.abs(t) < STRAIGHT_BULGE) {
    const s = ((x - ax) * dx + (y - ay) * dy) / (c * c);
    const off = Math.abs((x - ax) * dy - (y - ay) * dx) / c;
    return s * c > -near && (s - 1) * c < near && off < near;
  }
  const side = (dx * (y - ay) - dy * (x - ax)) / c;
  let within = near;
  if (Math.abs(t) > Math.PI / 2) {
    // (the missing part of a major arc: a minor arc of bulge pi - |t| on the other side)
    const missing = MISSING_SHARE * 0.5 * c * Math.tan(0.5 * (Math.PI - Math.abs(t)));
    if (missing < within) within = missing;
  }
  return t > 0 ? side > -within : side < within;
}

function nearSharedJunction(
  k1: number, k2: number, x: number, y: number, coords: Float64Array, lower: Int32Array, twins: Int32Array,
  near: number,
): boolean {
  const a1 = (lower[k1] / 3) | 0;
  const b1 = (twins[lower[k1]] / 3) | 0;
  const a2 = (lower[k2] / 3) | 0;
  const b2 = (twins[lower[k2]] / 3) | 0;
  for (let i = 0; i < 2; i++) {
    const v = i === 0 ? a1 : b1;
    if (v !== a2 && v !== b2) continue;
    if (Math.hypot(x - coords[2 * v], y - coords[2 * v + 1]) < near * 1e3) return true;
  }
  return false;
}
