// catalogue stage: a ranking cut into shards for many machines (one task of a batch array each), and the
// merge of the parts back into the catalogue a single run writes, byte for byte.
//
// Every shard plans the whole ranking (planRanking: enumeration and the exhaustive/search decision depend
// on the query alone), takes its share of the arrangements, and writes their entries unranked. The
// shares are balanced by the candidates each arrangement relaxes (a cost known from the query, so every
// machine cuts the same shards). The merge checks that the parts belong together and cover every
// arrangement exactly once, then ranks and counts with the code a single run uses (assembleCatalogue).

import { typingOfPairs } from '../solver/tensions.ts';
import { UsageError } from '../errors.ts';
import {
  type RankOptions, type RankPlan, assembleCatalogue, candidateKey, planRanking, runTasks, unrankedEntries, workerCount,
} from './rank.ts';
import type { Catalogue, CatalogueEntry } from './types.ts';

/** Format name of a part file. */
export const PART_FORMAT = 'lather-rank-part';
/** Version of the part format (2: entries of catalogue version 2, several per candidate). */
export const PART_VERSION = 2;

/** One shard's share of a ranking. */
export interface RankPart {
  format: typeof PART_FORMAT;
  version: typeof PART_VERSION;
  /** Version of lather that wrote the part (parts of different versions are not merged). */
  program: string;
  query: Catalogue['query'];
  /** This shard (1-based) of `count`. */
  shard: { index: number; count: number };
  /** What the parts must add up to: arrangements kept (one task each), candidates, enumeration counts. */
  totals: { tasks: number; candidates: number; enumerated: number; rootings: Catalogue['counts']['rootings'] };
  /** The tasks (arrangements, by position in the plan) of this shard, ascending. */
  tasks: number[];
  /** Their entries, unranked (one per equilibrium found, or one per candidate without any). */
  entries: CatalogueEntry[];
}

/**
 * Which tasks each of `count` shards gets: greedy by cost (largest first, ties by position), each to the
 * least loaded shard (ties to the lowest). Depends only on the costs, so every machine cuts the same.
 */
export function shardTasks(costs: readonly number[], count: number): number[][] {
  const order = costs.map((_, k) => k).sort((a, b) => costs[b] - costs[a] || a - b);
  const load = new Float64Array(count);
  const shards: number[][] = Array.from({ length: count }, () => []);
  for (const k of order) {
    let best = 0;
    for (let s = 1; s < count; s++) if (load[s] < load[best]) best = s;
    shards[best].push(k);
    load[best] += Math.max(1, costs[k]);
  }
  for (const s of shards) s.sort((a, b) => a - b);
  return shards;
}

/**
 * Rank shard `shard.index` (1-based) of `shard.count` of a ranking: the part a merge puts together.
 * @throws UsageError for a bad query or shard.
 */
export async function rankShard(
  areas: readonly number[], shard: { index: number; count: number }, program: string, options: RankOptions = {},
): Promise<RankPart> {
  const workers = workerCount(options);
  const plan = planRanking(areas, options);
  if (!(Number.isInteger(shard.index) && Number.isInteger(shard.count) && shard.index >= 1 && shard.index <= shard.count)) {
    throw new UsageError(`Shard ${shard.index}/${shard.count} is not valid when expected i/k with 1 <= i <= k.`);
  }
  const mine = shardTasks(plan.work, shard.count)[shard.index - 1];
  const total = mine.reduce((p, k) => p + plan.work[k], 0);
  const results = await runTasks(mine.map((k) => plan.tasks[k]), workers, total, options.onProgress);
  return {
    format: PART_FORMAT,
    version: PART_VERSION,
    program,
    query: plan.query,
    shard: { ...shard },
    totals: totalsOf(plan),
    tasks: mine,
    entries: results.flatMap((list, i) => unrankedEntries(plan, mine[i], list)),
  };
}

function totalsOf(plan: RankPlan): RankPart['totals'] {
  return { tasks: plan.tasks.length, candidates: plan.candidates, enumerated: plan.enumerated, rootings: plan.rootings };
}

/** The text of a part file (one entry per line, as catalogues are written). */
export function writePart(part: RankPart): string {
  const { entries, ...head } = part;
  const lines = Object.entries(head).map(([k, v]) => `  ${JSON.stringify(k)}: ${JSON.stringify(v)},`);
  return `{\n${lines.join('\n')}\n  "entries": [\n${entries.map((e) => `    ${JSON.stringify(e)}`).join(',\n')}\n  ]\n}\n`;
}

/** Read a part file's text; `source` names it in messages. @throws UsageError when it is not a part. */
export function readPart(text: string, source: string): RankPart {
  let data: unknown;
  try {
    data = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch {
    throw new UsageError(`Part ${source} is not JSON when expected a part written by rank --shard.`);
  }
  const part = data as Partial<RankPart>;
  if (part === null || typeof part !== 'object' || part.format !== PART_FORMAT) {
    throw new UsageError(`Part ${source} has format ${JSON.stringify(part?.format)} when expected "${PART_FORMAT}" (a part written by rank --shard).`);
  }
  if (part.version !== PART_VERSION) {
    throw new UsageError(`Part ${source} has version ${JSON.stringify(part.version)} when expected ${PART_VERSION}.`);
  }
  const shape =
    typeof part.program === 'string' && typeof part.query === 'object' && part.query !== null &&
    typeof part.shard?.index === 'number' && typeof part.shard?.count === 'number' &&
    typeof part.totals?.tasks === 'number' && Array.isArray(part.tasks) && part.tasks.every((k) => Number.isInteger(k)) &&
    Array.isArray(part.entries);
  if (!shape) throw new UsageError(`Part ${source} lacks program, query, shard, totals, tasks or entries when expected a whole part.`);
  return part as RankPart;
}

/**
 * Merge the parts of one sharded ranking into its catalogue, the same as a single run's. Every shard
 * must be present exactly once, with the same query, program version and totals; their tasks must
 * cover the plan exactly; `plan` (re-planned from the query) must agree with the totals.
 * @throws UsageError naming the part and the reason.
 */
export function mergeParts(parts: readonly { part: RankPart; source: string }[], program: string, options: RankOptions = {}): Catalogue {
  if (parts.length === 0) throw new UsageError('No parts given when expected the parts written by rank --shard.');
  const first = parts[0];
  const query = JSON.stringify(first.part.query);
  const count = first.part.shard.count;
  const seen = new Map<number, string>();
  for (const { part, source } of parts) {
    if (part.program !== program) throw new UsageError(`Part ${source} was written by lather ${part.program} when expected ${program}, this version.`);
    if (JSON.stringify(part.query) !== query) throw new UsageError(`Part ${source} has another query than ${first.source} when expected parts of one ranking.`);
    if (part.shard.count !== count) throw new UsageError(`Part ${source} is shard ${part.shard.index}/${part.shard.count} when expected one of ${count} shards, as ${first.source}.`);
    if (JSON.stringify(part.totals) !== JSON.stringify(first.part.totals)) throw new UsageError(`Part ${source} has other totals than ${first.source} when expected parts of one ranking.`);
    const twin = seen.get(part.shard.index);
    if (twin !== undefined) throw new UsageError(`Part ${source} is shard ${part.shard.index}/${count} again (also ${twin}) when expected each shard once.`);
    seen.set(part.shard.index, source);
  }
  for (let i = 1; i <= count; i++) {
    if (!seen.has(i)) throw new UsageError(`Shard ${i}/${count} is missing when expected all ${count} parts.`);
  }
  const q = first.part.query;
  const plan = planRanking(q.areas, {
    ...options, filter: q.filter, budgetSeconds: q.budgetSeconds, seed: q.seed, starts: q.starts, unstable: q.unstable,
    ...(q.types === undefined ? {} : { typing: typingOfPairs(q.types, q.tensions ?? {}, q.areas.length) }),
  });
  if (JSON.stringify(totalsOf(plan)) !== JSON.stringify(first.part.totals)) {
    throw new UsageError(`Part ${first.source} has totals that this query does not give when expected parts of this ranking.`);
  }
  const expected = shardTasks(plan.work, count);
  const entries: CatalogueEntry[] = [];
  for (const { part, source } of parts) {
    if (JSON.stringify(part.tasks) !== JSON.stringify(expected[part.shard.index - 1])) {
      throw new UsageError(`Part ${source} holds other arrangements than shard ${part.shard.index}/${count} when expected the shard's own.`);
    }
    // each task's candidates (an entry per equilibrium, or one failure): every candidate of an
    // exhaustive task, at most the cap of a searched one
    const perTask = new Map<string, Set<string>>();
    const perCode = new Map<string, number>();
    for (const e of part.entries) {
      perCode.set(e.code, (perCode.get(e.code) ?? 0) + 1);
      const seen = perTask.get(e.code) ?? new Set<string>();
      seen.add(candidateKey(e));
      perTask.set(e.code, seen);
    }
    let held = 0;
    for (const k of part.tasks) {
      const got = perTask.get(plan.tasks[k].code)?.size ?? 0;
      held += perCode.get(plan.tasks[k].code) ?? 0;
      const all = plan.tasks[k].mode === 'all';
      if (all ? got !== plan.work[k] : got < 1 || got > plan.work[k]) {
        throw new UsageError(`Part ${source} has ${got} candidates of ${plan.planned[k].id} when expected ${all ? '' : 'at most '}${plan.work[k]}.`);
      }
    }
    if (held !== part.entries.length) throw new UsageError(`Part ${source} has entries of arrangements outside its shard when expected only its own.`);
    entries.push(...part.entries.map((e) => ({ ...e })));
  }
  return assembleCatalogue(plan, entries);
}
