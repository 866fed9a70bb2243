// Benchmark: how long the installed program takes to start, as a ratio to a bare `node -e 0` measured in
// the same run (medians of several runs), and how long a worker thread of the rank pool takes to be ready.
// Targets: `lather --version` and `lather list 3` under 3x; a worker ready in under 0.2 s.
// Measures the compiled program in dist/ (built first, as `npm ci` and `npm pack` build it).
// Usage: npm run bench -- startup    (STARTUP_RUNS=n to change the number of runs, default 15)
import { execFileSync, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../..', import.meta.url));
execFileSync('npm', ['run', '--silent', 'build'], { cwd: root, stdio: 'inherit' });
const bin = fileURLToPath(new URL('../../dist/cli/lather.js', import.meta.url));
const runs = Number(process.env.STARTUP_RUNS ?? 15);

/** Median wall time (seconds) of `node ...args`, output discarded. */
function median(args: string[]): number {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, args, { stdio: ['ignore', 'ignore', 'inherit'] });
    times.push((performance.now() - t0) / 1000);
    if (r.status !== 0) throw new Error(`node ${args.join(' ')} exited with ${r.status}`);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

const bare = median(['-e', '0']);
console.log(`node -e 0              median ${bare.toFixed(3)} s (${runs} runs)`);
let failed = false;
for (const args of [['--version'], ['list', '3'], ['--help'], ['rank', '--areas', '1,2,3']]) {
  const t = median([bin, ...args]);
  const ratio = t / bare;
  const target = args[0] === '--version' || args[0] === 'list';
  if (target && ratio >= 3) failed = true;
  console.log(`lather ${args.join(' ').padEnd(16)} median ${t.toFixed(3)} s = ${ratio.toFixed(2)}x bare node${target ? ' (target < 3x)' : ''}`);
}

// a worker of the rank pool: from creating the pool to the answer of an empty batch
const worker = new URL('../../dist/catalogue/worker.js', import.meta.url).href;
const { Piscina } = await import('piscina');
const ready: number[] = [];
for (let i = 0; i < Math.min(runs, 7); i++) {
  const t0 = performance.now();
  // execArgv: [] as the compiled program has it (this benchmark itself runs under tsx)
  const pool = new Piscina({ filename: worker, minThreads: 1, maxThreads: 1, execArgv: [] });
  await pool.run([]);
  ready.push((performance.now() - t0) / 1000);
  await pool.destroy();
}
ready.sort((a, b) => a - b);
const workerReady = ready[Math.floor(ready.length / 2)];
if (workerReady >= 0.2) failed = true;
console.log(`worker thread ready    median ${workerReady.toFixed(3)} s (target < 0.2 s)`);
process.exitCode = failed ? 1 : 0;
