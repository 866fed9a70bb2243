// arcs stage: a first drawing built along a construction path, each wall cutting its cell to its area.
//
// Every bridgeless cubic plane map with at least 4 junctions has a wall whose deletion (then smoothing
// the two junctions left with two walls) leaves a bridgeless cubic plane map with one face fewer
// (the last ear of an ear decomposition is such a wall; maps/deletion.ts). Walls are deleted that way
// down to the theta graph, whose three faces are drawn as a
// double bubble with the right areas (a straight middle wall and two outer arcs). The walls are then
// put back in reverse order: each new wall's junctions are placed on the arcs they split (at the arcs'
// midpoints; a lens takes the middle third of its host wall), and its bulge is chosen so that it cuts
// the merged cell into the areas its two sides have to take. The result has the target areas at every
// step, so no cell starts out at a millionth of its size the way nested cells do in a barycentric
// drawing; it is checked (junction orders, positive areas) by the caller, who falls back on the
// barycentric drawing when it is not a valid drawing.
//
// The deletion order prefers walls of cells with few sides (a lens first), so that small details are
// the last walls put back. Faces keep their identity through the deletions as classes of the map's
// faces (the face on the left of a dart at any level is the class of its face in the map).

import type { CubicMap } from '../maps/cubic-map.ts';
import {
  DELETION_RECORD as RECORD, R_A1, R_A2, R_B1, R_B2, R_E, R_T, R_X1, R_X2, R_Y1, R_Y2, deleteWallInto, facePairsInto,
} from '../maps/deletion.ts';
import { facesInto } from '../maps/faces.ts';
import * as arc from './arc.ts';

// NOTE: local copies of imported functions (under some loaders, tsx, every use of an import is a
// getter call).
const segmentFactor = arc.segmentFactor;

// Places tried for a junction put back, as arc fractions along the wall it splits.
const PLACES = [0.5, 0.25, 0.75, 0.05, 0.95];
// Largest |bulge| of a wall put back (a near-full circle would sweep over its neighbours).
const MAX_BULGE = 2.6;
// Bisection steps of the bulge fit (the bracket (-MAX_BULGE, MAX_BULGE) shrinks below 1e-12).
const FIT_STEPS = 45;

/** Scratch of one dart count. */
interface InsertionWorkspace {
  tw: Int32Array;
  alive: Uint8Array;
  records: Int32Array;
  face: Int32Array;
  faceSize: Int32Array;
  parent: Int32Array;
  classTarget: Float64Array;
  bulge: Float64Array;
  order: Int32Array;
  key: Float64Array;
  merges: Int32Array;
  pairs: Int32Array;
}

const WORKSPACES = new Map<number, InsertionWorkspace>();

function workspaceFor(darts: number, faces: number): InsertionWorkspace {
  let ws = WORKSPACES.get(darts);
  if (!ws) {
    ws = {
      tw: new Int32Array(darts),
      alive: new Uint8Array(darts / 3),
      records: new Int32Array(RECORD * (darts / 3)),
      face: new Int32Array(darts),
      faceSize: new Int32Array(darts),
      parent: new Int32Array(faces),
      classTarget: new Float64Array(faces),
      bulge: new Float64Array(darts),
      order: new Int32Array(darts / 2),
      key: new Float64Array(darts / 2),
      merges: new Int32Array(2 * (darts / 3)),
      pairs: new Int32Array(faces * faces),
    };
    WORKSPACES.set(darts, ws);
  }
  return ws;
}

const nextDart = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);
const prevDart = (e: number): number => (e % 3 === 0 ? e + 2 : e - 1);

// Root of face f's class. No path compression: merges are undone in reverse order by resetting one link.
function find(parent: Int32Array, f: number): number {
  while (parent[f] !== f) f = parent[f];
  return f;
}

/**
 * Draw `map` (face 0 the outside, cell i + 1 of area targets[i]) along a construction path into coords
 * (2V) and bulges (E, numbered by map.wallIndex()). Returns false when no drawing was made (a map whose
 * walls could not be deleted down to the theta graph in the preferred order); the drawing returned
 * with true still needs the caller's validity check.
 */
export function drawByInsertionInto(map: CubicMap, targets: Float64Array, coords: Float64Array, bulges: Float64Array): boolean {
  const { twins, faceOf } = map;
  const darts = twins.length;
  const junctions = darts / 3;
  if (junctions < 2) return false;
  const faces = map.faceCount;
  const ws = workspaceFor(darts, faces);
  const { tw, alive, records, parent, classTarget, bulge, merges } = ws;
  tw.set(twins);
  alive.fill(1, 0, junctions);
  for (let f = 0; f < faces; f++) {
    parent[f] = f;
    classTarget[f] = f === 0 ? 0 : targets[f - 1];
  }

  // delete walls down to the theta graph
  let deleted = 0;
  for (let left = junctions; left > 2; left -= 2) {
    if (!deleteOne(ws, junctions, deleted)) return false;
    const r = deleted * RECORD;
    const fa = find(parent, faceOf[records[r + R_E]]);
    const fb = find(parent, faceOf[records[r + R_T]]);
    // merge the classes (a deletable wall has two faces), the outside's class staying the root
    const root = fb === find(parent, 0) ? fb : fa;
    const other = root === fa ? fb : fa;
    parent[other] = root;
    classTarget[root] += classTarget[other];
    merges[2 * deleted] = root;
    merges[2 * deleted + 1] = other;
    deleted++;
  }

  // draw the theta graph: junctions A, B on the x axis, the wall between the two cells straight
  let a = -1;
  let b = -1;
  for (let v = 0; v < junctions; v++) {
    if (!alive[v]) continue;
    if (a < 0) a = v;
    else b = v;
  }
  const outside = find(parent, 0);
  let middle = -1;
  for (let i = 0; i < 3; i++) {
    const d = 3 * a + i;
    if (find(parent, faceOf[d]) === outside) middle = 3 * a + ((i + 2) % 3);
  }
  if (middle < 0) return false;
  // ccw from the middle wall at A: the upper arc (bulging left), then the lower one (bulging right)
  const upper = nextDart(middle);
  const lower = nextDart(upper);
  const upperArea = classTarget[find(parent, faceOf[middle])];
  const lowerArea = classTarget[find(parent, faceOf[lower])];
  // the smaller cell gets the bulge of the equal double bubble, 2 pi / 3
  const c = Math.sqrt(Math.min(upperArea, lowerArea) / segmentFactor((2 * Math.PI) / 3));
  coords[2 * a] = -0.5 * c;
  coords[2 * a + 1] = 0;
  coords[2 * b] = 0.5 * c;
  coords[2 * b + 1] = 0;
  setBulge(tw, bulge, middle, 0);
  setBulge(tw, bulge, upper, bulgeForFactor(upperArea / (c * c)));
  setBulge(tw, bulge, lower, -bulgeForFactor(lowerArea / (c * c)));

  // put the walls back, last deleted first
  for (let k = deleted - 1; k >= 0; k--) {
    const r = k * RECORD;
    const e = records[r + R_E];
    const t = records[r + R_T];
    const A = (e / 3) | 0;
    const B = (t / 3) | 0;
    const x1 = records[r + R_X1];
    const x2 = records[r + R_X2];
    const y1 = records[r + R_Y1];
    const y2 = records[r + R_Y2];
    const b1 = records[r + R_B1];
    const b2 = records[r + R_B2];
    const a1 = records[r + R_A1];
    const a2 = records[r + R_A2];
    // Is the new wall a lens's? Then A's wall is a part of B's wall, split at B.
    const lens = ((x1 / 3) | 0) === B || ((x2 / 3) | 0) === B;
    const hostB = bulge[y1];
    const hostA = lens ? 0 : bulge[x1];
    // the two sides of the new wall, as classes at this level: undo deletion k's merge
    const root = merges[2 * k];
    const other = merges[2 * k + 1];
    parent[other] = other;
    classTarget[root] -= classTarget[other];
    const fe = find(parent, faceOf[e]);
    const ft = find(parent, faceOf[t]);
    tw[e] = t;
    tw[t] = e;
    alive[A] = 1;
    alive[B] = 1;
    // try the places of B and A along their walls; keep the one whose new wall bulges least
    let best = Infinity;
    let bestB = 0.5;
    let bestA = 0.5;
    for (let pass = 0; pass < 2; pass++) {
      const tries = pass === 0 ? PLACES.length * PLACES.length : 1;
      for (let i = 0; i < tries; i++) {
        const sB = pass === 0 ? PLACES[(i / PLACES.length) | 0] : bestB;
        const sA = pass === 0 ? PLACES[i % PLACES.length] : bestA;
        // restore B on its wall (y1 ... y2), then A on its wall (x1 ... x2)
        bulge[y1] = hostB;
        bulge[y2] = -hostB;
        splitInto(tw, bulge, coords, y1, y2, b1, b2, B, sB);
        if (!lens) {
          bulge[x1] = hostA;
          bulge[x2] = -hostA;
        }
        splitInto(tw, bulge, coords, x1, x2, a1, a2, A, sA);
        tw[e] = t;
        tw[t] = e;
        setBulge(tw, bulge, e, 0);
        const dx = coords[2 * B] - coords[2 * A];
        const dy = coords[2 * B + 1] - coords[2 * A + 1];
        const c2 = dx * dx + dy * dy;
        if (!(c2 > 0)) continue;
        // bulge of e that gives the face on its left its share: a bulge t into that face takes
        // c^2 h(t) from it
        let want: number;
        if (ft === outside || fe === outside) {
          const cell = ft === outside ? e : t;
          const area = faceArea(tw, bulge, coords, cell);
          const need = classTarget[ft === outside ? fe : ft] - area;
          want = cell === e ? need : -need;
        } else {
          const ae = faceArea(tw, bulge, coords, e);
          const at = faceArea(tw, bulge, coords, t);
          const sum = classTarget[fe] + classTarget[ft];
          want = (ae + at) * (sum > 0 ? classTarget[fe] / sum : 0.5) - ae;
        }
        if (pass === 1) {
          setBulge(tw, bulge, e, bulgeForFactor(-want / c2));
          break;
        }
        const tw0 = approximateBulge(-want / c2);
        // prefer small bulges, then places near the middles
        const score = Math.abs(tw0) + 0.05 * (Math.abs(sB - 0.5) + Math.abs(sA - 0.5));
        if (score < best) {
          best = score;
          bestB = sB;
          bestA = sA;
        }
      }
    }
    if (best === Infinity) return false;
  }

  // write the bulges by wall number (lower dart of each wall)
  for (let d = 0, w = 0; d < darts; d++) {
    if (d < twins[d]) bulges[w++] = bulge[d];
  }
  return true;
}

// Delete one wall of the current map (darts tw, junctions alive), the first deletable one in the
// preferred order (maps/deletion.ts), and write its record. Returns false when none is deletable.
function deleteOne(ws: InsertionWorkspace, junctions: number, k: number): boolean {
  const { tw, alive, face, faceSize, order, key, records, pairs } = ws;
  const darts = 3 * junctions;
  const faces = facesInto(tw, darts, face, faceSize, alive);
  facePairsInto(tw, darts, face, faces, pairs, alive);
  // candidate walls (lower darts), by the side count of the smaller cell on either side
  let count = 0;
  for (let e = 0; e < darts; e++) {
    if (!alive[(e / 3) | 0] || e > tw[e]) continue;
    const se = faceSize[face[e]];
    const st = faceSize[face[tw[e]]];
    key[count] = Math.min(se, st) * 1000 + Math.max(se, st) / 1000 + e * 1e-9;
    order[count++] = e;
  }
  // insertion sort by key (at most 3V/2 walls)
  for (let i = 1; i < count; i++) {
    const kv = key[i];
    const ov = order[i];
    let j = i - 1;
    while (j >= 0 && key[j] > kv) {
      key[j + 1] = key[j];
      order[j + 1] = order[j];
      j--;
    }
    key[j + 1] = kv;
    order[j + 1] = ov;
  }
  for (let i = 0; i < count; i++) {
    const e = order[i];
    if (pairs[face[e] * faces + face[tw[e]]] !== 1) continue;
    deleteWallInto(tw, alive, e, records, k * RECORD);
    return true;
  }
  return false;
}

// Put junction J (darts j1 toward the first end, j2 toward the second) back on the wall p ... q at
// arc fraction s from p's junction: the wall splits into p - j1 and j2 - q, each keeping the circle.
function splitInto(
  tw: Int32Array, bulge: Float64Array, coords: Float64Array, p: number, q: number, j1: number, j2: number,
  J: number, s: number,
): void {
  const P = (p / 3) | 0;
  const Q = (q / 3) | 0;
  const t = bulge[p];
  const px = coords[2 * P];
  const py = coords[2 * P + 1];
  const dx = coords[2 * Q] - px;
  const dy = coords[2 * Q + 1] - py;
  // the point at fraction s of the arc: its chord from P has length c sin(s t) / sin t and leaves at
  // (1 - s) t from the chord (inscribed angles; school geometry, no source)
  const ratio = Math.abs(t) < 1e-8 ? s : Math.sin(s * t) / Math.sin(t);
  const turn = (1 - s) * t;
  const cs = Math.cos(turn);
  const sn = Math.sin(turn);
  coords[2 * J] = px + ratio * (cs * dx - sn * dy);
  coords[2 * J + 1] = py + ratio * (sn * dx + cs * dy);
  tw[p] = j1;
  tw[j1] = p;
  tw[q] = j2;
  tw[j2] = q;
  setBulge(tw, bulge, p, s * t);
  setBulge(tw, bulge, j2, (1 - s) * t);
}

// Set the bulge of dart d's wall, seen from d (its twin sees the opposite).
function setBulge(tw: Int32Array, bulge: Float64Array, d: number, t: number): void {
  bulge[d] = t;
  bulge[tw[d]] = -t;
}

// Signed area of the face on the left of dart d (walked counter-clockwise for a cell): the polygon of
// its junctions less, per dart, the segment on its left.
function faceArea(tw: Int32Array, bulge: Float64Array, coords: Float64Array, d: number): number {
  let area = 0;
  let e = d;
  let guard = 0;
  do {
    const A = (e / 3) | 0;
    const B = (tw[e] / 3) | 0;
    const ax = coords[2 * A];
    const ay = coords[2 * A + 1];
    const bx = coords[2 * B];
    const by = coords[2 * B + 1];
    const c2 = (bx - ax) ** 2 + (by - ay) ** 2;
    area += 0.5 * (ax * by - ay * bx) - c2 * segmentFactor(bulge[e]);
    e = prevDart(tw[e]);
  } while (e !== d && ++guard < tw.length);
  return area;
}

// h on an even grid of [0, MAX_BULGE], for a quick inverse (school numerics, no source).
const TABLE_STEPS = 256;
const TABLE = new Float64Array(TABLE_STEPS + 1);
for (let i = 0; i <= TABLE_STEPS; i++) TABLE[i] = segmentFactor((MAX_BULGE * i) / TABLE_STEPS);

// The bulge with h(t) = value to within the table's resolution, by interpolation in the table.
function approximateBulge(value: number): number {
  const v = Math.abs(value);
  if (!(v < TABLE[TABLE_STEPS])) return value < 0 ? -MAX_BULGE : MAX_BULGE;
  let lo = 0;
  let hi = TABLE_STEPS;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (TABLE[mid] <= v) lo = mid;
    else hi = mid;
  }
  const t = (MAX_BULGE * (lo + (v - TABLE[lo]) / (TABLE[hi] - TABLE[lo]))) / TABLE_STEPS;
  return value < 0 ? -t : t;
}

// The bulge t in [-MAX_BULGE, MAX_BULGE] with h(t) = value (h is odd and increasing), by bisection.
function bulgeForFactor(value: number): number {
  let lo = -MAX_BULGE;
  let hi = MAX_BULGE;
  if (!(value < segmentFactor(hi))) return hi;
  if (!(value > segmentFactor(lo))) return lo;
  for (let i = 0; i < FIT_STEPS; i++) {
    const mid = 0.5 * (lo + hi);
    if (segmentFactor(mid) < value) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
