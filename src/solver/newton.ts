// solver stage: relax a cluster to its equilibrium: a first drawing, a constrained Newton descent, a verdict.
//
// Pipeline of one call:
//   1. normalise: lengths in units of sqrt(mean target area), so the mean cell area is 1;
//   2. start from the barycentric drawing (arcs/embed.ts), or from the construction-path drawing
//      (arcs/insertion.ts) when the barycentric one draws a cell below SMALL_START of its area (nested
//      cells: the barycentric drawing of a lens inside a ring comes out a millionth of its size), or
//      from a previous answer (relaxFrom); cells drawn far larger than their targets are shrunk in
//      place first (small-cells.ts);
//   3. descend (descent.ts): constrained Newton steps on the augmented penalty energy, each keeping
//      the shape's Hessian positive definite on the area constraints, until the equations hold to
//      rounding or a wall shrinks to zero length (a T1 collapse);
//   4. when that does not end, begin again from the other drawing; targets far apart (more than
//      EXTREME) that still end without an equilibrium are approached from targets closer together;
//   5. read the pressures off the curvatures (pressures.ts), certify with the independent
//      checkEquilibrium, and count the index and zero modes (stability.ts).

import { UsageError } from '../errors.ts';
import type { CubicMap } from '../maps/cubic-map.ts';
import { embedClusterInto } from '../arcs/embed.ts';
import { drawByInsertionInto } from '../arcs/insertion.ts';
import { BULGE_FACTORS, G, bulgeFactorsInto, bulgeOf, bulgeSine } from '../arcs/arc.ts';
import { type Certificate, certificatePasses, checkEquilibrium } from './certificate.ts';
import { descend, violationOf } from './descent.ts';
import { findRootFrom } from './roots.ts';
import { type NewtonOptions, type ResolvedNewtonOptions, resolveOptions } from './options.ts';
import { type ClusterProblem, problemOf, withTensions } from './problem.ts';
import { curvaturePressuresInto } from './pressures.ts';
import { perimeterInto } from './wall-terms.ts';
import type { Equilibrium } from './result.ts';
import { shrinkSmallCellsInto } from './small-cells.ts';
import { type LensHost, centreLensInto, placeLensInto, slidingHostOf, slidingHostsOf } from './family.ts';
import { stabilityOf } from './stability.ts';
import {
  OK, type Verdict, collapseOf, ordersHold, relativeLengthOf, shortestWallOf, tangentResidualOf, unbalancedJunctionOf,
} from './verdict.ts';
import { type Workspace, workspaceFor } from './workspace.ts';
import { mulberry32 } from '../random.ts';

/** A previous answer's geometry, the start of relaxFrom (caller's units). */
export interface EquilibriumStart {
  /** Junction coordinates, length 2V. */
  coords: Float64Array;
  /** Wall bulges, length E. */
  bulges: Float64Array;
  /** Cell pressures, length n. */
  pressures: Float64Array;
}

// The barycentric drawing is replaced by the construction-path drawing when some cell comes out below
// this fraction of its target area (there the descent would first spend tens of steps growing it).
const SMALL_START = 1e-4;
// A barycentric start that ends in a collapse is tried again from the construction-path drawing when
// some cell started more than FAR_START times off its target and the targets differ by more than
// SPREAD (the barycentric drawing knows nothing of the targets; at equal areas a second start does not
// pay).
const FAR_START = 6;
const SPREAD = 6;
// Targets more than EXTREME apart that a descent did not bring to an equilibrium are approached from
// targets MODERATE apart, STAGE times further apart at each stage (approachInRatio).
const EXTREME = 1e4;
const MODERATE = 1e2;
const STAGE = 10;

interface Attempt {
  verdict: Verdict;
  iterations: number;
}

const NO_CONVERGENCE: Verdict = { status: 'no-convergence', wall: null, cell: null };

// Descend from ws.z and name the end. A wall collapse that is a lens or a bead sliding to the end of its
// family (family.ts) is not taken for one, nor an end whose walls cross in a cluster with such families
// (a member slid into another wall): the lens or bead (for crossings, every one) is moved to the middle
// of its range and the descent goes on from there, up to FAMILY_TRIES times; if that does not end at an
// equilibrium with no walls crossing, the first end is the verdict.
function settle(map: CubicMap, problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, warm: boolean): Attempt {
  const d = descend(problem, ws, opt, opt.maxIterations, warm);
  let iterations = d.iterations;
  let end = d.end;
  perimeterInto(problem, ws.z, ws.cache, ws.areas);
  if ((end === 'settled' && (violationOf(ws.areas, ws.targets, problem.cells) > opt.tolerance || shortOfCertificate(map, problem, ws, opt))) ||
      end === 'stalled' || end === 'max-iterations') {
    // Did the descent settle at its rounding floor with an area still off by more than the tolerance,
    // or not settle? (A cell far smaller than the rest: the merit, of the largest cells' size, no longer
    // sees its area error.) Newton's method on the equations themselves asks for the area back exactly.
    // Its end is kept only when it is a certified equilibrium in order (else the descent's end, and its
    // verdict, which may send relax() to another start, stand).
    // (kept in the family buffer's first state, which is filled only after this)
    const kept = familyBuffers(problem.size).first;
    kept.set(ws.z);
    centreSmallestCell(problem, ws.z, ws.targets);
    const root = findRootFrom(problem, ws, opt, POLISH_BUDGET);
    iterations += root.iterations;
    const certified = root.converged || certificatePasses(certificateAt(map, problem, ws), opt.certificateTolerance);
    if (certified && verdictOf(problem, ws, opt, 'settled').status === 'ok') end = 'settled';
    else ws.z.set(kept);
  }
  const verdict = verdictOf(problem, ws, opt, end);
  let family = familyOfEnd(map, problem, ws, verdict);
  if (family === null) return { verdict, iterations };
  const { first, trial } = familyBuffers(problem.size);
  first.set(ws.z);
  let last = verdict;
  for (let attempt = 0; attempt < FAMILY_TRIES; attempt++) {
    let moved = false;
    if (family.tangled) moved = placeFamilies(map, problem, ws, family.hosts);
    else for (const host of family.hosts) if (centreLensInto(problem, ws.z, host, trial)) moved = true;
    if (!moved) break;
    // (the watch for a collapse looks at walls below 50 collapse lengths, and the pieces of a lens that
    // fills most of its wall may be that short all along its family: from the middle member it watches
    // at a hundredth of that, and the verdict still asks for every wall above the collapse length; a bead
    // or placed members are watched as usual, which ends the descents of the collapses that are no
    // family's sooner: measured at equal areas n = 7, 5.8k Newton iterations for the beads against 15k)
    const watch = family.hosts.every((h) => h.cell >= 0) ? FAMILY_WATCH * opt.collapseLength : opt.collapseLength;
    const again = descend(problem, ws, { ...opt, collapseLength: watch }, FAMILY_BUDGET, true);
    iterations += again.iterations;
    const next = verdictOf(problem, ws, opt, again.end);
    // (and no two walls cross: a lens moved along a curved wall may have been carried into another)
    if (next.status === 'ok' && crossingsAt(map, problem, ws) === 0) return { verdict: next, iterations };
    last = next;
    family = familyOfEnd(map, problem, ws, next);
    if (family === null) break;
  }
  // Did the family's members end with walls crossing wherever they were placed? The equilibrium found
  // is the answer (its walls cross), not the collapse of a lens slid to the end of its range.
  if (last !== verdict && (last.status === 'ok' || last.status === 'walls-cross')) return { verdict: last, iterations };
  ws.z.set(first);
  return { verdict, iterations };
}

// The lenses and beads (family.ts) to move after a descent ended with `verdict` at ws.z, or null when
// the end is no family's: a wall collapse of a lens's or bead's host piece is that lens or bead slid to
// the end of its range (moved to its middle); an end whose walls cross or are out of order at a
// junction ('tangled'), in a cluster with lenses or beads, may be a member of their family slid into
// another wall (each placed where the fewest walls cross, placeFamilies).
function familyOfEnd(
  map: CubicMap, problem: ClusterProblem, ws: Workspace, verdict: Verdict,
): { hosts: LensHost[]; tangled: boolean } | null {
  if (verdict.status === 'wall-collapse') {
    const host = slidingHostOf(problem, verdict.wall as number);
    return host === null ? null : { hosts: [host], tangled: false };
  }
  if (verdict.status !== 'ok' && verdict.status !== 'walls-cross') return null;
  const hosts = slidingHostsOf(problem);
  if (hosts.length === 0 || (verdict.status === 'ok' && crossingsAt(map, problem, ws) === 0)) return null;
  return { hosts, tangled: true };
}

// Places tried for a lens or bead whose family member has walls crossing: shares of its host pieces
// (placeLensInto), the middle first; with several lenses and beads, every combination of the first
// of them, as many as keep the combinations at most PLACEMENTS.
const SHARES = [0.5, 0.3, 0.7, 0.1, 0.9, 0.2, 0.8, 0.4, 0.6, 0.03, 0.97];
const PLACEMENTS = 125;

// Slide the lenses and beads of `hosts` in ws.z together to the combination of places (SHARES) that
// leaves the fewest walls crossing or out of order, the first with none; ws.z is left as it was when
// none leaves fewer than it has. Returns whether it was moved.
function placeFamilies(map: CubicMap, problem: ClusterProblem, ws: Workspace, hosts: LensHost[]): boolean {
  const { trial, here, best } = familyBuffers(problem.size);
  let fewest = tanglesAt(map, problem, ws);
  here.set(ws.z);
  let moved = false;
  const m = hosts.length;
  const per = Math.max(2, Math.min(SHARES.length, Math.floor(Math.pow(PLACEMENTS, 1 / m) + 1e-9)));
  const combinations = Math.min(PLACEMENTS, Math.pow(per, m));
  for (let c = 0; c < combinations && fewest > 0; c++) {
    ws.z.set(here);
    let placed = true;
    // (combination c in base `per`: digit i the place of host i)
    for (let i = 0, rest = c; i < m && placed; i++, rest = Math.floor(rest / per)) {
      placed = placeLensInto(problem, ws.z, hosts[i], SHARES[rest % per], trial);
    }
    if (!placed) continue;
    const t = tanglesAt(map, problem, ws);
    if (t < fewest) {
      fewest = t;
      moved = true;
      best.set(ws.z);
    }
  }
  ws.z.set(moved ? best : here);
  return moved;
}

// Walls that cross, and junctions out of order, at the state ws.z.
function tanglesAt(map: CubicMap, problem: ClusterProblem, ws: Workspace): number {
  const c = certificateAt(map, problem, ws);
  return c.crossings + c.misorderedJunctions;
}

// Walls that cross at the state ws.z (normalised units, checked against the normalised targets).
function crossingsAt(map: CubicMap, problem: ClusterProblem, ws: Workspace): number {
  return certificateAt(map, problem, ws).crossings;
}

// The certificate of the state ws.z (normalised units, checked against the normalised targets).
function certificateAt(map: CubicMap, problem: ClusterProblem, ws: Workspace): Certificate {
  const t0 = 2 * problem.junctions;
  const p0 = t0 + problem.walls;
  const z = ws.z;
  return checkEquilibrium(map, ws.targets.subarray(0, problem.cells), {
    coords: z.subarray(0, t0), bulges: z.subarray(t0, p0), pressures: z.subarray(p0, p0 + problem.cells),
  }, problem.tensions);
}

// Whether the state ws.z, a drawing in order without crossings, misses the certificate on its residuals
// alone: a descent settled at the rounding floor of its merit, which a cell 1e-14 of the others no
// longer moves (Newton's method on the equations themselves still does). The junctions' law first, which
// costs little and is what such a descent leaves undone; the certificate only then.
function shortOfCertificate(map: CubicMap, problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions): boolean {
  if (!(tangentResidualOf(problem, ws.z) > opt.certificateTolerance)) return false;
  const c = certificateAt(map, problem, ws);
  return c.crossings === 0 && c.misorderedJunctions === 0 && !certificatePasses(c, opt.certificateTolerance);
}

// The verdict of a descent that ended with `end` at ws.z.
// (descend leaves ws.cache at the records of ws.z)
function verdictOf(problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, end: string): Verdict {
  const { z, cache, targets } = ws;
  if (end === 'collapse') return collapseOf(problem, z, cache, targets, opt.collapseLength);
  if (end !== 'settled') return NO_CONVERGENCE;
  // Is the equilibrium reached with a wall below the collapse length, or out of order at a junction?
  if (relativeLengthOf(problem, cache, targets, shortestWallOf(problem, cache, targets)) < opt.collapseLength) {
    return collapseOf(problem, z, cache, targets, opt.collapseLength);
  }
  if (!ordersHold(problem, ws.z)) return { status: 'walls-cross', wall: null, cell: null };
  return OK;
}

// Move the drawing z so that the junctions of the cell of the smallest target are centred on the
// origin: cell areas are sums of cross products of junction coordinates (wall-terms.ts), so a cell of
// area 1e-12 drawn 1e-2 from the origin is resolved only to about 1e-9 of its area (small-cells.ts
// places it so at the start; a descent may carry it away).
function centreSmallestCell(problem: ClusterProblem, z: Float64Array, targets: Float64Array): void {
  const { cells, junctions, walls, starts, ends, lefts, rights } = problem;
  let small = 0;
  for (let f = 1; f < cells; f++) if (targets[f] < targets[small]) small = f;
  let x = 0;
  let y = 0;
  let count = 0;
  for (let k = 0; k < walls; k++) {
    if (lefts[k] !== small && rights[k] !== small) continue;
    for (const v of [starts[k], ends[k]]) {
      x += z[2 * v];
      y += z[2 * v + 1];
      count += 1;
    }
  }
  x /= count;
  y /= count;
  for (let v = 0; v < junctions; v++) {
    z[2 * v] -= x;
    z[2 * v + 1] -= y;
  }
}

// Newton iterations of the polish of a descent settled at its rounding floor (settle).
const POLISH_BUDGET = 20;
// Times a lens is moved back to the middle of its family after its descent slid it to an end.
const FAMILY_TRIES = 3;
const FAMILY_WATCH = 1e-2;
// Newton iterations of each descent from a family's middle member (it starts next to an equilibrium).
const FAMILY_BUDGET = 60;
// Per state size: the state at the first collapse, scratch for centreLensInto, and the state before the
// lenses are placed and the best placing so far (placeFamilies).
const FAMILY_BUFFERS = new Map<number, FamilyBuffers>();
interface FamilyBuffers {
  first: Float64Array;
  trial: Float64Array;
  here: Float64Array;
  best: Float64Array;
}
function familyBuffers(size: number): FamilyBuffers {
  let b = FAMILY_BUFFERS.get(size);
  if (!b) {
    b = { first: new Float64Array(size), trial: new Float64Array(size), here: new Float64Array(size), best: new Float64Array(size) };
    FAMILY_BUFFERS.set(size, b);
  }
  return b;
}

// Write a first drawing into ws.z: with 'auto' the barycentric one, or the construction-path one where
// the barycentric one draws a cell below SMALL_START of its area (and the other is a valid drawing);
// otherwise the one asked for (null when it cannot be made). Returns which was drawn.
function drawStart(
  map: CubicMap, problem: ClusterProblem, ws: Workspace, which: 'auto' | 'barycentric' | 'insertion',
): 'barycentric' | 'insertion' | null {
  const t0 = 2 * problem.junctions;
  const coords = ws.z.subarray(0, t0);
  const bulges = ws.z.subarray(t0, t0 + problem.walls);
  if (which !== 'insertion') {
    embedClusterInto(map, problem.cells, coords, bulges);
    if (which === 'barycentric') return 'barycentric';
    perimeterInto(problem, ws.z, ws.cache, ws.areas);
    let small = false;
    for (let f = 0; f < problem.cells; f++) if (!(ws.areas[f] >= SMALL_START * ws.targets[f])) small = true;
    if (!small) return 'barycentric';
  }
  if (drawByInsertionInto(map, ws.targets, coords, bulges)) {
    // (asked for explicitly, as a second start, it need not be a valid drawing: the descent may still
    // find its way from it)
    if (which === 'insertion') return 'insertion';
    perimeterInto(problem, ws.z, ws.cache, ws.areas);
    let valid = ordersHold(problem, ws.z);
    for (let f = 0; f < problem.cells; f++) if (!(ws.areas[f] > 0)) valid = false;
    if (valid) return 'insertion';
  }
  if (which === 'insertion') return null;
  embedClusterInto(map, problem.cells, coords, bulges);
  return 'barycentric';
}

// Shrink the cells of the drawing in ws.z that are drawn far larger than their targets to their size
// (small-cells.ts), unless that leaves an invalid drawing (walls out of order, a cell of no area).
function shrinkSmallCells(problem: ClusterProblem, ws: Workspace): void {
  perimeterInto(problem, ws.z, ws.cache, ws.areas);
  const before = ws.trial;
  before.set(ws.z);
  if (!shrinkSmallCellsInto(problem, ws.z, ws.targets, ws.areas)) return;
  perimeterInto(problem, ws.z, ws.cache, ws.areas);
  let valid = ordersHold(problem, ws.z);
  for (let f = 0; f < problem.cells; f++) if (!(ws.areas[f] > 0)) valid = false;
  if (!valid) ws.z.set(before);
}

// The answer for the circle (one cell): perimeter 2 sqrt(pi A), pressure 1/R (isoperimetric inequality).
// With a tension s on its one wall (tensions of length 1): energy s 2 pi R, pressure s/R (Laplace-Young).
function circleAnswer(map: CubicMap, areas: Float64Array, tensions: Float64Array | null): Equilibrium {
  const area = areas[0];
  const radius = Math.sqrt(area / Math.PI);
  const s = tensions === null ? 1 : tensions[0];
  const result: Equilibrium = {
    status: 'ok',
    perimeter: 2 * Math.PI * radius,
    energy: s * (2 * Math.PI * radius),
    pressures: Float64Array.of(s / radius),
    coords: new Float64Array(0),
    bulges: new Float64Array(0),
    curvatures: new Float64Array(0),
    areas: Float64Array.of(area),
    iterations: 0,
    restarts: 0,
    certificate: undefined as unknown as Certificate,
    index: 0,
    zeroModes: 0,
    collapsingWall: null,
    collapsingCell: null,
    unbalancedJunction: null,
    junctionTensions: null,
  };
  result.certificate = checkEquilibrium(map, areas, result, tensions);
  return result;
}

// Check the map, the areas and the tensions' count at the public boundary.
function checkInput(map: CubicMap, areas: Float64Array, opt: ResolvedNewtonOptions): void {
  const cells = map.faceCount - 1;
  if (areas.length !== cells) {
    throw new UsageError(`Got ${areas.length} areas when expected ${cells}, one per cell.`);
  }
  // (the circle has one wall, though its map has no darts)
  const walls = map.junctionCount === 0 ? 1 : map.twins.length / 2;
  if (opt.tensions !== null && opt.tensions.length !== walls) {
    throw new UsageError(`Got ${opt.tensions.length} tensions when expected ${walls}, one per wall.`);
  }
  for (let i = 0; i < cells; i++) {
    if (!(areas[i] > 0) || !Number.isFinite(areas[i])) {
      throw new UsageError(`Area of cell ${i + 1} is ${areas[i]} when expected a positive finite number.`);
    }
  }
}

function normaliseTargets(problem: ClusterProblem, ws: Workspace, areas: Float64Array): number {
  let total = 0;
  for (let f = 0; f < problem.cells; f++) total += areas[f];
  const unit = Math.sqrt(total / problem.cells);
  for (let f = 0; f < problem.cells; f++) ws.targets[f] = areas[f] / (unit * unit);
  return unit;
}

/**
 * Relax the cluster `map` (face 0 = outside, faces 1..n = cells) to an equilibrium with cell i + 1 of
 * area areas[i], from a first drawing of the arrangement. Never throws for a numerical failure: the
 * status names it. An 'ok' answer is a stable equilibrium in its arrangement (index 0) unless the
 * drawing it started from was one already.
 * @throws UsageError when the number of areas is not n or an area is not positive and finite, or an
 *   option is out of range.
 */
export function relax(map: CubicMap, areas: Float64Array, options?: NewtonOptions): Equilibrium {
  const opt = resolveOptions(options);
  checkInput(map, areas, opt);
  if (map.junctionCount === 0) return circleAnswer(map, areas, opt.tensions);
  const problem = withTensions(problemOf(map), opt.tensions);
  const { cells } = problem;
  const ws = workspaceFor(problem);
  const unit = normaliseTargets(problem, ws, areas);
  const first = drawStart(map, problem, ws, 'auto');
  // Can every junction balance its three tensions? If not, no relaxation can end: say so at once.
  const unbalanced = unbalancedJunctionOf(problem);
  if (unbalanced >= 0) return unbalancedAnswer(map, problem, ws, areas, unit, opt, unbalanced);
  shrinkSmallCells(problem, ws);
  // how far the start's areas are from the targets, and the targets from each other (largest factors)
  perimeterInto(problem, ws.z, ws.cache, ws.areas);
  let far = 1;
  let least = Infinity;
  let most = 0;
  for (let f = 0; f < cells; f++) {
    const q = ws.areas[f] / ws.targets[f];
    const r = q > 1 ? q : 1 / q;
    if (!(r <= far)) far = r;
    least = Math.min(least, ws.targets[f]);
    most = Math.max(most, ws.targets[f]);
  }
  let attempt = settle(map, problem, ws, opt, false);
  let restarts = 0;
  const status = attempt.verdict.status;
  if (status === 'no-convergence') {
    // Did the descent not end? Begin again from the other drawing.
    const again = secondStart(map, problem, ws, opt, first === 'barycentric' ? 'insertion' : 'barycentric', attempt, true);
    if (again !== null) {
      attempt = again;
      restarts = 1;
    }
  } else if ((status === 'wall-collapse' || status === 'cell-collapse') && first === 'barycentric' &&
      far > FAR_START && most > SPREAD * least) {
    // Did a barycentric start far from unequal targets end in a collapse? The descent came a long way in
    // the areas, through shapes the targets' equilibrium need not be reached by: begin again from the
    // construction-path drawing, which starts at the targets' areas, and keep what it finds if certified.
    const again = secondStart(map, problem, ws, opt, 'insertion', attempt, false);
    if (again !== null) {
      attempt = again;
      restarts = 1;
    }
  }
  if (attempt.verdict.status !== 'ok' && most > EXTREME * least) {
    // Are the areas far apart, and did the descent not reach an equilibrium? Approach them from areas
    // MODERATE apart, STAGE times further apart each time, each stage warm from the last.
    const approached = approachInRatio(map, problem, ws, opt, attempt);
    if (approached !== null) {
      attempt = approached;
      restarts++;
    }
  }
  return answerOf(map, problem, ws, areas, unit, opt, attempt, restarts);
}

/**
 * A first drawing of findEquilibria's later starts (equilibria.ts): the barycentric or the
 * construction-path drawing, its junctions moved and its bulges changed at random (seeded) when `seed`
 * is not null, by `amplitude` times each junction's shortest wall and times one radian.
 */
export interface DrawingStart {
  /** The barycentric or construction-path drawing, or a previous answer's geometry (caller's units). */
  drawing: 'barycentric' | 'insertion' | EquilibriumStart;
  seed: number | null;
  amplitude: number;
}

// Halvings of a perturbation that leaves an invalid drawing before the start is dropped.
const PERTURB_TRIES = 4;

/**
 * Write the first drawing `start` into the workspace of `map`'s problem, targets normalised (as relax
 * does); returns the problem, the workspace and the unit of length, or null when that drawing cannot be
 * made (the construction path fails, or every perturbation leaves an invalid drawing). With wall
 * `tensions` (options.tensions, checked) the problem weighs its walls by them.
 * Assumes checked input and at least one junction.
 */
export function drawingState(
  map: CubicMap, areas: Float64Array, start: DrawingStart, tensions: Float64Array | null = null,
): { problem: ClusterProblem; ws: Workspace; unit: number } | null {
  const problem = withTensions(problemOf(map), tensions);
  const ws = workspaceFor(problem);
  const unit = normaliseTargets(problem, ws, areas);
  if (typeof start.drawing === 'object') {
    loadStart(problem, ws, start.drawing, unit);
  } else {
    if (drawStart(map, problem, ws, start.drawing) === null) return null;
    shrinkSmallCells(problem, ws);
  }
  if (start.seed === null) return { problem, ws, unit };
  const base = Float64Array.from(ws.z);
  let amplitude = start.amplitude;
  for (let attempt = 0; attempt < PERTURB_TRIES; attempt++, amplitude *= 0.5) {
    ws.z.set(base);
    perturbInto(problem, ws.z, mulberry32(start.seed + attempt), amplitude);
    perimeterInto(problem, ws.z, ws.cache, ws.areas);
    let valid = ordersHold(problem, ws.z);
    for (let f = 0; f < problem.cells; f++) if (!(ws.areas[f] > 0)) valid = false;
    if (valid) return { problem, ws, unit };
  }
  return null;
}

// Move every junction of z by up to `amplitude` times its shortest wall's chord and every bulge by up to
// `amplitude` radians (kept BULGE_EDGE inside (-pi, pi)), from the generator `next`.
function perturbInto(problem: ClusterProblem, z: Float64Array, next: () => number, amplitude: number): void {
  const { junctions, walls, starts, ends } = problem;
  const t0 = 2 * junctions;
  const reach = new Float64Array(junctions).fill(Infinity);
  for (let k = 0; k < walls; k++) {
    const a = starts[k];
    const b = ends[k];
    const c = Math.hypot(z[2 * b] - z[2 * a], z[2 * b + 1] - z[2 * a + 1]);
    reach[a] = Math.min(reach[a], c);
    reach[b] = Math.min(reach[b], c);
  }
  for (let v = 0; v < junctions; v++) {
    const r = amplitude * reach[v] * Math.sqrt(next());
    const angle = 2 * Math.PI * next();
    z[2 * v] += r * Math.cos(angle);
    z[2 * v + 1] += r * Math.sin(angle);
  }
  for (let k = 0; k < walls; k++) {
    const t = bulgeOf(z[t0 + k]) + amplitude * (2 * next() - 1);
    z[t0 + k] = Math.max(-BULGE_EDGE, Math.min(BULGE_EDGE, t));
  }
}

// Bulges of a perturbed drawing stay this far inside (-pi, pi).
const BULGE_EDGE = Math.PI - 0.1;

/**
 * Relax from the first drawing `start` (findEquilibria's later starts), with the verdicts and the lens
 * family recovery of relax() but no second drawing; null when that drawing cannot be made.
 * @throws UsageError as relax() does.
 */
export function relaxFromDrawing(map: CubicMap, areas: Float64Array, start: DrawingStart, options?: NewtonOptions): Equilibrium | null {
  const opt = resolveOptions(options);
  checkInput(map, areas, opt);
  if (map.junctionCount === 0) return circleAnswer(map, areas, opt.tensions);
  // (a junction whose tensions cannot balance is relax()'s verdict: no other drawing changes it)
  if (unbalancedJunctionOf(withTensions(problemOf(map), opt.tensions)) >= 0) return null;
  const state = drawingState(map, areas, start, opt.tensions);
  if (state === null) return null;
  const { problem, ws, unit } = state;
  return answerOf(map, problem, ws, areas, unit, opt, settle(map, problem, ws, opt, false), 0);
}

/**
 * The answer at the state `z` (normalised units: lengths by `unit`, the targets normalised as relax
 * does; its pressures the Lagrange multipliers), reached by a search other than the descent (the root
 * finder of roots.ts) in `iterations` iterations: the verdict as for a settled descent, the
 * certificate, and the index and zero modes.
 * @throws UsageError as relax() does.
 */
export function answerAtState(map: CubicMap, areas: Float64Array, z: Float64Array, iterations: number, options?: NewtonOptions): Equilibrium {
  const opt = resolveOptions(options);
  checkInput(map, areas, opt);
  const problem = withTensions(problemOf(map), opt.tensions);
  const ws = workspaceFor(problem);
  const unit = normaliseTargets(problem, ws, areas);
  ws.z.set(z);
  const verdict = verdictOf(problem, ws, opt, 'settled');
  return answerOf(map, problem, ws, areas, unit, opt, { verdict, iterations }, 0);
}

// Relax at targets whose logarithms are a fraction of the way from the largest target to the real ones
// (MODERATE apart at first, STAGE times further apart at each next stage), each stage from the last
// one's equilibrium, ending at the real targets. Returns the final attempt when every stage ended at an
// equilibrium, else null with ws.z and ws.targets as they were.
function approachInRatio(
  map: CubicMap, problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions, first: Attempt,
): Attempt | null {
  const { cells } = problem;
  const goal = Float64Array.from(ws.targets.subarray(0, cells));
  let most = 0;
  let least = Infinity;
  for (let f = 0; f < cells; f++) {
    most = Math.max(most, goal[f]);
    least = Math.min(least, goal[f]);
  }
  const span = Math.log(most / least);
  const stages = Math.ceil((span - Math.log(MODERATE)) / Math.log(STAGE));
  ws.saved.set(ws.z);
  let iterations = first.iterations;
  for (let s = 0; s <= stages; s++) {
    const share = s === stages ? 1 : (Math.log(MODERATE) + s * Math.log(STAGE)) / span;
    for (let f = 0; f < cells; f++) ws.targets[f] = s === stages ? goal[f] : most * Math.exp(share * Math.log(goal[f] / most));
    if (s === 0) {
      drawStart(map, problem, ws, 'auto');
      shrinkSmallCells(problem, ws);
    }
    const stage = s > 0 ? continueTo(map, problem, ws, opt) : settle(map, problem, ws, opt, false);
    iterations += stage.iterations;
    if (stage.verdict.status !== 'ok') {
      ws.targets.set(goal);
      ws.z.set(ws.saved);
      first.iterations = iterations;
      return null;
    }
  }
  return { verdict: OK, iterations };
}

// Cells drawn this many times their targets are shrunk before a stage's Newton's method.
const PREDICT_FACTOR = 1.5;

// One stage of approachInRatio, from the last stage's equilibrium in ws.z: Newton's method on the
// equations first (the targets moved by a factor STAGE: the equilibrium moved a little, and Newton's
// method converges where a descent's merit no longer resolves a small cell), a warm descent if not.
function continueTo(map: CubicMap, problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions): Attempt {
  const kept = familyBuffers(problem.size).trial;
  kept.set(ws.z);
  // (the predictor: the cells whose targets fell shrunk to them, the same shapes smaller)
  perimeterInto(problem, ws.z, ws.cache, ws.areas);
  shrinkSmallCellsInto(problem, ws.z, ws.targets, ws.areas, PREDICT_FACTOR);
  centreSmallestCell(problem, ws.z, ws.targets);
  const root = findRootFrom(problem, ws, opt, POLISH_BUDGET);
  if (root.converged || certificatePasses(certificateAt(map, problem, ws), opt.certificateTolerance)) {
    const verdict = verdictOf(problem, ws, opt, 'settled');
    if (verdict.status === 'ok') return { verdict, iterations: root.iterations };
  }
  // (else a warm descent from the last stage's equilibrium; settle uses the family buffers, so it is
  // copied back first)
  ws.z.set(kept);
  const stage = settle(map, problem, ws, opt, true);
  return { verdict: stage.verdict, iterations: stage.iterations + root.iterations };
}

// Relax again from another first drawing; the first attempt's state is kept (and its verdict returned,
// with the iterations of both) unless the second ends ok, or `replace` and the second ends at all.
function secondStart(
  map: CubicMap, problem: ClusterProblem, ws: Workspace, opt: ResolvedNewtonOptions,
  which: 'barycentric' | 'insertion', first: Attempt, replace: boolean,
): Attempt | null {
  ws.saved.set(ws.z);
  if (drawStart(map, problem, ws, which) === null) {
    ws.z.set(ws.saved);
    return null;
  }
  shrinkSmallCells(problem, ws);
  const again = settle(map, problem, ws, opt, false);
  const iterations = first.iterations + again.iterations;
  if (again.verdict.status === 'ok' || (replace && again.verdict.status !== 'no-convergence')) {
    return { verdict: again.verdict, iterations };
  }
  ws.z.set(ws.saved);
  return { verdict: first.verdict, iterations };
}

/**
 * Relax from a previous answer's geometry `start` (for instance at nearby areas), in the caller's
 * units, its pressures as the first pressure estimates; falls back to a cold relax() when that does
 * not end at a certified equilibrium, then (when the arrangement has lenses or beads) to the start with
 * each of them moved to the middle of its range, and returns the warm answer if none is certified.
 * @throws UsageError as relax() does, or when start's arrays do not fit the map.
 */
export function relaxFrom(
  map: CubicMap, areas: Float64Array, start: EquilibriumStart, options?: NewtonOptions,
): Equilibrium {
  const opt = resolveOptions(options);
  checkInput(map, areas, opt);
  if (map.junctionCount === 0) return circleAnswer(map, areas, opt.tensions);
  const problem = withTensions(problemOf(map), opt.tensions);
  if (unbalancedJunctionOf(problem) >= 0) return relax(map, areas, options);
  const { junctions, walls, cells } = problem;
  if (start.coords.length !== 2 * junctions || start.bulges.length !== walls || start.pressures.length !== cells) {
    throw new UsageError(
      `Start has ${start.coords.length} coordinates, ${start.bulges.length} bulges and ${start.pressures.length} ` +
        `pressures when expected ${2 * junctions}, ${walls} and ${cells}.`,
    );
  }
  const ws = workspaceFor(problem);
  const unit = normaliseTargets(problem, ws, areas);
  const t0 = 2 * junctions;
  const p0 = t0 + walls;
  loadStart(problem, ws, start, unit);
  perimeterInto(problem, ws.z, ws.cache, ws.areas);
  let valid = ordersHold(problem, ws.z);
  for (let f = 0; f < cells; f++) if (!(ws.areas[f] > 0) || !Number.isFinite(ws.z[p0 + f])) valid = false;
  for (let i = 0; i < p0; i++) if (!Number.isFinite(ws.z[i]) || (i >= t0 && !(Math.abs(ws.z[i]) < Math.PI))) valid = false;
  if (!valid) return relax(map, areas, options);
  const warm = answerOf(map, problem, ws, areas, unit, opt, settle(map, problem, ws, opt, true), 0);
  if (warm.status === 'ok') return warm;
  const cold = relax(map, areas, options);
  cold.iterations += warm.iterations;
  cold.restarts += 1;
  if (cold.status === 'ok') return cold;
  // Has the start lenses or beads? Where each sat in its family is where the previous descent happened
  // to stop, and the way from there may pass a wall through the collapse length: begin again from the
  // start with each of them at the middle of its range.
  const hosts = slidingHostsOf(problem);
  if (hosts.length > 0) {
    loadStart(problem, ws, start, unit);
    const { trial } = familyBuffers(problem.size);
    for (const host of hosts) centreLensInto(problem, ws.z, host, trial);
    const again = settle(map, problem, ws, opt, true);
    if (again.verdict.status === 'ok') {
      const centred = answerOf(map, problem, ws, areas, unit, opt, again, cold.restarts + 1);
      centred.iterations += cold.iterations;
      if (centred.status === 'ok') return centred;
    }
    warm.iterations += again.iterations;
  }
  return warm;
}

// A previous answer's geometry `start` (caller's units) into ws.z, in units of `unit`.
function loadStart(problem: ClusterProblem, ws: Workspace, start: EquilibriumStart, unit: number): void {
  const t0 = 2 * problem.junctions;
  const p0 = t0 + problem.walls;
  for (let i = 0; i < t0; i++) ws.z[i] = start.coords[i] / unit;
  for (let k = 0; k < problem.walls; k++) ws.z[t0 + k] = start.bulges[k];
  for (let f = 0; f < problem.cells; f++) ws.z[p0 + f] = start.pressures[f] * unit;
}

const FACTORS = new Float64Array(BULGE_FACTORS);

// The answer for a junction whose tensions cannot balance: the first drawing in ws.z, named.
function unbalancedAnswer(
  map: CubicMap, problem: ClusterProblem, ws: Workspace, areas: Float64Array, unit: number,
  opt: ResolvedNewtonOptions, junction: number,
): Equilibrium {
  const answer = answerOf(map, problem, ws, areas, unit, opt, { verdict: NO_CONVERGENCE, iterations: 0 }, 0);
  const tensions = problem.tensions as Float64Array;
  const { wallOf } = problem;
  answer.status = 'junction-unbalanced';
  answer.unbalancedJunction = junction;
  answer.junctionTensions = [tensions[wallOf[3 * junction]], tensions[wallOf[3 * junction + 1]], tensions[wallOf[3 * junction + 2]]];
  return answer;
}

function answerOf(
  map: CubicMap, problem: ClusterProblem, ws: Workspace, areas: Float64Array, unit: number,
  opt: ResolvedNewtonOptions, attempt: Attempt, restarts: number,
): Equilibrium {
  const { junctions, walls, cells, starts, ends, tensions } = problem;
  const z = ws.z;
  const t0 = 2 * junctions;
  const p0 = t0 + walls;
  // one backing store for the answer's five arrays (a new typed array costs about as much whatever its
  // length, and an answer sent to another thread takes only its own numbers along)
  const block = new Float64Array(2 * junctions + 2 * walls + 2 * cells);
  const coords = block.subarray(0, t0);
  const bulges = block.subarray(t0, p0);
  const pressures = block.subarray(p0, p0 + cells);
  const curvatures = block.subarray(p0 + cells, p0 + cells + walls);
  const achieved = block.subarray(p0 + cells + walls);
  for (let i = 0; i < t0; i++) coords[i] = z[i] * unit;
  for (let k = 0; k < walls; k++) bulges[k] = bulgeOf(z[t0 + k]);
  // a settled answer's pressures are read off its curvatures (pressures.ts), not the descent's estimates
  if (attempt.verdict.status === 'ok') curvaturePressuresInto(problem, z, ws.targets, z.subarray(p0, p0 + cells), ws.normal, ws.pivots, ws.row, ws.lambda);
  for (let f = 0; f < cells; f++) pressures[f] = z[p0 + f] / unit;
  let perimeter = 0;
  let energy = 0;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const c = Math.hypot(z[b] - z[a], z[b + 1] - z[a + 1]);
    bulgeFactorsInto(z[t0 + k], FACTORS);
    const length = c * FACTORS[G] * unit;
    perimeter += length;
    if (tensions !== null) energy += tensions[k] * length;
    curvatures[k] = c > 0 ? (2 * bulgeSine(z[t0 + k])) / (c * unit) : 0;
  }
  perimeterInto(problem, z, ws.cache, achieved);
  for (let f = 0; f < cells; f++) achieved[f] *= unit * unit;
  const { verdict } = attempt;
  const answer: Equilibrium = {
    status: verdict.status,
    perimeter,
    energy: tensions === null ? perimeter : energy,
    pressures,
    coords,
    bulges,
    curvatures,
    areas: achieved,
    iterations: attempt.iterations,
    restarts,
    // (checked at the bulge coordinates of z: a wall near a full circle keeps its gap to full precision)
    certificate: checkEquilibrium(map, areas, { coords, bulges: z.subarray(t0, p0), pressures }, tensions),
    index: null,
    zeroModes: null,
    collapsingWall: verdict.wall,
    collapsingCell: verdict.cell,
    unbalancedJunction: null,
    junctionTensions: null,
  };
  if (answer.status === 'ok') {
    const c = answer.certificate;
    if (certificatePasses(c, opt.certificateTolerance)) {
      // stability: the inertia of the KKT matrix at the answer, counted at the cluster's own scales
      const { index, zeroModes } = stabilityOf(problem, ws, opt.zeroTolerance);
      // Fewer negative eigenvalues than constraints? The answer's second variation is not what it
      // claims to be: refuse it rather than report a made-up index.
      if (index < 0) answer.status = 'no-convergence';
      else {
        answer.index = index;
        answer.zeroModes = zeroModes;
      }
    } else if (c.crossings > 0 || c.misorderedJunctions > 0 || !(c.minCellArea > 0)) {
      answer.status = 'walls-cross';
    } else {
      answer.status = 'no-convergence';
    }
  }
  // never NaN: a non-finite number anywhere means the state is unusable
  if (!Number.isFinite(answer.perimeter)) answer.perimeter = 0;
  if (!Number.isFinite(answer.energy)) answer.energy = 0;
  for (const arr of [coords, bulges, pressures, curvatures, achieved]) {
    for (let i = 0; i < arr.length; i++) if (!Number.isFinite(arr[i])) arr[i] = 0;
  }
  return answer;
}
