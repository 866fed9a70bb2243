// maps stage: the faces of a twins array, walked counter-clockwise (the next dart along a face is
// prev(twins[e])), for maps that are being built or taken apart (a CubicMap computes its own once).

/**
 * Number the faces of the darts 0 .. darts of `twins` into faceOf (the face on the left of each dart,
 * in order of its smallest dart) and their side counts into faceSize; returns the face count. With
 * `alive`, only the darts of junctions v with alive[v] = 1 are walked (the others get -1).
 */
export function facesInto(
  twins: Int32Array, darts: number, faceOf: Int32Array, faceSize: Int32Array, alive: Uint8Array | null,
): number {
  faceOf.fill(-1, 0, darts);
  let f = 0;
  for (let e0 = 0; e0 < darts; e0++) {
    if (faceOf[e0] !== -1 || (alive !== null && !alive[(e0 / 3) | 0])) continue;
    let e = e0;
    let size = 0;
    do {
      faceOf[e] = f;
      size++;
      const t = twins[e];
      e = t % 3 === 0 ? t + 2 : t - 1; // prev(twin(e)), inlined: imported calls are slow under tsx
    } while (e !== e0 && size <= darts);
    faceSize[f++] = size;
  }
  return f;
}
