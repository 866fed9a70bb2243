// Benchmarks: runs every tests/bench/*.bench.ts in its own process (so peak memory is its own).
// Usage: npm run bench [-- name ...]   e.g. npm run bench -- enumerate
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const wanted = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.includes(w)))
  .sort();
let failed = 0;
for (const file of files) {
  process.stdout.write(`\n## ${file}\n`);
  const r = spawnSync(process.execPath, ['--import', 'tsx', '--expose-gc', join(here, file)], { stdio: 'inherit' });
  if (r.status !== 0) failed++;
}
process.exitCode = failed === 0 ? 0 : 1;
