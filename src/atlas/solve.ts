// atlas stage: rank every candidate at each sample of a block, as `rank` does (planRanking -> evaluateCluster
// -> assembleCatalogue), each candidate warm from its equilibrium at the nearest sample solved before it.
//
// A block is the unit of work of a worker thread; its result depends only on the block (the samples in
// it and their order), never on the number of workers, so an atlas is the same with one worker or many.

import { areaClasses, orbitRepresentative } from '../catalogue/assign.ts';
import { cellPermutations, clusterFromCode } from '../maps/cluster.ts';
import { evaluateCluster } from '../catalogue/evaluate.ts';
import { type RankPlan, assembleCatalogue, planRanking, rankedValue, unrankedEntries } from '../catalogue/rank.ts';
import type { CatalogueEntry } from '../catalogue/types.ts';
import type { NewtonOptions } from '../solver/options.ts';
import type { Equilibrium } from '../solver/result.ts';
import type { CellTyping } from '../solver/tensions.ts';

/** Samples solved before are searched for the nearest among the last this many (memory stays bounded). */
const WINDOW = 12;

/** A block of samples, solved in order. */
export interface AtlasBlock {
  cells: number;
  /** Design index of each sample. */
  indices: number[];
  /** Areas of each sample, largest first. */
  areas: number[][];
  warmStart: boolean;
  newton?: NewtonOptions;
  /** Cell types and tensions (by area position); absent: every tension 1. */
  typing?: CellTyping;
}

/** One certified or failed candidate at a sample, reduced to what the atlas keeps. */
export interface RankedCandidate {
  code: string;
  id: string;
  /** Index into the sample's areas (largest first) of the area in cell i + 1. */
  assignment: number[];
  /** Perimeter; with cell types, the energy (sum of tension times length) the ranking is by. */
  perimeter: number;
  index: number;
  zeroModes: number;
}

/** What a block gives back per sample: the certified candidates in ranking order. */
export interface SolvedSample {
  index: number;
  areas: number[];
  ranked: RankedCandidate[];
  exhaustive: boolean;
  candidates: number;
  warm: number;
}

/** The pattern of equal areas (and their types) a plan depends on. */
function patternOf(classes: ReturnType<typeof areaClasses>): string {
  return `${classes.multiplicity.join(',')}|${classes.types?.join(',') ?? ''}`;
}

/** The plan of a ranking at `areas`, from a cached plan with the same pattern of equal areas. */
export function planAt(areas: readonly number[], cache: Map<string, RankPlan>, typing?: CellTyping): RankPlan {
  const classes = areaClasses([...areas], typing?.types);
  const pattern = patternOf(classes);
  let base = cache.get(pattern);
  if (base === undefined) {
    base = planRanking(areas, { typing });
    cache.set(pattern, base);
  }
  // the arrangements, their candidates and the budget depend on the pattern of equal areas only
  return {
    ...base,
    query: { ...base.query, areas: [...areas] },
    classes,
    tasks: base.tasks.map((t) => ({ ...t, classes })),
  };
}

/** The symmetries of each arrangement met, by code. */
const groups = new Map<string, Int32Array[]>();

/**
 * The smallest image of an assignment (area positions by cell) under its arrangement's symmetries: one key
 * per class whatever the order of the areas' classes at a sample (with types, the catalogue's
 * representative follows the areas' sizes across types; untyped, it is already this one).
 */
function canonicalAssignment(code: string, assignment: readonly number[]): number[] {
  let group = groups.get(code);
  if (group === undefined) {
    group = cellPermutations(clusterFromCode(code));
    groups.set(code, group);
  }
  return [...orbitRepresentative(Int32Array.from(assignment), group)];
}

/** The certified entries of a catalogue, in its ranking order, reduced. */
function rankedOf(entries: readonly CatalogueEntry[]): RankedCandidate[] {
  const out: RankedCandidate[] = [];
  for (const e of entries) {
    const value = rankedValue(e);
    if (e.rank === null || value === null) break;
    out.push({ code: e.code, id: e.id, assignment: canonicalAssignment(e.code, e.assignment), perimeter: value, index: e.index ?? 0, zeroModes: e.zeroModes ?? 0 });
  }
  return out;
}

/** Rank every candidate at one sample; `starts` (per task) are the warm starts. */
export function rankSample(
  areas: readonly number[], cache: Map<string, RankPlan>, newton: NewtonOptions | undefined,
  starts: ReadonlyMap<string, Equilibrium>[] | null, typing?: CellTyping,
): { plan: RankPlan; ranked: RankedCandidate[]; exhaustive: boolean; states: Map<string, Equilibrium>[]; warm: number } {
  const plan = planAt(areas, cache, typing);
  let warm = 0;
  const results = plan.tasks.map((t, k) => {
    const task = { ...t, newton, starts: starts?.[k] };
    if (starts !== null) warm += Math.min(starts[k].size, plan.work[k]);
    return evaluateCluster(task);
  });
  const catalogue = assembleCatalogue(plan, results.flatMap((list, k) => unrankedEntries(plan, k, list)));
  const states = results.map((list) => {
    const m = new Map<string, Equilibrium>();
    for (const r of list) {
      if (r.equilibrium.status === 'ok') m.set(r.assignment.join(','), r.equilibrium);
    }
    return m;
  });
  return { plan, ranked: rankedOf(catalogue.entries), exhaustive: catalogue.counts.exhaustive, states, warm };
}

function distance2(a: readonly number[], b: readonly number[]): number {
  let d = 0;
  for (let i = 0; i < a.length; i++) d += (a[i] - b[i]) ** 2;
  return d;
}

/** Solve a block of samples in order, each warm from the nearest of the last WINDOW solved. */
export function solveBlock(block: AtlasBlock): SolvedSample[] {
  const cache = new Map<string, RankPlan>();
  const recent: { areas: number[]; pattern: string; states: Map<string, Equilibrium>[] }[] = [];
  const out: SolvedSample[] = [];
  block.areas.forEach((areas, s) => {
    const pattern = patternOf(areaClasses(areas, block.typing?.types));
    let from: Map<string, Equilibrium>[] | null = null;
    if (block.warmStart) {
      let best = Infinity;
      for (const r of recent) {
        const d = distance2(r.areas, areas);
        if (r.pattern === pattern && d < best) {
          best = d;
          from = r.states;
        }
      }
    }
    const result = rankSample(areas, cache, block.newton, from, block.typing);
    recent.push({ areas, pattern, states: result.states });
    if (recent.length > WINDOW) recent.shift();
    out.push({
      index: block.indices[s], areas, ranked: result.ranked, exhaustive: result.exhaustive,
      candidates: result.plan.work.reduce((p, q) => p + q, 0), warm: result.warm,
    });
  });
  return out;
}
