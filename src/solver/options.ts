// solver stage: the relaxer's options with their defaults, resolved and checked once per call.

import { UsageError } from '../errors.ts';

/** Options of relax() and relaxFrom(). Lengths are in units of sqrt(mean target cell area). */
export interface NewtonOptions {
  /**
   * Newton iterations allowed for one descent (a relaxation may begin again once from another drawing).
   * @default 100
   */
  maxIterations?: number;
  /**
   * Convergence: largest |entry| of the gradient of the Lagrangian and largest relative area error,
   * in normalised units (mean cell area 1); the descent also stops at the rounding floor.
   * @default 1e-12
   */
  tolerance?: number;
  /**
   * Largest certificate entry (relative area residual, tangent sum, scaled Laplace-Young residual)
   * an 'ok' answer may have.
   * @default 1e-10
   */
  certificateTolerance?: number;
  /**
   * Wall chord, relative to sqrt of the smaller target area of the cells on its two sides, below which
   * a wall counts as collapsing (a wall below 50 times this that keeps shrinking while the gradient
   * stays finite counts as collapsing too).
   * @default 1e-3
   */
  collapseLength?: number;
  /**
   * Relative size, to the largest in magnitude, below which an eigenvalue of the equilibrated KKT matrix
   * at the answer counts as a zero mode (stability.ts: every row scaled to largest entry 1 first, so
   * the count does not depend on the scale of the cells).
   * @default 1e-8
   */
  zeroTolerance?: number;
  /**
   * Largest change of any bulge in one Newton step, in radians.
   * @default 0.5
   */
  maxBulgeStep?: number;
  /**
   * Largest move of any junction in one Newton step, in units of sqrt(mean cell area).
   * @default 0.25
   */
  maxMoveStep?: number;
  /**
   * Tension of each wall, by map.wallIndex() (walls of different tension, design.md §8): the energy
   * minimised is the sum of tension times length, and the pressures are its multipliers. Unset (or all
   * 1) is the soap film, energy = perimeter. A cluster of one cell has one wall, its circle.
   * @default every wall 1
   */
  tensions?: Float64Array | null;
}

/** NewtonOptions with every field present (tensions null for all 1). */
export type ResolvedNewtonOptions = Required<Omit<NewtonOptions, 'tensions'>> & { tensions: Float64Array | null };

const DEFAULTS: ResolvedNewtonOptions = {
  maxIterations: 100,
  tolerance: 1e-12,
  certificateTolerance: 1e-10,
  collapseLength: 1e-3,
  zeroTolerance: 1e-8,
  maxBulgeStep: 0.5,
  maxMoveStep: 0.25,
  tensions: null,
};

/**
 * Fill in defaults and check ranges.
 * @throws UsageError when an option is not a finite number in its range.
 */
export function resolveOptions(options: NewtonOptions = {}): ResolvedNewtonOptions {
  const out = { ...DEFAULTS };
  const tensions = options.tensions;
  if (tensions !== undefined && tensions !== null) {
    if (!(tensions instanceof Float64Array)) throw new UsageError(`Option tensions is ${String(tensions)} when expected a Float64Array of wall tensions.`);
    for (let k = 0; k < tensions.length; k++) {
      if (!(tensions[k] > 0) || !Number.isFinite(tensions[k])) {
        throw new UsageError(`Tension of wall ${k} is ${tensions[k]} when expected a positive finite number.`);
      }
    }
    out.tensions = tensions;
  }
  for (const key of Object.keys(DEFAULTS) as (keyof NewtonOptions)[]) {
    if (key === 'tensions') continue;
    const value = options[key];
    if (value === undefined) continue;
    const integer = key === 'maxIterations';
    if (typeof value !== 'number' || !Number.isFinite(value) || !(value > 0) || (integer && !Number.isInteger(value))) {
      const want = integer ? 'a positive integer' : 'a positive finite number';
      throw new UsageError(`Option ${key} is ${String(value)} when expected ${want}.`);
    }
    out[key] = value;
  }
  return out;
}
