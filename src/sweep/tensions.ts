// sweep stage: cell types and wall tensions that may be formulas of the sweep's parameters
// (`sweep --types a,a,b,b --tension "a:b=t"`): the table at a sample, each candidate's wall tensions, and
// the energy's derivative through the tensions.
//
// With tensions s_w(p) the energy E = sum_w s_w L_w at fixed areas is stationary in the shape, so
// along a parameter dE/dp = sum_i p_i dA_i/dp + sum_w (ds_w/dp) L_w (the multipliers' sensitivity
// theorem; design.md §8): the first term is track.ts's perimeterSlope, the second is tensionSlope here.

import { FormulaError } from '../errors.ts';
import type { CubicMap } from '../maps/cubic-map.ts';
import type { Equilibrium } from '../solver/result.ts';
import { type TensionTable, unitTable, wallPairValues, wallTensions } from '../solver/tensions.ts';
import type { AreaFormula } from './formula.ts';

/** The cell types of a sweep and its tensions, each a formula of the parameters. */
export interface SweepTyping {
  /** Type labels, the outside (OUTSIDE_TYPE) first. */
  readonly labels: readonly string[];
  /** The type (index into labels, >= 1) of each area formula (slot). */
  readonly types: readonly number[];
  /** The tensions set (every other pair is 1): types i and j, and the formula. */
  readonly tensions: readonly { readonly i: number; readonly j: number; readonly formula: AreaFormula }[];
}

/**
 * The tension table at parameter values `scope`.
 * @throws FormulaError when a tension is not a positive finite number there.
 */
export function tensionTableAt(typing: SweepTyping, scope: Readonly<Record<string, number>>): TensionTable {
  const table = unitTable(typing.labels);
  const m = typing.labels.length;
  for (const { i, j, formula } of typing.tensions) {
    const v = formula.value(scope);
    if (!(Number.isFinite(v) && v > 0)) {
      const at = Object.entries(scope).map(([k, x]) => `${k} = ${x}`).join(', ');
      throw new FormulaError(`Tension ${typing.labels[i]}:${typing.labels[j]} "${formula.source}" is ${v} at ${at} when expected a positive finite number.`);
    }
    table.values[i * m + j] = v;
    table.values[j * m + i] = v;
  }
  return table;
}

/** The type of each cell of a candidate whose cell i + 1 holds slot slots[i]. */
export function cellTypesOf(typing: SweepTyping, slots: readonly number[]): Int32Array {
  return Int32Array.from(slots, (k) => typing.types[k]);
}

/** The wall tensions of a candidate's map at `scope` (null when all 1). */
export function tensionsAt(
  typing: SweepTyping, map: CubicMap, slots: readonly number[], scope: Readonly<Record<string, number>>,
): Float64Array | null {
  return wallTensions(map, cellTypesOf(typing, slots), tensionTableAt(typing, scope));
}

/** sum_w (ds_w/dp) L_w at an equilibrium of a candidate (0 when no tension uses `parameter`). */
export function tensionSlope(
  typing: SweepTyping, map: CubicMap, slots: readonly number[], eq: Equilibrium, scope: Readonly<Record<string, number>>,
  parameter: string,
): number {
  const m = typing.labels.length;
  const slopes = new Array<number>(m * m).fill(0);
  let any = false;
  for (const { i, j, formula } of typing.tensions) {
    if (!formula.uses.includes(parameter)) continue;
    const d = formula.slope(scope, parameter);
    slopes[i * m + j] = d;
    slopes[j * m + i] = d;
    any = true;
  }
  if (!any) return 0;
  const rates = wallPairValues(map, cellTypesOf(typing, slots), slopes, m);
  const { twins } = map;
  const wallOf = map.wallIndex();
  let sum = 0;
  for (let e = 0; e < twins.length; e++) {
    if (e > twins[e]) continue;
    const k = wallOf[e];
    const a = (e / 3) | 0;
    const b = (twins[e] / 3) | 0;
    const c = Math.hypot(eq.coords[2 * b] - eq.coords[2 * a], eq.coords[2 * b + 1] - eq.coords[2 * a + 1]);
    const t = eq.bulges[k];
    const length = t === 0 ? c : (c * t) / Math.sin(t);
    sum += rates[k] * length;
  }
  return sum;
}
