// catalogue stage: the consistency of a catalogue read back from a file, after its schema: the counts
// against the entries, the ranks in order, and every certified entry's geometry re-checked against its
// code and areas with the solver's independent checker (solver/certificate.ts).
//
// A file that passes the schema can still lie: a perimeter or a geometry set to null, a coordinate of
// 1e308, one entry's code swapped for another's, counts that contradict the entries. Each is refused
// here with one line naming the file, the entry and what was expected, before anything is drawn.

import { BULGE_FACTORS, G, G1, H, H1, arcLength, bulgeFactorsInto } from '../arcs/arc.ts';
import { type Cluster, cellPermutations, clusterFromCode } from '../maps/cluster.ts';
import { rootedMapCount } from '../maps/count.ts';
import { summarizeCluster } from '../maps/describe.ts';
import { type Certificate, certificatePasses, checkEquilibrium } from '../solver/certificate.ts';
import { resolveOptions } from '../solver/options.ts';
import { SAME_PERIMETER, SAME_PRESSURE } from '../solver/equilibria.ts';
import { type CellTyping, typingOfPairs, wallTensions } from '../solver/tensions.ts';
import { CatalogueFormatError, MapError, UsageError } from '../errors.ts';
import { type AreaClasses, areaClasses, labelledAssignmentCount, orbitCount, orbitRepresentative, userIndices } from './assign.ts';
import { isFiltering, passesFilter } from './filter.ts';
import { ORDER_DIGITS, candidateKey, rankedValue } from './rank.ts';
import { type Catalogue, type CatalogueEntry, WRITE_DIGITS, roundWritten } from './types.ts';

/**
 * Largest relative change of a number written to WRITE_DIGITS significant digits: half a unit in the
 * last digit kept (5e-12 for 12 digits).
 */
export const WRITE_ROUNDING = 0.5 * 10 ** (1 - WRITE_DIGITS);

/**
 * Largest residual that rounding the written geometry may add to a certificate entry (relative to the
 * entry's own scale). The bound of each entry is computed from its own geometry (roundingSlack); a
 * geometry whose bound exceeds this cannot carry its certificate in 12 digits and is refused. The
 * committed catalogues reach 2.0e-8 at most (the tangent bound of catalogues/equal-8.json, rank 256).
 */
export const MAX_ROUNDING_SLACK = 1e-4;

/**
 * Relative perimeter difference above which two equilibria of one candidate are distinct: the search's
 * own rule (solver/equilibria.ts SAME_PERIMETER).
 */
export const SAME_EQUILIBRIUM = SAME_PERIMETER;

/**
 * Two equilibria of one candidate at the same perimeter are still distinct when a pressure differs by
 * more than this times the largest |pressure| (or 1/sqrt(mean area)): half the search's own threshold
 * (SAME_PRESSURE), so the reader never refuses what the search kept apart.
 */
export const SAME_PRESSURES = 0.5 * SAME_PRESSURE;

/** The tolerance an 'ok' certificate is held to: the relaxer's own (solver/options.ts). */
export const CERTIFICATE_TOLERANCE = resolveOptions().certificateTolerance;

/** How much writing to 12 digits can move each re-checked quantity, to first order (see roundingSlack). */
export interface RoundingSlack {
  /** Largest change of |achieved - target| / target over the cells. */
  area: number;
  /** Largest change of the sum of the three unit tangents over the junctions. */
  tangent: number;
  /** Largest change of the scaled Laplace-Young residual over the walls. */
  curvature: number;
  /** Change of the perimeter, relative to the perimeter. */
  perimeter: number;
}

/** What the reader learns once per code: the cluster, its side counts, its symmetry on the cells. */
interface Arrangement {
  cluster: Cluster;
  /** Side count of each cell (summarizeCluster). */
  sides: number[];
  /** Whether the arrangement passes the query's filter. */
  passes: boolean;
  /** The cell permutations (computed only when the query has areas of more than one value). */
  group: Int32Array[] | null;
  /** The candidates seen with this code, by orbit representative ('' when there is one candidate per code). */
  candidates: Map<string, Candidate>;
  /** Position of the first entry with this code. */
  first: number;
}

/** What the reader learns of one candidate from its entries. */
interface Candidate {
  /** Its assignment as written (every entry of the candidate writes the same). */
  assignment: string;
  /** Position of its first entry. */
  first: number;
  /** Whether its entry is a failure (then it has no other). */
  failure: boolean;
  /** Starts tried (every entry of the candidate writes the same), and the starts its entries reached. */
  tried: number;
  reached: number;
  /** Its certified entries so far. */
  found: CatalogueEntry[];
}

/** A refusal in the making: what was found and what was expected (fail() adds the file and the entry). */
class Inconsistency extends Error {}

function refuse(found: string, expected: string): never {
  throw new Inconsistency(`${found} when expected ${expected}`);
}

/**
 * Check that a schema-valid catalogue is consistent: counts against entries, ranks in order, codes,
 * sides, areas and assignments, and every 'ok' entry's geometry (finite, of the lengths its code asks,
 * its perimeter and its re-computed certificate within the relaxer's tolerance plus what rounding to
 * 12 digits can add).
 * @throws CatalogueFormatError naming `source`, the entry (its position from 1, rank and code) and
 *   what was expected.
 */
export function checkCatalogueConsistency(catalogue: Catalogue, source: string): void {
  const { query, counts, entries } = catalogue;
  const n = query.areas.length;
  // cells of different types: the classes are of equal area and type, the ranking by energy
  let typing: CellTyping | undefined;
  try {
    if (query.tensions !== undefined && query.types === undefined) refuse('query has tensions but no types', 'types with tensions');
    typing = query.types === undefined ? undefined : typingOfPairs(query.types, query.tensions ?? {}, n);
  } catch (error) {
    if (error instanceof UsageError) fail(source, 'query', error.message);
    if (error instanceof Inconsistency) fail(source, 'query', error.message);
    throw error;
  }
  const classes = areaClasses(query.areas, typing?.types);
  const oneClass = labelledAssignmentCount(classes) === 1;
  const filtering = isFiltering(query.filter);
  const scratch = { used: new Uint8Array(n), classes: new Int32Array(n) };
  const arrangements = new Map<string, Arrangement>();
  const idOf = new Map<string, string>();
  const codeOf = new Map<string, string>();
  const tally: Record<string, number> = {};
  // a compact catalogue (a census) lists only the certified entries; its failures are counts alone
  const compact = catalogue.compact === true;
  let equilibria = 0;
  let stable = 0;
  let saddles = 0;

  // every entry on its own, then its place in the ranking
  let best: number | null = null;
  let previous: number | null = null;
  // per candidate: its largest stable perimeter so far, and whether a saddle of it came already
  const stableMost = new Map<string, number>();
  const saddleSeen = new Set<string>();
  for (let k = 0; k < entries.length; k++) {
    const entry = entries[k];
    try {
      let known = arrangements.get(entry.code);
      if (known === undefined) {
        const cluster = entryCluster(entry, n);
        const group = oneClass ? null : cellPermutations(cluster);
        // the summary (contacts, lenses, ...) only when a filter asks for it: most catalogues filter nothing
        const summary = filtering ? summarizeCluster(cluster) : null;
        known = {
          cluster, sides: summary?.sides ?? sidesOf(cluster), passes: summary === null || passesFilter(summary, query.filter), group,
          candidates: new Map(), first: k,
        };
        arrangements.set(entry.code, known);
      }
      checkEntry(entry, k, known, catalogue, classes, idOf, codeOf, scratch, typing);
      if (entry.status === 'ok') {
        equilibria++;
        if (entry.index === 0) stable++;
        else saddles++;
        // rank 1 is the least stable equilibrium (a saddle is never ranked before it: rank.ts)
        if (k > 0 && entry.index === 0 && entries[0].index !== 0) {
          refuse(`index is 0 after rank 1 of index ${entries[0].index}`, 'rank 1 stable when any equilibrium is (saddles after the least stable one)');
        }
        // ranks 1, 2, ... in file order, before every failure, perimeters not decreasing: the writer
        // orders perimeters rounded to ORDER_DIGITS (ties by code), so one may be below the one before
        // by a unit in that digit, plus the rounding of both to WRITE_DIGITS
        if (entry.rank !== k + 1) refuse(`rank is ${entry.rank}`, `${k + 1} (certified entries come first, ranked in file order)`);
        // (the energy in a typed catalogue)
        const p = rankedValue(entry)!;
        // a saddle is placed no lower than the least stable perimeter (rank 1) and its own candidate's
        // stable ones, which come before it (rank.ts rankingPerimeter)
        const candidate = candidateKey(entry);
        let placed = p;
        if (entry.index === 0) {
          if (saddleSeen.has(candidate)) refuse('index is 0 after a saddle of its candidate', "a candidate's stable equilibria before its saddles");
          stableMost.set(candidate, Math.max(stableMost.get(candidate) ?? -Infinity, p));
        } else {
          saddleSeen.add(candidate);
          placed = Math.max(p, stableMost.get(candidate) ?? -Infinity, best !== null && entries[0].index === 0 ? best : -Infinity);
        }
        if (previous !== null && placed < previous * (1 - 10 ** (1 - ORDER_DIGITS) - 2 * WRITE_ROUNDING)) {
          const what = typing === undefined ? 'perimeter' : 'energy';
          refuse(`${what} is ${p}, below rank ${k}'s ${previous}`, `ranks ordered by ${what}`);
        }
        best ??= p;
        previous = placed;
        const gap = (100 * (p - best)) / best;
        if (!(Math.abs(entry.gapPercent! - gap) <= 1e-8 * (1 + Math.abs(gap)))) {
          refuse(`gapPercent is ${entry.gapPercent}`, `${gap.toPrecision(6)} (100 (perimeter - best) / best, best ${best})`);
        }
      } else {
        if (compact) refuse(`status is "${entry.status}" in a compact catalogue`, 'only certified entries (failures are counted, not listed)');
        tally[entry.status] = (tally[entry.status] ?? 0) + 1;
        if (entry.rank !== null) refuse(`status is "${entry.status}" with rank ${entry.rank}`, 'no rank for a failure');
      }
    } catch (error) {
      if (error instanceof Inconsistency) fail(source, entryLabel(entry, k), error.message);
      throw error;
    }
  }

  // the counts as the writer (rank.ts) defines them
  const where = 'counts';
  const expectCount = (name: string, given: unknown, wanted: unknown, meaning: string): void => {
    if (JSON.stringify(given) !== JSON.stringify(wanted)) {
      fail(source, where, `${name} is ${JSON.stringify(given)} when expected ${JSON.stringify(wanted)} (${meaning})`);
    }
  };
  const listedFailures = compact ? Object.values(counts.failures).reduce((p, q) => p + q, 0) : 0;
  let listedCandidates = 0;
  for (const known of arrangements.values()) listedCandidates += known.candidates.size;
  const tried = listedCandidates + listedFailures;
  expectCount('tried', counts.tried, tried, compact ? 'the candidates listed and the failures counted' : 'the candidates among the entries, each relaxed');
  expectCount('equilibria', counts.equilibria, equilibria, 'the entries of status "ok"');
  expectCount('stable', counts.stable, stable, 'the entries of status "ok" and index 0');
  expectCount('saddles', counts.saddles, saddles, 'the entries of status "ok" and index 1 or more');
  if (!compact) {
    expectCount('failures', sortedKeys(counts.failures), sortedKeys(tally), 'the other entries by status');
    expectCount('arrangements', counts.arrangements, arrangements.size, 'the arrangements among the entries: every kept arrangement has one');
  } else if (arrangements.size > counts.arrangements) {
    fail(source, where, `arrangements is ${counts.arrangements} when expected at least ${arrangements.size} (the arrangements among the entries)`);
  }
  // candidates: the assignments up to symmetry of every kept arrangement (orbitCount, as rank.ts counts)
  const tooMany = (known: Arrangement, count: number, bound: string): never => {
    const k = known.first;
    fail(source, entryLabel(entries[k], k), `its arrangement has ${known.candidates.size} candidates when expected ${bound}${count} (its assignments up to symmetry)`);
  };
  let candidates = 0;
  let rootings = 0n;
  const walls = 3 * (n - 1);
  const orbits = new Map<Arrangement, number>();
  for (const known of arrangements.values()) {
    const count = known.group === null ? 1 : orbitCount(classes, known.group);
    orbits.set(known, count);
    candidates += count;
    if (n >= 2) rootings += BigInt((4 * walls) / known.cluster.symmetry);
    if (known.candidates.size > count) tooMany(known, count, 'at most ');
  }
  if (!compact) {
    expectCount('candidates', counts.candidates, candidates, 'the assignments up to symmetry of the arrangements listed');
    for (const [known, count] of orbits) if (counts.exhaustive && known.candidates.size < count) tooMany(known, count, '');
  } else if (candidates > counts.candidates) {
    fail(source, where, `candidates is ${counts.candidates} when expected at least ${candidates} (the candidates of the arrangements listed)`);
  }
  expectCount('skipped', counts.skipped, counts.candidates - tried, 'candidates - tried');
  expectCount('exhaustive', counts.exhaustive, counts.candidates === tried, 'tried = candidates');
  const expected = n >= 2 ? String(BigInt(n + 1) * rootedMapCount(n - 1)) : '0';
  expectCount('rootings.expected', counts.rootings.expected, expected, `(n + 1) A000309(n - 1) at n = ${n}`);
  expectCount('rootings.sum', counts.rootings.sum, expected, 'a complete enumeration sums to the expected value');
  if (!filtering && !compact) {
    // nothing filtered: the entries list every arrangement, so they give the enumeration's own counts
    expectCount('enumerated', counts.enumerated, arrangements.size, 'every arrangement is kept when nothing is filtered');
    expectCount('rootings.sum', counts.rootings.sum, n >= 2 ? String(rootings) : '0', 'the sum of 4E/|Aut| over the arrangements listed');
  } else if (counts.enumerated < counts.arrangements) {
    fail(source, where, `enumerated is ${counts.enumerated} when expected at least arrangements, ${counts.arrangements}`);
  }
}

function fail(source: string, where: string, what: string): never {
  throw new CatalogueFormatError(`${source}, ${where}: ${what}.`);
}

function entryLabel(entry: CatalogueEntry, k: number): string {
  const code = JSON.stringify(entry.code);
  return entry.rank === null || entry.status !== 'ok'
    ? `entry ${k + 1} (code ${code}, ${entry.status})`
    : `entry ${k + 1} (rank ${entry.rank}, code ${code})`;
}

function sortedKeys(record: Record<string, number>): Record<string, number> {
  const out: Record<string, number> = {};
  for (const key of Object.keys(record).sort()) out[key] = record[key];
  return out;
}

/** The entry's cluster, checked to be canonical and of n cells. */
function entryCluster(entry: CatalogueEntry, n: number): Cluster {
  let cluster: Cluster;
  try {
    cluster = clusterFromCode(entry.code);
  } catch (error) {
    if (error instanceof MapError) refuse(`code does not decode (${error.message.replace(/\.$/, '')})`, 'an admissible arrangement code');
    throw error;
  }
  if (cluster.code !== entry.code) refuse('code is not in canonical form', `"${cluster.code}" (the code lather writes)`);
  if (cluster.cells !== n) refuse(`code has ${cluster.cells} cells`, `${n}, one per area of the query`);
  return cluster;
}

/** Side count of each cell, as summarizeCluster gives them (the circle has one side). */
function sidesOf(cluster: Cluster): number[] {
  const sides: number[] = [];
  for (let f = 1; f <= cluster.cells; f++) sides.push(cluster.cells === 1 ? 1 : cluster.map.faceSize(f));
  return sides;
}

const same = (a: readonly number[], b: readonly number[]): boolean => a.length === b.length && a.every((x, i) => x === b[i]);

function checkEntry(
  entry: CatalogueEntry, k: number, known: Arrangement, catalogue: Catalogue, classes: AreaClasses,
  idOf: Map<string, string>, codeOf: Map<string, string>,
  scratch: { used: Uint8Array; classes: Int32Array }, typing: CellTyping | undefined,
): void {
  const { query } = catalogue;
  // a typed catalogue gives every entry its energy (null for a failure), an untyped one none
  if (typing === undefined && entry.energy !== undefined) refuse('energy is given', 'no energy in a catalogue without types (the perimeter is ranked)');
  if (typing !== undefined && entry.energy === undefined) refuse('energy is missing', 'an energy (or null for a failure) in a catalogue with types');
  const n = query.areas.length;
  const { cluster, sides, passes, group, candidates } = known;
  if (!same(entry.sides, sides)) refuse(`sides are [${entry.sides}]`, `[${sides}] (the side counts of cells 1..${n} of its code)`);
  if (!passes) refuse('arrangement fails the query\'s filter', `only arrangements that pass ${JSON.stringify(query.filter)}`);

  // the id: "n.k", one per code
  const m = /^([0-9]+)\.([0-9]+)$/.exec(entry.id)!;
  if (Number(m[1]) !== n || !(Number(m[2]) >= 1 && Number(m[2]) <= catalogue.counts.enumerated)) {
    refuse(`id is "${entry.id}"`, `"${n}.k" with k from 1 to ${catalogue.counts.enumerated}`);
  }
  const knownId = idOf.get(entry.code);
  const knownCode = codeOf.get(entry.id);
  if ((knownId ?? entry.id) !== entry.id) refuse(`id is "${entry.id}"`, `"${knownId}", the id of this code in an earlier entry`);
  if ((knownCode ?? entry.code) !== entry.code) refuse(`id "${entry.id}" is also that of code "${knownCode}"`, 'one id per arrangement');
  idOf.set(entry.code, entry.id);
  codeOf.set(entry.id, entry.code);

  // the assignment: each of the query's areas once, equal areas in the user's order, up to symmetry
  const { assignment } = entry;
  for (const [name, values] of [['assignment', assignment], ['cellAreas', entry.cellAreas]] as const) {
    if (values.length !== n) refuse(`${name} has ${values.length} numbers`, `${n}, one per cell`);
  }
  const used = scratch.used.fill(0);
  const s = scratch.classes;
  for (let i = 0; i < n; i++) {
    const a = assignment[i];
    if (!(a < n) || used[a]++ > 0) refuse(`assignment is [${assignment}]`, `each of 0..${n - 1} once (an index into the query's areas per cell)`);
    s[i] = classes.classOf[a];
    if (entry.cellAreas[i] !== roundWritten(query.areas[a])) {
      refuse(`cellAreas are [${entry.cellAreas}]`, `[${assignment.map((j) => roundWritten(query.areas[j]))}] (the query's areas under the assignment)`);
    }
  }
  // equal areas are given out in the query's order (userIndices); each candidate (the classes up to
  // the symmetry of the arrangement, evaluate.ts) once: an exhaustive task writes the smallest sequence
  // of each orbit, a search the sequence it tried
  const given = userIndices(s, classes);
  if (!same(given, assignment)) refuse(`assignment is [${assignment}]`, `[${given}] (equal areas given out in the query's order)`);
  checkCandidate(entry, k, candidates, group === null ? '' : orbitRepresentative(s, group).join(','), cluster, pressureScale(query.areas));

  // the failure fields
  const walls = cluster.map.twins.length / 2;
  if (entry.collapsingWall !== null && !(entry.collapsingWall < Math.max(walls, 1))) {
    refuse(`collapsingWall is ${entry.collapsingWall}`, `a wall from 0 to ${Math.max(walls, 1) - 1}`);
  }
  if (entry.collapsingCell !== null && !(entry.collapsingCell <= n)) refuse(`collapsingCell is ${entry.collapsingCell}`, `a cell from 1 to ${n}`);
  const answers: readonly (keyof CatalogueEntry)[] = ['perimeter', 'gapPercent', 'index', 'zeroModes', 'pressures', 'geometry', ...(typing === undefined ? [] : ['energy' as const])];
  if (entry.status !== 'ok') {
    for (const field of answers) if (entry[field] !== null) refuse(`${field} is given for a failure`, 'null (a failure has no answer)');
    return;
  }
  for (const field of answers) if (entry[field] === null) refuse(`${field} is null`, 'a value for a certified ("ok") entry');
  const tensions = typing === undefined ? null : wallTensions(cluster.map, assignment.map((i) => typing.types[i]), typing.table);
  checkAnswer(entry, cluster, Float64Array.from(assignment, (i) => query.areas[i]), tensions);
}

/** The pressure scale of a query's areas: 1/sqrt(mean area). */
function pressureScale(areas: readonly number[]): number {
  let total = 0;
  for (const a of areas) total += a;
  return 1 / Math.sqrt(total / areas.length);
}

/** Whether two pressure lists differ by more than SAME_PRESSURES of their largest entry (or `scale`). */
function pressuresApart(a: readonly number[], b: readonly number[], scale: number): boolean {
  let most = scale;
  for (let i = 0; i < a.length; i++) most = Math.max(most, Math.abs(a[i]), Math.abs(b[i]));
  for (let i = 0; i < a.length; i++) if (Math.abs(a[i] - b[i]) > SAME_PRESSURES * most) return true;
  return false;
}

/**
 * An entry among the others of its candidate (`key`, its orbit representative): a failure alone, or
 * certified equilibria that are distinct (as solver/equilibria.ts keeps them: perimeters more than
 * SAME_EQUILIBRIUM apart relative, or other pressures, family or index), all with the candidate's
 * assignment and starts tried, together reached by at most the starts tried; its family, if any,
 * within its cluster.
 */
function checkCandidate(
  entry: CatalogueEntry, k: number, candidates: Map<string, Candidate>, key: string, cluster: Cluster, scale: number,
): void {
  const ok = entry.status === 'ok';
  const assignment = entry.assignment.join(',');
  let known = candidates.get(key);
  if (known === undefined) {
    known = { assignment, first: k, failure: !ok, tried: entry.tried, reached: 0, found: [] };
    candidates.set(key, known);
  } else {
    const where = `that of entry ${known.first + 1}`;
    if (known.failure || !ok) refuse(`assignment [${entry.assignment}] repeats the candidate of an earlier entry`, 'each candidate once, or once per equilibrium (a failure only alone)');
    if (known.assignment !== assignment) refuse(`assignment is [${entry.assignment}]`, `[${known.assignment}], ${where}, for one candidate`);
    if (known.tried !== entry.tried) refuse(`tried is ${entry.tried}`, `${known.tried}, ${where} of the same candidate`);
  }
  if (!ok) {
    if (entry.reached !== null || entry.family !== null) refuse('reached or family is given for a failure', 'null (a failure has no equilibrium)');
    return;
  }
  if (entry.reached === null) refuse('reached is null', 'the starts that reached a certified entry (0 or more)');
  known.reached += entry.reached;
  if (known.reached > known.tried) refuse(`its candidate's entries were reached by ${known.reached} starts`, `at most the ${known.tried} tried`);
  const { family } = entry;
  if (family !== null) {
    const walls = cluster.map.twins.length / 2;
    if (!(family.cell <= cluster.cells)) refuse(`family.cell is ${family.cell}`, `a cell from 1 to ${cluster.cells}`);
    if (!family.walls.every((w) => w < walls)) refuse(`family.walls are [${family.walls}]`, `walls from 0 to ${walls - 1}`);
    if (!(family.from <= family.at && family.at <= family.to)) refuse(`family range is ${family.from} to ${family.to} at ${family.at}`, 'from <= at <= to');
    if (!(entry.zeroModes! >= 1)) refuse(`zeroModes is ${entry.zeroModes} for a family`, 'at least 1 (a lens that slides is a zero mode)');
  }
  const p = entry.perimeter!;
  const familyText = JSON.stringify(family);
  for (const other of known.found) {
    const apart = Math.abs(p - other.perimeter!) > (SAME_EQUILIBRIUM - 4 * WRITE_ROUNDING) * Math.max(p, other.perimeter!);
    if (!apart && other.index === entry.index && JSON.stringify(other.family) === familyText && !pressuresApart(entry.pressures!, other.pressures!, scale)) {
      refuse(`perimeter ${p} repeats an equilibrium of its candidate (rank ${other.rank})`, `distinct equilibria (perimeters more than ${SAME_EQUILIBRIUM} apart, or other pressures, family or index)`);
    }
  }
  known.found.push(entry);
}

/**
 * An 'ok' entry: finite numbers of the right lengths, a perimeter and a certificate its geometry bears
 * out at the query's own areas (areas[i] for cell i + 1).
 */
function checkAnswer(entry: CatalogueEntry, cluster: Cluster, areas: Float64Array, tensions: Float64Array | null): void {
  const { map } = cluster;
  const n = areas.length;
  const { coords, bulges } = entry.geometry!;
  const pressures = entry.pressures!;
  const lengths: [string, number[], number][] = [
    ['pressures', pressures, n], ['geometry.coords', coords, 2 * map.junctionCount], ['geometry.bulges', bulges, map.twins.length / 2],
  ];
  for (const [name, values, length] of lengths) {
    if (values.length !== length) refuse(`${name} has ${values.length} numbers`, `${length} for code "${cluster.code}"`);
    const bad = values.findIndex((x) => !Number.isFinite(x));
    if (bad >= 0) refuse(`${name}[${bad}] is ${values[bad]}`, 'a finite number');
  }
  const perimeter = entry.perimeter!;
  if (!Number.isFinite(perimeter) || !Number.isFinite(entry.gapPercent!)) refuse(`perimeter is ${perimeter}, gapPercent ${entry.gapPercent}`, 'finite numbers');

  // every two junctions are joined by walls, each at least as long as its chord: the drawing's extent
  // along either axis is at most the perimeter
  for (let axis = 0; axis < 2; axis++) {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = axis; i < coords.length; i += 2) {
      lo = Math.min(lo, coords[i]);
      hi = Math.max(hi, coords[i]);
    }
    if (hi - lo > perimeter) refuse(`geometry spans ${hi - lo} in ${axis === 0 ? 'x' : 'y'}`, `at most the perimeter, ${perimeter}`);
  }

  const geometry = { coords: Float64Array.from(coords), bulges: Float64Array.from(bulges), pressures: Float64Array.from(pressures) };
  const slack = roundingSlack(cluster, areas, geometry);
  const worst = Math.max(slack.area, slack.tangent, slack.curvature, slack.perimeter);
  if (!(worst <= MAX_ROUNDING_SLACK)) {
    refuse(`geometry could move its certificate by ${worst.toPrecision(3)} through rounding alone`, `at most ${MAX_ROUNDING_SLACK} (walls not far below the drawing's size)`);
  }
  const tolerance = CERTIFICATE_TOLERANCE;
  const length = drawnPerimeter(cluster, areas, geometry.coords, geometry.bulges);
  if (!(Math.abs(perimeter - length) <= (tolerance + slack.perimeter) * length)) {
    refuse(`perimeter is ${perimeter}`, `${length.toPrecision(12)}, the length of its walls`);
  }
  if (entry.energy !== undefined) {
    const energy = drawnPerimeter(cluster, areas, geometry.coords, geometry.bulges, tensions);
    if (!(Math.abs((entry.energy as number) - energy) <= (tolerance + slack.perimeter) * energy)) {
      refuse(`energy is ${entry.energy}`, `${energy.toPrecision(12)}, the sum of tension times length of its walls`);
    }
  }
  if (!certificatePasses(entry.certificate, tolerance)) {
    refuse(`certificate ${JSON.stringify(entry.certificate)} does not pass`, `residuals at most ${tolerance}, positive walls and cells, no crossing`);
  }
  const c = checkEquilibrium(map, areas, geometry, tensions);
  const limits: [keyof Certificate, number][] = [
    ['areaResidual', tolerance + slack.area],
    ['tangentResidual', tolerance + slack.tangent],
    ['curvatureResidual', tolerance + slack.curvature],
  ];
  for (const [name, limit] of limits) {
    if (!(c[name] <= limit)) refuse(`re-checked ${name} is ${c[name].toPrecision(3)}`, `at most ${limit.toPrecision(3)} for an equilibrium of its code and areas`);
  }
  if (!certificatePasses(c, Infinity)) {
    refuse(
      `re-checked geometry has shortest wall ${c.minWallLength.toPrecision(3)}, smallest cell ${c.minCellArea.toPrecision(3)}, ` +
        `${c.crossings} crossings and ${c.misorderedJunctions} misordered junctions`,
      'positive walls and cells, no crossing, every junction in the order of its code',
    );
  }
}

const FACTORS = new Float64Array(BULGE_FACTORS);

/**
 * The perimeter of a drawing: the sum of its arc lengths (the circle: 2 sqrt(pi A)); with wall
 * `tensions`, the sum of tension times length (the energy).
 */
function drawnPerimeter(cluster: Cluster, areas: Float64Array, coords: Float64Array, bulges: Float64Array, tensions: Float64Array | null = null): number {
  const { twins } = cluster.map;
  if (twins.length === 0) return (tensions === null ? 1 : tensions[0]) * (2 * Math.sqrt(Math.PI * areas[0]));
  let sum = 0;
  for (let e = 0, k = 0; e < twins.length; e++) {
    if (e > twins[e]) continue;
    const a = (e / 3) | 0;
    const b = (twins[e] / 3) | 0;
    const s = tensions === null ? 1 : tensions[k];
    sum += s * arcLength(coords[2 * a], coords[2 * a + 1], coords[2 * b], coords[2 * b + 1], bulges[k++]);
  }
  return sum;
}

/**
 * First-order bounds of how much writing a geometry to WRITE_DIGITS significant digits can move what
 * the reader re-checks, from the geometry as written. Rounding moves junction v by at most
 * d_v = sqrt(2) r max(|x_v|, |y_v|) and a bulge t by r |t| (r = WRITE_ROUNDING). For a wall of chord c
 * from a to b (arcs/arc.ts: L = c g(t), S = c^2 h(t), curvature 2 sin t / c):
 * - the chord turns by at most (d_a + d_b) / c, so each end's tangent by (d_a + d_b) / c + r |t|;
 *   a junction's tangent sum moves by at most the sum over its three walls;
 * - the length moves by g (d_a + d_b) + c |g'| r |t|;
 * - the curvature by 2 |sin t| (d_a + d_b) / c^2 + 2 |cos t| r |t| / c, the pressure jump by
 *   r (|p_left| + |p_right|), both divided by the residual's scale |jump| + 1/sqrt(mean area);
 * - a cell's area by, per wall, (d_a + d_b) c / 2 (the polygon: vertex v moves the area by d_v times
 *   half the distance between its neighbours) plus 2 c |h| (d_a + d_b) + c^2 |h'| r |t| (the segment).
 */
export function roundingSlack(
  cluster: Cluster, areas: Float64Array, geometry: { coords: Float64Array; bulges: Float64Array; pressures: Float64Array },
): RoundingSlack {
  const r = WRITE_ROUNDING;
  const { coords, bulges, pressures } = geometry;
  const { twins, faceOf, junctionCount } = cluster.map;
  const cells = areas.length;
  let total = 0;
  for (let i = 0; i < cells; i++) total += areas[i];
  const unit = Math.sqrt(total / cells);
  const pressureOf = (f: number): number => (f > 0 ? pressures[f - 1] : 0);
  if (twins.length === 0) {
    // the circle: only its pressure is written (curvature residual |1/R - p| / (|p| + 1/unit))
    return { area: 0, tangent: 0, curvature: (r * Math.abs(pressures[0])) / (Math.abs(pressures[0]) + 1 / unit), perimeter: 0 };
  }
  const moved = (v: number): number => Math.SQRT2 * r * Math.max(Math.abs(coords[2 * v]), Math.abs(coords[2 * v + 1]));
  const turn = new Float64Array(junctionCount);
  const cellMove = new Float64Array(cells + 1);
  let tangent = 0;
  let curvature = 0;
  let length = 0;
  let perimeter = 0;
  for (let e = 0, k = 0; e < twins.length; e++) {
    if (e > twins[e]) continue;
    const a = (e / 3) | 0;
    const b = (twins[e] / 3) | 0;
    const t = bulges[k++];
    const c = Math.hypot(coords[2 * b] - coords[2 * a], coords[2 * b + 1] - coords[2 * a + 1]);
    const dc = moved(a) + moved(b);
    const dt = r * Math.abs(t);
    bulgeFactorsInto(t, FACTORS);
    const angle = dc / c + dt;
    turn[a] += angle;
    turn[b] += angle;
    length += FACTORS[G] * c;
    perimeter += FACTORS[G] * dc + c * Math.abs(FACTORS[G1]) * dt;
    const pl = pressureOf(faceOf[e]);
    const pr = pressureOf(faceOf[twins[e]]);
    const dk = (2 * Math.abs(Math.sin(t)) * dc) / (c * c) + (2 * Math.abs(Math.cos(t)) * dt) / c;
    curvature = Math.max(curvature, (dk + r * (Math.abs(pl) + Math.abs(pr))) / (Math.abs(pr - pl) + 1 / unit));
    const da = 0.5 * dc * c + 2 * c * Math.abs(FACTORS[H]) * dc + c * c * Math.abs(FACTORS[H1]) * dt;
    cellMove[faceOf[e]] += da;
    cellMove[faceOf[twins[e]]] += da;
  }
  for (let v = 0; v < junctionCount; v++) tangent = Math.max(tangent, turn[v]);
  let area = 0;
  for (let f = 1; f <= cells; f++) area = Math.max(area, cellMove[f] / areas[f - 1]);
  return { area, tangent, curvature, perimeter: perimeter / length };
}
