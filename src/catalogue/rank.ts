// catalogue stage: rank every arrangement of n cells at given areas into a catalogue.
//
// enumerate (maps) -> filter -> candidates up to symmetry (assign.ts) -> relax (evaluate.ts, on worker
// threads when asked) -> total order: perimeter, then code, then assignment -> catalogue.

import { availableParallelism } from 'node:os';
import { eventLoopTurns } from '../event-loop.ts';
import { cellPermutations, enumerateClusters, type Cluster } from '../maps/cluster.ts';
import { summarizeCluster } from '../maps/describe.ts';
import { rootedMapCount } from '../maps/count.ts';
import { CODE_CELL_LIMIT } from '../maps/code.ts';
import { countText, durationText, estimateClusterCount } from '../maps/estimate.ts';
import { UsageError } from '../errors.ts';
import { withPool } from './pool.ts';
import type { NewtonOptions } from '../solver/options.ts';
import { DEFAULT_STARTS, type FoundEquilibrium } from '../solver/equilibria.ts';
import type { Equilibrium } from '../solver/result.ts';
import { type CellTyping, tensionPairs } from '../solver/tensions.ts';
import { type AreaClasses, areaClasses, orbitCount, userIndices } from './assign.ts';
import { type CandidateResult, type ClusterTask, evaluateCluster } from './evaluate.ts';
import { type ArrangementFilter, checkFilter, isFiltering, passesFilter } from './filter.ts';
import {
  CATALOGUE_FORMAT, CATALOGUE_VERSION, type Catalogue, type CatalogueEntry,
} from './types.ts';

/** Most cells rank accepts without `large`. */
export const RANK_LIMIT = 9;

/**
 * Most worker threads a ranking uses, whatever is asked: each thread holds a relaxer and a copy of its
 * tasks, and a thread per core is all the work can use (common practice, no source).
 */
export const WORKER_LIMIT = 64;

/** Options of rankAreas(). */
export interface RankOptions {
  /** Which arrangements to consider. @default {} (all) */
  filter?: ArrangementFilter;
  /**
   * Work allowed before the ranking switches from exhaustive to search, in seconds on one core of the
   * reference machine (candidates times secondsPerCandidate): it depends on the query alone. @default 60
   */
  budgetSeconds?: number;
  /** Worker threads (1 = run in this thread), 1 to WORKER_LIMIT. @default 1 */
  workers?: number;
  /** Seed of the search's random starts and of each candidate's perturbed first drawings. @default 1 */
  seed?: number;
  /** First drawings tried per candidate, a positive integer. @default DEFAULT_STARTS (solver/equilibria.ts) */
  starts?: number;
  /** Also look for saddles (index >= 1) and list them. @default false */
  unstable?: boolean;
  /** Allow more than RANK_LIMIT cells. @default false */
  large?: boolean;
  /** Called with (candidates done, candidates planned) as work completes. */
  onProgress?: (done: number, total: number) => void;
  /** Options of the relaxer. */
  newton?: NewtonOptions;
  /**
   * Cell types and the tensions between them (walls of different tension): cells of one type with
   * equal areas are one class, and the ranking is by energy. @default untyped, every tension 1
   */
  typing?: CellTyping;
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
  if (areas.length > CODE_CELL_LIMIT) {
    throw new UsageError(`${areas.length} cells is above ${CODE_CELL_LIMIT} when expected at most ${CODE_CELL_LIMIT} (the most cells an arrangement code holds).`);
  }
  if (areas.length > RANK_LIMIT && !large) {
    const { clusters } = estimateClusterCount(areas.length);
    throw new UsageError(
      `${areas.length} cells is above ${RANK_LIMIT} when expected at most ${RANK_LIMIT} without --large ` +
        `(${countText(clusters)} arrangements, ${durationText(minimumSeconds(areas.length, false))} of work on one core).`,
    );
  }
}

/**
 * Seconds of work (on one core) any ranking of n cells takes at least: enumerating every arrangement,
 * and, when no filter removes any, relaxing each at least once (a search still tries one candidate per
 * arrangement). From the estimated count, a lower bound (estimate.ts).
 */
export function minimumSeconds(n: number, filtered: boolean): number {
  const { clusters, seconds } = estimateClusterCount(n);
  return seconds + (filtered ? 0 : clusters * secondsPerCandidate(n));
}

/**
 * Check the budget of a query before any work: the budget (work on one core, as the choice between
 * exhaustive and search reads it) must pay for the least work the query takes (minimumSeconds), so a
 * ranking never runs far beyond it, whatever the workers or shards.
 * @throws UsageError naming the budget and the estimate.
 */
export function checkBudget(n: number, filter: ArrangementFilter, budgetSeconds: number): void {
  if (!(Number.isFinite(budgetSeconds) && budgetSeconds >= 0)) {
    throw new UsageError(`Budget ${budgetSeconds} is not valid when expected a finite number of seconds >= 0.`);
  }
  const least = minimumSeconds(n, isFiltering(filter));
  if (least > budgetSeconds) {
    const what = isFiltering(filter) ? 'to enumerate them' : 'to enumerate them and relax each once';
    throw new UsageError(
      `Budget ${budgetSeconds} s is below the least work ${n} cells take, ${durationText(least)} on one core ` +
        `(${countText(estimateClusterCount(n).clusters)} arrangements, ${what}), when expected a budget of at least ${Math.ceil(least)} s.`,
    );
  }
}

/** The first drawings per candidate of rank options: a positive integer. @throws UsageError otherwise. */
export function startCount(starts: number | undefined): number {
  const k = starts ?? DEFAULT_STARTS;
  if (!(Number.isSafeInteger(k) && k >= 1)) {
    throw new UsageError(`Starts ${k} is not valid when expected a positive whole number of first drawings per candidate.`);
  }
  return k;
}

/** The worker threads of rank options: 1 to WORKER_LIMIT (default 1). @throws UsageError otherwise. */
export function workerCount(options: RankOptions): number {
  const workers = options.workers ?? 1;
  if (!(Number.isSafeInteger(workers) && workers >= 1 && workers <= WORKER_LIMIT)) {
    throw new UsageError(`Workers ${workers} is not valid when expected a whole number from 1 to ${WORKER_LIMIT}.`);
  }
  return workers;
}

export interface Planned {
  cluster: Cluster;
  id: string;
  sides: number[];
  candidates: number;
}

/** A ranking before any relaxing: the query, the kept arrangements and one task per arrangement. */
export interface RankPlan {
  query: Catalogue['query'];
  /** Arrangements enumerated, and the rooting identity over all of them. */
  enumerated: number;
  rootings: Catalogue['counts']['rootings'];
  /** Candidates among the kept arrangements. */
  candidates: number;
  classes: AreaClasses;
  planned: Planned[];
  /** One task per kept arrangement, in enumeration order; `tasks[k]` relaxes `planned[k]`. */
  tasks: ClusterTask[];
  /** Candidates the tasks will relax (all, or the search's caps). */
  work: number[];
  ids: Map<string, string>;
}

/**
 * Plan a ranking: enumerate, filter, count candidates, and decide from the query alone (never from the
 * workers or the machine) whether each arrangement is relaxed exhaustively or searched.
 * @throws UsageError for bad areas or too many cells.
 */
export function planRanking(areas: readonly number[], options: RankOptions = {}): RankPlan {
  checkAreas(areas, options.large);
  const n = areas.length;
  const filter = options.filter ?? {};
  checkFilter(filter);
  const budgetSeconds = options.budgetSeconds ?? 60;
  checkBudget(n, filter, budgetSeconds);
  const seed = options.seed ?? 1;
  const starts = startCount(options.starts);
  const unstable = options.unstable === true;
  const typing = options.typing;
  if (typing !== undefined && typing.types.length !== n) {
    throw new UsageError(`Got ${typing.types.length} types when expected ${n}, one per area.`);
  }
  const classes = areaClasses([...areas], typing?.types);

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
    // (starts left to the search's default when not asked for: the default tries its later starts only
    // where the first gives no verdict, solver/equilibria.ts DEFAULT_STARTS)
    cap: Math.min(cap, p.candidates), seed: seed + k, newton: options.newton, search: { starts: options.starts, unstable },
    ...(typing === undefined ? {} : { tensions: typing.table }),
  }));
  return {
    query: {
      areas: [...areas], filter, budgetSeconds, seed, starts, unstable,
      ...(typing === undefined ? {} : { types: typing.types.map((t) => typing.table.labels[t]), tensions: tensionPairs(typing) }),
    },
    enumerated,
    rootings: {
      sum: n >= 2 ? String(rootings) : '0',
      expected: n >= 2 ? String(BigInt(n + 1) * rootedMapCount(n - 1)) : '0',
    },
    candidates, classes, planned, tasks,
    work: tasks.map((t, k) => (t.mode === 'all' ? planned[k].candidates : t.cap)),
    ids,
  };
}

/**
 * Rank every arrangement of areas.length cells at those areas. Exhaustive when the candidates fit the
 * budget; otherwise a local search per arrangement (see evaluate.ts), and the counts say so.
 * @throws UsageError for bad areas or too many cells.
 */
export async function rankAreas(areas: readonly number[], options: RankOptions = {}): Promise<Catalogue> {
  const workers = workerCount(options);
  const plan = planRanking(areas, options);
  const total = plan.work.reduce((p, q) => p + q, 0);
  const results = await runTasks(plan.tasks, workers, total, options.onProgress);
  return assembleCatalogue(plan, results.flatMap((list, k) => unrankedEntries(plan, k, list)));
}

/**
 * The catalogue of a plan from the entries of its relaxed candidates (in any order: they are put in the
 * ranking's total order here), with the counts taken from the entries.
 */
export function assembleCatalogue(plan: RankPlan, unranked: CatalogueEntry[]): Catalogue {
  const entries = rankEntries(unranked);
  const failures: Record<string, number> = {};
  const candidates = new Set<string>();
  let equilibria = 0;
  let stable = 0;
  for (const e of entries) {
    candidates.add(candidateKey(e));
    if (e.status === 'ok') {
      equilibria++;
      if (e.index === 0) stable++;
    } else failures[e.status] = (failures[e.status] ?? 0) + 1;
  }
  const tried = candidates.size;
  return {
    format: CATALOGUE_FORMAT,
    version: CATALOGUE_VERSION,
    query: plan.query,
    counts: {
      enumerated: plan.enumerated, arrangements: plan.planned.length, candidates: plan.candidates, tried,
      skipped: plan.candidates - tried, exhaustive: tried === plan.candidates, equilibria, stable,
      saddles: equilibria - stable, failures,
      rootings: plan.rootings,
    },
    entries,
  };
}

/** Run the tasks in this thread or on a pool; results in task order either way. */
export async function runTasks(
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
  return withPool(import.meta.url, 'worker', workers, async (run) => {
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
        const r = (await run(b)) as CandidateResult[][];
        r.forEach(report);
        return r;
      }),
    );
    return parts.flat();
  });
}

/** Significant digits perimeters are compared at, so rounding noise never reorders equal perimeters. */
export const ORDER_DIGITS = 11;

/** The candidate an entry belongs to: its code and assignment (the same on all its entries). */
export function candidateKey(e: { code: string; assignment: readonly number[] }): string {
  return `${e.code} ${e.assignment.join(',')}`;
}

/**
 * The entries (not yet ranked) of the candidates task k of a plan relaxed: one per equilibrium found,
 * or one for a candidate without any (its failure).
 */
export function unrankedEntries(plan: RankPlan, k: number, results: readonly CandidateResult[]): CatalogueEntry[] {
  const p = plan.planned[k];
  const areas = plan.query.areas;
  const typed = plan.query.types !== undefined;
  const out: CatalogueEntry[] = [];
  for (const r of results) {
    const assignment = userIndices(Int32Array.from(r.assignment), plan.classes);
    const candidate = { id: p.id, code: p.cluster.code, sides: p.sides, assignment, cellAreas: assignment.map((i) => areas[i]) };
    const tried = r.search.tried;
    if (r.search.found.length === 0) {
      const eq = r.search.failure ?? r.equilibrium;
      const becomes = r.becomes === null ? null : { code: r.becomes, id: plan.ids.get(r.becomes) ?? '?' };
      out.push(entryOf(candidate, eq, null, tried, becomes, typed));
    } else {
      for (const found of r.search.found) out.push(entryOf(candidate, found.equilibrium, found, tried, null, typed));
    }
  }
  return out;
}

/** One entry: the candidate's fields, then the answer's (a certified one when `found` is given). */
function entryOf(
  candidate: Pick<CatalogueEntry, 'id' | 'code' | 'sides' | 'assignment' | 'cellAreas'>, eq: Equilibrium,
  found: FoundEquilibrium | null, tried: number, becomes: CatalogueEntry['becomes'], typed: boolean,
): CatalogueEntry {
  const ok = eq.status === 'ok';
  return {
    rank: null,
    ...candidate,
    status: eq.status,
    perimeter: ok ? eq.perimeter : null,
    ...(typed ? { energy: ok ? eq.energy : null } : {}),
    gapPercent: null,
    index: ok ? eq.index : null,
    zeroModes: ok ? eq.zeroModes : null,
    pressures: ok ? [...eq.pressures] : null,
    geometry: ok ? { coords: [...eq.coords], bulges: [...eq.bulges] } : null,
    certificate: { ...eq.certificate },
    iterations: eq.iterations,
    collapsingWall: eq.collapsingWall,
    becomes,
    collapsingCell: eq.collapsingCell,
    reached: ok ? (found?.reached ?? 1) : null,
    tried,
    family: found?.family === null || found === null ? null : { ...found.family, walls: [...found.family.walls] },
  };
}

/**
 * What the ranking orders: the energy in a typed catalogue (its entries carry `energy`), else the
 * perimeter; null for a failure.
 */
export function rankedValue(e: { perimeter: number | null; energy?: number | null }): number | null {
  return e.energy === undefined ? e.perimeter : e.energy;
}

/** A perimeter (or energy) as the ranking compares it: ORDER_DIGITS significant digits. */
export function orderPerimeter(p: number): number {
  return Number(p.toPrecision(ORDER_DIGITS));
}

/**
 * Where a certified entry sits in the ranking: its perimeter (orderPerimeter), but a saddle never
 * before `floor`: the least stable perimeter of the ranking and the largest of its own candidate's
 * stable equilibria (-Infinity when there are none). A saddle below every stable equilibrium means the
 * search missed the minimiser it descends to, so rank 1 stays the least stable equilibrium, the
 * ranking's answer; and a candidate's saddles are listed after its stable equilibria.
 */
export function rankingPerimeter(e: { perimeter: number | null; energy?: number | null; index: number | null }, floor: number): number {
  const p = orderPerimeter(rankedValue(e) as number);
  return e.index === 0 ? p : Math.max(p, floor);
}

const compareText = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/**
 * Put entries in the ranking's total order, whatever order they come in: certified ones by perimeter
 * (rankingPerimeter), then index (stable first), code and assignment, the equilibria of one candidate
 * by zero modes, exact perimeter and family; then the failures by code and assignment. Number the
 * certified ones, with their gap to rank 1.
 */
function rankEntries(entries: CatalogueEntry[]): CatalogueEntry[] {
  const key = (e: CatalogueEntry) => e.assignment.join(',');
  // the saddles' floors: the least stable perimeter, and the largest stable one of each candidate
  let least = Infinity;
  const stableMost = new Map<string, number>();
  for (const e of entries) {
    if (e.perimeter === null || e.index !== 0) continue;
    const p = orderPerimeter(rankedValue(e) as number);
    least = Math.min(least, p);
    stableMost.set(candidateKey(e), Math.max(stableMost.get(candidateKey(e)) ?? -Infinity, p));
  }
  if (least === Infinity) least = -Infinity;
  // each certified entry's place, once (the sort compares each entry many times)
  const placed = new Map<CatalogueEntry, number>();
  for (const e of entries) {
    if (e.perimeter !== null) placed.set(e, rankingPerimeter(e, Math.max(least, stableMost.get(candidateKey(e)) ?? -Infinity)));
  }
  entries.sort((a, b) => {
    if (a.perimeter !== null && b.perimeter !== null) {
      const pa = placed.get(a)!;
      const pb = placed.get(b)!;
      if (pa !== pb) return pa - pb;
      if (a.index !== b.index) return a.index! - b.index!;
    } else if (a.perimeter !== null) return -1;
    else if (b.perimeter !== null) return 1;
    const byCandidate = compareText(a.code, b.code) || compareText(key(a), key(b));
    if (byCandidate !== 0 || a.perimeter === null || b.perimeter === null) return byCandidate;
    // two equilibria of one candidate at the same rounded perimeter
    return (a.zeroModes! - b.zeroModes!) || ((rankedValue(a) as number) - (rankedValue(b) as number)) ||
      compareText(JSON.stringify(a.family), JSON.stringify(b.family)) || compareText(JSON.stringify(a.geometry), JSON.stringify(b.geometry));
  });
  const best = entries.length > 0 && entries[0].perimeter !== null ? rankedValue(entries[0]) : null;
  let rank = 0;
  for (const e of entries) {
    if (e.perimeter === null || best === null) continue;
    e.rank = ++rank;
    e.gapPercent = (100 * ((rankedValue(e) as number) - best)) / best;
  }
  return entries;
}

/** Default worker count: the cores available (at most WORKER_LIMIT). */
export function defaultWorkers(): number {
  return Math.min(availableParallelism(), WORKER_LIMIT);
}
