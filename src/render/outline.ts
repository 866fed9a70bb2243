// render stage: cell boundaries and walls traced into a PathContext (SVG path data when none is given).

import type { ClusterDrawing } from './types.ts';
import { dartBulge } from './types.ts';
import type { PathContext } from './context.ts';
import { SvgPath, circlePath, wallTo } from './path.ts';
import { junctionOf } from '../maps/cubic-map.ts';

/**
 * Trace the boundary of cell f (1..n) into `context`: from the junction of the face's first dart,
 * each wall along the dart in walking order (map.faceNext; counter-clockwise in the drawing's y-up
 * frame), its bulge sign flipped when the dart is the upper dart of its wall, then closed. The circle
 * (no junctions) traces the circle of area areas[0] about the origin. Assumes checkDrawing passed.
 * Without a context, returns the SVG path data at `digits` decimals.
 */
export function traceCell(drawing: ClusterDrawing, f: number, context: PathContext): void;
export function traceCell(drawing: ClusterDrawing, f: number, context?: undefined, digits?: number): string;
export function traceCell(drawing: ClusterDrawing, f: number, context?: PathContext, digits = 3): string | void {
  const target = context ?? new SvgPath(digits);
  const { map, coords, bulges, areas } = drawing;
  if (map.twins.length === 0) {
    circlePath(target, 0, 0, Math.sqrt(areas[0] / Math.PI));
  } else {
    const walls = map.wallIndex();
    const first = map.faceDarts[map.faceStarts[f]];
    const a0 = junctionOf(first);
    target.moveTo(coords[2 * a0], coords[2 * a0 + 1]);
    let e = first;
    do {
      const a = junctionOf(e);
      const b = map.headOf(e);
      const t = dartBulge(map, walls, bulges, e);
      wallTo(target, coords[2 * a], coords[2 * a + 1], coords[2 * b], coords[2 * b + 1], t);
      e = map.faceNext(e);
    } while (e !== first);
    target.closePath();
  }
  if (context === undefined) return target.toString();
}

/**
 * Trace every wall once into `context`, each as its own subpath along its lower dart (junctionOf(e)
 * to headOf(e), bulge as given), in dart order. The circle traces its one closed wall.
 * Assumes checkDrawing passed. Without a context, returns the SVG path data at `digits` decimals.
 */
export function traceWalls(drawing: ClusterDrawing, context: PathContext): void;
export function traceWalls(drawing: ClusterDrawing, context?: undefined, digits?: number): string;
export function traceWalls(drawing: ClusterDrawing, context?: PathContext, digits = 3): string | void {
  const target = context ?? new SvgPath(digits);
  const { map, coords, bulges } = drawing;
  if (map.twins.length === 0) {
    traceCell(drawing, 1, target);
  } else {
    const walls = map.wallIndex();
    for (let e = 0; e < map.twins.length; e++) {
      if (e > map.twins[e]) continue;
      const a = junctionOf(e);
      const b = map.headOf(e);
      target.moveTo(coords[2 * a], coords[2 * a + 1]);
      wallTo(target, coords[2 * a], coords[2 * a + 1], coords[2 * b], coords[2 * b + 1], bulges[walls[e]]);
    }
  }
  if (context === undefined) return target.toString();
}
