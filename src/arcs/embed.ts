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
// Each wall is then drawn as the circular arc through its two junctions and its wall node. An arc can
// swing past a neighbouring wall at a junction where the straight drawing is valid; the walls at such a
// junction are flattened (bulges halved) until the order holds. Finally the drawing is scaled to the
// requested total area.
//
// Node numbering: junction v -> v, wall k -> V + k, cell f (face f >= 1) -> V + E + f - 1.

import type { CubicMap } from '../maps/cubic-map.ts';
import { bulgeThrough } from './arc.ts';

/** A drawing: junction coordinates (coords[2v], coords[2v + 1]) and one bulge per wall (see arc.ts). */
export interface Drawing {
  /** Junction coordinates, length 2V. */
  coords: Float64Array;
  /** Bulge of wall k (numbered as by map.wallIndex()), positive into the face left of its lower dart. */
  bulges: Float64Array;
}

/**
 * Draw `map` (face 0 = outside) so that its cells enclose `totalArea` in all. The circle (no darts)
 * gives empty arrays. The map must be 2-connected (every admissible cluster map is).
 */
export function embedCluster(map: CubicMap, totalArea: number): Drawing {
  const { twins, faceOf, faceStarts, faceDarts } = map;
  const junctions = map.junctionCount;
  const walls = twins.length / 2;
  if (junctions === 0) return { coords: new Float64Array(0), bulges: new Float64Array(0) };
  const cells = map.faceCount - 1;
  const nodes = junctions + walls + cells;
  const wallOf = map.wallIndex();
  const centre = (f: number): number => (f === 0 ? -1 : junctions + walls + f - 1);

  // place the outside's boundary on the circle, clockwise (the outside is walked clockwise)
  const radius = Math.sqrt(totalArea / Math.PI);
  const x = new Float64Array(nodes);
  const y = new Float64Array(nodes);
  const fixed = new Uint8Array(nodes);
  const outer = faceStarts[1] - faceStarts[0];
  for (let i = 0; i < outer; i++) {
    const e = faceDarts[faceStarts[0] + i];
    const pair = [(e / 3) | 0, junctions + wallOf[e]];
    for (let s = 0; s < 2; s++) {
      const angle = (-2 * Math.PI * (2 * i + s)) / (2 * outer);
      x[pair[s]] = radius * Math.cos(angle);
      y[pair[s]] = radius * Math.sin(angle);
      fixed[pair[s]] = 1;
    }
  }

  // the subdivision's edges, each listed once: per dart, junction-wall node, junction-centre (its
  // corner) and wall node-centre (its side)
  const edgeA = new Int32Array(3 * twins.length);
  const edgeB = new Int32Array(3 * twins.length);
  let m = 0;
  for (let e = 0; e < twins.length; e++) {
    const v = (e / 3) | 0;
    const w = junctions + wallOf[e];
    const c = centre(faceOf[e]);
    edgeA[m] = v;
    edgeB[m++] = w;
    if (c >= 0) {
      edgeA[m] = v;
      edgeB[m++] = c;
      edgeA[m] = w;
      edgeB[m++] = c;
    }
  }

  // solve the Laplacian system for the free nodes by conjugate gradients (it is symmetric positive
  // definite: every free node is joined to the fixed boundary through the subdivision)
  const degree = new Float64Array(nodes);
  for (let i = 0; i < m; i++) {
    degree[edgeA[i]]++;
    degree[edgeB[i]]++;
  }
  for (const pos of [x, y]) conjugateGradient(pos, fixed, degree, edgeA, edgeB, m);

  // draw each wall through its node
  const coords = new Float64Array(2 * junctions);
  for (let v = 0; v < junctions; v++) {
    coords[2 * v] = x[v];
    coords[2 * v + 1] = y[v];
  }
  const bulges = new Float64Array(walls);
  for (let e = 0; e < twins.length; e++) {
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
      if (inOrder(map, wallOf, coords, bulges, v)) continue;
      bad = true;
      for (let i = 0; i < 3; i++) bulges[wallOf[3 * v + i]] *= 0.5;
    }
    if (!bad) break;
  }
  // scale to the requested total area (flattened outer walls no longer follow the circle)
  let area = 0;
  for (let e = 0; e < twins.length; e++) {
    if (faceOf[e] !== 0) continue;
    // the outside is walked clockwise, so its signed area is minus the cluster's
    const a = (e / 3) | 0;
    const b = (twins[e] / 3) | 0;
    const t = e < twins[e] ? bulges[wallOf[e]] : -bulges[wallOf[e]];
    const c2 = (coords[2 * b] - coords[2 * a]) ** 2 + (coords[2 * b + 1] - coords[2 * a + 1]) ** 2;
    const h = Math.abs(t) < 1e-8 ? t / 6 : (t - Math.sin(t) * Math.cos(t)) / (4 * Math.sin(t) ** 2);
    area -= 0.5 * (coords[2 * a] * coords[2 * b + 1] - coords[2 * a + 1] * coords[2 * b]) - c2 * h;
  }
  const stretch = Math.sqrt(totalArea / area);
  for (let i = 0; i < coords.length; i++) coords[i] *= stretch;
  return { coords, bulges };
}

// Largest |bulge| of an inner wall in the drawing: a wall node far from a short chord would otherwise
// give a near-full circle sweeping over its neighbours.
const MAX_INNER_BULGE = Math.PI / 3;

// Halvings of the bulges at a junction whose arcs leave it out of the map's order (2^-12 is straight
// for any purpose here).
const REPAIR_ROUNDS = 12;

// Whether the three arcs at junction v leave it in counter-clockwise order (darts 3v, 3v+1, 3v+2).
function inOrder(map: CubicMap, wallOf: Int32Array, coords: Float64Array, bulges: Float64Array, v: number): boolean {
  const { twins } = map;
  const angles = [0, 0, 0];
  for (let i = 0; i < 3; i++) {
    const e = 3 * v + i;
    const w = (twins[e] / 3) | 0;
    const t = e < twins[e] ? bulges[wallOf[e]] : -bulges[wallOf[e]];
    angles[i] = Math.atan2(coords[2 * w + 1] - coords[2 * v + 1], coords[2 * w] - coords[2 * v]) + t;
  }
  const turn = (x: number): number => ((x % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
  const d1 = turn(angles[1] - angles[0]);
  const d2 = turn(angles[2] - angles[0]);
  return d1 > 0 && d1 < d2;
}

// Solve (D - A) pos = 0 on the free nodes with the fixed nodes as boundary values, in place.
// CG converges in at most (number of free nodes) steps in exact arithmetic; twice that bounds it here.
function conjugateGradient(
  pos: Float64Array, fixed: Uint8Array, degree: Float64Array, edgeA: Int32Array, edgeB: Int32Array, m: number,
): void {
  const n = pos.length;
  const r = new Float64Array(n);
  const p = new Float64Array(n);
  const q = new Float64Array(n);
  // r = -(L pos) on free nodes
  const apply = (src: Float64Array, dst: Float64Array, freeOnly: boolean): void => {
    for (let i = 0; i < n; i++) dst[i] = freeOnly && fixed[i] ? 0 : degree[i] * src[i];
    for (let i = 0; i < m; i++) {
      const a = edgeA[i];
      const b = edgeB[i];
      const sa = freeOnly && fixed[a] ? 0 : src[a];
      const sb = freeOnly && fixed[b] ? 0 : src[b];
      dst[a] -= sb;
      dst[b] -= sa;
    }
    for (let i = 0; i < n; i++) if (fixed[i]) dst[i] = 0;
  };
  for (let i = 0; i < n; i++) if (!fixed[i]) pos[i] = 0;
  apply(pos, r, false);
  let rr = 0;
  let bb = 0;
  for (let i = 0; i < n; i++) {
    r[i] = -r[i];
    p[i] = r[i];
    rr += r[i] * r[i];
  }
  bb = rr;
  for (let it = 0; it < 2 * n && rr > 1e-30 * bb; it++) {
    apply(p, q, true);
    let pq = 0;
    for (let i = 0; i < n; i++) pq += p[i] * q[i];
    const alpha = rr / pq;
    let next = 0;
    for (let i = 0; i < n; i++) {
      pos[i] += alpha * p[i];
      r[i] -= alpha * q[i];
      next += r[i] * r[i];
    }
    const beta = next / rr;
    rr = next;
    for (let i = 0; i < n; i++) p[i] = r[i] + beta * p[i];
  }
}
