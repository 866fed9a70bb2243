// Benchmark: 100-sample log paths for four cells ("1, 1, 1, t") and five cells ("1, 1, 1, 1, t"), t = 0.05..20,
// with transitions and boundaries located; against 100 (four cells) or 10 (five cells, scaled) independent rankings.
import { rankAreas } from '../../src/catalogue/rank.ts';
import { parseAreaFormulas } from '../../src/sweep/formula.ts';
import { sweepPath } from '../../src/sweep/path.ts';
import { rangeSamples } from '../../src/sweep/domain.ts';
import { PeakMemory, stats } from './common.ts';

// targets on the reference machine (issue 5): four cells under 10 s, five cells under 60 s
const CASES = [
  { areas: '1, 1, 1, t', target: 10, repeats: 3, ranks: 100 },
  { areas: '1, 1, 1, 1, t', target: 60, repeats: 1, ranks: 10 },
];
const memory = new PeakMemory();
let sink = 0;
for (const { areas, target, repeats, ranks } of CASES) {
  const formulas = parseAreaFormulas(areas, ['t']);
  const domain = { kind: 'path' as const, parameter: { name: 't', from: 0.05, to: 20 }, samples: 100, log: true };
  const times: number[] = [];
  let last = sweepPath(formulas, { ...domain, samples: 5 }); // warm up
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    last = sweepPath(formulas, domain);
    times.push((performance.now() - t0) / 1000);
  }
  sink += last.transitions.length + last.boundaries.length;
  const k = last.counts.relaxations;
  // independent rankings at evenly spread samples of the same path, one worker
  const xs = rangeSamples(domain.parameter, ranks, true);
  const t1 = performance.now();
  for (const x of xs) sink += (await rankAreas(formulas.map((f) => f.value({ t: x })))).entries.length;
  const perRank = (performance.now() - t1) / 1000 / ranks;
  const best = Math.min(...times);
  console.log(
    `${formulas.length} cells "${areas}", 100 samples: ${stats(times)} (target < ${target} s: ${best < target ? 'met' : 'MISSED'}) | ` +
      `${last.counts.candidates} candidates, ${k.cold} cold + ${k.warm} warm + ${k.probe} probe relaxations, ` +
      `${last.transitions.length} transitions, ${last.boundaries.length} boundaries | ` +
      `100 independent rankings: ${(100 * perRank).toFixed(2)} s (${ranks} timed), ${((100 * perRank) / best).toFixed(1)}x the sweep | ` +
      `peak RSS ${memory.mib().toFixed(0)} MiB`,
  );
}
console.log(`(sink ${sink})`);
