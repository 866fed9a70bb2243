// sweep stage: relax a candidate at any parameter value between samples, warm from its nearest known equilibrium on the path.

import type { NewtonOptions } from '../solver/options.ts';
import type { Equilibrium } from '../solver/result.ts';
import { candidateAreasInto, type CandidateSet } from './candidates.ts';
import { slotValuesInto } from './domain.ts';
import type { AreaFormula } from './formula.ts';
import { type RelaxCounts, type TrackedState, perimeterSlope, trackStep } from './track.ts';
import { type SweepTyping, tensionSlope, tensionsAt } from './tensions.ts';

/**
 * Wall chord (relative to sqrt of the smaller neighbouring area) below which a probe counts a wall as
 * collapsed. Much smaller than the relaxer's default, so a located boundary sits where the wall
 * really reaches zero length rather than where the default threshold is crossed.
 */
export const PROBE_COLLAPSE = 1e-6;

/** A certified equilibrium of one candidate at parameter value p. */
export interface KnownState {
  readonly p: number;
  readonly state: TrackedState;
}

/** What locating needs to know about a path sweep. */
export interface PathContext {
  readonly formulas: readonly AreaFormula[];
  readonly parameter: string;
  readonly set: CandidateSet;
  /** Options of the relaxer while probing (the samples' options with PROBE_COLLAPSE). */
  readonly probeOptions: NewtonOptions;
  readonly counts: RelaxCounts;
  readonly tolerance: number;
  /** The cell types and tension formulas, when typed. */
  readonly typing?: SweepTyping;
}

/** The probe options derived from the samples' relaxer options. */
export function probeOptionsOf(newton: NewtonOptions | undefined): NewtonOptions {
  return { ...newton, collapseLength: Math.min(PROBE_COLLAPSE, newton?.collapseLength ?? PROBE_COLLAPSE) };
}

/** The target areas of candidate c at parameter value p. */
export function areasAt(ctx: PathContext, c: number, p: number): Float64Array {
  const slots = slotValuesInto(ctx.formulas, { [ctx.parameter]: p }, new Float64Array(ctx.formulas.length));
  const candidate = ctx.set.candidates[c];
  return candidateAreasInto(candidate, slots, new Float64Array(candidate.slots.length));
}

/** dA_i/dp of every cell of candidate c at p. */
export function areaSlopesAt(ctx: PathContext, c: number, p: number): Float64Array {
  const candidate = ctx.set.candidates[c];
  const scope = { [ctx.parameter]: p };
  const out = new Float64Array(candidate.slots.length);
  for (let i = 0; i < out.length; i++) out[i] = ctx.formulas[candidate.slots[i]].slope(scope, ctx.parameter);
  return out;
}

/**
 * dE/dp of a known state: sum of pressure times area slope, plus sum of tension slope times wall length
 * when tensions depend on p (tensions.ts); dP/dp at unit tension.
 */
export function slopeAt(ctx: PathContext, c: number, known: KnownState): number {
  const eq = known.state.equilibrium;
  const d = perimeterSlope(eq, areaSlopesAt(ctx, c, known.p));
  if (ctx.typing === undefined) return d;
  const cand = ctx.set.candidates[c];
  return d + tensionSlope(ctx.typing, cand.cluster.map, cand.slots, eq, { [ctx.parameter]: known.p }, ctx.parameter);
}

/** The energy (perimeter at unit tension) at q extrapolated to first order from a known state (exact to O((q - p)^2)). */
export function extrapolatedPerimeter(ctx: PathContext, c: number, known: KnownState, q: number): number {
  return known.state.equilibrium.energy + slopeAt(ctx, c, known) * (q - known.p);
}

/** The known state nearest to p, or null. */
export function nearest(list: readonly KnownState[], p: number): KnownState | null {
  let best: KnownState | null = null;
  for (const k of list) if (best === null || Math.abs(k.p - p) < Math.abs(best.p - p)) best = k;
  return best;
}

/** The result of one probe. */
export interface ProbeResult {
  /** The certified state on the branch of the start, or null. */
  readonly known: KnownState | null;
  /** The relaxer's answer (a failure's kind and collapsing wall included). */
  readonly equilibrium: Equilibrium;
}

/**
 * Relax candidate c at p, warm from the nearest of `list` (which must not be empty); a certified
 * answer on the same branch is added to the list.
 */
export function probe(ctx: PathContext, c: number, p: number, list: KnownState[]): ProbeResult {
  const from = nearest(list, p);
  if (from === null) throw new Error(`Probe of candidate ${c} has no known state when expected at least one.`);
  const areas = areasAt(ctx, c, p);
  const cand = ctx.set.candidates[c];
  const tensions = ctx.typing === undefined ? null : tensionsAt(ctx.typing, cand.cluster.map, cand.slots, { [ctx.parameter]: p });
  const options = tensions === null ? ctx.probeOptions : { ...ctx.probeOptions, tensions };
  const step = trackStep(cand.cluster.map, areas, from.state, options, ctx.counts, 'probe');
  if (!step.continued) return { known: null, equilibrium: step.equilibrium };
  const known = { p, state: { areas, equilibrium: step.equilibrium } };
  list.push(known);
  return { known, equilibrium: step.equilibrium };
}
