// sweep stage: the triangular (barycentric) sample grid shared by the sweep and its region map.

import { UsageError } from '../errors.ts';

/**
 * Barycentric weights (w0, w1, w2) of the centroid of every small triangle of a triangle grid with
 * `divisions` per side, in row order (the small triangles of each row, upward then downward): 3 numbers per sample, divisions^2 samples.
 * The sweep samples the areas there, so its winners line up with renderRegionMap.
 * @throws UsageError when divisions is not a positive integer.
 */
export function triangleSamples(divisions: number): Float64Array {
  const m = checkDivisions(divisions);
  const out = new Float64Array(3 * m * m);
  let k = 0;
  for (const [, , corners] of triangleCells(m)) {
    // the centroid of three lattice points (i, j): weights (1 - (i+j)/m, i/m, j/m)
    let wi = 0;
    let wj = 0;
    for (const [i, j] of corners) {
      wi += i;
      wj += j;
    }
    out[k++] = 1 - (wi + wj) / (3 * m);
    out[k++] = wi / (3 * m);
    out[k++] = wj / (3 * m);
  }
  return out;
}

export function checkDivisions(divisions: number): number {
  if (!(Number.isInteger(divisions) && divisions >= 1)) throw new UsageError(`Divisions is ${divisions} when expected a positive integer.`);
  return divisions;
}

/** The small triangles in sample order as [i, j, lattice corners, points up]. */
export function triangleCells(m: number): [number, number, [number, number][], boolean][] {
  const cells: [number, number, [number, number][], boolean][] = [];
  for (let j = 0; j < m; j++) {
    for (let i = 0; i < m - j; i++) {
      cells.push([i, j, [[i, j], [i + 1, j], [i, j + 1]], true]);
      if (i < m - 1 - j) cells.push([i, j, [[i + 1, j], [i + 1, j + 1], [i, j + 1]], false]);
    }
  }
  return cells;
}

