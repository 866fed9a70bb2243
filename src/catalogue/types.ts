// catalogue stage: the catalogue of a ranking, as plain data (what format.ts writes and reads), and the
// rounding of the floats written.

import type { ArrangementFilter } from './filter.ts';
import type { Certificate } from '../solver/certificate.ts';
import type { LensRange } from '../solver/equilibria.ts';

/** Format name written into every catalogue file. */
export const CATALOGUE_FORMAT = 'lather-catalogue';
/**
 * Version of the catalogue format this release writes. Version 2 lists one entry per equilibrium found
 * (a candidate may have several) and records the search (starts, saddles); version 1 files are still
 * read (format.ts upgrades them in memory).
 */
export const CATALOGUE_VERSION = 2;
/** The versions the reader accepts. */
export const CATALOGUE_VERSIONS_READ: readonly number[] = [1, 2];
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
  /** Seed of the search's random starts and of each candidate's perturbed first drawings. */
  seed: number;
  /** First drawings tried per candidate (solver/equilibria.ts). Version 1 files: 1. */
  starts: number;
  /** Whether saddles (index >= 1) were searched for (`--unstable`). Version 1 files: false. */
  unstable: boolean;
  /**
   * Cells of different types (walls of different tension): the type of each area, in `areas` order.
   * Absent when untyped; then every tension is 1 and the ranking is by perimeter.
   */
  types?: string[];
  /** With `types`: the tensions that are not 1, "a:b" (labels in order of first appearance, "out" first) to value. */
  tensions?: Record<string, number>;
}

/** How much was done. */
export interface CatalogueCounts {
  /** Arrangements of n cells enumerated. */
  enumerated: number;
  /** Arrangements kept by the filter. */
  arrangements: number;
  /** Candidates (arrangement, assignment up to symmetry) among the kept arrangements. */
  candidates: number;
  /** Candidates relaxed (each from `query.starts` first drawings). */
  tried: number;
  /** Candidates not relaxed (only when not exhaustive). */
  skipped: number;
  /** Whether every candidate was relaxed. */
  exhaustive: boolean;
  /** Certified equilibria (entries of status 'ok'): those of index 0, and saddles (index >= 1). */
  equilibria: number;
  stable: number;
  saddles: number;
  /** Candidates with no certified equilibrium, by the kind of failure of their first start. */
  failures: Record<string, number>;
  /** Rooting identity over every enumerated arrangement: sum of 4E/|Aut(M,f)| and (n+1) A000309(n-1). */
  rootings: { sum: string; expected: string };
}

/** The certificate of an entry: the relaxer's own (solver/certificate.ts). */
export type EntryCertificate = Certificate;

/** Where the lens of a family can slide (solver/equilibria.ts LensRange), as written. */
export type EntryFamily = LensRange;

/**
 * One certified equilibrium of a candidate (an arrangement with its areas), or the one entry of a
 * candidate that has none. A candidate with several equilibria has several entries, each with the
 * candidate's fields (id, code, sides, assignment, cellAreas, tried) and its own.
 */
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
  /** Perimeter (total wall length) of the equilibrium; null for failures. */
  perimeter: number | null;
  /**
   * In a typed catalogue (query.types): the energy, sum of tension times length, which the ranking
   * orders (null for failures); absent otherwise.
   */
  energy?: number | null;
  /** Perimeter (energy, when typed) above the best, in percent; null for failures. */
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
  /** Starts that reached this equilibrium (0: found by the root finder alone); null for failures. */
  reached: number | null;
  /** First drawings tried for the candidate (the same on all its entries). */
  tried: number;
  /** For a member of a lens family: where its lens can slide; else null. */
  family: EntryFamily | null;
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
  /**
   * Certified equilibria by rank (perimeter; stable and saddles together, rank 1 stable), then the
   * candidates without one by code and assignment.
   */
  entries: CatalogueEntry[];
}
