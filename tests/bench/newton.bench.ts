// Benchmark: relax() answers per second from a cold start (a first drawing, no previous answer) for
// n = 4, 6, 8, 10, equal and random areas, and equal areas with random wall tensions in [0.6, 1.6]
// (drawn again until every junction can balance them, so that each answer is a relaxation), and equal
// areas with every tension 1.3 (the shapes of unit tension through the weighted kernel); certified equilibria and named failures counted apart, with
// their mean Newton iterations, the answers that began again from a second drawing, peak memory; then
// the census of every arrangement with n <= 7 at equal areas. Run: npx tsx tests/bench/newton.bench.ts
import { enumerateClusters } from '../../src/maps/cluster.ts';
import type { CubicMap } from '../../src/maps/cubic-map.ts';
import { relax } from '../../src/solver/newton.ts';
import { certificatePasses, checkEquilibrium } from '../../src/solver/certificate.ts';
import { PeakMemory, mulberry32, stats } from './common.ts';

// clusters per size: all for n <= 6; every STRIDE-th of the first ones for larger n (enumeration order)
const SAMPLE: Record<number, { count: number; stride: number }> = {
  4: { count: 10, stride: 1 },
  6: { count: 263, stride: 1 },
  8: { count: 300, stride: 37 },
  10: { count: 150, stride: 401 },
};
const REPEATS = 5;

function sample(n: number): CubicMap[] {
  const { count, stride } = SAMPLE[n];
  const out: CubicMap[] = [];
  let i = 0;
  for (const c of enumerateClusters(n)) {
    if (i++ % stride === 0) out.push(c.map);
    if (out.length === count) break;
  }
  return out;
}

// Wall tensions uniform in [0.6, 1.6], drawn again until no junction has one at least the sum of the
// other two (a junction that cannot balance is told before relaxing, which would not measure a relaxation).
function balancedTensions(map: CubicMap, random: () => number): Float64Array {
  const wallOf = map.wallIndex();
  const tensions = new Float64Array(map.twins.length / 2);
  for (;;) {
    for (let k = 0; k < tensions.length; k++) tensions[k] = 0.6 + random();
    let balanced = true;
    for (let v = 0; v < map.junctionCount; v++) {
      const [a, b, c] = [tensions[wallOf[3 * v]], tensions[wallOf[3 * v + 1]], tensions[wallOf[3 * v + 2]]];
      if (a >= b + c || b >= a + c || c >= a + b) balanced = false;
    }
    if (balanced) return tensions;
  }
}

/** Run the benchmark and print its table; returns the sink so the work cannot be optimised away. */
export function run(): number {
  const memory = new PeakMemory();
  let sink = 0;
  // warm up the compiled code on every size first (the first sizes timed would otherwise pay for it)
  for (const n of [4, 6, 8, 10]) {
    for (const map of sample(n).slice(0, 40)) sink += relax(map, new Float64Array(n).fill(1)).iterations;
  }
  for (const n of [4, 6, 8, 10]) {
    const maps = sample(n);
    const random = mulberry32(1000 + n);
    const families = (['equal', 'random', 'tension', 'scaled'] as const).map((family) => {
      const areas = maps.map(() => Float64Array.from({ length: n }, () => (family === 'random' ? 1 + 9 * random() : 1)));
      // 'scaled': every wall 1.3, the same shapes as 'equal' through the weighted kernel (its cost alone)
      const options = maps.map((map) =>
        family === 'tension' ? { tensions: balancedTensions(map, random) }
          : family === 'scaled' ? { tensions: new Float64Array(map.twins.length / 2).fill(1.3) } : {});
      // warm up (the workspaces and the compiled code, not the answers: every call starts cold)
      for (let i = 0; i < maps.length; i++) sink += relax(maps[i], areas[i], options[i]).iterations;
      return {
        family, areas, options, times: [] as number[], kinds: {} as Record<string, number>, okIterations: 0, failIterations: 0, restarts: 0,
      };
    });
    // the families take turns within each repeat, so that a change in the machine's load falls on all of them
    for (let rep = 0; rep < REPEATS; rep++) {
      for (const f of families) {
        const t0 = performance.now();
        for (let i = 0; i < maps.length; i++) {
          const r = relax(maps[i], f.areas[i], f.options[i]);
          sink += r.energy;
          if (rep === 0) {
            f.kinds[r.status] = (f.kinds[r.status] ?? 0) + 1;
            if (r.status === 'ok') f.okIterations += r.iterations;
            else f.failIterations += r.iterations;
            f.restarts += r.restarts;
          }
        }
        f.times.push((performance.now() - t0) / 1000);
      }
    }
    for (const { family, times, kinds, okIterations, failIterations, restarts } of families) {
      const best = Math.min(...times);
      const ok = kinds.ok ?? 0;
      const failed = maps.length - ok;
      const failures = Object.entries(kinds)
        .filter(([k]) => k !== 'ok')
        .map(([k, v]) => `${k} ${v}`)
        .join(', ');
      console.log(
        `n=${n} ${family.padEnd(7)} ${maps.length} clusters: ${(maps.length / best).toFixed(0)} answers/s, ` +
          `${((okIterations + failIterations) / best).toFixed(0)} Newton iterations/s ` +
          `(${stats(times)}), certified ${ok} (mean iterations ${ok ? (okIterations / ok).toFixed(1) : '-'}), ` +
          `failures ${failed}: ${failures || 'none'} (mean iterations ${failed ? (failIterations / failed).toFixed(1) : '-'}), ` +
          `second drawings ${restarts}`,
      );
    }
  }
  // census: every arrangement with n <= 7 at equal areas
  let total = 0;
  let stuck = 0;
  for (let n = 2; n <= 7; n++) {
    const kinds: Record<string, number> = {};
    let recheck = 0;
    let best = Infinity;
    const areas = new Float64Array(n).fill(1);
    const t0 = performance.now();
    let count = 0;
    for (const c of enumerateClusters(n)) {
      const r = relax(c.map, areas);
      kinds[r.status] = (kinds[r.status] ?? 0) + 1;
      if (r.status === 'ok') {
        best = Math.min(best, r.perimeter);
        if (!certificatePasses(checkEquilibrium(c.map, areas, r), 1e-10)) recheck++;
      }
      count++;
    }
    total += count;
    stuck += kinds['no-convergence'] ?? 0;
    const seconds = (performance.now() - t0) / 1000;
    console.log(
      `census n=${n}: ${count} arrangements in ${seconds.toFixed(2)} s: ${JSON.stringify(kinds)}, ` +
        `best perimeter ${best.toFixed(9)}, ok answers failing the independent re-check: ${recheck}`,
    );
  }
  console.log(`census n<=7: no-convergence ${stuck} of ${total} (${((100 * stuck) / total).toFixed(2)}%)`);
  console.log(`peak memory ${memory.mib().toFixed(0)} MiB (sink ${sink.toExponential(3)})`);
  return sink;
}

run();
