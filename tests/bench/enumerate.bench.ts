// Benchmark: maps and clusters per second for n = 8, 9, 10 (and 11 with BENCH_LARGE=1), peak memory.
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { countArrangements } from '../../src/maps/count.ts';
import { PeakMemory, stats } from './common.ts';

const memory = new PeakMemory();
const sizes = process.env.BENCH_LARGE ? [8, 9, 10, 11] : [8, 9, 10];
let sink = 0;
for (const n of sizes) {
  const repeats = n <= 9 ? 3 : 1;
  // warm up
  if (n <= 9) for (const c of enumerateClusters(n)) sink += c.symmetry;
  const mapTimes: number[] = [];
  const clusterTimes: number[] = [];
  let maps = 0;
  let clusters = 0;
  for (let r = 0; r < repeats; r++) {
    let t0 = performance.now();
    const counts = countArrangements(n);
    mapTimes.push((performance.now() - t0) / 1000);
    maps = counts.maps;
    t0 = performance.now();
    clusters = 0;
    for (const c of enumerateClusters(n)) {
      clusters++;
      sink += c.code.length;
    }
    clusterTimes.push((performance.now() - t0) / 1000);
  }
  const mapBest = Math.min(...mapTimes);
  const clusterBest = Math.min(...clusterTimes);
  console.log(
    `n=${n}: ${maps} maps, ${clusters} clusters | maps only (count): ${stats(mapTimes)}, ${(maps / mapBest).toFixed(0)} maps/s | ` +
      `every cluster with its code: ${stats(clusterTimes)}, ${(clusters / clusterBest).toFixed(0)} clusters/s | peak RSS ${memory.mib().toFixed(0)} MiB`,
  );
}
console.log(`(sink ${sink})`);
