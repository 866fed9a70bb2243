// maps stage: canonical labellings of cubic plane maps and clusters, and their automorphisms.
//
// A labelling starts at a dart e with an orientation o (+1 reads junctions counter-clockwise, -1 reads
// them clockwise, i.e. labels the mirror image). Breadth first from e, the first time a junction is
// reached through dart d its darts get the next three labels d, rot(d), rot(rot(d)). The code is the
// relabelled twins array; the canonical code is the lexicographically smallest over the allowed
// starts. Starts giving the smallest code are exactly the automorphisms (one per start), so their
// number is the order of the automorphism group and a start of the other orientation among them
// means a reflection is a symmetry.

import { type CubicMap, next, prev } from './cubic-map.ts';

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
    d = orientation === 1 ? next(d) : prev(d);
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
        u = orientation === 1 ? next(u) : prev(u);
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
 * The returned arrays are fresh copies.
 */
export function canonicalForm(
  map: CubicMap,
  allow?: (dart: number, orientation: number) => boolean,
): CanonicalForm {
  const twins = map.twins;
  const m = twins.length;
  if (m === 0) {
    return { code: new Int32Array(0), starts: new Int32Array(0), order: 2, reflective: true };
  }
  const s = scratchFor(m);
  const { labels, order, best, trial, starts } = s;
  let count = 0;
  let haveBest = false;
  for (let e = 0; e < m; e++) {
    for (let o = 1; o >= -1; o -= 2) {
      if (allow !== undefined && !allow(e, o)) continue;
      const c = labelFrom(twins, e, o, labels, order, best, trial, haveBest);
      if (c < 0) {
        best.set(trial.subarray(0, m));
        haveBest = true;
        count = 0;
        starts[count++] = e * 2 + (o === 1 ? 0 : 1);
      } else if (c === 0) {
        starts[count++] = e * 2 + (o === 1 ? 0 : 1);
      }
    }
  }
  let reflective = false;
  const first = starts[0] & 1;
  for (let i = 1; i < count; i++) if ((starts[i] & 1) !== first) reflective = true;
  return { code: best.slice(0, m), starts: starts.slice(0, count), order: count, reflective };
}

/**
 * The dart relabelling of one start: result[label] = dart. Two smallest starts s1, s2 give the
 * automorphism dart order1[j] -> order2[j].
 */
export function labellingOrder(map: CubicMap, start: number): Int32Array {
  const m = map.twins.length;
  const labels = new Int32Array(m);
  const order = new Int32Array(m);
  const trial = new Int32Array(m);
  labelFrom(map.twins, start >> 1, (start & 1) === 0 ? 1 : -1, labels, order, trial, trial, false);
  return order;
}

/** Starts of a cluster: darts whose face (as seen in that orientation) is face `outer`. */
export function clusterStartFilter(map: CubicMap, outer: number): (dart: number, orientation: number) => boolean {
  const faceOf = map.faceOf;
  // in the mirror image the face on the left of e is the face on its right, the face of prev(e)
  return (e, o) => (o === 1 ? faceOf[e] : faceOf[prev(e)]) === outer;
}

/**
 * Canonical form of the cluster (map, outer face). In the canonical labelling the outside is the face
 * of dart 0, so the code alone determines the cluster.
 */
export function canonicalCluster(map: CubicMap, outer: number): CanonicalForm {
  if (map.twins.length === 0) {
    return { code: new Int32Array(0), starts: new Int32Array(0), order: 1, reflective: true };
  }
  return canonicalForm(map, clusterStartFilter(map, outer));
}
