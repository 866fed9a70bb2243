// arcs stage: a first drawing of any admissible cluster map, as junction coordinates and wall bulges.
//
// Barycentric embedding ("How to draw a graph", Proc. London Math. Soc. 13 (1963)) of the map's
// barycentric subdivision: its nodes are the junctions, one node per wall (the wall's midpoint) and
// one node per cell (the cell's centre); its edges join each wall's node to the wall's two junctions
// and to the centres of its two faces, and each cell's centre to the junctions on its boundary. The
// outside's boundary (its junctions and wall nodes, in walking order) is fixed, evenly spaced, on a
// circle; every other node sits at the mean of its neighbours. The subdivision of a 2-connected cubic
// map is a simple internally triangulated disc (no wall has one face on both sides, no face meets a
// junction twice), so the drawing is a plane straight-line drawing with every triangle positively
// oriented ("One-to-one piecewise linear mappings over triangulations", Math. Comp. 72 (2003)).
// NOTE: nested cells come out small (a lens inside a ring can be a millionth of the mean area); the
// relaxer then draws along a construction path instead (insertion.ts).
//
// Each wall is then drawn as the circular arc through its two junctions and its wall node. An arc can
// swing past a neighbouring wall at a junction where the straight drawing is valid; the walls at such a
// junction are flattened (bulges halved) until the order holds. Finally the drawing is scaled to the
// requested total area.
//
// Node numbering: junction v -> v, wall k -> V + k, cell f (face f >= 1) -> V + E + f - 1.

import type { CubicMap } from '../maps/cubic-map.ts';
import { choleskyRootInto, choleskyRootSolveInto } from '../linalg/cholesky.ts';
import * as arc from './arc.ts';
import { junctionInOrder } from './junction.ts';

// NOTE: local copies of imported functions (under some loaders, tsx, every use of an import is a
// getter call).
const segmentFactor = arc.segmentFactor;
const bulgeThrough = arc.bulgeThrough;

/** A drawing: junction coordinates (coords[2v], coords[2v + 1]) and one bulge per wall (see arc.ts). */
export interface Drawing {
  /** Junction coordinates, length 2V. */
  coords: Float64Array;
  /** Bulge of wall k (numbered as by map.wallIndex()), positive into the face left of its lower dart. */
  bulges: Float64Array;
}

// Largest |bulge| of an inner wall in the drawing: a wall node far from a short chord would otherwise
// give a near-full circle sweeping over its neighbours.
const MAX_INNER_BULGE = Math.PI / 3;

// Halvings of the bulges at a junction whose arcs leave it out of the map's order (2^-12 is straight
// for any purpose here).
const REPAIR_ROUNDS = 12;

/** Working arrays of one junction count (every map with V junctions has the same sizes). */
interface EmbedWorkspace {
  x: Float64Array;
  y: Float64Array;
  fixed: Uint8Array;
  slot: Int32Array;
  matrix: Float64Array;
  bx: Float64Array;
  by: Float64Array;
  edgeA: Int32Array;
  edgeB: Int32Array;
  wallOf: Int32Array;
}

const WORKSPACES = new Map<number, EmbedWorkspace>();

function workspaceFor(junctions: number, walls: number, cells: number, darts: number): EmbedWorkspace {
  let ws = WORKSPACES.get(junctions);
  if (!ws) {
    const nodes = junctions + walls + cells;
    ws = {
      x: new Float64Array(nodes),
      y: new Float64Array(nodes),
      fixed: new Uint8Array(nodes),
      slot: new Int32Array(nodes),
      matrix: new Float64Array(nodes * nodes),
      bx: new Float64Array(nodes),
      by: new Float64Array(nodes),
      edgeA: new Int32Array(3 * darts),
      edgeB: new Int32Array(3 * darts),
      wallOf: new Int32Array(darts),
    };
    WORKSPACES.set(junctions, ws);
  }
  return ws;
}

/**
 * Draw `map` (face 0 = outside) so that its cells enclose `totalArea` in all. The circle (no darts)
 * gives empty arrays. The map must be 2-connected (every admissible cluster map is).
 */
export function embedCluster(map: CubicMap, totalArea: number): Drawing {
  const coords = new Float64Array(2 * map.junctionCount);
  const bulges = new Float64Array(map.twins.length / 2);
  embedClusterInto(map, totalArea, coords, bulges);
  return { coords, bulges };
}

/** embedCluster writing into caller buffers: coords (length 2V) and bulges (length E). */
export function embedClusterInto(map: CubicMap, totalArea: number, coords: Float64Array, bulges: Float64Array): void {
  const { twins, faceOf, faceStarts, faceDarts } = map;
  const junctions = map.junctionCount;
  const darts = twins.length;
  const walls = darts / 2;
  if (junctions === 0) return;
  const cells = map.faceCount - 1;
  const nodes = junctions + walls + cells;
  const ws = workspaceFor(junctions, walls, cells, darts);
  const { x, y, fixed, edgeA, edgeB, wallOf } = ws;
  // wall numbers as map.wallIndex() gives them, without its allocation
  for (let e = 0, k = 0; e < darts; e++) {
    const t = twins[e];
    if (e < t) {
      wallOf[e] = k;
      wallOf[t] = k;
      k++;
    }
  }
  const centre = (f: number): number => (f === 0 ? -1 : junctions + walls + f - 1);

  // place the outside's boundary on the circle, clockwise (the outside is walked clockwise)
  const radius = Math.sqrt(totalArea / Math.PI);
  x.fill(0, 0, nodes);
  y.fill(0, 0, nodes);
  fixed.fill(0, 0, nodes);
  const outer = faceStarts[1] - faceStarts[0];
  for (let i = 0; i < outer; i++) {
    const e = faceDarts[faceStarts[0] + i];
    for (let s = 0; s < 2; s++) {
      const node = s === 0 ? (e / 3) | 0 : junctions + wallOf[e];
      const angle = (-2 * Math.PI * (2 * i + s)) / (2 * outer);
      x[node] = radius * Math.cos(angle);
      y[node] = radius * Math.sin(angle);
      fixed[node] = 1;
    }
  }

  // the subdivision's edges, each listed once: per dart, the half of its wall at its junction
  // (junction - wall node), and for a cell's dart its corner (junction - centre) and side (wall node -
  // centre)
  let m = 0;
  for (let e = 0; e < darts; e++) {
    const v = (e / 3) | 0;
    const w = junctions + wallOf[e];
    const f = faceOf[e];
    edgeA[m] = v;
    edgeB[m++] = w;
    if (f === 0) continue;
    const c = centre(f);
    edgeA[m] = v;
    edgeB[m++] = c;
    edgeA[m] = w;
    edgeB[m++] = c;
  }

  // solve the Laplacian system for the free nodes: (D - A) restricted to them is symmetric positive
  // definite (every free node is joined to the fixed boundary through the subdivision); one dense
  // Cholesky factorisation serves both coordinates
  const { slot, matrix, bx, by } = ws;
  let free = 0;
  for (let i = 0; i < nodes; i++) slot[i] = fixed[i] ? -1 : free++;
  matrix.fill(0, 0, free * free);
  bx.fill(0, 0, free);
  by.fill(0, 0, free);
  for (let i = 0; i < m; i++) {
    const a = edgeA[i];
    const b = edgeB[i];
    const sa = slot[a];
    const sb = slot[b];
    if (sa >= 0) matrix[sa * free + sa] += 1;
    if (sb >= 0) matrix[sb * free + sb] += 1;
    if (sa >= 0 && sb >= 0) {
      if (sa > sb) matrix[sa * free + sb] -= 1;
      else matrix[sb * free + sa] -= 1;
    } else if (sa >= 0) {
      bx[sa] += x[b];
      by[sa] += y[b];
    } else if (sb >= 0) {
      bx[sb] += x[a];
      by[sb] += y[a];
    }
  }
  choleskyRootInto(matrix, free);
  choleskyRootSolveInto(matrix, free, bx);
  choleskyRootSolveInto(matrix, free, by);
  for (let i = 0; i < nodes; i++) {
    const k = slot[i];
    if (k < 0) continue;
    x[i] = bx[k];
    y[i] = by[k];
  }

  // draw each wall through its node
  for (let v = 0; v < junctions; v++) {
    coords[2 * v] = x[v];
    coords[2 * v + 1] = y[v];
  }
  for (let e = 0; e < darts; e++) {
    const t = twins[e];
    if (e > t) continue;
    const a = (e / 3) | 0;
    const b = (t / 3) | 0;
    const w = junctions + wallOf[e];
    const bulge = bulgeThrough(x[a], y[a], x[w], y[w], x[b], y[b]);
    // outer walls follow the circle; inner ones are kept to minor arcs, which stay near their chord
    bulges[wallOf[e]] = fixed[w] ? bulge : Math.max(-MAX_INNER_BULGE, Math.min(MAX_INNER_BULGE, bulge));
  }
  // Does an arc swing past a neighbour at its junction? Flatten the walls there until the order holds.
  for (let round = 0; round < REPAIR_ROUNDS; round++) {
    let bad = false;
    for (let v = 0; v < junctions; v++) {
      if (junctionInOrder(twins, wallOf, coords, bulges, 0, v)) continue;
      bad = true;
      for (let i = 0; i < 3; i++) bulges[wallOf[3 * v + i]] *= 0.5;
    }
    if (!bad) break;
  }
  // scale to the requested total area (flattened outer walls no longer follow the circle)
  let area = 0;
  for (let e = 0; e < darts; e++) {
    if (faceOf[e] !== 0) continue;
    // the outside is walked clockwise, so its signed area is minus the cluster's
    const a = (e / 3) | 0;
    const b = (twins[e] / 3) | 0;
    const t = e < twins[e] ? bulges[wallOf[e]] : -bulges[wallOf[e]];
    const c2 = (coords[2 * b] - coords[2 * a]) ** 2 + (coords[2 * b + 1] - coords[2 * a + 1]) ** 2;
    area -= 0.5 * (coords[2 * a] * coords[2 * b + 1] - coords[2 * a + 1] * coords[2 * b]) - c2 * segmentFactor(t);
  }
  const stretch = Math.sqrt(totalArea / area);
  for (let i = 0; i < 2 * junctions; i++) coords[i] *= stretch;
}
