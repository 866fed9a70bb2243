// catalogue stage: rank every arrangement of n cells at given areas into a catalogue.
//
// enumerate (maps) -> filter -> candidates up to symmetry (assign.ts) -> relax (evaluate.ts, on worker
// threads when asked) -> total order: perimeter, then code, then assignment -> catalogue.

import { availableParallelism } from 'node:os';
import { eventLoopTurns } from '../event-loop.ts';
import { cellPermutations, enumerateClusters, type Cluster } from '../maps/cluster.ts';
import { summarizeCluster } from '../maps/describe.ts';
import { rootedMapCount } from '../maps/count.ts';
import { UsageError } from '../errors.ts';
import type { NewtonOptions } from '../solver/options.ts';
import { type AreaClasses, areaClasses, orbitCount, userIndices } from './assign.ts';
import { type CandidateResult, type ClusterTask, evaluateCluster } from './evaluate.ts';
import { type ArrangementFilter, passesFilter } from './filter.ts';
import {
  CATALOGUE_FORMAT, CATALOGUE_VERSION, type Catalogue, type CatalogueEntry,
} from './types.ts';

/** Most cells rank accepts without `large`. */
export const RANK_LIMIT = 9;

/** Options of rankAreas(). */
export interface RankOptions {
  /** Which arrangements to consider. @default {} (all) */
  filter?: ArrangementFilter;
  /**
   * Work allowed before the ranking switches from exhaustive to search, in seconds on one core of the
   * reference machine (candidates times secondsPerCandidate): it depends on the query alone. @default 60
   */
  budgetSeconds?: number;
  /** Worker threads (1 = run in this thread). @default 1 */
  workers?: number;
  /** Seed of the search's random starts. @default 1 */
  seed?: number;
  /** Allow more than RANK_LIMIT cells. @default false */
  large?: boolean;
  /** Called with (candidates done, candidates planned) as work completes. */
  onProgress?: (done: number, total: number) => void;
  /** Options of the relaxer. */
  newton?: NewtonOptions;
}

/**
 * Seconds one worker needs per candidate at n cells, from the relaxer benchmark on the reference
 * machine (tests/bench/newton.bench.ts), rounded up.
 */
export function secondsPerCandidate(cells: number): number {
  return 2e-4 * Math.pow(Math.max(cells, 2) / 4, 2.5);
}

/** Check the areas of a query. @throws UsageError naming the bad value. */
export function checkAreas(areas: readonly number[], large = false): void {
  if (areas.length < 1) throw new UsageError('No areas given when expected at least one positive area.');
  areas.forEach((a, i) => {
    if (!(typeof a === 'number' && Number.isFinite(a) && a > 0)) {
      throw new UsageError(`Area ${i + 1} is ${a} when expected a positive finite number.`);
    }
  });
  if (areas.length > RANK_LIMIT && !large) {
    const clusters = estimateClusters(areas.length);
    const seconds = clusters * secondsPerCandidate(areas.length);
    throw new UsageError(
      `${areas.length} cells is above ${RANK_LIMIT} when expected at most ${RANK_LIMIT} without --large ` +
        `(about ${clusters.toPrecision(3)} arrangements, at least ${Math.ceil(seconds / 60)} minutes of relaxing on one core).`,
    );
  }
}

function estimateClusters(n: number): number {
  return (Number(rootedMapCount(n - 1)) * (n + 1)) / (12 * (n - 1));
}

interface Planned {
  cluster: Cluster;
  id: string;
  sides: number[];
  candidates: number;
}

/**
 * Rank every arrangement of areas.length cells at those areas. Exhaustive when the candidates fit the
 * budget; otherwise a local search per arrangement (see evaluate.ts), and the counts say so.
 * @throws UsageError for bad areas or too many cells.
 */
export async function rankAreas(areas: readonly number[], options: RankOptions = {}): Promise<Catalogue> {
  checkAreas(areas, options.large);
  const n = areas.length;
  const filter = options.filter ?? {};
  const budgetSeconds = options.budgetSeconds ?? 60;
  const workers = Math.max(1, Math.floor(options.workers ?? 1));
  const seed = options.seed ?? 1;
  const classes = areaClasses([...areas]);

  // enumerate, keep the filtered arrangements, and check the rooting identity on all of them
  const planned: Planned[] = [];
  let enumerated = 0;
  let rootings = 0n;
  const E = 3 * (n - 1);
  const ids = new Map<string, string>();
  for (const cluster of enumerateClusters(n)) {
    enumerated++;
    ids.set(cluster.code, `${n}.${enumerated}`);
    if (n >= 2) rootings += BigInt((4 * E) / cluster.symmetry);
    const summary = summarizeCluster(cluster);
    if (!passesFilter(summary, filter)) continue;
    const candidates = orbitCount(classes, cellPermutations(cluster));
    planned.push({ cluster, id: `${n}.${enumerated}`, sides: summary.sides, candidates });
  }
  const candidates = planned.reduce((p, q) => p + q.candidates, 0);
  // the budget is work on one core, so the choice between exhaustive and search depends on the query alone
  // (never on the number of workers or the speed of this machine): same query, same catalogue
  const affordable = Math.floor(budgetSeconds / secondsPerCandidate(n));
  const fits = candidates <= affordable;
  const cap = fits ? Infinity : Math.max(1, Math.floor(affordable / Math.max(1, planned.length)));

  const tasks: ClusterTask[] = planned.map((p, k) => ({
    code: p.cluster.code, classes, mode: p.candidates <= cap ? 'all' : 'search',
    cap: Math.min(cap, p.candidates), seed: seed + k, newton: options.newton,
  }));
  const total = tasks.reduce((p, t, k) => p + (t.mode === 'all' ? planned[k].candidates : t.cap), 0);
  const results = await runTasks(tasks, workers, total, options.onProgress);

  const entries = buildEntries(planned, results, classes, [...areas], ids);
  const tried = results.reduce((p, r) => p + r.length, 0);
  const failures: Record<string, number> = {};
  let equilibria = 0;
  let stable = 0;
  for (const e of entries) {
    if (e.status === 'ok') {
      equilibria++;
      if (e.index === 0) stable++;
    } else failures[e.status] = (failures[e.status] ?? 0) + 1;
  }
  return {
    format: CATALOGUE_FORMAT,
    version: CATALOGUE_VERSION,
    query: { areas: [...areas], filter, budgetSeconds, seed },
    counts: {
      enumerated, arrangements: planned.length, candidates, tried, skipped: candidates - tried, exhaustive: tried === candidates,
      equilibria, stable, failures,
      rootings: {
        sum: n >= 2 ? String(rootings) : '0',
        expected: n >= 2 ? String(BigInt(n + 1) * rootedMapCount(n - 1)) : '0',
      },
    },
    entries,
  };
}

/** Run the tasks in this thread or on a pool; results in task order either way. */
async function runTasks(
  tasks: ClusterTask[], workers: number, total: number, onProgress?: (done: number, total: number) => void,
): Promise<CandidateResult[][]> {
  let done = 0;
  const report = (r: CandidateResult[]) => {
    done += r.length;
    onProgress?.(done, total);
  };
  if (workers === 1 || total < 64) {
    const turn = eventLoopTurns();
    const out: CandidateResult[][] = [];
    for (const t of tasks) {
      const r = evaluateCluster(t);
      report(r);
      out.push(r);
      await turn(); // signals and progress are heard during a long ranking in this thread
    }
    return out;
  }
  const { Piscina } = await import('piscina');
  // compiled (dist/): the worker is plain JavaScript; from the sources (tests, development) tsx runs it,
  // resolved from here so the pool works whatever the current directory is
  const compiled = !import.meta.url.endsWith('.ts');
  const pool = new Piscina({
    filename: new URL(compiled ? './worker.js' : './worker.ts', import.meta.url).href,
    execArgv: compiled ? [] : ['--import', import.meta.resolve('tsx')],
    minThreads: workers,
    maxThreads: workers,
  });
  try {
    // batches of about equal work keep messaging cheap and the threads busy
    const perBatch = Math.max(1, Math.ceil(total / (workers * 32)));
    const batches: ClusterTask[][] = [];
    let current: ClusterTask[] = [];
    let weight = 0;
    for (const t of tasks) {
      current.push(t);
      weight += t.cap;
      if (weight >= perBatch) {
        batches.push(current);
        current = [];
        weight = 0;
      }
    }
    if (current.length > 0) batches.push(current);
    const parts = await Promise.all(
      batches.map(async (b) => {
        const r = (await pool.run(b)) as CandidateResult[][];
        r.forEach(report);
        return r;
      }),
    );
    return parts.flat();
  } finally {
    await pool.destroy();
  }
}

/** Significant digits perimeters are compared at, so rounding noise never reorders equal perimeters. */
export const ORDER_DIGITS = 11;

function buildEntries(
  planned: Planned[], results: CandidateResult[][], classes: AreaClasses, areas: number[], ids: Map<string, string>,
): CatalogueEntry[] {
  const entries: CatalogueEntry[] = [];
  results.forEach((list, k) => {
    const p = planned[k];
    for (const r of list) {
      const eq = r.equilibrium;
      const ok = eq.status === 'ok';
      const s = Int32Array.from(r.assignment);
      const assignment = userIndices(s, classes);
      entries.push({
        rank: null,
        id: p.id,
        code: p.cluster.code,
        sides: p.sides,
        assignment,
        cellAreas: assignment.map((i) => areas[i]),
        status: eq.status,
        perimeter: ok ? eq.perimeter : null,
        gapPercent: null,
        index: ok ? eq.index : null,
        zeroModes: ok ? eq.zeroModes : null,
        pressures: ok ? [...eq.pressures] : null,
        geometry: ok ? { coords: [...eq.coords], bulges: [...eq.bulges] } : null,
        certificate: { ...eq.certificate },
        iterations: eq.iterations,
        collapsingWall: eq.collapsingWall,
        becomes: r.becomes === null ? null : { code: r.becomes, id: ids.get(r.becomes) ?? '?' },
        collapsingCell: eq.collapsingCell,
      });
    }
  });
  const key = (e: CatalogueEntry) => e.assignment.join(',');
  entries.sort((a, b) => {
    if (a.perimeter !== null && b.perimeter !== null) {
      const pa = Number(a.perimeter.toPrecision(ORDER_DIGITS));
      const pb = Number(b.perimeter.toPrecision(ORDER_DIGITS));
      if (pa !== pb) return pa - pb;
    } else if (a.perimeter !== null) return -1;
    else if (b.perimeter !== null) return 1;
    return a.code < b.code ? -1 : a.code > b.code ? 1 : key(a) < key(b) ? -1 : key(a) > key(b) ? 1 : 0;
  });
  const best = entries.length > 0 && entries[0].perimeter !== null ? entries[0].perimeter : null;
  let rank = 0;
  for (const e of entries) {
    if (e.perimeter === null || best === null) continue;
    e.rank = ++rank;
    e.gapPercent = (100 * (e.perimeter - best)) / best;
  }
  return entries;
}

/** Default worker count: the cores available. */
export function defaultWorkers(): number {
  return availableParallelism();
}
