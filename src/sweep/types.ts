// sweep stage: the results of a sweep, as plain data (what the CLI prints, plots and writes as JSON).

import type { ArrangementFilter } from '../catalogue/filter.ts';
import type { NewtonOptions } from '../solver/options.ts';
import type { CandidateSet } from './candidates.ts';
import type { GridDomain, PathDomain, TriangleDomain } from './domain.ts';
import type { AreaFormula } from './formula.ts';
import type { RelaxCounts, TrackedState } from './track.ts';
import type { SweepTyping } from './tensions.ts';

/** Options of sweepPath() and sweepRegion(). */
export interface SweepOptions {
  /** Which arrangements to consider. @default {} (all) */
  filter?: ArrangementFilter;
  /** Candidates ranked within this many at some sample are the competitors (plotted, boundaries located). @default 4 */
  competitors?: number;
  /**
   * Most samples a candidate that failed from a cold start is skipped before it is tried again.
   * @default 16 along a path, 8 over a region (prepare.ts SWEEP_DEFAULTS)
   */
  maxSkip?: number;
  /** Width in the parameter to which transitions and boundaries are located. @default 1e-6 */
  tolerance?: number;
  /** Options of the relaxer at the samples. */
  newton?: NewtonOptions;
  /**
   * Cell types of the area formulas and the tensions between them (formulas of the parameters); the
   * ranking at each sample is then by energy. @default untyped, every tension 1
   */
  typing?: SweepTyping;
  /** Called with (samples done, samples planned). */
  onProgress?: (done: number, total: number) => void;
}

/** A candidate with a perimeter at one sample. */
export interface Placed {
  /** Candidate index (into candidates). */
  readonly candidate: number;
  /** Its energy (sum of tension times length: the perimeter when every tension is 1). */
  readonly perimeter: number;
}

/** Where the best candidate changes along a path. */
export interface Transition {
  /** Parameter value of the change, located to `tolerance`. */
  readonly at: number;
  /**
   * Interval that holds the change: the last bracket (width at most `tolerance`), or around a crossing
   * found by Newton's method its error bound |d''/(2 d')| h^2 for the last step h.
   */
  readonly bracket: readonly [number, number];
  /** Candidate winning below and above. */
  readonly from: number;
  readonly to: number;
  /**
   * 'crossing': both exist there and their perimeters cross; 'existence': the winner below stops
   * existing (or the winner above starts), its perimeter extrapolated to `at` by dP/ds = sum p_i dA_i/ds.
   */
  readonly kind: 'crossing' | 'existence';
  /** Perimeters of `from` and `to` at `at`. */
  readonly perimeters: readonly [number, number];
}

/** Where a competitor's equilibrium stops (or starts) existing along a path. */
export interface Boundary {
  readonly candidate: number;
  /**
   * Parameter value: for a wall collapse, where the wall's chord, extrapolated linearly from the two
   * certified probes nearest the bracket, reaches zero; otherwise the bracket's middle.
   */
  readonly at: number;
  /** The last bisection bracket (width at most `tolerance`): certified at one end, not at the other. */
  readonly bracket: readonly [number, number];
  /** Side of `at` on which the equilibrium exists. */
  readonly exists: 'below' | 'above';
  /** How the relaxation fails on the other side. */
  readonly status: string;
  /** For a wall collapse, the wall (map.wallIndex numbering) and the arrangement its T1 swap leads to. */
  readonly collapsingWall: number | null;
  readonly becomes: { readonly code: string; readonly id: string } | null;
  /** Perimeter of the equilibrium at `at`, extrapolated from the last certified probe. */
  readonly perimeter: number;
  /**
   * Zero modes of the certified state at the sample next to the boundary. When positive (e.g. a lens free to slide along its wall)
   * the boundary depends on where the free part drifted, not only on the areas.
   */
  readonly zeroModes: number;
}

/** A run of the parameter with one winner. */
export interface Interval {
  readonly from: number;
  readonly to: number;
  /** Winner (candidate index), or null where no candidate is certified. */
  readonly winner: number | null;
  /** Samples inside the interval. */
  readonly samples: number;
}

/** What a sweep did, for the report. */
export interface SweepCounts {
  readonly enumerated: number;
  readonly arrangements: number;
  readonly candidates: number;
  readonly relaxations: RelaxCounts;
}

/** The result of sweepPath(). */
export interface PathSweep {
  readonly kind: 'path';
  readonly formulas: readonly AreaFormula[];
  readonly domain: PathDomain;
  readonly set: CandidateSet;
  /** Parameter value of each sample. */
  readonly xs: Float64Array;
  /** Value of each formula at each sample: slotValues[k * formulas.length + i]. */
  readonly slotValues: Float64Array;
  /** Certified equilibrium of each candidate at each sample (null where none): states[c][k]. */
  readonly states: (TrackedState | null)[][];
  /** Status of each candidate at each sample: 'ok', a failure kind, or 'skipped' (not tried there). */
  readonly statuses: string[][];
  /** The certified candidates of each sample in ranking order, at most `competitors` of them. */
  readonly ranked: Placed[][];
  /** Candidate indices of the competitors, winners first (in order of first win). */
  readonly competitors: number[];
  readonly transitions: Transition[];
  readonly boundaries: Boundary[];
  readonly intervals: Interval[];
  readonly counts: SweepCounts;
  /** The cell types and tensions of the sweep, when typed (every `perimeter` is then an energy). */
  readonly typing?: SweepTyping;
}

/** A connected set of grid samples with the same winner. */
export interface Region {
  readonly winner: number | null;
  /** Sample indices in the region, ascending. */
  readonly members: number[];
  /** Smallest and largest value of each parameter over the region's samples. */
  readonly extent: readonly (readonly [number, number])[];
}

/** The result of sweepRegion(). */
export interface RegionSweep {
  readonly kind: 'region';
  readonly formulas: readonly AreaFormula[];
  readonly domain: GridDomain | TriangleDomain;
  readonly set: CandidateSet;
  /** Parameter names and the value of each at each sample (values[k * names.length + j]). */
  readonly names: readonly string[];
  readonly values: Float64Array;
  readonly slotValues: Float64Array;
  /** Winner and runner-up of each sample. */
  readonly ranked: Placed[][];
  /** Certified winner state of each sample (for drawings). */
  readonly winnerStates: (TrackedState | null)[];
  readonly regions: Region[];
  readonly counts: SweepCounts;
  /** The cell types and tensions of the sweep, when typed (every `perimeter` is then an energy). */
  readonly typing?: SweepTyping;
}
