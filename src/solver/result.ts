// solver stage: the plain-object answer of the relaxer, with its certificate and stability.

import type { Certificate } from './certificate.ts';

/**
 * How a relaxation ended.
 * - 'ok': a certified equilibrium (every certificate entry within tolerance, a valid drawing, and a
 *   second variation whose inertia accounts for every constraint).
 * - 'wall-collapse': a wall shrinks to zero length on the way to the targets (the arrangement wants a
 *   T1 neighbour swap there); `collapsingWall` names it.
 * - 'cell-collapse': every wall of one cell shrinks together (the cell pinches off as a round bubble
 *   touching the rest at a point); `collapsingCell` names it.
 * - 'walls-cross': the equations are solved but two walls cross or the walls at a junction are out of
 *   the map's order, so the solution is not a drawing of this arrangement.
 * - 'fold': an equilibrium branch followed by area continuation turned back before the targets. The
 *   present relaxer does not continue in the areas and does not give this verdict; it stays a status
 *   of catalogues written by earlier versions.
 * - 'no-convergence': the solver did not converge (existence unknown): the descent from both first
 *   drawings ended without a verdict (or the certified answer's inertia counted fewer negative
 *   eigenvalues than constraints, which is refused). It says nothing about whether an equilibrium
 *   exists, and the sweep never takes it for an existence boundary.
 * - 'junction-unbalanced': the tensions of the three walls at a junction violate the triangle
 *   inequality (one at least the sum of the other two), so no junction of those walls can balance (the
 *   Neumann triangle does not exist; design.md §8): told before relaxing, from the tensions alone.
 *   `unbalancedJunction` and `junctionTensions` name it; the geometry is the first drawing.
 */
export type EquilibriumStatus =
  | 'ok' | 'wall-collapse' | 'cell-collapse' | 'walls-cross' | 'fold' | 'no-convergence' | 'junction-unbalanced';

/**
 * An answer of relax()/relaxFrom(). Every number is finite. Geometry is in the caller's units; for a
 * failure it is the last state reached (a valid-looking drawing near where the solve gave up).
 * Walls are numbered by map.wallIndex(); wall k runs along its lower dart e (e < twins[e]) from
 * junctionOf(e) to headOf(e) and its bulge is positive into face map.faceOf[e] (its left).
 */
export interface Equilibrium {
  /** How the relaxation ended. */
  status: EquilibriumStatus;
  /** Sum of all wall lengths (the circle: 2 sqrt(pi A)). */
  perimeter: number;
  /**
   * Sum of tension times length over the walls, the energy minimised (options.tensions); equal to
   * `perimeter` when every tension is 1.
   */
  energy: number;
  /** Pressure of cell i + 1 at index i (outside pressure 0); the Lagrange multipliers of the areas. */
  pressures: Float64Array;
  /** Junction coordinates, coords[2v], coords[2v + 1]; empty for the circle. */
  coords: Float64Array;
  /** Bulge of each wall in (-pi, pi); empty for the circle. */
  bulges: Float64Array;
  /** Signed curvature 2 sin t / c of each wall (positive: bulging left of its lower dart); empty for the circle. */
  curvatures: Float64Array;
  /** Achieved area of cell i + 1 at index i. */
  areas: Float64Array;
  /** Newton iterations used in all descents together. */
  iterations: number;
  /**
   * Relaxations begun again: from a second first drawing (relax), or the cold relax after a warm one
   * (relaxFrom); 0 when the first descent gave the verdict. (Earlier versions, which continued in the
   * areas, called it continuationSolves.)
   */
  restarts: number;
  /** The independent check of this answer (checkEquilibrium). */
  certificate: Certificate;
  /**
   * Stability index: negative directions of the second variation on the area constraints' tangent
   * space less the rigid motions (0 = stable in its arrangement); null unless status is 'ok'.
   */
  index: number | null;
  /** Zero modes of the second variation (e.g. a lens sliding along its wall); null unless status is 'ok'. */
  zeroModes: number | null;
  /** For 'wall-collapse', the collapsing wall's index; otherwise null. */
  collapsingWall: number | null;
  /** For 'cell-collapse', the collapsing cell's number (1..n); otherwise null. */
  collapsingCell: number | null;
  /** For 'junction-unbalanced', the junction v (darts 3v, 3v + 1, 3v + 2); otherwise null. */
  unbalancedJunction: number | null;
  /** For 'junction-unbalanced', the tensions of its three walls in dart order; otherwise null. */
  junctionTensions: [number, number, number] | null;
}
