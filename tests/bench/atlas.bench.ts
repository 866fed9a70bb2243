// Benchmark: lather atlas, samples per second for four and five cells, with and without warm starts from the
// nearest solved sample, on one worker and on two; the target is 10,000 samples of four cells in
// under 10 minutes with 2 workers (and 1,000 samples of five cells). BENCH_LARGE=1 runs more samples.
import { runAtlas } from '../../src/atlas/atlas.ts';
import { PeakMemory, stats } from './common.ts';

const large = process.env.BENCH_LARGE === '1';
const CASES = [
  { cells: 4, samples: large ? 1000 : 128, workers: [1, 2], cold: true, target: { samples: 10000, seconds: 600 } },
  { cells: 5, samples: large ? 64 : 8, workers: [1], cold: false, target: { samples: 1000, seconds: null } },
];
const memory = new PeakMemory();
let sink = 0;
await runAtlas({ cells: 4, samples: 4, maxBoundaries: 0 }); // warm up
for (const { cells, samples, workers, cold, target } of CASES) {
  const runs: { label: string; warmStart: boolean; workers: number }[] = [
    ...workers.map((w) => ({ label: `rank's own starts, ${w} worker${w > 1 ? 's' : ''}`, warmStart: false, workers: w })),
    ...(cold ? [{ label: 'warm from the nearest solved sample, 1 worker', warmStart: true, workers: 1 }] : []),
  ];
  for (const run of runs) {
    const t0 = performance.now();
    const a = await runAtlas({ cells, samples, warmStart: run.warmStart, workers: run.workers, maxBoundaries: 0 });
    const seconds = (performance.now() - t0) / 1000;
    sink += a.classes.length;
    const rate = samples / seconds;
    const projected = target.samples / rate;
    console.log(
      `${cells} cells, ${samples} samples, ${run.label}: ${stats([seconds])}, ${rate.toFixed(2)} samples/s, ` +
        `${a.candidates} candidates per sample, warm-start share ${(100 * a.warmShare).toFixed(1)}%; ` +
        `${target.samples} samples would take ${(projected / 60).toFixed(1)} min` +
        (target.seconds === null ? '' : ` (target ${target.seconds / 60} min with 2 workers)`),
    );
  }
}
console.log(`peak RSS ${memory.mib().toFixed(0)} MiB (sink ${sink})`);
