// Benchmark: time and peak memory of full exhaustive ranks, equal areas n = 6, 7, 8 and distinct areas
// n = 4, 5, 6, with 1 and 2 workers. BENCH_RANK="equal-6 distinct-5" picks cases; BENCH_WORKERS="2" workers.
import { rankAreas } from '../../src/catalogue/rank.ts';
import { PeakMemory } from './common.ts';

const memory = new PeakMemory();
const all = ['equal-6', 'equal-7', 'equal-8', 'distinct-4', 'distinct-5', 'distinct-6'];
const cases = (process.env.BENCH_RANK ?? all.join(' ')).split(/\s+/).filter((c) => c !== '');
const workerCounts = (process.env.BENCH_WORKERS ?? '1 2').split(/\s+/).map(Number);
let sink = 0;
// warm up the solver and the enumerator
await rankAreas([1, 1, 1, 1, 1]);
for (const name of cases) {
  const [kind, size] = name.split('-');
  const n = Number(size);
  const areas = kind === 'equal' ? new Array(n).fill(1) : Array.from({ length: n }, (_, i) => 1 + 0.37 * i);
  for (const workers of workerCounts) {
    const t0 = performance.now();
    const c = await rankAreas(areas, { workers, budgetSeconds: 1e9 });
    const seconds = (performance.now() - t0) / 1000;
    sink += c.entries.length;
    const f = Object.entries(c.counts.failures).map(([k, v]) => `${v} ${k}`).join(', ');
    console.log(
      `${name} workers=${workers}: ${seconds.toFixed(2)} s, ${c.counts.arrangements} arrangements, ${c.counts.candidates} candidates, ` +
        `${(c.counts.tried / seconds).toFixed(0)} candidates/s, ${c.counts.equilibria} equilibria (${c.counts.stable} stable), failures: ${f} | ` +
        `best ${c.entries[0]?.perimeter?.toFixed(9)} | peak RSS ${memory.mib().toFixed(0)} MiB (main thread process)`,
    );
  }
}
console.log(`(sink ${sink})`);
