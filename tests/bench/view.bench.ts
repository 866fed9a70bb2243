// Benchmark: the viewer page of catalogues/equal-8.json (15069 entries): reading the catalogue (schema
// checked), the entries' facts (codes decoded, shortest walls, T1 swaps) and the page text, and the
// relaxations the page's sliders run (relax() of certified entries at the same areas moved by 10%).
import { readFileSync } from 'node:fs';
import { readCatalogue } from '../../src/catalogue/format.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { relax } from '../../src/solver/newton.ts';
import { entryFacts } from '../../src/view/facts.ts';
import { renderViewPage } from '../../src/view/page.ts';
import { PeakMemory, stats } from './common.ts';

const memory = new PeakMemory();
let sink = 0;
const text = readFileSync(new URL('../../catalogues/equal-8.json', import.meta.url), 'utf8');
const catalogue = readCatalogue(text); // warm up (schema compiled)
const phases: Record<string, number[]> = { read: [], facts: [], page: [] };
for (let r = 0; r < 3; r++) {
  let t = performance.now();
  sink += readCatalogue(text).entries.length;
  phases.read.push((performance.now() - t) / 1000);
  t = performance.now();
  sink += entryFacts(catalogue.entries).length;
  phases.facts.push((performance.now() - t) / 1000);
  t = performance.now();
  sink += renderViewPage(catalogue, '', 'equal-8.json').length;
  phases.page.push((performance.now() - t) / 1000);
}
console.log(
  `equal-8 page (${catalogue.entries.length} entries): read ${stats(phases.read)} | facts ${stats(phases.facts)} | ` +
    `facts and page text ${stats(phases.page)}`,
);

// the sliders: every certified entry of equal-8 relaxed with its first cell 10% larger
const certified = catalogue.entries.filter((e) => e.status === 'ok');
const maps = certified.map((e) => clusterFromCode(e.code).map);
const times: number[] = [];
for (let r = 0; r < 3; r++) {
  const t = performance.now();
  for (let i = 0; i < certified.length; i++) {
    const areas = Float64Array.from(certified[i].cellAreas);
    areas[0] *= 1.1;
    sink += relax(maps[i], areas).perimeter;
  }
  times.push((performance.now() - t) / 1000 / certified.length);
}
console.log(`slider relaxations, 8 cells (${certified.length} entries): per relaxation ${stats(times.map((s) => s * 1000)).replace(/ s/g, ' ms')} | peak RSS ${memory.mib().toFixed(0)} MiB`);
console.log(`(sink ${sink})`);
