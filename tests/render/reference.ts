// render tests: independent reference geometry (dense sampling of each wall's circle) for the checks.

import type { ClusterDrawing } from '../../src/render/types.ts';
import { junctionOf } from '../../src/maps/cubic-map.ts';

/**
 * The circle of the wall a -> b with bulge t, found as the intersection of the chord's perpendicular
 * bisector with the normal to the tangent at a (the tangent is the chord turned by t; a circle's
 * radius is perpendicular to its tangent), plus the arc's start angle and signed sweep: the arc
 * leaves a along the tangent, so it turns clockwise (negative angle) when the tangent is left of
 * the chord, and it subtends twice the tangent-chord angle (tangent-chord angle theorem).
 */
export function referenceCircle(ax: number, ay: number, bx: number, by: number, t: number) {
  const dx = bx - ax;
  const dy = by - ay;
  const tx = dx * Math.cos(t) - dy * Math.sin(t);
  const ty = dx * Math.sin(t) + dy * Math.cos(t);
  // a + s (-ty, tx) on the bisector: (a + s n - m) . (b - a) = 0
  const s = (0.5 * (dx * dx + dy * dy)) / (-ty * dx + tx * dy);
  const cx = ax - s * ty;
  const cy = ay + s * tx;
  const r = Math.hypot(ax - cx, ay - cy);
  const start = Math.atan2(ay - cy, ax - cx);
  return { cx, cy, r, start, sweep: -2 * t };
}

/** `count` + 1 points along the wall a -> b with bulge t, a and b included. */
export function sampleWall(ax: number, ay: number, bx: number, by: number, t: number, count: number): number[] {
  if (t === 0) {
    const out: number[] = [];
    for (let k = 0; k <= count; k++) out.push(ax + ((bx - ax) * k) / count, ay + ((by - ay) * k) / count);
    return out;
  }
  const { cx, cy, r, start, sweep } = referenceCircle(ax, ay, bx, by, t);
  const out: number[] = [];
  for (let k = 0; k <= count; k++) {
    const angle = start + (sweep * k) / count;
    out.push(cx + r * Math.cos(angle), cy + r * Math.sin(angle));
  }
  return out;
}

/** Cell f of a drawing as a dense polygon (flat x, y list), walking its darts with faceNext. */
export function cellPolygon(drawing: ClusterDrawing, f: number, perWall = 2000): number[] {
  const { map, coords, bulges } = drawing;
  const walls = map.wallIndex();
  const first = map.faceDarts[map.faceStarts[f]];
  const out: number[] = [];
  let e = first;
  do {
    const a = junctionOf(e);
    const b = map.headOf(e);
    const t = e < map.twins[e] ? bulges[walls[e]] : -bulges[walls[e]];
    const points = sampleWall(coords[2 * a], coords[2 * a + 1], coords[2 * b], coords[2 * b + 1], t, perWall);
    out.push(...points.slice(0, -2));
    e = map.faceNext(e);
  } while (e !== first);
  return out;
}

/** Area and centroid of a polygon by the shoelace formulas. */
export function polygonMoments(p: number[]): { area: number; cx: number; cy: number } {
  let area = 0;
  let mx = 0;
  let my = 0;
  const count = p.length / 2;
  for (let k = 0; k < count; k++) {
    const x0 = p[2 * k];
    const y0 = p[2 * k + 1];
    const x1 = p[(2 * k + 2) % p.length];
    const y1 = p[(2 * k + 3) % p.length];
    const cross = x0 * y1 - x1 * y0;
    area += cross / 2;
    mx += ((x0 + x1) * cross) / 6;
    my += ((y0 + y1) * cross) / 6;
  }
  return { area, cx: mx / area, cy: my / area };
}

/** Even-odd point in polygon (ray crossing). */
export function polygonContains(p: number[], x: number, y: number): boolean {
  let inside = false;
  const count = p.length / 2;
  for (let k = 0, l = count - 1; k < count; l = k++) {
    const xk = p[2 * k];
    const yk = p[2 * k + 1];
    const xl = p[2 * l];
    const yl = p[2 * l + 1];
    if (yk > y !== yl > y && x < ((xl - xk) * (y - yk)) / (yl - yk) + xk) inside = !inside;
  }
  return inside;
}

/** A small seeded generator, for reproducible random points. */
export { mulberry32 } from '../../src/random.ts';
