// Benchmark: reading committed catalogues back (JSON, schema, consistency and certificate re-checks),
// the time `lather show` and `lather draw` spend before their first line. BENCH_READ="equal-8" picks files.
import { readFileSync } from 'node:fs';
import { readCatalogue } from '../../src/catalogue/format.ts';
import { PeakMemory, stats } from './common.ts';

const memory = new PeakMemory();
const names = (process.env.BENCH_READ ?? 'equal-6 equal-7 equal-8 tray-six').split(/\s+/).filter((n) => n !== '');
let sink = 0;
for (const name of names) {
  const text = readFileSync(new URL(`../../catalogues/${name}.json`, import.meta.url), 'utf8');
  sink += readCatalogue(text, name).entries.length; // warm up (ajv compiles the schema once)
  const seconds: number[] = [];
  for (let r = 0; r < 5; r++) {
    const t0 = performance.now();
    const c = readCatalogue(text, name);
    seconds.push((performance.now() - t0) / 1000);
    sink += c.entries.length;
  }
  const entries = readCatalogue(text, name).entries.length;
  const min = Math.min(...seconds);
  console.log(
    `read ${name}.json (${(text.length / 2 ** 20).toFixed(1)} MiB, ${entries} entries): ${stats(seconds)}, ` +
      `${(entries / min).toFixed(0)} entries/s | peak RSS ${memory.mib().toFixed(0)} MiB`,
  );
}
console.log(`(sink ${sink})`);
