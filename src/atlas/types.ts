// atlas stage: the results of an atlas, as plain data (what the CLI prints, plots and writes as JSON).

import type { NewtonOptions } from '../solver/options.ts';
import type { CellTyping } from '../solver/tensions.ts';

/** Options of runAtlas(). */
export interface AtlasOptions {
  /** Number of cells, 2..8. */
  cells: number;
  /** Number of samples. */
  samples: number;
  /** Seed of the design. @default 1 */
  seed?: number;
  /** Least share of the total area of any cell. @default DEFAULT_MIN_SHARE (design.ts) */
  minShare?: number;
  /** Worker threads (1 = this thread). The result does not depend on it. @default 1 */
  workers?: number;
  /**
   * Start each candidate from its equilibrium at the nearest sample already solved in the block. Measured no
   * faster at four cells (64 samples: 4.87 s warm against 5.04 s with rank's own starts, 5.43 against 5.42 in
   * a second pair), so off by default: every sample is then exactly what `rank` gives at its areas. @default false
   */
  warmStart?: boolean;
  /** Most class boundaries located by bisection (four cells only). @default 200 */
  maxBoundaries?: number;
  /** Width along a segment to which a boundary is located. @default 1e-6 */
  tolerance?: number;
  /** Options of the relaxer. */
  newton?: NewtonOptions;
  /**
   * A type per cell and the walls' tensions: areas are sampled ordered within each type only, every
   * candidate is relaxed with the tensions and ranked by energy (`perimeter` fields then hold the energy,
   * and a "rank" is the position in the query's order; boundaries compare energies). No claim is tested then.
   */
  typing?: CellTyping;
  /** Called with (samples done, samples planned). */
  onProgress?: (done: number, total: number) => void;
}

/** One candidate at one sample, described by area rank (independent of how the cells are numbered). */
export interface AtlasPlacement {
  /** Winner class (index into Atlas.classes). */
  class: number;
  /** Canonical code and id ("n.k") of the arrangement. */
  code: string;
  id: string;
  /** Area rank of the cell i + 1 (1 = largest area) at index i: the candidate's assignment. */
  ranks: number[];
  /** Side count of the cell holding the largest area, the second largest, ... */
  sidesByRank: number[];
  /** One pair per wall: the area ranks of the two regions it separates (0 = the outside), smaller first. */
  wallsByRank: [number, number][];
  perimeter: number;
  /** Stability index and zero modes of the equilibrium. */
  index: number;
  zeroModes: number;
}

/** Whether the claim of the standard arrangement holds at a sample (four cells). */
export interface ClaimAtSample {
  /** The winner is the standard arrangement with the two largest areas on the two sides of its central wall. */
  holds: boolean;
  /**
   * (best perimeter violating the claim - best perimeter satisfying it) / the smaller of the two:
   * positive where the claim holds; null when one side has no certified candidate.
   */
  margin: number | null;
}

/** One sample of the atlas. */
export interface AtlasSample {
  /** Position in the design (0-based). */
  index: number;
  /** Cell areas, largest first, summing to the number of cells. */
  areas: number[];
  /** Least-perimeter certified candidate, and the next one (another arrangement or another assignment); null when none. */
  winner: AtlasPlacement | null;
  runnerUp: AtlasPlacement | null;
  /** (runner-up perimeter - winner perimeter) / winner perimeter; null without both. */
  margin: number | null;
  /**
   * The best certified candidate of another arrangement than the winner's (the runner-up may be the winner's
   * arrangement with two areas exchanged), and its relative gap to the winner; null when there is none.
   */
  otherArrangement: { class: number; id: string; sidesByRank: number[]; perimeter: number; margin: number } | null;
  /** Whether every candidate was relaxed (rank's budget; false means a local search per arrangement). */
  exhaustive: boolean;
  /** Candidates relaxed from the nearest solved sample's equilibrium, and the others. */
  starts: { warm: number; other: number };
  /** Four cells only. */
  claim?: ClaimAtSample;
}

/**
 * A winner class: arrangement plus area-rank pattern, described as its placements are (`class` is the
 * class's position in Atlas.classes, most samples first).
 */
export interface AtlasClass extends Pick<AtlasPlacement, 'class' | 'code' | 'id' | 'ranks' | 'sidesByRank' | 'wallsByRank'> {
  /** Samples won, and their share of all samples. */
  samples: number;
  share: number;
  /** Smallest margin over the samples won, and the sample (design index) where it is seen. */
  smallestMargin: number | null;
  smallestMarginAt: number | null;
}

/** Where the winner class changes between two neighbouring samples, located along their segment. */
export interface AtlasBoundary {
  /** The two samples (design indices) and their classes. */
  from: number;
  to: number;
  fromClass: number;
  toClass: number;
  /** Position along the segment from `from` (0) to `to` (1), and the bracket holding the change. */
  t: number;
  bracket: [number, number];
  /** Areas at t (largest first). */
  areas: number[];
  /** 'crossing': the two perimeters cross; 'existence': one of the two stops existing. */
  kind: 'crossing' | 'existence';
  /** Perimeters of the two at the located point (null where one does not exist). */
  perimeters: [number | null, number | null];
  /** A full ranking at the located point finds one of the two winning (else a third class wins there). */
  confirmed: boolean;
}

/** The summary of the claim over all samples (four cells). */
export interface ClaimSummary {
  statement: string;
  holds: number;
  fails: number;
  /** Samples where no certified candidate decides it. */
  undecided: number;
  /** Smallest claim margin over the samples (negative when it fails somewhere), and where. */
  smallestMargin: number | null;
  smallestMarginAt: number | null;
  /** Design indices of the samples where it fails (at most 100). */
  failures: number[];
}

/** An atlas: the query, every sample and the summary. */
export interface Atlas {
  cells: number;
  /** With cell types: the type of each position and the tensions not 1 ("a:b" -> value); winners by energy. */
  types?: string[];
  tensions?: Record<string, number>;
  seed: number;
  minShare: number;
  /** Largest ratio of two areas the design can reach. */
  reachableRatio: number;
  /** Largest ratio of two areas among the samples. */
  largestRatio: number;
  samples: AtlasSample[];
  classes: AtlasClass[];
  /** Samples with no certified candidate. */
  noWinner: number;
  /** Smallest margin over all samples, and where. */
  smallestMargin: number | null;
  smallestMarginAt: number | null;
  /** Smallest gap from the winner to the best candidate of another arrangement, and where. */
  smallestArrangementMargin: number | null;
  smallestArrangementMarginAt: number | null;
  /** Pairs of neighbouring samples (each sample and its nearest) with different winner classes. */
  changes: [number, number][];
  /** Boundaries located (four cells), at most maxBoundaries of the changes, nearest pairs first. */
  boundaries: AtlasBoundary[];
  /** Whether every sample was ranked exhaustively. */
  exhaustive: boolean;
  /** Candidates relaxed per sample (of the first sample), warm starts over all candidate relaxations. */
  candidates: number;
  warmShare: number;
  claim: ClaimSummary | null;
}
