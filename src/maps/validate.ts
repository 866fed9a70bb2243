// maps stage: the admissibility check for a map read from outside (cubic, planar, connected, bridgeless).

import { type CubicMap } from './cubic-map.ts';
import { MapError } from '../errors.ts';

/**
 * Check that `map` is an admissible cluster of `cells` cells: twins an involution (checked by the
 * CubicMap constructor), connected, planar (V - E + F = 2), no wall from a junction to itself and no
 * bridge (a wall with the same face on both sides), and cells + 1 faces.
 * @throws MapError naming the first violated condition.
 */
export function validateCluster(map: CubicMap, cells: number): void {
  const twins = map.twins;
  const m = twins.length;
  const V = map.junctionCount;
  if (cells === 1) {
    if (m !== 0) throw new MapError(`One cell has ${V} junctions when expected none (a circle).`);
    return;
  }
  if (V !== 2 * (cells - 1)) {
    throw new MapError(`Map has ${V} junctions when expected ${2 * (cells - 1)} for ${cells} cells (Euler's formula).`);
  }
  for (let e = 0; e < m; e++) {
    if (((twins[e] / 3) | 0) === ((e / 3) | 0)) {
      throw new MapError(`Wall of dart ${e} is a loop at junction ${(e / 3) | 0} when expected two distinct ends.`);
    }
  }
  // connected: a breadth-first sweep over junctions with an explicit queue
  const seen = new Uint8Array(V);
  const queue = new Int32Array(V);
  let head = 0;
  let tail = 0;
  seen[0] = 1;
  queue[tail++] = 0;
  while (head < tail) {
    const v = queue[head++];
    for (let r = 0; r < 3; r++) {
      const w = (twins[3 * v + r] / 3) | 0;
      if (seen[w] === 0) {
        seen[w] = 1;
        queue[tail++] = w;
      }
    }
  }
  if (tail !== V) throw new MapError(`Map reaches ${tail} of its ${V} junctions when expected a connected map.`);
  const F = map.faceCount;
  const E = m / 2;
  if (V - E + F !== 2) {
    throw new MapError(`Map has V - E + F = ${V - E + F} when expected 2 (a plane map, Euler's formula).`);
  }
  for (let e = 0; e < m; e++) {
    if (map.faceOf[e] === map.faceOf[twins[e]]) {
      throw new MapError(`Wall of dart ${e} has face ${map.faceOf[e]} on both sides when expected no bridge.`);
    }
  }
  if (F !== cells + 1) throw new MapError(`Map has ${F - 1} cells when expected ${cells}.`);
}
