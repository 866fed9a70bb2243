// Benchmark helpers: seeded PRNG, timing statistics, peak memory.

/** mulberry32: a small seeded PRNG returning floats in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

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
