// sweep stage: the candidates of a sweep: (arrangement, assignment of the area formulas up to symmetry).
//
// Slots (the user's formulas) with identical formulas form one class for the whole sweep, so the
// candidates are those of a ranking with the classes fixed once: for every arrangement, every orbit
// representative of the class sequences under the arrangement's symmetry (catalogue/assign.ts). A
// candidate keeps its cells' formulas along the path; only their values change.

import { cellPermutations, enumerateClusters, type Cluster } from '../maps/cluster.ts';
import { summarizeCluster } from '../maps/describe.ts';
import { wallSwapCode } from '../maps/t1.ts';
import { type AreaClasses, orbitAssignments, userIndices } from '../catalogue/assign.ts';
import { type ArrangementFilter, passesFilter } from '../catalogue/filter.ts';
import type { AreaFormula } from './formula.ts';

/** One candidate of a sweep. */
export interface SweepCandidate {
  /** Position in the sweep's candidate list (0-based). */
  readonly index: number;
  /** Arrangement id "n.k" (position in `lather list n`). */
  readonly id: string;
  /** Canonical code of the arrangement. */
  readonly code: string;
  /** The arrangement, in canonical labelling. */
  readonly cluster: Cluster;
  /** Side count of each cell. */
  readonly sides: readonly number[];
  /** Which formula (index into the user's list) sits in each cell: cell i + 1 at index i. */
  readonly slots: readonly number[];
  /** The formula of each cell, as typed. */
  readonly cellFormulas: readonly string[];
  /** The type label of each cell, when the sweep is typed. */
  readonly cellTypes?: readonly string[];
  /** Tie-break key after perimeter and code: the slots joined by commas. */
  readonly assignmentKey: string;
}

/** The candidate set of a sweep and what was enumerated for it. */
export interface CandidateSet {
  readonly candidates: SweepCandidate[];
  /** Arrangements of n cells enumerated. */
  readonly enumerated: number;
  /** Arrangements kept by the filter. */
  readonly arrangements: number;
  /** Arrangement id of every enumerated code (for naming T1 neighbours). */
  readonly ids: ReadonlyMap<string, string>;
}

/**
 * The formula classes: slots with the same parsed formula (AreaFormula.key), and the same type when
 * `types` (one per slot) is given, share a class, numbered by first appearance. `values` holds the
 * class's first slot index (areas come from the formulas).
 */
export function formulaClasses(formulas: readonly AreaFormula[], types?: readonly number[]): AreaClasses {
  const keyOf = (i: number): string => (types === undefined ? formulas[i].key : `${formulas[i].key}|${types[i]}`);
  const keys: string[] = [];
  const classOf = formulas.map((_, i) => {
    let k = keys.indexOf(keyOf(i));
    if (k < 0) k = keys.push(keyOf(i)) - 1;
    return k;
  });
  const values = keys.map((key) => formulas.findIndex((_, i) => keyOf(i) === key));
  const multiplicity = keys.map((_, k) => classOf.filter((c) => c === k).length);
  return { values, multiplicity, classOf };
}

/**
 * Every candidate of a sweep over `formulas` (one per cell; `types`: one type per formula, when typed),
 * arrangements in enumeration order.
 */
export function sweepCandidates(
  formulas: readonly AreaFormula[], filter: ArrangementFilter = {}, typing?: { types: readonly number[]; labels: readonly string[] },
): CandidateSet {
  const n = formulas.length;
  const classes = formulaClasses(formulas, typing?.types);
  const candidates: SweepCandidate[] = [];
  const ids = new Map<string, string>();
  let enumerated = 0;
  let arrangements = 0;
  for (const cluster of enumerateClusters(n)) {
    enumerated++;
    const id = `${n}.${enumerated}`;
    ids.set(cluster.code, id);
    const summary = summarizeCluster(cluster);
    if (!passesFilter(summary, filter)) continue;
    arrangements++;
    for (const s of orbitAssignments(classes, cellPermutations(cluster))) {
      const slots = userIndices(s, classes);
      candidates.push({
        index: candidates.length,
        id,
        code: cluster.code,
        cluster,
        sides: summary.sides,
        slots,
        cellFormulas: slots.map((k) => formulas[k].source),
        ...(typing === undefined ? {} : { cellTypes: slots.map((k) => typing.labels[typing.types[k]]) }),
        assignmentKey: slots.join(','),
      });
    }
  }
  return { candidates, enumerated, arrangements, ids };
}

/** The target area of each cell of `candidate` given the value of each slot. */
export function candidateAreasInto(candidate: SweepCandidate, slotValues: ArrayLike<number>, out: Float64Array): Float64Array {
  const { slots } = candidate;
  for (let i = 0; i < slots.length; i++) out[i] = slotValues[slots[i]];
  return out;
}

/** Readable "which formula sits in which cell", e.g. "1:1 2:1 3:1 4:t" (typed: "1:1(a) 2:1(a) 3:2(b) 4:2(b)"). */
export function cellFormulasText(candidate: SweepCandidate): string {
  const types = candidate.cellTypes;
  return candidate.cellFormulas.map((f, i) => `${i + 1}:${f.replace(/\s+/g, '')}${types === undefined ? '' : `(${types[i]})`}`).join(' ');
}

/**
 * The arrangement the T1 swap of wall `wall` (map.wallIndex numbering) of the candidate's arrangement
 * leads to, as code and id, or null when the swap leaves no admissible cluster.
 */
export function t1Neighbour(candidate: SweepCandidate, wall: number, ids: ReadonlyMap<string, string>): { code: string; id: string } | null {
  const code = wallSwapCode(candidate.cluster, wall);
  return code === null ? null : { code, id: ids.get(code) ?? '?' };
}
