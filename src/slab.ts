// shared: small typed arrays carved out of large shared buffers.
//
// NOTE: on Node 20 `new Int32Array(n)` costs about 0.6 microseconds whatever n is (each one gets its
// own zeroed backing store), while a view on an existing buffer costs about 0.03. Code that makes a
// few small arrays per enumerated cluster or per relaxed candidate takes them from here instead.
// A view keeps its whole chunk alive, so use the slab for results that are dropped as a stream goes on.

const CHUNK_BYTES = 1 << 20;

let chunk = new ArrayBuffer(CHUNK_BYTES);
let offset = 0;

/** Reserve `bytes` (a multiple of 8) in the current chunk, starting a new chunk when it is full. */
function reserve(bytes: number): number {
  if (offset + bytes > CHUNK_BYTES) {
    chunk = new ArrayBuffer(Math.max(CHUNK_BYTES, bytes));
    offset = 0;
  }
  const at = offset;
  offset += bytes;
  return at;
}

/** A zero-filled Int32Array of length n from the slab. */
export function slabInt32(n: number): Int32Array {
  const at = reserve((4 * n + 7) & ~7);
  return new Int32Array(chunk, at, n);
}

/** A zero-filled Float64Array of length n from the slab. */
export function slabFloat64(n: number): Float64Array {
  const at = reserve(8 * n);
  return new Float64Array(chunk, at, n);
}

/** A copy of `source` in the slab. */
export function slabCopyInt32(source: Int32Array): Int32Array {
  const out = slabInt32(source.length);
  out.set(source);
  return out;
}
