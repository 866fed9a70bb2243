// Benchmark helpers: seeded PRNG, timing statistics, peak memory.

export { mulberry32 } from '../../src/random.ts';

/** min and mean ± std of a list of seconds, formatted. */
export function stats(seconds: number[]): string {
  const min = Math.min(...seconds);
  const mean = seconds.reduce((p, q) => p + q, 0) / seconds.length;
  const sd = Math.sqrt(seconds.reduce((p, q) => p + (q - mean) ** 2, 0) / Math.max(1, seconds.length - 1));
  return `min ${min.toFixed(3)} s, mean ${mean.toFixed(3)} ± ${sd.toFixed(3)} s`;
}

/** Track the peak resident set size (MiB) by sampling. */
export class PeakMemory {
  private peak = 0;
  private timer: NodeJS.Timeout;
  constructor() {
    this.timer = setInterval(() => this.sample(), 50);
    this.timer.unref();
  }
  sample(): void {
    this.peak = Math.max(this.peak, process.memoryUsage().rss);
  }
  /** Peak RSS so far in MiB (the maxRSS of the process, sampled). */
  mib(): number {
    this.sample();
    return Math.max(this.peak, process.resourceUsage().maxRSS * 1024) / 2 ** 20;
  }
}
