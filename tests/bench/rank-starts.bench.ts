// Benchmark: the search for every equilibrium (solver/equilibria.ts findEquilibria) against one
// relaxation per candidate (relax(), today's ranking), over the candidates a ranking relaxes, in one
// run: equal areas n = 6, 7 (8 with BENCH_LARGE=1) and distinct areas n = 5, each candidate warm from
// the cluster's previous certified answer as the ranking does (catalogue/evaluate.ts). Then the search
// with saddles (`unstable`) at equal areas n = 5, 6: time, saddles found and their indices. Times are
// the least of three runs taken in turn; Newton iterations, which do not depend on the machine's load,
// are counted too.
// BENCH_STARTS="equal-6 distinct-5" picks the cases of the first part. Run: npm run bench -- rank
import { areaClasses, areasOf, orbitAssignments } from '../../src/catalogue/assign.ts';
import { cellPermutations, enumerateClusters } from '../../src/maps/cluster.ts';
import { findEquilibria } from '../../src/solver/equilibria.ts';
import { relax, relaxFrom } from '../../src/solver/newton.ts';
import type { Equilibrium } from '../../src/solver/result.ts';
import type { CubicMap } from '../../src/maps/cubic-map.ts';

interface Candidate {
  map: CubicMap;
  /** Areas of each candidate of the cluster, in the ranking's order. */
  areas: Float64Array[];
}

function candidatesOf(areas: number[]): Candidate[] {
  const classes = areaClasses(areas);
  const out: Candidate[] = [];
  for (const c of enumerateClusters(areas.length)) {
    const group = cellPermutations(c);
    out.push({ map: c.map, areas: [...orbitAssignments(classes, group)].map((s) => areasOf(s, classes)) });
  }
  return out;
}

// One relaxation per candidate, warm from the cluster's previous certified answer: certified count and
// Newton iterations.
function today(candidates: Candidate[]): { found: number; iterations: number } {
  let found = 0;
  let iterations = 0;
  for (const { map, areas } of candidates) {
    let previous: Equilibrium | null = null;
    for (const a of areas) {
      const eq: Equilibrium = previous === null ? relax(map, a) : relaxFrom(map, a, previous);
      iterations += eq.iterations;
      if (eq.status === 'ok') {
        found++;
        previous = eq;
      }
    }
  }
  return { found, iterations };
}

// The search per candidate, warm the same way: equilibria found, saddles among them, and the indices.
function search(
  candidates: Candidate[], unstable: boolean,
): { found: number; saddles: number; indices: Map<number, number>; arrangements: number; iterations: number } {
  let found = 0;
  let iterations = 0;
  let saddles = 0;
  let arrangements = 0;
  const indices = new Map<number, number>();
  for (const { map, areas } of candidates) {
    let previous: Equilibrium | null = null;
    let withSaddle = false;
    for (const a of areas) {
      const s = findEquilibria(map, a, { unstable }, previous);
      found += s.found.length;
      iterations += s.iterations;
      for (const f of s.found) {
        const index = f.equilibrium.index as number;
        if (index > 0) {
          saddles++;
          withSaddle = true;
          indices.set(index, (indices.get(index) ?? 0) + 1);
        }
      }
      if (s.found.length > 0) previous = s.found[0].equilibrium;
    }
    if (withSaddle) arrangements++;
  }
  return { found, saddles, indices, arrangements, iterations };
}

function timed<T>(f: () => T): [T, number] {
  const t0 = performance.now();
  const value = f();
  return [value, (performance.now() - t0) / 1000];
}

// The least time of REPEATS runs of each, taken in turn (a shared machine's load falls on both alike).
const REPEATS = 3;

const all = ['equal-6', 'equal-7', 'distinct-5', ...(process.env.BENCH_LARGE ? ['equal-8'] : [])];
const cases = (process.env.BENCH_STARTS ?? all.join(' ')).split(/\s+/).filter((c) => c !== '');
const areasFor = (name: string): number[] => {
  const [kind, size] = name.split('-');
  const n = Number(size);
  return kind === 'equal' ? new Array(n).fill(1) : Array.from({ length: n }, (_, i) => 1 + 0.37 * i);
};
// warm up the solver
today(candidatesOf([1, 1, 1, 1, 1]));
search(candidatesOf([1, 1, 1, 1, 1]), false);
for (const name of cases) {
  const candidates = candidatesOf(areasFor(name));
  const count = candidates.reduce((s, c) => s + c.areas.length, 0);
  let before = Infinity;
  let seconds = Infinity;
  let ok = { found: 0, iterations: 0 };
  let after = { found: 0, iterations: 0 };
  for (let r = 0; r < REPEATS; r++) {
    const [a, t1] = timed(() => today(candidates));
    const [b, t2] = timed(() => search(candidates, false));
    ok = a;
    after = b;
    before = Math.min(before, t1);
    seconds = Math.min(seconds, t2);
  }
  console.log(
    `${name}: ${count} candidates; relax ${before.toFixed(2)} s, ${ok.iterations} iterations (${ok.found} certified); ` +
      `findEquilibria default ${seconds.toFixed(2)} s, ${after.iterations} iterations (${after.found} equilibria); ` +
      `ratio ${(seconds / before).toFixed(2)} in time, ${(after.iterations / ok.iterations).toFixed(2)} in iterations (min of ${REPEATS})`,
  );
}
for (const name of ['equal-5', 'equal-6']) {
  const candidates = candidatesOf(areasFor(name));
  const [r, seconds] = timed(() => search(candidates, true));
  const indices = [...r.indices].sort((a, b) => a[0] - b[0]).map(([i, c]) => `${c} of index ${i}`).join(', ');
  console.log(
    `${name} --unstable: ${seconds.toFixed(2)} s, ${r.found} equilibria, ${r.saddles} saddles in ${r.arrangements} arrangements` +
      `${indices === '' ? '' : ` (${indices})`}`,
  );
}
