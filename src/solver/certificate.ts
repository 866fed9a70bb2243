// solver stage: an independent check of an equilibrium, recomputed from junction coordinates and bulges.
//
// Nothing here calls the residual code: every wall is rebuilt as a circle (centre, radius) or a
// segment, tangents are taken perpendicular to the radius, segment areas as sector minus triangle,
// and the cells are walked through map.faceDarts. The certificate's entries are dimensionless:
// areas relative to each cell's target, curvatures relative to |pressure difference| + 1/sqrt(A), A the
// smaller target area of the wall's two sides.

import type { CubicMap } from '../maps/cubic-map.ts';

/** What checkEquilibrium measured. Lengths and areas are in the caller's units. */
export interface Certificate {
  /** Largest |achieved - target| / target over the cells. */
  areaResidual: number;
  /** Largest |sum of the three unit tangents| over the junctions (Plateau's 120-degree law). */
  tangentResidual: number;
  /**
   * Largest |curvature - pressure difference| / (|pressure difference| + 1/sqrt(A)) over the walls, A the
   * smaller target area of the wall's two sides (Laplace-Young law, relative to the wall's own scale).
   */
  curvatureResidual: number;
  /** Shortest wall (arc length). */
  minWallLength: number;
  /** Smallest achieved cell area. */
  minCellArea: number;
  /** Number of pairs of walls that cross or touch away from their shared junctions. */
  crossings: number;
  /** Number of junctions whose walls are not in the map's counter-clockwise order. */
  misorderedJunctions: number;
}

/** The geometry checkEquilibrium reads: any relax() result has these fields. */
export interface EquilibriumGeometry {
  /** Junction coordinates, length 2V. */
  coords: Float64Array;
  /** Wall bulges, length E (positive into the face left of the wall's lower dart). */
  bulges: Float64Array;
  /** Cell pressures, length n. */
  pressures: Float64Array;
}

// Below this |bulge| a wall is checked as a straight segment: its sagitta is under 2.5e-8 of its chord.
const STRAIGHT = 1e-7;

// Scratch of the check, grown to the largest wall count seen (one check runs at a time).
let LOWER = new Int32Array(0);
let WALL_OF = new Int32Array(0);
let CX = new Float64Array(0);
let CY = new Float64Array(0);
let RADIUS = new Float64Array(0);
let BOX = new Float64Array(0);
const ANGLE = new Float64Array(3);
const PX = new Float64Array(2);
const PY = new Float64Array(2);

function scratchFor(walls: number): void {
  if (LOWER.length >= walls) return;
  LOWER = new Int32Array(walls);
  WALL_OF = new Int32Array(2 * walls);
  CX = new Float64Array(walls);
  CY = new Float64Array(walls);
  RADIUS = new Float64Array(walls);
  BOX = new Float64Array(4 * walls);
}

/** Whether every residual entry is at most `tolerance` and the drawing is a valid cluster drawing. */
export function certificatePasses(certificate: Certificate, tolerance: number): boolean {
  return (
    certificate.areaResidual <= tolerance &&
    certificate.tangentResidual <= tolerance &&
    certificate.curvatureResidual <= tolerance &&
    certificate.minWallLength > 0 &&
    certificate.minCellArea > 0 &&
    certificate.crossings === 0 &&
    certificate.misorderedJunctions === 0
  );
}

/**
 * Recompute the certificate of `result` for `map` and target `areas` (areas[i] for cell i + 1).
 * Non-finite inputs give Infinity residuals, never NaN.
 */
export function checkEquilibrium(map: CubicMap, areas: Float64Array, result: EquilibriumGeometry): Certificate {
  const { twins, faceStarts, faceDarts } = map;
  const cells = areas.length;
  let total = 0;
  for (let i = 0; i < cells; i++) total += areas[i];
  const unit = Math.sqrt(total / cells);
  const { coords, bulges, pressures } = result;
  // Is it the circle? One wall, no junctions: perimeter 2 pi R, area pi R^2, curvature 1/R.
  if (twins.length === 0) {
    const p = pressures[0];
    const radius = Math.sqrt(areas[0] / Math.PI);
    return finite({
      areaResidual: 0,
      tangentResidual: 0,
      curvatureResidual: Math.abs(1 / radius - p) / (Math.abs(p) + 1 / unit),
      minWallLength: 2 * Math.PI * radius,
      minCellArea: areas[0],
      crossings: 0,
      misorderedJunctions: 0,
    });
  }
  const walls = twins.length / 2;
  scratchFor(walls);
  const wallOf = WALL_OF;
  const lower = LOWER;
  for (let e = 0, k = 0; e < twins.length; e++) {
    if (e < twins[e]) {
      wallOf[e] = k;
      wallOf[twins[e]] = k;
      lower[k++] = e;
    }
  }

  // rebuild each wall: centre, radius, arc length, signed curvature
  const cx = CX;
  const cy = CY;
  const radius = RADIUS;
  let minWallLength = Infinity;
  let curvatureResidual = 0;
  for (let k = 0; k < walls; k++) {
    const e = lower[k];
    const a = (e / 3) | 0;
    const b = (twins[e] / 3) | 0;
    const t = bulges[k];
    const dx = coords[2 * b] - coords[2 * a];
    const dy = coords[2 * b + 1] - coords[2 * a + 1];
    const chord = Math.hypot(dx, dy);
    let length = chord;
    let curvature = 0;
    if (Math.abs(t) >= STRAIGHT) {
      // centre on the chord's perpendicular bisector, at (c/2) cot t on the side opposite the left normal
      const cot = Math.cos(t) / Math.sin(t);
      cx[k] = coords[2 * a] + 0.5 * dx + 0.5 * cot * dy;
      cy[k] = coords[2 * a + 1] + 0.5 * dy - 0.5 * cot * dx;
      radius[k] = Math.hypot(coords[2 * a] - cx[k], coords[2 * a + 1] - cy[k]);
      length = 2 * Math.abs(t) * radius[k]; // central angle 2|t|
      curvature = Math.sign(t) / radius[k];
    }
    minWallLength = Math.min(minWallLength, length);
    const fl = map.faceOf[e];
    const fr = map.faceOf[twins[e]];
    const jump = (fr > 0 ? pressures[fr - 1] : 0) - (fl > 0 ? pressures[fl - 1] : 0);
    // relative to the wall's own scale: the smaller target area of its two sides (a wall between two
    // cells a billionth of the rest is judged at their size, not at the cluster's)
    const local = Math.min(fl > 0 ? areas[fl - 1] : Infinity, fr > 0 ? areas[fr - 1] : Infinity);
    curvatureResidual = Math.max(curvatureResidual, Math.abs(curvature - jump) / (Math.abs(jump) + 1 / Math.sqrt(local)));
  }

  // unit tangents at each junction, away from it, and their order
  let tangentResidual = 0;
  let misorderedJunctions = 0;
  const angle = ANGLE;
  const turn = (x: number): number => ((x % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
  for (let v = 0; v < map.junctionCount; v++) {
    let sx = 0;
    let sy = 0;
    for (let i = 0; i < 3; i++) {
      const e = 3 * v + i;
      const k = wallOf[e];
      const forward = e < twins[e];
      const t = forward ? bulges[k] : -bulges[k];
      let tx: number;
      let ty: number;
      if (Math.abs(t) < STRAIGHT) {
        const w = (twins[e] / 3) | 0;
        tx = coords[2 * w] - coords[2 * v];
        ty = coords[2 * w + 1] - coords[2 * v + 1];
      } else {
        // perpendicular to the radius; a wall bulging left of its dart turns clockwise about its centre
        const rx = coords[2 * v] - cx[k];
        const ry = coords[2 * v + 1] - cy[k];
        tx = t > 0 ? ry : -ry;
        ty = t > 0 ? -rx : rx;
      }
      const norm = Math.hypot(tx, ty);
      sx += tx / norm;
      sy += ty / norm;
      angle[i] = Math.atan2(ty, tx);
    }
    tangentResidual = Math.max(tangentResidual, Math.hypot(sx, sy));
    const d1 = turn(angle[1] - angle[0]);
    const d2 = turn(angle[2] - angle[0]);
    if (!(d1 > 0 && d1 < d2 && d2 < 2 * Math.PI)) misorderedJunctions++;
  }

  // cell areas: polygon of the face's junctions plus, per dart, the segment on its left taken away
  let areaResidual = 0;
  let minCellArea = Infinity;
  for (let f = 1; f <= cells; f++) {
    let sum = 0;
    let comp = 0;
    for (let i = faceStarts[f]; i < faceStarts[f + 1]; i++) {
      const e = faceDarts[i];
      const a = (e / 3) | 0;
      const b = (twins[e] / 3) | 0;
      const k = wallOf[e];
      const t = e < twins[e] ? bulges[k] : -bulges[k];
      // compensated summation of the two terms: keep the low-order part lost by each addition
      for (let term = 0; term < 2; term++) {
        const x = term === 0
          ? 0.5 * (coords[2 * a] * coords[2 * b + 1] - coords[2 * a + 1] * coords[2 * b])
          : -segmentArea(Math.hypot(coords[2 * b] - coords[2 * a], coords[2 * b + 1] - coords[2 * a + 1]), t);
        const s = sum + x;
        comp += Math.abs(sum) >= Math.abs(x) ? sum - s + x : x - s + sum;
        sum = s;
      }
    }
    const achieved = sum + comp;
    minCellArea = Math.min(minCellArea, achieved);
    areaResidual = Math.max(areaResidual, Math.abs(achieved - areas[f - 1]) / areas[f - 1]);
  }

  const crossings = countCrossings(map, coords, bulges, lower, cx, cy, radius, 1e-9 * unit);
  return finite({
    areaResidual,
    tangentResidual,
    curvatureResidual,
    minWallLength,
    minCellArea,
    crossings,
    misorderedJunctions,
  });
}

// Replace NaN by Infinity so that a certificate is never NaN and never passes by accident.
function finite(c: Certificate): Certificate {
  for (const key of Object.keys(c) as (keyof Certificate)[]) {
    if (Number.isNaN(c[key])) c[key] = key === 'minWallLength' || key === 'minCellArea' ? -Infinity : Infinity;
  }
  return c;
}

// Signed area between a chord of length c and the arc of bulge t: sector minus triangle of the circle,
// R^2 (theta - sin theta) / 2 with central angle theta = 2|t| and R = c / (2 |sin t|); a series for
// small theta, where the difference cancels (theta - sin theta = theta^3/6 - theta^5/120 + ...).
function segmentArea(c: number, t: number): number {
  const theta = 2 * Math.abs(t);
  const r = c / (2 * Math.abs(Math.sin(t)));
  if (t === 0) return 0;
  let diff: number;
  if (theta < 0.05) {
    const q = theta * theta;
    diff = theta * q * (1 / 6 - q * (1 / 120 - q * (1 / 5040 - q / 362880)));
  } else {
    diff = theta - Math.sin(theta);
  }
  return Math.sign(t) * 0.5 * r * r * diff;
}

// Count pairs of walls whose curves meet at a point that is not a junction they share. A pair whose
// bounding boxes (grown by `near`) do not overlap cannot meet.
function countCrossings(
  map: CubicMap, coords: Float64Array, bulges: Float64Array, lower: Int32Array,
  cx: Float64Array, cy: Float64Array, radius: Float64Array, near: number,
): number {
  const { twins } = map;
  const walls = map.twins.length / 2;
  const box = BOX;
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
  if (t >= STRAIGHT) {
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

// Intersections of the supporting circles or lines of walls k1 and k2 (at most 2), into px, py.
function meetInto(
  k1: number, k2: number, coords: Float64Array, bulges: Float64Array, lower: Int32Array, twins: Int32Array,
  cx: Float64Array, cy: Float64Array, radius: Float64Array, px: Float64Array, py: Float64Array,
): number {
  const straight1 = Math.abs(bulges[k1]) < STRAIGHT;
  const straight2 = Math.abs(bulges[k2]) < STRAIGHT;
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

// Whether a point of wall k's supporting curve lies on the wall itself: strictly on the bulge side of
// the chord for an arc (the arc bulging left of a->b is the part of its circle left of the chord line),
// between the end points for a segment.
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
  if (Math.abs(t) < STRAIGHT) {
    const s = ((x - ax) * dx + (y - ay) * dy) / (c * c);
    const off = Math.abs((x - ax) * dy - (y - ay) * dx) / c;
    return s * c > -near && (s - 1) * c < near && off < near;
  }
  const side = (dx * (y - ay) - dy * (x - ax)) / c;
  return t > 0 ? side > -near : side < near;
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
