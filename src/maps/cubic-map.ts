// maps stage: a cubic plane map stored as darts (half-walls) in one Int32Array.
//
// Conventions, fixed project-wide:
//   - junction v owns darts 3v, 3v+1, 3v+2, listed counter-clockwise around v, so the rotation
//     sigma is arithmetic: next(e) = the next dart counter-clockwise around the same junction;
//   - twins[e] is alpha(e), the other half of e's wall (an involution with no fixed points);
//   - the face of dart e is the face on its LEFT; the next dart along that face is
//     faceNext(e) = prev(twins[e]) (that is sigma^-1 o alpha), so bounded faces are walked
//     counter-clockwise and the outside clockwise. Face orbits are those of alpha o sigma.
//   - faces are numbered by their smallest dart, so face 0 is the face of dart 0. In a cluster the
//     outside is the face of dart 0: face 0 is the outside and faces 1..n are cells 1..n.
//   - the single circle (one cell, no junctions) is the map with zero darts and two faces.
//
//        prev(e)            e leaves junction v; its face lies to its left
//          \      face(e)
//           v ------ e ------>
//          /      face(prev(e))
//        next(e) is counter-clockwise from e, so face(e) is the sector e..next(e)

import { MapError } from '../errors.ts';
import { slabInt32 } from '../slab.ts';

/** Next dart counter-clockwise around the same junction. */
export function next(e: number): number {
  return e % 3 === 2 ? e - 2 : e + 1;
}

/** Next dart clockwise around the same junction. */
export function prev(e: number): number {
  return e % 3 === 0 ? e + 2 : e - 1;
}

/** Junction that dart e leaves from. */
export function junctionOf(e: number): number {
  return (e / 3) | 0;
}

/**
 * A cubic plane map: every junction has three darts; faces are computed once at construction.
 * Instances are immutable; `twins` must not be changed after construction.
 */
export class CubicMap {
  /** alpha: twins[e] is the other dart of e's wall. Length 3 * junctionCount. */
  readonly twins: Int32Array;
  /** Number of junctions V. */
  readonly junctionCount: number;
  /** faceOf[e] is the face on the left of dart e. */
  readonly faceOf: Int32Array;
  /** Number of faces (cells plus the outside). */
  readonly faceCount: number;
  /** Darts of face f are faceDarts[faceStarts[f] .. faceStarts[f + 1]), in walking order, smallest first. */
  readonly faceStarts: Int32Array;
  /** Darts of all faces, face by face; see faceStarts. */
  readonly faceDarts: Int32Array;

  /**
   * Wrap a twins array. Checks only that it is a fixed-point-free involution on 3V darts (skipped when
   * `trusted`, for arrays made by this library); use validateCluster for the full admissibility check.
   * @throws MapError when twins is not an involution on its darts.
   */
  constructor(twins: Int32Array, trusted = false) {
    const m = twins.length;
    if (!trusted) checkInvolution(twins);
    this.twins = twins;
    this.junctionCount = m / 3;
    const faceOf = slabInt32(m).fill(-1);
    const faceDarts = slabInt32(m);
    // NOTE: a map has at most m faces (each owns a dart), plus two for the circle's special case
    const starts = slabInt32(m + 3);
    let f = 0;
    let k = 0;
    for (let e0 = 0; e0 < m; e0++) {
      if (faceOf[e0] !== -1) continue;
      // walk the face on the left of e0
      let e = e0;
      do {
        faceOf[e] = f;
        faceDarts[k++] = e;
        const t = twins[e];
        e = t % 3 === 0 ? t + 2 : t - 1;
      } while (e !== e0);
      starts[++f] = k;
    }
    // Is this the circle (no junctions)? It has an inside and an outside.
    if (m === 0) f = 2;
    this.faceOf = faceOf;
    this.faceCount = f;
    this.faceStarts = starts.subarray(0, f + 1);
    this.faceDarts = faceDarts;
  }

  /** Number of walls E = 3V/2 (zero for the circle, which has one wall and no junctions). */
  get wallCount(): number {
    return this.twins.length / 2;
  }

  /** Number of darts on face f (its side count); 1 for each face of the circle. */
  faceSize(f: number): number {
    if (this.twins.length === 0) return 1;
    return this.faceStarts[f + 1] - this.faceStarts[f];
  }

  /** The other half of dart e's wall. */
  twin(e: number): number {
    return this.twins[e];
  }

  /** Next dart along the face on the left of e. */
  faceNext(e: number): number {
    return prev(this.twins[e]);
  }

  /** Junction that dart e points to. */
  headOf(e: number): number {
    return (this.twins[e] / 3) | 0;
  }

  /** The wall of dart e, numbered 0..E-1 by the smaller of its two darts' rank; see wallIndex(). */
  wallIndex(): Int32Array {
    const m = this.twins.length;
    const walls = new Int32Array(m);
    let k = 0;
    for (let e = 0; e < m; e++) {
      const t = this.twins[e];
      if (e < t) {
        walls[e] = k;
        walls[t] = k;
        k++;
      }
    }
    return walls;
  }
}

/** @throws MapError when twins is not a fixed-point-free involution on a multiple of 3 darts. */
function checkInvolution(twins: Int32Array): void {
  const m = twins.length;
  if (m % 3 !== 0) throw new MapError(`Map has ${m} darts when expected a multiple of 3.`);
  for (let e = 0; e < m; e++) {
    const t = twins[e];
    if (!(t >= 0 && t < m) || twins[t] !== e || t === e) {
      throw new MapError(`Dart ${e} has twin ${t} when expected an involution without fixed points.`);
    }
  }
}

/** The theta graph: two junctions joined by three walls (the double bubble's map). */
export function thetaMap(): CubicMap {
  // dart 3+k pairs with dart of the same wall; junction 1 lists them clockwise as seen from 0
  return new CubicMap(Int32Array.from([3, 5, 4, 0, 2, 1]));
}

/** The circle: one cell, no junctions. */
export function circleMap(): CubicMap {
  return new CubicMap(new Int32Array(0));
}
