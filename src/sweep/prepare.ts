// sweep stage: what a path sweep and a region sweep set up alike: the options with their defaults, the
// candidates, the samples and the slot values at each sample.

import { UsageError } from '../errors.ts';
import { RANK_LIMIT } from '../catalogue/rank.ts';
import type { NewtonOptions } from '../solver/options.ts';
import { type CandidateSet, type SweepCandidate, candidateAreasInto, sweepCandidates } from './candidates.ts';
import { type SamplePoints, type SweepDomain, checkFormulasOnDomain, domainSamples, sampleScope, slotValuesInto } from './domain.ts';
import type { AreaFormula } from './formula.ts';
import { type RelaxCounts, emptyCounts } from './track.ts';
import { tensionTableAt, tensionsAt } from './tensions.ts';
import type { SweepOptions } from './types.ts';

/**
 * The defaults of SweepOptions, the one place they are set. A candidate that failed cold is skipped
 * for at most 16 samples along a path, 8 over a region (its samples run row by row, so 8 is most of a
 * row of a small grid).
 */
export const SWEEP_DEFAULTS = {
  competitors: 4,
  maxSkip: { path: 16, region: 8 },
  tolerance: 1e-6,
} as const;

/** A sweep's setup (prepareSweep). */
export interface PreparedSweep {
  /** Competitors: candidates ranked within this many at some sample. */
  competitorCount: number;
  /** Most samples a candidate that failed cold is skipped. */
  maxSkip: number;
  /** Width in the parameter to which transitions and boundaries are located. */
  tolerance: number;
  /** Options of the relaxer. */
  newton: NewtonOptions | undefined;
  /** The candidates and the enumeration's counts. */
  set: CandidateSet;
  /** set.candidates. */
  candidates: readonly SweepCandidate[];
  /** The samples of the domain. */
  points: SamplePoints;
  /** Number of samples. */
  count: number;
  /** The formulas' values (one per cell slot) at sample k: slotValues[k m .. (k + 1) m). */
  slotValues: Float64Array;
  /** Relaxations counted by kind, filled as the sweep runs. */
  counts: RelaxCounts;
  /** Candidate c's cell areas at sample k (a new array). */
  areasAt(c: number, k: number): Float64Array;
  /** The relaxer's options for candidate c at sample k (its wall tensions there, when typed). */
  newtonAt(c: number, k: number): NewtonOptions | undefined;
}

/**
 * Check the formulas and the options of a sweep over `domain` and set it up.
 * @throws FormulaError when a formula is not a positive finite area somewhere on the domain.
 * @throws UsageError when an option is out of range or there are more cells than a ranking takes.
 */
export function prepareSweep(
  formulas: readonly AreaFormula[], domain: SweepDomain, options: SweepOptions, kind: 'path' | 'region',
): PreparedSweep {
  checkFormulasOnDomain(formulas, domain);
  if (formulas.length > RANK_LIMIT) {
    throw new UsageError(`${formulas.length} cells is above ${RANK_LIMIT} when expected at most ${RANK_LIMIT} cells for a sweep.`);
  }
  const competitorCount = options.competitors ?? SWEEP_DEFAULTS.competitors;
  const maxSkip = options.maxSkip ?? SWEEP_DEFAULTS.maxSkip[kind];
  const tolerance = options.tolerance ?? SWEEP_DEFAULTS.tolerance;
  if (!(Number.isInteger(competitorCount) && competitorCount >= 1)) throw new UsageError(`Competitors is ${competitorCount} when expected a whole number of at least 1.`);
  if (!(Number.isInteger(maxSkip) && maxSkip >= 1)) throw new UsageError(`Largest skip is ${maxSkip} when expected a whole number of at least 1.`);
  if (!(tolerance > 0 && Number.isFinite(tolerance))) throw new UsageError(`Tolerance is ${tolerance} when expected a positive finite number.`);
  const { typing } = options;
  if (typing !== undefined && typing.types.length !== formulas.length) {
    throw new UsageError(`Got ${typing.types.length} types when expected ${formulas.length}, one per area.`);
  }
  const set = sweepCandidates(formulas, options.filter, typing);
  const { candidates } = set;
  const points = domainSamples(domain);
  const count = points.count;
  // every tension is checked on every sample before any relaxing
  if (typing !== undefined) for (let k = 0; k < count; k++) tensionTableAt(typing, sampleScope(points, k));
  const m = formulas.length;
  const slotValues = new Float64Array(count * m);
  for (let k = 0; k < count; k++) slotValuesInto(formulas, sampleScope(points, k), slotValues.subarray(k * m, (k + 1) * m));
  const areasAt = (c: number, k: number): Float64Array =>
    candidateAreasInto(candidates[c], slotValues.subarray(k * m, (k + 1) * m), new Float64Array(candidates[c].slots.length));
  const newtonAt = (c: number, k: number): NewtonOptions | undefined => {
    if (typing === undefined) return options.newton;
    const tensions = tensionsAt(typing, candidates[c].cluster.map, candidates[c].slots, sampleScope(points, k));
    return tensions === null ? options.newton : { ...options.newton, tensions };
  };
  return {
    competitorCount, maxSkip, tolerance, newton: options.newton, set, candidates, points, count, slotValues,
    counts: emptyCounts(), areasAt, newtonAt,
  };
}
