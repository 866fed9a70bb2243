// solver stage: a first drawing for cells far smaller than the rest: each group of adjacent small cells
// is shrunk in place, about the centroid of its junctions, to its target size.
//
// A first drawing (barycentric, or by construction path) knows the arrangement, not the areas' scale:
// at areas (1, 1e-9) it draws both cells of a double bubble alike, and the descent would have to shrink
// one a billion times while its walls keep their order. Shrinking the small cells' junctions towards
// their centroid turns a cell at a junction into a small triangle at that junction, a lens into a small
// lens on its wall, and a cell with more sides into a small copy of itself: the walls of the group
// keep their bulges (the same shapes, smaller), the walls that leave the group stretch to reach it, and
// the other cells keep nearly their areas. The whole drawing is then moved so that the smallest group
// sits at the origin: cell areas are sums of cross products of junction coordinates (wall-terms.ts), so a
// cell of area 1e-12 is resolved to the rounding of coordinates near it, not of coordinates of size 1.

import { bulgeForSegmentFactor, segmentFactor } from '../arcs/arc.ts';
import type { ClusterProblem } from './problem.ts';

// A wall's signed share of the areas of its cells: half the cross product of its ends less its segment
// c^2 h(t) (the term Q of wall-terms.ts, which sums these over a cell's walls).
function shareOf(z: Float64Array, a: number, b: number, t: number): number {
  const c2 = (z[2 * b] - z[2 * a]) ** 2 + (z[2 * b + 1] - z[2 * a + 1]) ** 2;
  return 0.5 * (z[2 * a] * z[2 * b + 1] - z[2 * a + 1] * z[2 * b]) - c2 * segmentFactor(t);
}

/**
 * A cell whose drawn area is above its target times SMALL_CELL_FACTOR is shrunk (with the cells of its
 * group) by the square root of the ratio; below, the descent reaches the target in a few steps.
 */
export const SMALL_CELL_FACTOR = 1e3;

/**
 * Shrink, in the drawing z (normalised units), every group of adjacent cells drawn more than
 * `factor` (default SMALL_CELL_FACTOR) times their target areas to their targets' size, and move the drawing so that the
 * group of the smallest target sits at the origin. `areas` are the drawn areas (perimeterInto).
 * Returns whether anything was moved.
 */
export function shrinkSmallCellsInto(
  problem: ClusterProblem, z: Float64Array, targets: Float64Array, areas: Float64Array, factor = SMALL_CELL_FACTOR,
): boolean {
  const { cells, junctions, walls, starts, ends, lefts, rights } = problem;
  // Is any cell drawn too large? (Most drawings: no, and nothing is allocated.)
  let any = false;
  for (let f = 0; f < cells; f++) if (areas[f] > factor * targets[f]) any = true;
  if (!any) return false;
  // the cells too large, grouped by shared walls (union-find on cells)
  const parent = new Int32Array(cells);
  for (let f = 0; f < cells; f++) parent[f] = f;
  const small = (f: number): boolean => f >= 0 && areas[f] > factor * targets[f];
  const root = (f: number): number => {
    while (parent[f] !== f) f = parent[f] = parent[parent[f]];
    return f;
  };
  for (let k = 0; k < walls; k++) {
    const l = lefts[k];
    const r = rights[k];
    if (small(l) && small(r)) parent[root(l)] = root(r);
  }
  // per group: drawn and target area, and each junction's group (the smallest target wins a junction
  // shared by two groups: its cell needs the junction close)
  const drawn = new Float64Array(cells);
  const wanted = new Float64Array(cells);
  for (let f = 0; f < cells; f++) {
    if (!small(f)) continue;
    drawn[root(f)] += areas[f];
    wanted[root(f)] += targets[f];
  }
  const groupOf = new Int32Array(junctions).fill(-1);
  for (let k = 0; k < walls; k++) {
    for (const f of [lefts[k], rights[k]]) {
      if (!small(f)) continue;
      const g = root(f);
      for (const v of [starts[k], ends[k]]) {
        const h = groupOf[v];
        if (h < 0 || wanted[g] < wanted[h]) groupOf[v] = g;
      }
    }
  }
  // shrink each group about the centroid of its junctions
  const cx = new Float64Array(cells);
  const cy = new Float64Array(cells);
  const count = new Int32Array(cells);
  for (let v = 0; v < junctions; v++) {
    const g = groupOf[v];
    if (g < 0) continue;
    cx[g] += z[2 * v];
    cy[g] += z[2 * v + 1];
    count[g]++;
  }
  let origin = -1;
  for (let g = 0; g < cells; g++) {
    if (count[g] === 0) continue;
    cx[g] /= count[g];
    cy[g] /= count[g];
    if (origin < 0 || wanted[g] < wanted[origin]) origin = g;
  }
  // the walls of larger cells with both ends in groups (a large cell's outer wall round a small lens,
  // nearly a full circle): their share of the cells' areas, chord cross product plus segment, before
  const kept = new Float64Array(walls).fill(NaN);
  for (let k = 0; k < walls; k++) {
    if (small(lefts[k]) || small(rights[k]) || groupOf[starts[k]] < 0 || groupOf[ends[k]] < 0) continue;
    kept[k] = shareOf(z, starts[k], ends[k], z[2 * junctions + k]);
  }
  for (let v = 0; v < junctions; v++) {
    const g = groupOf[v];
    if (g < 0) continue;
    const s = Math.sqrt(wanted[g] / drawn[g]);
    z[2 * v] = cx[g] + s * (z[2 * v] - cx[g]);
    z[2 * v + 1] = cy[g] + s * (z[2 * v + 1] - cy[g]);
  }
  // (and after: the same share, from a bulge towards +-pi, so the larger cells keep their areas)
  for (let k = 0; k < walls; k++) {
    if (Number.isNaN(kept[k])) continue;
    const a = starts[k];
    const b = ends[k];
    const c2 = (z[2 * b] - z[2 * a]) ** 2 + (z[2 * b + 1] - z[2 * a + 1]) ** 2;
    const segment = shareOf(z, a, b, 0) - kept[k];
    if (c2 > 0) z[2 * junctions + k] = bulgeForSegmentFactor(segment / c2);
  }
  // the smallest group at the origin
  const ox = cx[origin];
  const oy = cy[origin];
  for (let v = 0; v < junctions; v++) {
    z[2 * v] -= ox;
    z[2 * v + 1] -= oy;
  }
  return true;
}
