// maps stage: every bridgeless cubic plane map with a given number of faces, up to isomorphism.
//
// Generation by canonical construction path (design §3). Every such map with at least four junctions
// has a deletable wall: deleting it and smoothing its two ends leaves a bridgeless cubic plane map
// with one face fewer. Conversely a child is made from a parent by inserting a wall across a face,
// from a point on one of its walls to a point on another (or on the same wall: a lens). A child is
// kept only when the inserted wall lies in the automorphism orbit of its canonical deletable wall,
// and children of one parent are told apart by their canonical code. So every map appears exactly
// once, with no table of maps seen: memory is the depth of the search times one parent's children.
//
// A wall is deletable when the two faces it separates share no other wall (deletion.ts). Among the deletable walls
// the canonical class has the smallest invariant (sizes of the two faces it separates, then of the
// faces at its two ends); canonical labellings start only from darts of that class.

import { CubicMap, next, prev, thetaMap } from './cubic-map.ts';
import * as deletion from './deletion.ts';
import * as faces from './faces.ts';
import { type CanonicalForm, canonicalForm, labellingOrder } from './canonical.ts';
import { UsageError } from '../errors.ts';
import { CODE_CELL_LIMIT } from './code.ts';

// NOTE: local copies (under some loaders, tsx, every use of an import is a getter call).
const facesInto = faces.facesInto;
const facePairsInto = deletion.facePairsInto;

/** A map produced by the enumerator, with its automorphism group. */
export interface EnumeratedMap {
  /** The map, in the canonical labelling of the search. */
  map: CubicMap;
  /** |Aut(M)|, reflections included. */
  order: number;
  /** Whether an orientation-reversing automorphism exists. */
  reflective: boolean;
  /** Face orbits: orbitOf[f] is the smallest face in f's orbit under Aut(M). */
  orbitOf: Int32Array;
  /** stabiliser[f]: order of the subgroup fixing face f. */
  stabiliser: Int32Array;
  /** stabiliserReflective[f]: 1 when that subgroup holds a reflection. */
  stabiliserReflective: Uint8Array;
  /** Whether the map is 3-connected (no two faces share two walls; at least 4 junctions). */
  threeConnected: boolean;
}

/** Options of the enumerator. */
export interface EnumerateOptions {
  /** Part of the work to do, as { index, count } with 0 <= index < count. @default whole search */
  shard?: { index: number; count: number };
}

/** Level (number of cells) at which the search tree is cut into shards, for a target of `cells`. */
export function shardLevel(cells: number): number {
  return Math.min(cells, 7);
}

/** Workspace for evaluating children of one size (3V darts, F faces). */
class ChildWork {
  readonly m: number;
  readonly twins: Int32Array;
  readonly faceOf: Int32Array;
  readonly faceSize: Int32Array;
  readonly pairCount: Int32Array;
  readonly keys: Float64Array;
  readonly faces: number;
  constructor(m: number, faces: number) {
    this.m = m;
    this.faces = faces;
    this.twins = new Int32Array(m);
    this.faceOf = new Int32Array(m);
    this.faceSize = new Int32Array(faces + 1);
    this.pairCount = new Int32Array((faces + 1) * (faces + 1));
    this.keys = new Float64Array(m);
  }
}

/** Invariant of the wall of dart e (faces it separates, then faces at its ends), from face sizes. */
function wallKey(w: ChildWork, e: number, t: number): number {
  const { faceOf, faceSize } = w;
  const S = w.m; // face sizes are below the dart count
  const sa = faceSize[faceOf[e]];
  const sb = faceSize[faceOf[t]];
  const ea = faceSize[faceOf[e % 3 === 2 ? e - 2 : e + 1]];
  const eb = faceSize[faceOf[t % 3 === 2 ? t - 2 : t + 1]];
  return ((Math.min(sa, sb) * S + Math.max(sa, sb)) * S + Math.min(ea, eb)) * S + Math.max(ea, eb);
}

/**
 * Whether the wall of dart `d` is deletable with the smallest invariant among deletable walls. When it
 * is, w.keys holds every dart's wall invariant (+Infinity for walls that are not deletable) and the
 * return value is that smallest invariant; otherwise -1 (returned as soon as a smaller one is seen).
 */
function smallestDeletableKey(w: ChildWork, d: number): number {
  const { m, twins, faceOf, pairCount, keys, faces } = w;
  const K = faces + 1;
  facePairsInto(twins, m, faceOf, K, pairCount, null);
  const dt = twins[d];
  if (pairCount[faceOf[d] * K + faceOf[dt]] !== 1) return -1;
  const own = wallKey(w, d, dt);
  for (let e = 0; e < m; e++) {
    const t = twins[e];
    if (e > t) continue;
    let key = Infinity;
    if (pairCount[faceOf[e] * K + faceOf[t]] === 1) {
      key = wallKey(w, e, t);
      // Is a smaller deletable wall here? Then the new wall is not canonical.
      if (key < own) return -1;
    }
    keys[e] = key;
    keys[t] = key;
  }
  return own;
}

/**
 * Insert a wall into the face on the left of darts x and y of parent twins P (V junctions), writing the
 * child into out. New junctions A = V (on x's wall) and B = V + 1 (on y's wall). Dart layout of a new
 * junction J placed on dart d (d from s to t): 3J+0 points on to t, 3J+1 into the face, 3J+2 back to s;
 * that is counter-clockwise because the face lies to the left of d.
 *
 *      s ---x---> A ---> t        x === y (lens):  s ---x---> A ---> B ---> t
 *                 |                                           \_____/
 *      ... <-y--- B <--- ...                                 new wall
 */
function insertInto(P: Int32Array, V: number, x: number, y: number, out: Int32Array): void {
  out.set(P);
  const a = 3 * V;
  const b = 3 * V + 3;
  const xt = P[x];
  if (x === y) {
    out[x] = a + 2;
    out[a + 2] = x;
    out[a] = b + 2;
    out[b + 2] = a;
    out[b] = xt;
    out[xt] = b;
  } else {
    const yt = P[y];
    out[x] = a + 2;
    out[a + 2] = x;
    out[a] = xt;
    out[xt] = a;
    out[y] = b + 2;
    out[b + 2] = y;
    out[b] = yt;
    out[yt] = b;
  }
  out[a + 1] = b + 1;
  out[b + 1] = a + 1;
}

/**
 * Re-express the smallest starts in the canonical labelling itself: start (d, o) becomes
 * (label of d, o relative to the first start's orientation), so the first start is (0, +1).
 */
function inCanonicalLabels(twins: Int32Array, form: CanonicalForm): CanonicalForm {
  if (form.order === 1) return { ...form, starts: Int32Array.of(0) };
  const order0 = labellingOrder(twins, form.starts[0]);
  const labels = new Int32Array(order0.length);
  for (let j = 0; j < order0.length; j++) labels[order0[j]] = j;
  const flip0 = form.starts[0] & 1;
  const starts = form.starts.map((s) => labels[s >> 1] * 2 + ((s & 1) ^ flip0));
  return { ...form, starts };
}

/** The result of canonicalising a child whose new wall passed the invariant test. */
interface Accepted {
  form: CanonicalForm;
  map: CubicMap;
}

/**
 * The children of one parent, in a deterministic order, each accepted exactly when its new wall is in
 * the orbit of its canonical deletable wall; duplicates among one parent's children removed by code.
 */
function childrenOf(parent: CubicMap, work: ChildWork): Accepted[] {
  const P = parent.twins;
  const V = parent.junctionCount;
  const out: Accepted[] = [];
  const seen = new Set<string>();
  const { twins, faceOf, faceSize, keys } = work;
  const m = work.m;
  const newDart = 3 * V + 1;
  const newTwin = 3 * V + 4;
  for (let f = 0; f < parent.faceCount; f++) {
    const lo = parent.faceStarts[f];
    const hi = parent.faceStarts[f + 1];
    for (let i = lo; i < hi; i++) {
      for (let j = i; j < hi; j++) {
        const x = parent.faceDarts[i];
        const y = parent.faceDarts[j];
        insertInto(P, V, x, y, twins);
        facesInto(twins, m, faceOf, faceSize, null);
        // Is the new wall outside the canonical class? Then another parent owns this child.
        const best = smallestDeletableKey(work, newDart);
        if (best < 0) continue;
        const form = canonicalForm(twins.subarray(0, m), (e) => keys[e] === best);
        let inOrbit = false;
        for (let k = 0; k < form.starts.length; k++) {
          const d = form.starts[k] >> 1;
          if (d === newDart || d === newTwin) inOrbit = true;
        }
        if (!inOrbit) continue;
        const key = form.code.join(',');
        if (seen.has(key)) continue;
        seen.add(key);
        out.push({ form: inCanonicalLabels(twins.subarray(0, m), form), map: new CubicMap(form.code, true) });
      }
    }
  }
  return out;
}

/** Face orbits, stabilisers and 3-connectivity of an accepted map. */
function describe(acc: Accepted): EnumeratedMap {
  const { map, form } = acc;
  const F = map.faceCount;
  const orbitOf = new Int32Array(F);
  const stabiliser = new Int32Array(F);
  const stabiliserReflective = new Uint8Array(F);
  for (let f = 0; f < F; f++) orbitOf[f] = f;
  // the map is already in canonical labelling, so the identity is the first smallest start
  if (form.order > 1) {
    const faceOf = map.faceOf;
    for (let k = 0; k < form.starts.length; k++) {
      // the automorphism sends dart j (its own label) to order[j]; a reflection swaps left and right
      const order = labellingOrder(map.twins, form.starts[k]);
      const reflection = (form.starts[k] & 1) === 1;
      for (let f = 0; f < F; f++) {
        const d = map.faceDarts[map.faceStarts[f]];
        const g = reflection ? faceOf[prev(order[d])] : faceOf[order[d]];
        if (g === f) {
          stabiliser[f]++;
          if (reflection) stabiliserReflective[f] = 1;
        }
        if (g < orbitOf[f]) orbitOf[f] = g;
      }
    }
  } else {
    stabiliser.fill(1);
  }
  return {
    map,
    order: form.order,
    reflective: form.reflective,
    orbitOf,
    stabiliser,
    stabiliserReflective,
    threeConnected: isThreeConnected(map),
  };
}

/** 3-connected: at least 4 junctions and no two faces sharing two walls (a simple dual). */
export function isThreeConnected(map: CubicMap): boolean {
  if (map.junctionCount < 4) return false;
  const F = map.faceCount;
  const count = new Uint8Array(F * F);
  const { twins, faceOf } = map;
  for (let e = 0; e < twins.length; e++) {
    const t = twins[e];
    if (e > t) continue;
    const k = faceOf[e] * F + faceOf[t];
    if (count[k] === 1) return false;
    count[k] = 1;
    count[faceOf[t] * F + faceOf[e]] = 1;
  }
  return true;
}

/**
 * The most shards a run is cut into. Shards are dealt the subtrees below shardLevel() in turn, and there
 * are far fewer than this for any cell count one can enumerate, so more shards would only be empty.
 */
export const SHARD_LIMIT = 1_000_000;

/** Check a cell count and shard for the enumerator. @throws UsageError. */
function checkArguments(cells: number, options: EnumerateOptions): { index: number; count: number } {
  if (!Number.isSafeInteger(cells) || cells < 1 || cells > CODE_CELL_LIMIT) {
    throw new UsageError(`Cell count ${cells} is not valid when expected a whole number from 1 to ${CODE_CELL_LIMIT} (the most a code holds).`);
  }
  const shard = options.shard ?? { index: 0, count: 1 };
  if (!Number.isSafeInteger(shard.count) || shard.count < 1 || shard.count > SHARD_LIMIT ||
    !Number.isSafeInteger(shard.index) || shard.index < 0 || shard.index >= shard.count) {
    throw new UsageError(`Shard ${shard.index}/${shard.count} (zero-based) is not valid when expected i/k with 0 <= i < k <= ${SHARD_LIMIT}.`);
  }
  return shard;
}

/**
 * Every bridgeless cubic plane map with cells + 1 faces, up to isomorphism (reflections included),
 * in a deterministic order. For one cell it yields the circle (no junctions).
 * @throws UsageError when cells is not a whole number >= 1.
 */
export function* enumerateMaps(cells: number, options: EnumerateOptions = {}): Generator<EnumeratedMap> {
  const shard = checkArguments(cells, options);
  if (cells === 1) {
    if (shard.index === 0) {
      const circle = new CubicMap(new Int32Array(0));
      yield {
        map: circle, order: 1, reflective: true, orbitOf: Int32Array.from([0, 1]),
        stabiliser: Int32Array.from([1, 1]), stabiliserReflective: Uint8Array.from([1, 1]), threeConnected: false,
      };
    }
    return;
  }
  const theta = thetaMap();
  const thetaForm = canonicalForm(theta.twins);
  const root: Accepted = { form: inCanonicalLabels(theta.twins, thetaForm), map: new CubicMap(thetaForm.code, true) };
  const split = shardLevel(cells);
  let splitIndex = 0;
  if (cells === 2) {
    if (shard.index === 0) yield describe(root);
    return;
  }
  const works: ChildWork[] = [];
  for (let c = 3; c <= cells; c++) works[c] = new ChildWork(6 * (c - 1), c + 1);
  // depth-first over levels with an explicit stack: stack[c] holds the pending maps of c cells
  const stack: Accepted[][] = [];
  const cursor: number[] = [];
  stack[2] = [root];
  cursor[2] = 0;
  let level = 2;
  while (level >= 2) {
    if (cursor[level] >= stack[level].length) {
      level--;
      continue;
    }
    const item = stack[level][cursor[level]++];
    if (level === split) {
      const mine = splitIndex % shard.count === shard.index;
      splitIndex++;
      if (!mine) continue;
    }
    if (level === cells) {
      yield describe(item);
      continue;
    }
    const children = childrenOf(item.map, works[level + 1]);
    level++;
    stack[level] = children;
    cursor[level] = 0;
  }
}
