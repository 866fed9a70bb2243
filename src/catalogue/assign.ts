// catalogue stage: the ways of giving a list of areas to a cluster's cells, up to the cluster's symmetry.
//
// Areas are grouped into classes of equal value (class 0 = largest area). An assignment is a sequence
// of class ids, one per cell; a symmetry g of the cluster sends sequence s to s' with s'[g(i)] = s[i].
// The representative of an orbit is its lexicographically smallest sequence, so equal areas collapse
// to one candidate and all-distinct areas give n!/|symmetry action on the cells| of them. With cell
// types (walls of different tension) a class is an area and a type: cells of one type with equal areas
// are one class, equal areas of two types are two.

/** The user's areas grouped into classes of equal value (and equal type, when typed). */
export interface AreaClasses {
  /** The value of each class, largest first (then by type). */
  values: number[];
  /** The type of each class (an index into a TensionTable's labels), when the cells are typed. */
  types?: number[];
  /** How many areas fall in each class. */
  multiplicity: number[];
  /** Class id of each of the user's areas, in the user's order. */
  classOf: number[];
}

/**
 * Group areas into classes of exactly equal value, largest first; with `types` (one type index per
 * area) of equal value and equal type, by value then type.
 */
export function areaClasses(areas: readonly number[], types?: readonly number[]): AreaClasses {
  if (types === undefined) {
    const values = [...new Set(areas)].sort((a, b) => b - a);
    const classOf = areas.map((a) => values.indexOf(a));
    const multiplicity = values.map((_, k) => classOf.filter((c) => c === k).length);
    return { values, multiplicity, classOf };
  }
  const keys = [...new Map(areas.map((a, i) => [`${a}|${types[i]}`, [a, types[i]] as const])).values()]
    .sort((x, y) => y[0] - x[0] || x[1] - y[1]);
  const classOf = areas.map((a, i) => keys.findIndex(([v, t]) => v === a && t === types[i]));
  const multiplicity = keys.map((_, k) => classOf.filter((c) => c === k).length);
  return { values: keys.map(([v]) => v), types: keys.map(([, t]) => t), multiplicity, classOf };
}

/** The type of each cell of a class sequence (all 1 when the classes are untyped). */
export function typesOf(s: ArrayLike<number>, classes: AreaClasses): Int32Array {
  const out = new Int32Array(s.length).fill(1);
  if (classes.types !== undefined) for (let i = 0; i < s.length; i++) out[i] = classes.types[s[i]];
  return out;
}

/** n! / prod(m_k!): the number of labelled assignments of the classes to n cells. */
export function labelledAssignmentCount(classes: AreaClasses): number {
  let n = 0;
  let r = 1;
  for (const m of classes.multiplicity) {
    for (let i = 1; i <= m; i++) {
      n++;
      r = (r * n) / i;
    }
  }
  return Math.round(r);
}

/** Whether `s` is the smallest sequence of its orbit under the cell permutations `group` (rows 0-based or 1-based, see below). */
export function isOrbitMinimal(s: Int32Array, group: Int32Array[], scratch: Int32Array): boolean {
  const n = s.length;
  for (let k = 1; k < group.length; k++) {
    const g = group[k];
    // image: cell i's class moves to cell g(i) (rows hold 1-based cell numbers)
    for (let i = 0; i < n; i++) scratch[g[i] - 1] = s[i];
    for (let i = 0; i < n; i++) {
      if (scratch[i] < s[i]) return false;
      if (scratch[i] > s[i]) break;
    }
  }
  return true;
}

/**
 * Every orbit representative, in lexicographic order of the class sequences (multiset permutations
 * in lexicographic order, each kept when orbit-minimal). The yielded array is reused: copy it to keep it.
 */
export function* orbitAssignments(classes: AreaClasses, group: Int32Array[]): Generator<Int32Array> {
  const n = classes.classOf.length;
  const s = new Int32Array(n);
  let p = 0;
  classes.multiplicity.forEach((m, k) => {
    for (let i = 0; i < m; i++) s[p++] = k;
  });
  const scratch = new Int32Array(n);
  for (;;) {
    if (isOrbitMinimal(s, group, scratch)) yield s;
    // next multiset permutation in lexicographic order
    let i = n - 2;
    while (i >= 0 && s[i] >= s[i + 1]) i--;
    if (i < 0) return;
    let j = n - 1;
    while (s[j] <= s[i]) j--;
    [s[i], s[j]] = [s[j], s[i]];
    for (let a = i + 1, b = n - 1; a < b; a++, b--) [s[a], s[b]] = [s[b], s[a]];
  }
}

/** Orbit representative of any sequence (the smallest image under the group). */
export function orbitRepresentative(s: Int32Array, group: Int32Array[]): Int32Array {
  const n = s.length;
  let best = Int32Array.from(s);
  const img = new Int32Array(n);
  for (let k = 1; k < group.length; k++) {
    const g = group[k];
    for (let i = 0; i < n; i++) img[g[i] - 1] = s[i];
    for (let i = 0; i < n; i++) {
      if (img[i] < best[i]) {
        best = Int32Array.from(img);
        break;
      }
      if (img[i] > best[i]) break;
    }
  }
  return best;
}

/**
 * For a class sequence, which of the user's areas sits in each cell: result[i] is an index into the
 * user's list for cell i + 1 (equal areas are given out in the user's order).
 */
export function userIndices(s: Int32Array, classes: AreaClasses): number[] {
  const pools = classes.values.map(() => [] as number[]);
  classes.classOf.forEach((c, idx) => pools[c].push(idx));
  const used = classes.values.map(() => 0);
  return [...s].map((c) => pools[c][used[c]++]);
}

/** The cell areas of a class sequence. */
export function areasOf(s: Int32Array, classes: AreaClasses): Float64Array {
  const out = new Float64Array(s.length);
  for (let i = 0; i < s.length; i++) out[i] = classes.values[s[i]];
  return out;
}

/**
 * Exact number of orbit representatives (Burnside's lemma): the mean over the group of the number of
 * class sequences each permutation fixes (constant on its cycles).
 */
export function orbitCount(classes: AreaClasses, group: Int32Array[]): number {
  let total = 0;
  for (const g of group) total += fixedCount(cycleLengths(g), classes.multiplicity);
  return Math.round(total / group.length);
}

function cycleLengths(g: Int32Array): number[] {
  const n = g.length;
  const seen = new Uint8Array(n);
  const lengths: number[] = [];
  for (let i = 0; i < n; i++) {
    if (seen[i]) continue;
    let len = 0;
    for (let j = i; !seen[j]; j = g[j] - 1) {
      seen[j] = 1;
      len++;
    }
    lengths.push(len);
  }
  return lengths;
}

/** Ways to colour the cycles so that class k gets exactly multiplicity[k] cells. */
function fixedCount(cycles: number[], multiplicity: number[]): number {
  const memo = new Map<string, number>();
  const go = (c: number, left: number[]): number => {
    if (c === cycles.length) return left.every((x) => x === 0) ? 1 : 0;
    const key = `${c}|${left.join(',')}`;
    const hit = memo.get(key);
    if (hit !== undefined) return hit;
    let sum = 0;
    for (let k = 0; k < left.length; k++) {
      if (left[k] >= cycles[c]) {
        left[k] -= cycles[c];
        sum += go(c + 1, left);
        left[k] += cycles[c];
      }
    }
    memo.set(key, sum);
    return sum;
  };
  return go(0, [...multiplicity]);
}
