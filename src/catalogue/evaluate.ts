// catalogue stage: relax every candidate assignment of one cluster (or search among them).
//
// This is the unit of work a worker thread receives; its result depends only on the task, so a ranking
// is the same with one worker or many. Within a cluster a candidate's search (solver/equilibria.ts)
// starts from the previous certified answer when there is one (warm start), then from its own first
// drawings (barycentric, construction path, seeded perturbations).

import { clusterFromCode, cellPermutations } from '../maps/cluster.ts';
import { wallSwapCode } from '../maps/t1.ts';
import { type EquilibriumSearch, findEquilibria, searchAnswer } from '../solver/equilibria.ts';
import type { NewtonOptions } from '../solver/options.ts';
import { type TensionTable, wallTensions } from '../solver/tensions.ts';
import type { Equilibrium } from '../solver/result.ts';
import { type AreaClasses, areasOf, orbitAssignments, orbitRepresentative, typesOf } from './assign.ts';
import { mulberry32 } from '../random.ts';

/** One cluster's share of a ranking. */
export interface ClusterTask {
  /** Canonical code of the cluster. */
  code: string;
  /** The area classes of the query. */
  classes: AreaClasses;
  /** 'all': every orbit representative; 'search': at most `cap` candidates by local search. */
  mode: 'all' | 'search';
  /** Most candidates tried in 'search' mode. */
  cap: number;
  /** Seed of the search's random starts. */
  seed: number;
  /** Whether to start each candidate from the previous certified one. @default true */
  warmStart?: boolean;
  /**
   * Certified equilibria of some candidates at nearby areas (keyed by the class sequence joined with
   * commas), each tried as that candidate's start before anything else ('all' mode). @default none
   */
  starts?: ReadonlyMap<string, Equilibrium>;
  /** Options passed to the relaxer. */
  newton?: NewtonOptions;
  /**
   * How hard each candidate is searched: first drawings per candidate, and whether saddles are looked
   * for (solver/equilibria.ts SearchOptions; the perturbed starts are seeded with `seed`).
   * @default the search's defaults
   */
  search?: { starts?: number; unstable?: boolean };
  /**
   * The tensions between the cell types of classes.types (walls of different tension); each candidate
   * relaxes with its walls' tensions. @default every tension 1
   */
  tensions?: TensionTable;
}

/** One relaxed candidate, as plain data (it crosses thread boundaries). */
export interface CandidateResult {
  code: string;
  /** Area class of each cell (cell i + 1 at index i). */
  assignment: number[];
  /** What the search found: every certified equilibrium, or the failure; the starts tried. */
  search: EquilibriumSearch;
  /**
   * The candidate's answer: its first equilibrium found (the least stable one when there is one), else
   * the failure (warm starts and the local search read it).
   */
  equilibrium: Equilibrium;
  /** For a wall collapse: the code of the arrangement the T1 swap of that wall leads to, if admissible. */
  becomes: string | null;
}

/** Relax the candidates of one cluster task, in a deterministic order. */
export function evaluateCluster(task: ClusterTask): CandidateResult[] {
  const cluster = clusterFromCode(task.code);
  const group = cellPermutations(cluster);
  const warm = task.warmStart !== false;
  const out: CandidateResult[] = [];
  let previous: Equilibrium | null = null;
  const options = { ...task.newton, ...task.search, seed: task.seed };
  const solve = (s: Int32Array, from: Equilibrium | null): CandidateResult => {
    const areas = areasOf(s, task.classes);
    const tensions = wallTensions(cluster.map, typesOf(s, task.classes), task.tensions);
    const search = findEquilibria(cluster.map, areas, tensions === null ? options : { ...options, tensions }, from !== null && warm ? from : null);
    const eq = searchAnswer(search);
    const becomes = eq.status === 'wall-collapse' && eq.collapsingWall !== null ? wallSwapCode(cluster, eq.collapsingWall) : null;
    const result = { code: task.code, assignment: [...s], search, equilibrium: eq, becomes };
    out.push(result);
    return result;
  };
  if (task.mode === 'all') {
    for (const s of orbitAssignments(task.classes, group)) {
      const r = solve(s, task.starts?.get(s.join(',')) ?? previous);
      if (r.equilibrium.status === 'ok') previous = r.equilibrium;
    }
    return out;
  }
  searchCluster(task, cluster.map.faceCount - 1, group, (s, from) => solve(s, from), cluster.map, out);
  return out;
}

/**
 * Local search over assignments: starts from the placement with larger areas on cells with more sides,
 * then from seeded random placements; from each, exchange the areas of two cells and keep an exchange
 * that lowers the energy (the perimeter at unit tension; first improvement, re-relaxing from the current geometry), until no
 * exchange helps or `cap` candidates have been tried.
 */
function searchCluster(
  task: ClusterTask,
  n: number,
  group: Int32Array[],
  solve: (s: Int32Array, from: Equilibrium | null) => CandidateResult,
  map: { faceSize(f: number): number },
  out: CandidateResult[],
): void {
  const seen = new Set<string>();
  const rng = mulberry32(task.seed);
  const base: number[] = [];
  task.classes.multiplicity.forEach((m, k) => {
    for (let i = 0; i < m; i++) base.push(k);
  });
  // sensible start: cells by side count, most sides first, get the classes from the largest area down
  const bySides = [...Array(n).keys()].sort((a, b) => map.faceSize(b + 1) - map.faceSize(a + 1) || a - b);
  const sensible = new Int32Array(n);
  bySides.forEach((cell, i) => (sensible[cell] = base[i]));
  const starts: Int32Array[] = [sensible];
  for (let r = 0; r < 2; r++) {
    const shuffled = [...base];
    for (let i = n - 1; i > 0; i--) {
      const j = Math.floor(rng() * (i + 1));
      [shuffled[i], shuffled[j]] = [shuffled[j], shuffled[i]];
    }
    starts.push(Int32Array.from(shuffled));
  }
  const tryOne = (s: Int32Array, from: Equilibrium | null): CandidateResult | null => {
    if (out.length >= task.cap) return null;
    const key = orbitRepresentative(s, group).join(',');
    if (seen.has(key)) return null;
    seen.add(key);
    return solve(Int32Array.from(s), from);
  };
  for (const start of starts) {
    let current = tryOne(start, null);
    if (current === null || current.equilibrium.status !== 'ok') continue;
    let improved = true;
    while (improved && out.length < task.cap) {
      improved = false;
      const s = Int32Array.from(current.assignment);
      for (let i = 0; i < n && !improved; i++) {
        for (let j = i + 1; j < n && !improved; j++) {
          if (s[i] === s[j]) continue;
          const t = Int32Array.from(s);
          [t[i], t[j]] = [t[j], t[i]];
          const r = tryOne(t, current.equilibrium);
          if (r !== null && r.equilibrium.status === 'ok' && r.equilibrium.energy < current.equilibrium.energy) {
            current = r;
            improved = true;
          }
        }
      }
    }
  }
}
