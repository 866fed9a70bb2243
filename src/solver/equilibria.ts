// solver stage: every equilibrium of one arrangement at given areas that a search can find: several
// first drawings (`starts`), each descended to an end; the distinct certified equilibria kept with how
// many starts reached each; saddles on request (Newton's method on the full equilibrium system).
//
// This file holds the contract the catalogue builds on (findEquilibria and its result types). The first
// version runs one relaxation (relax(), or relaxFrom() from a warm start): today's answer.

import type { CubicMap } from '../maps/cubic-map.ts';
import { type EquilibriumStart, relax, relaxFrom } from './newton.ts';
import type { NewtonOptions } from './options.ts';
import type { Equilibrium } from './result.ts';

/** Options of findEquilibria(): the relaxer's, and how hard to search. */
export interface SearchOptions extends NewtonOptions {
  /**
   * First drawings tried per candidate: the barycentric one, the construction-path one, then seeded
   * perturbations of them.
   * @default DEFAULT_STARTS
   */
  starts?: number;
  /** Also look for saddles (index >= 1) by Newton's method on the full equilibrium system. @default false */
  unstable?: boolean;
  /** Seed of the perturbed starts (same seed, same answers). @default 1 */
  seed?: number;
}

/** Starts tried per candidate when none are asked for. */
export const DEFAULT_STARTS = 1;

/** Where a lens of a family can be: its cell and host walls, and the range it slides over. */
export interface LensRange {
  /** The lens cell (1..n). */
  cell: number;
  /** Its two host pieces (map.wallIndex numbering), ka at one end, kb at the other. */
  walls: [number, number];
  /**
   * Share of the host wall (ka + lens + kb, measured along the circle) on ka's side of the lens at
   * the answer, and the least and largest shares the family reaches (a piece shrinks to nothing at
   * either end).
   */
  at: number;
  from: number;
  to: number;
}

/** One certified equilibrium found by the search. */
export interface FoundEquilibrium {
  /** The answer (status 'ok'). */
  equilibrium: Equilibrium;
  /** Starts whose relaxation ended at this equilibrium (a saddle found only by the root finder: 0). */
  reached: number;
  /** For a member of a lens family (zero modes from sliding lenses): where its lens can slide; else null. */
  family: LensRange | null;
}

/** What the search found for one candidate. */
export interface EquilibriumSearch {
  /**
   * The distinct certified equilibria (perimeters more than 1e-9 relative apart, or a different
   * family): stable ones first by perimeter, then saddles by index and perimeter. Saddles appear only
   * with `unstable` (or when a descent itself ended at one).
   */
  found: FoundEquilibrium[];
  /** When nothing was found: the answer of the first start, whose status names the failure; else null. */
  failure: Equilibrium | null;
  /** Starts tried. */
  tried: number;
  /** Newton iterations of the whole search. */
  iterations: number;
}

/**
 * Every equilibrium of the cluster `map` with cell i + 1 of area areas[i] that the search finds, from
 * `options.starts` first drawings (after `warm`, a previous answer at nearby areas, when given).
 * Never throws for a numerical failure.
 * @throws UsageError as relax() does, or when an option is out of range.
 */
export function findEquilibria(
  map: CubicMap, areas: Float64Array, options: SearchOptions = {}, warm: EquilibriumStart | null = null,
): EquilibriumSearch {
  const eq = warm === null ? relax(map, areas, options) : relaxFrom(map, areas, warm, options);
  if (eq.status === 'ok') return { found: [{ equilibrium: eq, reached: 1, family: null }], failure: null, tried: 1, iterations: eq.iterations };
  return { found: [], failure: eq, tried: 1, iterations: eq.iterations };
}
