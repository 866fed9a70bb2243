// Benchmark: the equal-area census (every arrangement of n cells at equal areas, ranked exhaustively) in
// arrangements per second at n = 8 (and n = 9 with BENCH_LARGE=1, about 3 minutes a run on 2 cores),
// with 1 and 2 workers, its outcomes by kind with their mean Newton iterations; then seconds per
// candidate of the n = 6 distinct-area ranking on a fixed sample of its arrangements (every
// DISTINCT_STRIDE-th, all of their assignments), against the budget's estimate secondsPerCandidate(6).
// BENCH_WORKERS="1" picks the worker counts.
import { evaluateCluster } from '../../src/catalogue/evaluate.ts';
import { planRanking, rankAreas, secondsPerCandidate } from '../../src/catalogue/rank.ts';
import { PeakMemory, stats } from './common.ts';

const memory = new PeakMemory();
const sizes = process.env.BENCH_LARGE ? [8, 9] : [8];
const workerCounts = (process.env.BENCH_WORKERS ?? '1 2').split(/\s+/).filter((w) => w !== '').map(Number);
// the distinct-area sample: every DISTINCT_STRIDE-th arrangement of n = 6 (263 in all), each with every
// assignment of the areas 1 + 0.37 i up to its symmetry, relaxed REPEATS times in this thread
const DISTINCT_STRIDE = 16;
const REPEATS = 3;
let sink = 0;

// warm up the solver and the enumerator
await rankAreas([1, 1, 1, 1, 1, 1], { workers: 1 });
for (const n of sizes) {
  const areas = new Array(n).fill(1);
  for (const workers of workerCounts) {
    const t0 = performance.now();
    const c = await rankAreas(areas, { workers, budgetSeconds: 1e9 });
    const seconds = (performance.now() - t0) / 1000;
    sink += c.entries.length;
    let okIterations = 0;
    let failIterations = 0;
    for (const e of c.entries) {
      if (e.status === 'ok') okIterations += e.iterations;
      else failIterations += e.iterations;
    }
    const failed = c.counts.tried - c.counts.equilibria;
    const f = Object.entries(c.counts.failures).map(([k, v]) => `${v} ${k}`).join(', ');
    console.log(
      `census n=${n} workers=${workers}: ${seconds.toFixed(1)} s, ${c.counts.arrangements} arrangements, ` +
        `${(c.counts.arrangements / seconds).toFixed(0)} arrangements/s | ${c.counts.equilibria} equilibria ` +
        `(mean iterations ${(okIterations / Math.max(1, c.counts.equilibria)).toFixed(1)}), failures ${failed}: ${f} ` +
        `(mean iterations ${(failIterations / Math.max(1, failed)).toFixed(1)}) | best ${c.entries[0]?.perimeter?.toFixed(9)} | ` +
        `peak RSS ${memory.mib().toFixed(0)} MiB (main thread process)`,
    );
  }
}

// seconds per candidate at n = 6 distinct areas, in this thread
const plan = planRanking(Array.from({ length: 6 }, (_, i) => 1 + 0.37 * i), { budgetSeconds: 1e9 });
const sample = plan.tasks.filter((_, k) => k % DISTINCT_STRIDE === 0);
const candidates = sample.reduce((p, t) => p + t.cap, 0);
for (const t of sample.slice(0, 4)) sink += evaluateCluster(t).length;
const times: number[] = [];
let ok = 0;
for (let r = 0; r < REPEATS; r++) {
  const t0 = performance.now();
  for (const t of sample) {
    for (const c of evaluateCluster(t)) if (r === 0 && c.equilibrium.status === 'ok') ok++;
  }
  times.push((performance.now() - t0) / 1000);
}
const best = Math.min(...times);
console.log(
  `distinct n=6 sample (${sample.length} of ${plan.tasks.length} arrangements, ${candidates} of ${plan.candidates} candidates): ` +
    `${stats(times)}, ${((1e3 * best) / candidates).toFixed(3)} ms per candidate (budget estimate ` +
    `${(1e3 * secondsPerCandidate(6)).toFixed(3)} ms), ${ok} equilibria | peak RSS ${memory.mib().toFixed(0)} MiB`,
);
console.log(`(sink ${sink})`);
