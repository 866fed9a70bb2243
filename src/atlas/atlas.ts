// atlas stage: evidence maps over the whole simplex of area ratios: rank every candidate at every sample of
// a design (design.ts, solve.ts), describe each winner by area rank, and summarise: winner classes with
// their share of samples and least margin, where the class changes, and (four cells) where the
// boundaries between classes lie and how the claim of the standard arrangement fares.

import { eventLoopTurns } from '../event-loop.ts';
import { withPool } from '../catalogue/pool.ts';
import { type RankPlan, workerCount } from '../catalogue/rank.ts';
import { clusterFromCode } from '../maps/cluster.ts';
import { type ClusterSummary, summarizeCluster } from '../maps/describe.ts';
import { relax, relaxFrom } from '../solver/newton.ts';
import type { Equilibrium } from '../solver/result.ts';
import { atlasSamples, checkDesign, compactOrder, reachableRatio } from './design.ts';
import { type AtlasBlock, type RankedCandidate, type SolvedSample, rankSample, solveBlock } from './solve.ts';
import type {
  Atlas, AtlasBoundary, AtlasClass, AtlasOptions, AtlasPlacement, AtlasSample, ClaimAtSample, ClaimSummary,
} from './types.ts';
import { UsageError } from '../errors.ts';
import { tensionPairs, wallTensions } from '../solver/tensions.ts';

/** Samples per block (the unit of work of a worker; fixed, so the atlas does not depend on the workers). */
export const BLOCK = 32;

/** The claim tested at four cells, in words. */
export const FOUR_CELL_CLAIM =
  'the winner is the standard arrangement (two 4-sided cells sharing a central wall, a 3-sided cell at each end) with the two largest areas on the two sides of the central wall';

/** Summaries of arrangements by code, computed once. */
function summaries(): (code: string) => ClusterSummary {
  const cache = new Map<string, ClusterSummary>();
  return (code) => {
    let s = cache.get(code);
    if (s === undefined) {
      s = summarizeCluster(clusterFromCode(code));
      cache.set(code, s);
    }
    return s;
  };
}

/** Class key of a candidate: its arrangement and which area rank sits in each cell (an orbit representative). */
function classKey(c: RankedCandidate): string {
  return `${c.code} ${c.assignment.join(',')}`;
}

/** Side counts and walls by area rank (1 = largest; 0 = the outside). */
export function byRank(summary: ClusterSummary, assignment: readonly number[]): { ranks: number[]; sidesByRank: number[]; wallsByRank: [number, number][] } {
  const ranks = assignment.map((i) => i + 1);
  const sidesByRank = new Array<number>(ranks.length);
  ranks.forEach((r, cell) => (sidesByRank[r - 1] = summary.sides[cell]));
  const rankOf = (region: number): number => (region === 0 ? 0 : ranks[region - 1]);
  const wallsByRank = summary.contacts
    .map(([a, b]): [number, number] => {
      const [x, y] = [rankOf(a), rankOf(b)];
      return x <= y ? [x, y] : [y, x];
    })
    .sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  return { ranks, sidesByRank, wallsByRank };
}

/**
 * Whether a four-cell candidate satisfies the claim: the standard arrangement (sides 4, 4, 3, 3, every
 * cell on the outside, the two 4-sided cells sharing a wall) with ranks 1 and 2 in its 4-sided cells.
 */
export function satisfiesClaim(summary: ClusterSummary, assignment: readonly number[]): boolean {
  if (summary.cells !== 4 || summary.touchingOutside.length !== 4) return false;
  if ([...summary.sides].sort().join('') !== '3344') return false;
  const four = summary.sides.flatMap((s, i) => (s === 4 ? [i + 1] : []));
  if (!summary.contacts.some(([a, b]) => a === four[0] && b === four[1])) return false;
  const ranks = four.map((cell) => assignment[cell - 1]).sort();
  return ranks[0] === 0 && ranks[1] === 1;
}

function claimAt(ranked: readonly RankedCandidate[], summaryOf: (code: string) => ClusterSummary): ClaimAtSample {
  let yes: number | null = null;
  let no: number | null = null;
  for (const c of ranked) {
    if (satisfiesClaim(summaryOf(c.code), c.assignment)) yes ??= c.perimeter;
    else no ??= c.perimeter;
    if (yes !== null && no !== null) break;
  }
  const holds = ranked.length > 0 && satisfiesClaim(summaryOf(ranked[0].code), ranked[0].assignment);
  return { holds, margin: yes === null || no === null ? null : (no - yes) / Math.min(yes, no) };
}

/** Solve every block, in this thread or on a pool; results by design index. */
async function solveAll(blocks: AtlasBlock[], workers: number, total: number, onProgress?: (done: number, total: number) => void): Promise<SolvedSample[]> {
  const out = new Array<SolvedSample>(total);
  let done = 0;
  const keep = (list: SolvedSample[]): void => {
    for (const s of list) out[s.index] = s;
    done += list.length;
    onProgress?.(done, total);
  };
  if (workers <= 1 || blocks.length === 1) {
    const turn = eventLoopTurns();
    for (const b of blocks) {
      keep(solveBlock(b));
      await turn(); // signals and progress are heard during a long atlas
    }
    return out;
  }
  await withPool(import.meta.url, 'worker', workers, async (run) => {
    await Promise.all(blocks.map(async (b) => keep((await run(b)) as SolvedSample[])));
  });
  return out;
}

/** For each sample, its nearest other sample (squared distance of the area vectors); -1 for a single sample. */
function nearestNeighbours(areas: Float64Array, n: number): { near: Int32Array; d2: Float64Array } {
  const count = areas.length / n;
  const near = new Int32Array(count).fill(-1);
  const d2 = new Float64Array(count).fill(Infinity);
  for (let a = 0; a < count; a++) {
    for (let b = a + 1; b < count; b++) {
      let d = 0;
      for (let i = 0; i < n; i++) {
        const x = areas[a * n + i] - areas[b * n + i];
        d += x * x;
      }
      if (d < d2[a]) {
        d2[a] = d;
        near[a] = b;
      }
      if (d < d2[b]) {
        d2[b] = d;
        near[b] = a;
      }
    }
  }
  return { near, d2 };
}

/**
 * The atlas of `cells` cells over `samples` samples of the simplex of areas.
 * @throws UsageError for bad options (cells outside 2..8, samples out of range, a least share that leaves nothing).
 */
export async function runAtlas(options: AtlasOptions): Promise<Atlas> {
  const design = checkDesign(options);
  const n = design.cells;
  const workers = workerCount({ workers: options.workers });
  const maxBoundaries = options.maxBoundaries ?? 200;
  if (!(Number.isInteger(maxBoundaries) && maxBoundaries >= 0)) {
    throw new UsageError(`Most boundaries is ${maxBoundaries} when expected a whole number of at least 0.`);
  }
  const tolerance = options.tolerance ?? 1e-6;
  if (!(tolerance > 0 && tolerance < 1)) throw new UsageError(`Tolerance is ${tolerance} when expected a number in (0, 1).`);
  const typing = options.typing;
  if (typing !== undefined && typing.types.length !== n) {
    throw new UsageError(`Got ${typing.types.length} types when expected ${n}, one per cell.`);
  }
  const areas = atlasSamples(design, typing?.types);
  const count = design.samples;
  const order = compactOrder(areas, n);
  const blocks: AtlasBlock[] = [];
  for (let start = 0; start < count; start += BLOCK) {
    const indices = [...order.subarray(start, Math.min(count, start + BLOCK))];
    blocks.push({
      cells: n, indices, areas: indices.map((k) => [...areas.subarray(k * n, (k + 1) * n)]),
      warmStart: options.warmStart ?? false, newton: options.newton, ...(typing === undefined ? {} : { typing }),
    });
  }
  const solved = await solveAll(blocks, workers, count, options.onProgress);

  // classes: every candidate that wins, comes second or is the best of another arrangement somewhere,
  // most wins first, then by key
  const summaryOf = summaries();
  const wins = new Map<string, number>();
  const otherOf = (s: SolvedSample): RankedCandidate | null => s.ranked.find((c) => c.code !== s.ranked[0].code) ?? null;
  for (const s of solved) {
    const other = s.ranked.length > 0 ? otherOf(s) : null;
    for (const c of [...s.ranked.slice(0, 2), ...(other === null ? [] : [other])]) if (!wins.has(classKey(c))) wins.set(classKey(c), 0);
    if (s.ranked.length > 0) wins.set(classKey(s.ranked[0]), (wins.get(classKey(s.ranked[0])) ?? 0) + 1);
  }
  const keys = [...wins.keys()].sort((a, b) => (wins.get(b) as number) - (wins.get(a) as number) || (a < b ? -1 : a > b ? 1 : 0));
  const classOf = new Map(keys.map((k, i) => [k, i]));
  const placement = (c: RankedCandidate): AtlasPlacement => ({
    class: classOf.get(classKey(c)) as number,
    code: c.code, id: c.id, ...byRank(summaryOf(c.code), c.assignment),
    perimeter: c.perimeter, index: c.index, zeroModes: c.zeroModes,
  });

  const samples: AtlasSample[] = solved.map((s) => {
    const winner = s.ranked.length > 0 ? placement(s.ranked[0]) : null;
    const runnerUp = s.ranked.length > 1 ? placement(s.ranked[1]) : null;
    const other = winner === null ? null : otherOf(s);
    const sample: AtlasSample = {
      index: s.index, areas: s.areas, winner, runnerUp,
      // (candidates tied at rank's ORDER_DIGITS may differ in the last digits either way: a tie is a margin of 0)
      margin: winner !== null && runnerUp !== null ? Math.max(0, (runnerUp.perimeter - winner.perimeter) / winner.perimeter) : null,
      otherArrangement: winner === null || other === null ? null : {
        class: classOf.get(classKey(other)) as number, id: other.id,
        sidesByRank: byRank(summaryOf(other.code), other.assignment).sidesByRank, perimeter: other.perimeter,
        margin: Math.max(0, (other.perimeter - winner.perimeter) / winner.perimeter),
      },
      exhaustive: s.exhaustive, starts: { warm: s.warm, other: s.candidates - s.warm },
    };
    if (n === 4 && typing === undefined) sample.claim = claimAt(s.ranked, summaryOf);
    return sample;
  });

  const classes: AtlasClass[] = keys.map((key, k) => {
    const [code, assignment] = key.split(' ');
    const won = samples.filter((s) => s.winner?.class === k);
    let least: AtlasSample | null = null;
    for (const s of won) if (s.margin !== null && (least === null || s.margin < (least.margin as number))) least = s;
    return {
      class: k, code, id: summaryOfId(solved, code), ...byRank(summaryOf(code), assignment.split(',').map(Number)),
      samples: won.length, share: won.length / count,
      smallestMargin: least?.margin ?? null, smallestMarginAt: least?.index ?? null,
    };
  });
  let least: AtlasSample | null = null;
  let leastOther: AtlasSample | null = null;
  for (const s of samples) {
    if (s.margin !== null && (least === null || s.margin < (least.margin as number))) least = s;
    const m = s.otherArrangement?.margin;
    if (m !== undefined && (leastOther === null || m < (leastOther.otherArrangement?.margin as number))) leastOther = s;
  }

  // where the class changes: each sample against its nearest neighbour
  const { near, d2 } = nearestNeighbours(areas, n);
  const pairs = new Map<string, [number, number, number]>();
  for (let a = 0; a < count; a++) {
    const b = near[a];
    const wa = samples[a].winner;
    const wb = b < 0 ? null : samples[b].winner;
    if (wa === null || wb === null || wa.class === wb.class) continue;
    const [x, y] = a < b ? [a, b] : [b, a];
    pairs.set(`${x},${y}`, [x, y, d2[a]]);
  }
  const changes = [...pairs.values()].sort((p, q) => p[2] - q[2] || p[0] - q[0] || p[1] - q[1]);
  const boundaries: AtlasBoundary[] = [];
  if (n === 4) {
    const cache = new Map<string, RankPlan>();
    for (const [x, y] of changes.slice(0, maxBoundaries)) {
      const b = locateBoundary(samples[x], samples[y], solved[x].ranked[0], solved[y].ranked[0], tolerance, options, cache, classOf);
      if (b !== null) boundaries.push(b);
    }
  }

  let claim: ClaimSummary | null = null;
  if (n === 4 && typing === undefined) {
    let holds = 0;
    let fails = 0;
    let undecided = 0;
    let leastClaim: AtlasSample | null = null;
    const failures: number[] = [];
    for (const s of samples) {
      const c = s.claim as ClaimAtSample;
      if (s.winner === null) undecided++;
      else if (c.holds) holds++;
      else {
        fails++;
        if (failures.length < 100) failures.push(s.index);
      }
      if (c.margin !== null && (leastClaim === null || c.margin < (leastClaim.claim?.margin as number))) leastClaim = s;
    }
    claim = {
      statement: FOUR_CELL_CLAIM, holds, fails, undecided,
      smallestMargin: leastClaim?.claim?.margin ?? null, smallestMarginAt: leastClaim?.index ?? null, failures,
    };
  }

  let largestRatio = 1;
  for (let k = 0; k < count; k++) {
    const s = areas.subarray(k * n, (k + 1) * n);
    largestRatio = Math.max(largestRatio, Math.max(...s) / Math.min(...s));
  }
  const relaxations = solved.reduce((p, s) => p + s.candidates, 0);
  return {
    cells: n, ...(typing === undefined ? {} : { types: typing.types.map((t) => typing.table.labels[t]), tensions: tensionPairs(typing) }),
    seed: design.seed, minShare: design.minShare, reachableRatio: reachableRatio(n, design.minShare), largestRatio,
    samples, classes, noWinner: samples.filter((s) => s.winner === null).length,
    smallestMargin: least?.margin ?? null, smallestMarginAt: least?.index ?? null,
    smallestArrangementMargin: leastOther?.otherArrangement?.margin ?? null, smallestArrangementMarginAt: leastOther?.index ?? null,
    changes: changes.map(([x, y]) => [x, y]), boundaries,
    exhaustive: samples.every((s) => s.exhaustive),
    candidates: solved[0].candidates,
    warmShare: relaxations === 0 ? 0 : solved.reduce((p, s) => p + s.warm, 0) / relaxations,
    claim,
  };
}

/** The id ("n.k") of an arrangement, read off the samples. */
function summaryOfId(solved: readonly SolvedSample[], code: string): string {
  for (const s of solved) for (const c of s.ranked) if (c.code === code) return c.id;
  return '?';
}

/** The target area of each cell of a candidate at the areas `at` (largest first). */
function cellAreas(c: RankedCandidate, at: readonly number[]): Float64Array {
  return Float64Array.from(c.assignment, (i) => at[i]);
}

/**
 * Locate where the winner changes from candidate `a` (winning at sample x) to `b` (winning at y) along
 * the segment between the two samples, by bisection on the sign of P_a - P_b (a candidate that does not
 * exist loses), each probe warm from the candidate's nearest certified state; then rank every candidate
 * at the located point to see whether a third class wins there. Null when a cannot be found again at x
 * or b at y (cold starts that miss the ranking's branch).
 */
export function locateBoundary(
  x: AtlasSample, y: AtlasSample, a: RankedCandidate, b: RankedCandidate, tolerance: number, options: AtlasOptions,
  cache: Map<string, RankPlan>, classOf: ReadonlyMap<string, number>,
): AtlasBoundary | null {
  const mapA = clusterFromCode(a.code).map;
  const mapB = clusterFromCode(b.code).map;
  const at = (t: number): number[] => x.areas.map((v, i) => (1 - t) * v + t * y.areas[i]);
  // with cell types, each candidate relaxed with its walls' tensions (cell i + 1 holds area position assignment[i])
  const typing = options.typing;
  const newtonOf = (c: RankedCandidate, map: typeof mapA): AtlasOptions['newton'] => (typing === undefined ? options.newton : {
    ...options.newton, tensions: wallTensions(map, Int32Array.from(c.assignment, (i) => typing.types[i]), typing.table),
  });
  const newtonA = newtonOf(a, mapA);
  const newtonB = newtonOf(b, mapB);
  const knownA: { t: number; eq: Equilibrium }[] = [];
  const knownB: { t: number; eq: Equilibrium }[] = [];
  const probe = (c: RankedCandidate, map: typeof mapA, newton: AtlasOptions['newton'], list: typeof knownA, t: number): Equilibrium | null => {
    const target = cellAreas(c, at(t));
    let start: Equilibrium | null = null;
    let best = Infinity;
    for (const k of list) {
      if (Math.abs(k.t - t) < best) {
        best = Math.abs(k.t - t);
        start = k.eq;
      }
    }
    const eq = start === null ? relax(map, target, newton) : relaxFrom(map, target, start, newton);
    if (eq.status !== 'ok') return null;
    list.push({ t, eq });
    return eq;
  };
  const a0 = probe(a, mapA, newtonA, knownA, 0);
  const b1 = probe(b, mapB, newtonB, knownB, 1);
  if (a0 === null || b1 === null) return null;
  // d(t) = P_a - P_b; a missing candidate loses: d = +inf when a is missing, -inf when b is
  const d = (t: number): number => {
    const ea = probe(a, mapA, newtonA, knownA, t);
    const eb = probe(b, mapB, newtonB, knownB, t);
    if (ea === null) return Infinity;
    if (eb === null) return -Infinity;
    return ea.energy - eb.energy;
  };
  let lo = 0;
  let hi = 1;
  let dLo = d(0);
  let dHi = d(1);
  // is the change not a sign change of d after all (the ranking's branch missed)? then nothing to locate
  if (!(dLo <= 0 && dHi > 0)) return null;
  while (hi - lo > tolerance) {
    const m = 0.5 * (lo + hi);
    const dm = d(m);
    if (dm <= 0) {
      lo = m;
      dLo = dm;
    } else {
      hi = m;
      dHi = dm;
    }
  }
  const crossing = Number.isFinite(dLo) && Number.isFinite(dHi);
  const t = crossing && dLo !== dHi ? lo + ((hi - lo) * dLo) / (dLo - dHi) : 0.5 * (lo + hi);
  const point = at(t);
  const pa = probe(a, mapA, newtonA, knownA, t);
  const pb = probe(b, mapB, newtonB, knownB, t);
  const check = rankSample(point, cache, options.newton, null, typing);
  const top = check.ranked[0];
  const topClass = top === undefined ? -1 : classOf.get(classKey(top)) ?? -1;
  return {
    from: x.index, to: y.index, fromClass: x.winner?.class as number, toClass: y.winner?.class as number,
    t, bracket: [lo, hi], areas: point, kind: crossing ? 'crossing' : 'existence',
    perimeters: [pa?.energy ?? null, pb?.energy ?? null],
    confirmed: topClass === x.winner?.class || topClass === y.winner?.class,
  };
}
