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

import type { ClusterProblem } from './problem.ts';

/**
 * A cell whose drawn area is above its target times SMALL_CELL_FACTOR is shrunk (with the cells of its
 * group) by the square root of the ratio; below, the descent reaches the target in a few steps.
 */
export const SMALL_CELL_FACTOR = 1e3;

/**
 * Shrink, in the drawing z (normalised units), every group of adjacent cells drawn more than
 * SMALL_CELL_FACTOR times their target areas to their targets' size, and move the drawing so that the
 * group of the smallest target sits at the origin. `areas` are the drawn areas (perimeterInto).
 * Returns whether anything was moved.
 */
export function shrinkSmallCellsInto(problem: ClusterProblem, z: Float64Array, targets: Float64Array, areas: Float64Array): boolean {
  const { cells, junctions, walls, starts, ends, lefts, rights } = problem;
  // Is any cell drawn too large? (Most drawings: no, and nothing is allocated.)
  let any = false;
  for (let f = 0; f < cells; f++) if (areas[f] > SMALL_CELL_FACTOR * targets[f]) any = true;
  if (!any) return false;
  // the cells too large, grouped by shared walls (union-find on cells)
  const parent = new Int32Array(cells);
  for (let f = 0; f < cells; f++) parent[f] = f;
  const small = (f: number): boolean => f >= 0 && areas[f] > SMALL_CELL_FACTOR * targets[f];
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
  for (let v = 0; v < junctions; v++) {
    const g = groupOf[v];
    if (g < 0) continue;
    const s = Math.sqrt(wanted[g] / drawn[g]);
    z[2 * v] = cx[g] + s * (z[2 * v] - cx[g]);
    z[2 * v + 1] = cy[g] + s * (z[2 * v + 1] - cy[g]);
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
