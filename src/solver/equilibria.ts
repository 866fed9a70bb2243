// solver stage: every equilibrium of one arrangement at given areas that a search can find: several
// first drawings (`starts`), each descended to an end; the distinct certified equilibria kept with how
// many starts reached each; saddles on request (Newton's method on the full equilibrium system).
//
// The starts: first relax() (or relaxFrom() from a warm start), today's answer, so the search never
// loses what one relaxation finds; then the construction-path drawing, then seeded perturbations of the
// barycentric and construction-path drawings (relaxFromDrawing), each descended to its end; areas
// nearly equal that none of them brought to an equilibrium are continued from the equal-area one. Two
// certified answers are one equilibrium when their perimeters agree to SAME_PERIMETER (relative) and
// their pressures to SAME_PRESSURE (relative to the cluster's pressure scale): members of one lens
// family have the same perimeter and pressures, so a family is found once.
//
// Saddles (`unstable`): Newton's method on the full equilibrium system (roots.ts) from points of each
// start's descent path (its first drawing, and after each of PATH_BUDGETS steps: the path passes near
// the saddles that guard its way, a collapse's included) and from perturbations of every certified
// equilibrium found; each end is certified and classified as relax() does its answers (newton.ts
// answerAtState). Then two searches aimed at saddles (modes.ts): mode following uphill from every
// stable equilibrium found (each of the lowest modes in both directions, the lowest two together), and
// at equal areas a search kept on the drawings with a group of the arrangement's symmetries
// (symmetry.ts), each end polished by Newton's method and certified the same way. Measured at n = 4..6
// equal areas: the mode following ends at a wall shrinking to nothing (the lowest passes out of these
// minima are T1 changes of arrangement) and the symmetric search at the known minima; no saddle found.
// Not yet tried: a minimisation with a collapsing wall held at a fixed short length.

import { UsageError } from '../errors.ts';
import type { CubicMap } from '../maps/cubic-map.ts';
import { descend } from './descent.ts';
import { lensHostOf, lensSharesOf } from './family.ts';
import {
  type DrawingStart, type EquilibriumStart, answerAtState, drawingState, relax, relaxFrom, relaxFromDrawing,
} from './newton.ts';
import { type NewtonOptions, resolveOptions } from './options.ts';
import { problemOf } from './problem.ts';
import type { Equilibrium } from './result.ts';
import { followModes } from './modes.ts';
import { findRootFrom } from './roots.ts';
import { type StateSymmetry, cyclicGroupOf, stateSymmetriesOf, symmetriseInto } from './symmetry.ts';

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

/**
 * Starts tried per candidate when none are asked for. With this default, the starts after the first
 * are tried only when the first ended without a verdict on the arrangement ('no-convergence', or
 * 'walls-cross': equations solved by a drawing that is not one of the arrangement): a collapse verdict
 * stands, which keeps a ranking's time that of one relaxation per candidate (every further start costs
 * about one more; `npm run bench -- rank-starts`). Starts asked for explicitly are all tried.
 */
export const DEFAULT_STARTS = 3;

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
  const { starts: asked, unstable = false, seed = 1, ...newton } = options;
  if (asked !== undefined && !(Number.isInteger(asked) && asked >= 1)) {
    throw new UsageError(`Option starts is ${String(asked)} when expected a positive integer.`);
  }
  if (!(Number.isInteger(seed) && seed >= 0 && seed <= 0xffffffff)) {
    throw new UsageError(`Option seed is ${String(seed)} when expected an integer from 0 to 4294967295.`);
  }
  const starts = asked ?? DEFAULT_STARTS;
  const search = new Search(areas);
  const first = warm === null ? relax(map, areas, newton) : relaxFrom(map, areas, warm, newton);
  search.add(first, 1);
  let tried = 1;
  if (map.junctionCount > 0 && (asked !== undefined || unstable || first.status === 'no-convergence' || first.status === 'walls-cross')) {
    for (let i = 1; i < starts; i++) {
      const eq = relaxFromDrawing(map, areas, startOf(i, seed), newton);
      tried++;
      if (eq !== null) search.add(eq, 1);
    }
  }
  if (search.found.length === 0 && map.junctionCount > 0 && nearlyEqual(areas)) {
    // Are the areas equal but for rounding-sized differences? Continue from the equal-area equilibrium.
    const mean = areas.reduce((s, a) => s + a, 0) / areas.length;
    const level = relax(map, new Float64Array(areas.length).fill(mean), newton);
    search.iterations += level.iterations;
    if (level.status === 'ok') {
      search.add(relaxFrom(map, areas, level, newton), 1);
      tried++;
    }
  }
  // (no saddle where a junction's tensions cannot balance: relax() said so from the tensions alone)
  if (unstable && map.junctionCount > 0 && first.status !== 'junction-unbalanced') findSaddles(map, areas, newton, starts, seed, search);
  return search.result(map, first, tried);
}

/**
 * Two certified answers are one equilibrium when their perimeters agree to SAME_PERIMETER relative and
 * every pressure to SAME_PRESSURE times the largest |pressure| (plus the scale 1/sqrt(mean area)).
 */
export const SAME_PERIMETER = 1e-9;
export const SAME_PRESSURE = 1e-6;

/** The answer a search stands for: its first equilibrium (the least stable one when there is one), else its failure. */
export function searchAnswer(search: EquilibriumSearch): Equilibrium {
  return search.found.length > 0 ? search.found[0].equilibrium : search.failure!;
}
// Areas this close to equal (relative) that no start brought to an equilibrium are reached by
// continuation from the equal-area equilibrium.
const NEAR_EQUAL = 1e-3;
// A perturbed start moves junctions by up to PERTURBATION of their shortest wall and bulges by up to
// PERTURBATION radians.
const PERTURBATION = 0.3;
// Saddles: Newton's method (at most ROOT_BUDGET iterations) from the states a descent reaches after
// each of PATH_BUDGETS steps (0: the drawing itself), and from PERTURBED perturbations of every
// certified equilibrium (their sizes SADDLE_PERTURBATIONS in turn).
const ROOT_BUDGET = 40;
const PATH_BUDGETS = [0, 1, 2, 4, 8, 16, 32];
const PERTURBED = 4;
const SADDLE_PERTURBATIONS = [0.3, 0.6];
// Mode following (modes.ts) from every stable equilibrium found: each of the FOLLOWED lowest non-zero
// modes in both directions, and the lowest two together in the four pairs of directions, at most
// FOLLOW_BUDGET steps each. At equal areas, the symmetric search: the first drawings descended
// SYMMETRIC_DESCENT steps, then kept on the drawings with one group of symmetries (the whole group
// and the cyclic group of each symmetry) for at most FOLLOW_BUDGET steps.
const FOLLOWED = 3;
const FOLLOW_BUDGET = 60;
const SYMMETRIC_DESCENT = 16;

// The i-th start (i >= 1): the construction-path drawing, then perturbations of the barycentric and the
// construction-path drawings in turn.
function startOf(i: number, seed: number): DrawingStart {
  if (i === 1) return { drawing: 'insertion', seed: null, amplitude: 0 };
  return { drawing: i % 2 === 0 ? 'barycentric' : 'insertion', seed: mix(seed, i), amplitude: PERTURBATION };
}

// A seed for the i-th use of `seed` (a multiplicative hash; common practice, no source).
function mix(seed: number, i: number): number {
  return (Math.imul(seed ^ 0x9e3779b9, 0x85ebca6b) + Math.imul(i, 0xc2b2ae35)) >>> 0;
}

// Areas not all equal whose largest is within NEAR_EQUAL (relative) of their least.
function nearlyEqual(areas: Float64Array): boolean {
  let least = Infinity;
  let most = 0;
  for (const a of areas) {
    least = Math.min(least, a);
    most = Math.max(most, a);
  }
  return most > least && most <= (1 + NEAR_EQUAL) * least;
}

// Newton's method on the equilibrium system from the descent paths of the starts and from perturbations
// of every equilibrium found so far; every certified end is added (reached by no start).
function findSaddles(map: CubicMap, areas: Float64Array, newton: NewtonOptions, starts: number, seed: number, search: Search): void {
  const opt = resolveOptions(newton);
  const tryRoot = (start: DrawingStart, path: number): void => {
    const state = drawingState(map, areas, start, opt.tensions);
    if (state === null) return;
    const { problem, ws } = state;
    let iterations = 0;
    if (path > 0) iterations += descend(problem, ws, opt, path, false).iterations;
    const root = findRootFrom(problem, ws, opt, ROOT_BUDGET);
    iterations += root.iterations;
    search.iterations += iterations;
    if (root.converged) search.add(answerAtState(map, areas, ws.z, iterations, newton), 0);
  };
  const drawings: DrawingStart[] = [{ drawing: 'barycentric', seed: null, amplitude: 0 }];
  for (let i = 1; i < starts; i++) drawings.push(startOf(i, seed));
  for (const start of drawings) for (const path of PATH_BUDGETS) tryRoot(start, path);
  const known = search.found.map((f) => f.equilibrium);
  for (let j = 0; j < known.length; j++) {
    for (let m = 0; m < PERTURBED; m++) {
      const amplitude = SADDLE_PERTURBATIONS[m % SADDLE_PERTURBATIONS.length];
      tryRoot({ drawing: known[j], seed: mix(seed, 1000 * (j + 1) + m), amplitude }, 0);
    }
  }
  // mode following from every stable equilibrium, then Newton's method from where it ends
  const follow = (start: DrawingStart, modes: number[], signs: number[], group: readonly StateSymmetry[] | null): void => {
    const state = drawingState(map, areas, start, opt.tensions);
    if (state === null) return;
    const { problem, ws } = state;
    let iterations = 0;
    let project: ((z: Float64Array) => void) | null = null;
    if (group !== null) {
      iterations += descend(problem, ws, opt, SYMMETRIC_DESCENT, false).iterations;
      const scratch = new Float64Array(problem.size);
      project = (z) => symmetriseInto(problem, group, z, scratch);
      project(ws.z);
    }
    const path = followModes(problem, ws, modes, signs, FOLLOW_BUDGET, project);
    iterations += path.iterations;
    if (path.converged) {
      const root = findRootFrom(problem, ws, opt, ROOT_BUDGET);
      iterations += root.iterations;
      if (root.converged) search.add(answerAtState(map, areas, ws.z, iterations, newton), 0);
    }
    search.iterations += iterations;
  };
  for (const eq of known) {
    if (eq.index !== 0) continue;
    const start: DrawingStart = { drawing: eq, seed: null, amplitude: 0 };
    for (let m = 0; m < FOLLOWED; m++) for (const sign of [1, -1]) follow(start, [m], [sign], null);
    for (const a of [1, -1]) for (const b of [1, -1]) follow(start, [0, 1], [a, b], null);
  }
  // the symmetric search, at equal areas, with the symmetries that keep the walls' tensions (those keep
  // the equations)
  if (!areas.every((a) => a === areas[0])) return;
  const { tensions } = opt;
  const symmetries = stateSymmetriesOf(map).filter((g) => tensions === null || g.wall.every((w, k) => tensions[w] === tensions[k]));
  if (symmetries.length < 2) return;
  // (a cyclic group is generated by several of its members: each group once)
  const groups = new Map<string, readonly StateSymmetry[]>();
  for (const group of [symmetries, ...symmetries.slice(1).map(cyclicGroupOf)]) {
    const key = group.map((g) => `${g.junction.join(',')}/${g.wall.join(',')}/${g.sign.join(',')}`).sort().join(';');
    if (!groups.has(key)) groups.set(key, group);
  }
  for (const group of groups.values()) for (const start of drawings.slice(0, 2)) follow(start, [], [], group);
}

// The distinct certified equilibria seen so far.
class Search {
  readonly found: FoundEquilibrium[] = [];
  iterations = 0;
  private readonly scale: number;

  constructor(areas: Float64Array) {
    let total = 0;
    for (const a of areas) total += a;
    this.scale = 1 / Math.sqrt(total / areas.length);
  }

  // Count an answer: a certified one reached `reached` times more (a new equilibrium, or one seen).
  add(eq: Equilibrium, reached: number): void {
    this.iterations += reached > 0 ? eq.iterations : 0;
    if (eq.status !== 'ok') return;
    const same = this.found.find((f) => this.same(f.equilibrium, eq));
    if (same !== undefined) same.reached += reached;
    else this.found.push({ equilibrium: eq, reached, family: null });
  }

  private same(a: Equilibrium, b: Equilibrium): boolean {
    if (Math.abs(a.perimeter - b.perimeter) > SAME_PERIMETER * Math.max(a.perimeter, b.perimeter)) return false;
    let most = this.scale;
    for (let f = 0; f < a.pressures.length; f++) most = Math.max(most, Math.abs(a.pressures[f]), Math.abs(b.pressures[f]));
    for (let f = 0; f < a.pressures.length; f++) if (Math.abs(a.pressures[f] - b.pressures[f]) > SAME_PRESSURE * most) return false;
    return true;
  }

  // The search's answer: stable equilibria by perimeter, then saddles by index and perimeter; their
  // lens ranges; the first start's answer when nothing was found.
  result(map: CubicMap, first: Equilibrium, tried: number): EquilibriumSearch {
    const found = this.found.slice().sort((a, b) =>
      (a.equilibrium.index as number) - (b.equilibrium.index as number) || a.equilibrium.perimeter - b.equilibrium.perimeter);
    for (const f of found) f.family = familyOf(map, f.equilibrium);
    return { found, failure: found.length === 0 ? first : null, tried, iterations: this.iterations };
  }
}

// Where the lens of a family member can slide (the first lens set in one wall), or null when the answer
// has no zero mode or no such lens.
function familyOf(map: CubicMap, eq: Equilibrium): LensRange | null {
  if (!(eq.zeroModes !== null && eq.zeroModes > 0) || map.junctionCount === 0) return null;
  const problem = problemOf(map);
  const t0 = 2 * problem.junctions;
  const z = new Float64Array(problem.size);
  z.set(eq.coords);
  z.set(eq.bulges, t0);
  z.set(eq.pressures, t0 + problem.walls);
  for (let k = 0; k < problem.walls; k++) {
    const host = lensHostOf(problem, k);
    if (host === null || host.ka !== k) continue;
    const shares = lensSharesOf(problem, z, host);
    if (shares !== null) return { cell: host.cell + 1, walls: [host.ka, host.kb], ...shares };
  }
  return null;
}
