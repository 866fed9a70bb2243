// maps stage: canonical labellings of cubic plane maps and clusters, and their automorphisms.
//
// A labelling starts at a dart e with an orientation o (+1 reads junctions counter-clockwise, -1 reads
// them clockwise, i.e. labels the mirror image). Breadth first from e, the first time a junction is
// reached through dart d its darts get the next three labels d, rot(d), rot(rot(d)). The code is the
// relabelled twins array; the canonical code is the lexicographically smallest over the allowed
// starts. Starts giving the smallest code are exactly the automorphisms (one per start), so their
// number is the order of the automorphism group and a start of the other orientation among them
// means a reflection is a symmetry.

import { type CubicMap } from './cubic-map.ts';
import { slabCopyInt32 } from '../slab.ts';

/** The result of a canonical labelling search. */
export interface CanonicalForm {
  /** Relabelled twins array of the smallest start (a CubicMap's twins in canonical labelling). */
  code: Int32Array;
  /** Starts achieving it, as dart * 2 + (orientation === 1 ? 0 : 1); the first one is the canonical start. */
  starts: Int32Array;
  /** Order of the automorphism group (the number of smallest starts). */
  order: number;
  /** Whether an orientation-reversing automorphism is among them. */
  reflective: boolean;
}

/** Scratch buffers reused across searches of maps with up to `capacity` darts. */
interface Scratch {
  capacity: number;
  labels: Int32Array;
  order: Int32Array;
  best: Int32Array;
  trial: Int32Array;
  starts: Int32Array;
  candidates: Int32Array;
}

let scratch: Scratch | null = null;

function scratchFor(m: number): Scratch {
  if (scratch === null || scratch.capacity < m) {
    // NOTE: a map has 2m flags (dart, orientation), so 2m bounds the number of smallest starts
    scratch = {
      capacity: m,
      labels: new Int32Array(m),
      order: new Int32Array(m),
      best: new Int32Array(m),
      trial: new Int32Array(m),
      starts: new Int32Array(2 * m),
      candidates: new Int32Array(2 * m),
    };
  }
  return scratch;
}

/**
 * Label the map from (start, orientation) into `order` (label -> dart) and `labels` (dart -> label),
 * comparing with `best` as it goes. Returns -1 when the code is smaller than best (written to trial),
 * 0 when equal, +1 when larger (aborted early). With `haveBest` false it always returns -1.
 */
function labelFrom(
  twins: Int32Array,
  start: number,
  orientation: number,
  labels: Int32Array,
  order: Int32Array,
  best: Int32Array,
  trial: Int32Array,
  haveBest: boolean,
): number {
  const m = twins.length;
  labels.fill(-1, 0, m);
  let fresh = 0;
  // label the start junction
  let d = start;
  for (let r = 0; r < 3; r++) {
    labels[d] = fresh;
    order[fresh++] = d;
    d = orientation === 1 ? (d % 3 === 2 ? d - 2 : d + 1) : d % 3 === 0 ? d + 2 : d - 1;
  }
  let state = haveBest ? 0 : -1;
  for (let i = 0; i < m; i++) {
    const t = twins[order[i]];
    if (labels[t] === -1) {
      // first visit of t's junction: its darts get the next three labels
      let u = t;
      for (let r = 0; r < 3; r++) {
        labels[u] = fresh;
        order[fresh++] = u;
        u = orientation === 1 ? (u % 3 === 2 ? u - 2 : u + 1) : u % 3 === 0 ? u + 2 : u - 1;
      }
    }
    const value = labels[t];
    trial[i] = value;
    if (state === 0) {
      if (value < best[i]) state = -1;
      else if (value > best[i]) return 1;
    }
  }
  return state;
}

/**
 * Canonical form over the starts accepted by `allow(dart, orientation)` (all starts when omitted).
 * The start set must be invariant under every automorphism for the result to be canonical.
 * `twins` is a CubicMap's twins array. The returned arrays are fresh copies.
 */
export function canonicalForm(
  twins: Int32Array,
  allow?: (dart: number, orientation: number) => boolean,
): CanonicalForm {
  const m = twins.length;
  if (m === 0) {
    return { code: new Int32Array(0), starts: new Int32Array(0), order: 2, reflective: true };
  }
  const candidates = scratchFor(m).candidates;
  let k = 0;
  for (let e = 0; e < m; e++) {
    if (allow === undefined || allow(e, 1)) candidates[k++] = 2 * e;
    if (allow === undefined || allow(e, -1)) candidates[k++] = 2 * e + 1;
  }
  return canonicalFromStarts(twins, candidates, k);
}

/**
 * Canonical form over the first `count` encoded starts of `candidates` (dart * 2 + mirror bit),
 * a set invariant under every automorphism.
 */
export function canonicalFromStarts(twins: Int32Array, candidates: Int32Array, count: number): CanonicalForm {
  const m = twins.length;
  const s = scratchFor(m);
  const { labels, order, best, trial, starts } = s;
  let found = 0;
  let haveBest = false;
  for (let k = 0; k < count; k++) {
    const start = candidates[k];
    const c = labelFrom(twins, start >> 1, (start & 1) === 0 ? 1 : -1, labels, order, best, trial, haveBest);
    if (c < 0) {
      best.set(trial.subarray(0, m));
      haveBest = true;
      found = 0;
      starts[found++] = start;
    } else if (c === 0) {
      starts[found++] = start;
    }
  }
  let reflective = false;
  const first = starts[0] & 1;
  for (let i = 1; i < found; i++) if ((starts[i] & 1) !== first) reflective = true;
  return { code: slabCopyInt32(best.subarray(0, m)), starts: slabCopyInt32(starts.subarray(0, found)), order: found, reflective };
}

/**
 * The dart relabelling of one start: result[label] = dart. Two smallest starts s1, s2 give the
 * automorphism dart order1[j] -> order2[j].
 */
export function labellingOrder(twins: Int32Array, start: number): Int32Array {
  const m = twins.length;
  const labels = new Int32Array(m);
  const order = new Int32Array(m);
  const trial = new Int32Array(m);
  labelFrom(twins, start >> 1, (start & 1) === 0 ? 1 : -1, labels, order, trial, trial, false);
  return order;
}

/**
 * Canonical form of the cluster (map, outer face). Starts are the darts along the outside in either
 * orientation, narrowed to those with the smallest key (side count of the cell across the start
 * wall, then of the cell at the start junction's third sector), which automorphisms preserve. In the
 * canonical labelling the outside is the face of dart 0, so the code alone determines the cluster.
 */
export function canonicalCluster(map: CubicMap, outer: number): CanonicalForm {
  const m = map.twins.length;
  if (m === 0) {
    return { code: new Int32Array(0), starts: new Int32Array(0), order: 1, reflective: true };
  }
  const { faceOf, faceStarts, faceDarts } = map;
  const candidates = scratchFor(m).candidates;
  const lo = faceStarts[outer];
  const hi = faceStarts[outer + 1];
  // dart d along the outside starts orientation +1; in the mirror image the start is next(d), whose
  // right-hand face is the outside. Key: side count across the start wall, then of the third sector.
  let best = Infinity;
  for (let i = lo; i < hi; i++) {
    const d = faceDarts[i];
    const a = sizeOf(faceStarts, faceOf[d % 3 === 0 ? d + 2 : d - 1]);
    const b = sizeOf(faceStarts, faceOf[d % 3 === 2 ? d - 2 : d + 1]);
    best = Math.min(best, a * m + b, b * m + a);
  }
  let k = 0;
  for (let i = lo; i < hi; i++) {
    const d = faceDarts[i];
    const a = sizeOf(faceStarts, faceOf[d % 3 === 0 ? d + 2 : d - 1]);
    const b = sizeOf(faceStarts, faceOf[d % 3 === 2 ? d - 2 : d + 1]);
    if (a * m + b === best) candidates[k++] = 2 * d;
    if (b * m + a === best) candidates[k++] = 2 * (d % 3 === 2 ? d - 2 : d + 1) + 1;
  }
  return canonicalFromStarts(map.twins, candidates, k);
}

function sizeOf(faceStarts: Int32Array, f: number): number {
  return faceStarts[f + 1] - faceStarts[f];
}
