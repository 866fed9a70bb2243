// maps stage: deleting a wall of a bridgeless cubic plane map and smoothing its two ends, the step of a
// construction path taken backwards: which walls may be deleted, and the deletion on a twins array.
//
// A wall is deletable when the two faces it separates share no other wall: the deletion merges them,
// and a second wall between them would be left with one face on both sides, a bridge (a 2-edge cut of
// a plane graph is a 2-cycle of its dual). With at least four junctions every other way the deletion could fail (smoothing a junction
// into a loop) also puts a second wall between the two faces, so the test is exact: the enumerator's
// canonical construction path (enumerate.ts) and the construction-path drawing (arcs/insertion.ts)
// both use it.
//
//        x1                      y1
//   ... --- a1 \          / b1 --- ...          after:  x1 ======= x2   (A smoothed)
//               A --e--t- B                              y1 ======= y2   (B smoothed)
//   ... --- a2 /          \ b2 --- ...
//        x2                      y2

/** Offsets in the record of one deletion: the wall's darts e (at A) and t (at B). */
export const R_E = 0;
/** Offset of t, the wall's dart at B. */
export const R_T = 1;
/** Offset of A's other darts a1 = next(e), a2 = prev(e). */
export const R_A1 = 2;
/** Offset of a2. */
export const R_A2 = 3;
/** Offset of the twins x1, x2 of a1, a2 before the deletion. */
export const R_X1 = 4;
/** Offset of x2. */
export const R_X2 = 5;
/** Offset of B's other darts b1 = next(t), b2 = prev(t). */
export const R_B1 = 6;
/** Offset of b2. */
export const R_B2 = 7;
/** Offset of the twins y1, y2 of b1, b2, read after A was smoothed. */
export const R_Y1 = 8;
/** Offset of y2. */
export const R_Y2 = 9;
/** Length of one deletion's record. */
export const DELETION_RECORD = 10;

/**
 * Count the walls between each pair of faces into pairCount (faces x faces, symmetric; a wall with one
 * face on both sides counts once) from the face numbers faceOf of the darts 0 .. darts of `twins`. With
 * `alive`, only the darts of junctions v with alive[v] = 1 count.
 */
export function facePairsInto(
  twins: Int32Array, darts: number, faceOf: Int32Array, faces: number, pairCount: Int32Array, alive: Uint8Array | null,
): void {
  pairCount.fill(0, 0, faces * faces);
  for (let e = 0; e < darts; e++) {
    const t = twins[e];
    if (e > t || (alive !== null && !alive[(e / 3) | 0])) continue;
    const a = faceOf[e];
    const b = faceOf[t];
    pairCount[a * faces + b]++;
    if (a !== b) pairCount[b * faces + a]++;
  }
}

/**
 * Delete the wall of dart e from twins (junctions A of e and B of twins[e] marked dead in alive) and
 * smooth A and B: each one's two other walls become one. The record (DELETION_RECORD numbers at
 * records[r]) holds what puts the wall back. The caller has checked that the wall is deletable.
 */
export function deleteWallInto(twins: Int32Array, alive: Uint8Array, e: number, records: Int32Array, r: number): void {
  const t = twins[e];
  records[r + R_E] = e;
  records[r + R_T] = t;
  smoothInto(twins, e, records, r + R_A1);
  smoothInto(twins, t, records, r + R_B1);
  alive[(e / 3) | 0] = 0;
  alive[(t / 3) | 0] = 0;
}

// Smooth the junction of dart d (whose wall is being deleted): its other darts d1 = next(d), d2 =
// prev(d) and their twins (read now) into records[o .. o + 4), and the twins joined into one wall.
function smoothInto(twins: Int32Array, d: number, records: Int32Array, o: number): void {
  const d1 = d % 3 === 2 ? d - 2 : d + 1;
  const d2 = d % 3 === 0 ? d + 2 : d - 1;
  const x1 = twins[d1];
  const x2 = twins[d2];
  twins[x1] = x2;
  twins[x2] = x1;
  records[o] = d1;
  records[o + 1] = d2;
  records[o + 2] = x1;
  records[o + 3] = x2;
}
