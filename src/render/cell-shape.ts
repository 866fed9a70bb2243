// render stage: per-cell geometry of a drawing (area, centroid, inside test, label point) and its extent.

import type { ClusterDrawing } from './types.ts';
import { dartBulge } from './types.ts';
import { segmentFactor } from '../arcs/arc.ts';
import { arcBoundsInto, emptyBox, segmentMomentFactor, segmentWinding, wallDistance } from './arc-geometry.ts';
import { junctionOf } from '../maps/cubic-map.ts';

/** Area and area-weighted centroid of one cell. */
export interface CellMoments {
  /** Signed area (positive for a cell walked counter-clockwise, as every cell is). */
  readonly area: number;
  readonly cx: number;
  readonly cy: number;
}

/** Where a cell's label goes, and how far that point is from the cell's boundary. */
export interface LabelPoint {
  readonly x: number;
  readonly y: number;
  /** Distance from (x, y) to the nearest wall of the cell; 0 when no interior point was found. */
  readonly clearance: number;
}

/** Grid points per side when searching a cell for its most interior point. */
const SEARCH_GRID = 16;
/** The centroid is kept as the label point when its clearance is at least this share of the best found. */
const CENTROID_SHARE = 0.5;

/**
 * Visit the walls of face f in walking order (counter-clockwise for a cell) as
 * (ax, ay, bx, by, t) with t the bulge in the direction of the dart.
 */
function forEachSide(
  drawing: ClusterDrawing,
  walls: Int32Array,
  f: number,
  visit: (ax: number, ay: number, bx: number, by: number, t: number) => void,
): void {
  const { map, coords, bulges } = drawing;
  const first = map.faceDarts[map.faceStarts[f]];
  let e = first;
  do {
    const a = junctionOf(e);
    const b = map.headOf(e);
    const t = dartBulge(map, walls, bulges, e);
    visit(coords[2 * a], coords[2 * a + 1], coords[2 * b], coords[2 * b + 1], t);
    e = map.faceNext(e);
  } while (e !== first);
}

/**
 * Area and centroid of cell f: the junction polygon (shoelace sums) less the segment of every wall
 * that bulges into the cell, plus the segment of every wall that bulges out of it. Segment area
 * (c^2/4) f(t) and moment (c^3/12) q(t): see arc-geometry.ts.
 */
export function cellMoments(drawing: ClusterDrawing, walls: Int32Array, f: number): CellMoments {
  let area = 0;
  let mx = 0;
  let my = 0;
  forEachSide(drawing, walls, f, (ax, ay, bx, by, t) => {
    const cross = ax * by - bx * ay;
    area += 0.5 * cross;
    mx += ((ax + bx) * cross) / 6;
    my += ((ay + by) * cross) / 6;
    const dx = bx - ax;
    const dy = by - ay;
    const c2 = dx * dx + dy * dy;
    // a left bulge (t > 0) cuts its segment out of the cell on its left
    const s = c2 * segmentFactor(t);
    const q = (c2 / 12) * segmentMomentFactor(t);
    area -= s;
    mx -= s * 0.5 * (ax + bx) - dy * q;
    my -= s * 0.5 * (ay + by) + dx * q;
  });
  return { area, cx: mx / area, cy: my / area };
}

/** Does (px, py) lie inside cell f? Winding number of its boundary: polygon plus wall segments. */
export function cellContains(drawing: ClusterDrawing, walls: Int32Array, f: number, px: number, py: number): boolean {
  let winding = 0;
  forEachSide(drawing, walls, f, (ax, ay, bx, by, t) => {
    // polygon edge a -> b: signed crossing of the rightward ray from p
    const cross = (bx - ax) * (py - ay) - (px - ax) * (by - ay);
    if (ay <= py && by > py && cross > 0) winding++;
    else if (by <= py && ay > py && cross < 0) winding--;
    winding += segmentWinding(px, py, ax, ay, bx, by, t);
  });
  return winding !== 0;
}

/** Distance from (px, py) to the nearest wall of cell f. */
export function cellClearance(drawing: ClusterDrawing, walls: Int32Array, f: number, px: number, py: number): number {
  let best = Infinity;
  forEachSide(drawing, walls, f, (ax, ay, bx, by, t) => {
    const d = wallDistance(px, py, ax, ay, bx, by, t);
    if (d < best) best = d;
  });
  return best;
}

/** Exact bounding box [minX, minY, maxX, maxY] of cell f's walls. */
export function cellBounds(drawing: ClusterDrawing, walls: Int32Array, f: number): Float64Array {
  const box = emptyBox();
  forEachSide(drawing, walls, f, (ax, ay, bx, by, t) => arcBoundsInto(ax, ay, bx, by, t, box));
  return box;
}

/**
 * Exact bounding box [minX, minY, maxX, maxY] of a whole drawing: every wall once, along its lower
 * dart; for the circle (no junctions), the circle of area areas[0] about the origin.
 */
export function drawingBounds(drawing: ClusterDrawing): Float64Array {
  const { map, coords, bulges } = drawing;
  if (map.twins.length === 0) {
    const r = Math.sqrt(drawing.areas[0] / Math.PI);
    return Float64Array.of(-r, -r, r, r);
  }
  const box = emptyBox();
  const walls = map.wallIndex();
  for (let e = 0; e < map.twins.length; e++) {
    if (e > map.twins[e]) continue;
    const a = junctionOf(e);
    const b = map.headOf(e);
    arcBoundsInto(coords[2 * a], coords[2 * a + 1], coords[2 * b], coords[2 * b + 1], bulges[walls[e]], box);
  }
  return box;
}

/**
 * A point inside cell f for its label: the area-weighted centroid when it is inside and not much
 * closer to the boundary than the best point of a grid search; otherwise the grid point farthest
 * from the boundary (a 16 x 16 grid over the cell's box, then an 8 x 8 grid around the best point).
 * Deterministic. When no grid point is inside (a sliver thinner than the grid), the centroid is
 * returned with clearance 0.
 */
export function labelPoint(drawing: ClusterDrawing, walls: Int32Array, f: number): LabelPoint {
  const { cx, cy } = cellMoments(drawing, walls, f);
  const box = cellBounds(drawing, walls, f);
  let bestX = cx;
  let bestY = cy;
  let best = 0;
  const search = (x0: number, y0: number, w: number, h: number, steps: number): void => {
    for (let j = 0; j < steps; j++) {
      const y = y0 + ((j + 0.5) * h) / steps;
      for (let i = 0; i < steps; i++) {
        const x = x0 + ((i + 0.5) * w) / steps;
        if (!cellContains(drawing, walls, f, x, y)) continue;
        const d = cellClearance(drawing, walls, f, x, y);
        if (d > best) {
          best = d;
          bestX = x;
          bestY = y;
        }
      }
    }
  };
  const w = box[2] - box[0];
  const h = box[3] - box[1];
  search(box[0], box[1], w, h, SEARCH_GRID);
  if (best > 0) {
    const sx = (2 * w) / SEARCH_GRID;
    const sy = (2 * h) / SEARCH_GRID;
    search(bestX - sx / 2, bestY - sy / 2, sx, sy, SEARCH_GRID / 2);
  }
  if (Number.isFinite(cx) && Number.isFinite(cy) && cellContains(drawing, walls, f, cx, cy)) {
    const d = cellClearance(drawing, walls, f, cx, cy);
    if (d >= CENTROID_SHARE * best) return { x: cx, y: cy, clearance: d };
  }
  if (best > 0) return { x: bestX, y: bestY, clearance: best };
  return { x: Number.isFinite(cx) ? cx : 0.5 * (box[0] + box[2]), y: Number.isFinite(cy) ? cy : 0.5 * (box[1] + box[3]), clearance: 0 };
}
