// arcs stage: the order in which the three walls of a junction leave it in a drawing.

import { bulgeOf } from './arc.ts';

const TAU = 2 * Math.PI;

/**
 * Whether the three arcs at junction v leave it in the counter-clockwise order of its darts 3v, 3v + 1,
 * 3v + 2 (the map's order). coords holds the junction coordinates (coords[2w], coords[2w + 1]);
 * bulges[offset + wallOf[e]] is the bulge of dart e's wall along its lower dart (a dart e > twins[e]
 * runs against it, bulge negated), a bulge coordinate (arcs/arc.ts). Each arc leaves along its chord turned by its bulge (arcs/arc.ts).
 */
export function junctionInOrder(
  twins: Int32Array, wallOf: Int32Array, coords: Float64Array, bulges: Float64Array, offset: number, v: number,
): boolean {
  let first = 0;
  let d1 = 0;
  for (let i = 0; i < 3; i++) {
    const e = 3 * v + i;
    const w = (twins[e] / 3) | 0;
    const t = e < twins[e] ? bulgeOf(bulges[offset + wallOf[e]]) : -bulgeOf(bulges[offset + wallOf[e]]);
    const angle = Math.atan2(coords[2 * w + 1] - coords[2 * v + 1], coords[2 * w] - coords[2 * v]) + t;
    if (i === 0) {
      first = angle;
      continue;
    }
    const d = (((angle - first) % TAU) + TAU) % TAU;
    if (i === 1) d1 = d;
    else return d1 > 0 && d > d1;
  }
  return false;
}
