// catalogue stage: the catalogue of a ranking, as plain data (what format.ts writes and reads), and the
// rounding of the floats written.

import type { ArrangementFilter } from './filter.ts';
import type { Certificate } from '../solver/certificate.ts';

/** Format name written into every catalogue file. */
export const CATALOGUE_FORMAT = 'lather-catalogue';
/** Version of the catalogue format this release reads and writes. */
export const CATALOGUE_VERSION = 1;
/** Significant digits of every float written (but the query's); the solver itself never rounds. */
export const WRITE_DIGITS = 12;

/** A float as a catalogue file holds it: WRITE_DIGITS significant digits, integers as they are, no -0. */
export function roundWritten(x: number): number {
  if (!Number.isFinite(x)) return x; // the schema refuses it: a non-finite number is a bug upstream
  if (Number.isInteger(x)) return x;
  const r = Number(x.toPrecision(WRITE_DIGITS));
  return Object.is(r, -0) ? 0 : r;
}

/** A copy of a JSON value with every number rounded as roundWritten rounds it (objects keep their key order). */
export function roundedWritten(value: unknown): unknown {
  if (typeof value === 'number') return roundWritten(value);
  if (Array.isArray(value)) return value.map(roundedWritten);
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) out[k] = roundedWritten(v);
    return out;
  }
  return value;
}

/** What was asked. */
export interface CatalogueQuery {
  /** The areas as given, in the user's order. */
  areas: number[];
  /** Arrangement filters applied. */
  filter: ArrangementFilter;
  /** Work budget in seconds that decided between exhaustive ranking and search. */
  budgetSeconds: number;
  /** Seed of the search's random starts (used only when not exhaustive). */
  seed: number;
}

/** How much was done. */
export interface CatalogueCounts {
  /** Arrangements of n cells enumerated. */
  enumerated: number;
  /** Arrangements kept by the filter. */
  arrangements: number;
  /** Candidates (arrangement, assignment up to symmetry) among the kept arrangements. */
  candidates: number;
  /** Candidates relaxed. */
  tried: number;
  /** Candidates not relaxed (only when not exhaustive). */
  skipped: number;
  /** Whether every candidate was relaxed. */
  exhaustive: boolean;
  /** Certified equilibria, and those of index 0 among them. */
  equilibria: number;
  stable: number;
  /** Failures by kind. */
  failures: Record<string, number>;
  /** Rooting identity over every enumerated arrangement: sum of 4E/|Aut(M,f)| and (n+1) A000309(n-1). */
  rootings: { sum: string; expected: string };
}

/** The certificate of an entry: the relaxer's own (solver/certificate.ts). */
export type EntryCertificate = Certificate;

/** One candidate: an arrangement with its areas, relaxed. */
export interface CatalogueEntry {
  /** 1-based rank among certified equilibria by perimeter; null for failures. */
  rank: number | null;
  /** Arrangement id "n.k" (position in `lather list n`). */
  id: string;
  /** Canonical code of the arrangement. */
  code: string;
  /** Side count of each cell. */
  sides: number[];
  /** Which of the query's areas sits in each cell: an index into query.areas, cell i + 1 at i. */
  assignment: number[];
  /** Target area of each cell. */
  cellAreas: number[];
  /** 'ok' or the failure kind. */
  status: string;
  /** Perimeter of the equilibrium; null for failures. */
  perimeter: number | null;
  /** Perimeter above the best, in percent; null for failures. */
  gapPercent: number | null;
  /** Stability index and zero modes; null for failures. */
  index: number | null;
  zeroModes: number | null;
  /** Pressures of the cells; null for failures. */
  pressures: number[] | null;
  /** Junction coordinates (x0, y0, x1, y1, ...) and wall bulges; null for failures. */
  geometry: { coords: number[]; bulges: number[] } | null;
  /** The certificate of the answer (also for failures: the last state reached). */
  certificate: EntryCertificate;
  /** Newton iterations used. */
  iterations: number;
  /** For a wall collapse: the wall (map.wallIndex numbering) and the arrangement its T1 swap leads to. */
  collapsingWall: number | null;
  becomes: { code: string; id: string } | null;
  /** For a cell collapse: the cell. */
  collapsingCell: number | null;
}

/** A ranking catalogue. */
export interface Catalogue {
  format: typeof CATALOGUE_FORMAT;
  version: typeof CATALOGUE_VERSION;
  /**
   * A compact catalogue (for a census): only the certified entries are listed; the failures are in
   * counts.failures alone. Absent for a full catalogue.
   */
  compact?: true;
  query: CatalogueQuery;
  counts: CatalogueCounts;
  /** Certified equilibria by rank, then failures by code and assignment. */
  entries: CatalogueEntry[];
}
