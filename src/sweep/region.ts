// sweep stage: sweep two parameters (a grid) or three shares of a fixed total (a triangle): the winner at every sample and the regions they form.
//
// Samples are visited in the domain's order (domain.ts) over a neighbour graph (grid: left, right,
// below, above; triangle: small triangles sharing an edge). A candidate certified at an already
// visited neighbour starts from that equilibrium; otherwise cold, with the same back-off as a path
// after a cold failure. When a candidate is found cold, it is carried by warm starts into the visited
// neighbours where it was missing (breadth first), so a region does not depend on where it was entered.

import { UsageError } from '../errors.ts';
import type { Equilibrium } from '../solver/result.ts';
import type { GridDomain, TriangleDomain } from './domain.ts';
import type { AreaFormula } from './formula.ts';
import { rankSamples } from './order.ts';
import { prepareSweep } from './prepare.ts';
import { type TrackedState, trackStep } from './track.ts';
import type { Region, RegionSweep, SweepOptions } from './types.ts';

/**
 * The neighbour lists of a domain's samples, in its sample order.
 * @throws UsageError when the grid size or the divisions are not positive integers.
 */
export function sampleNeighbours(domain: GridDomain | TriangleDomain): number[][] {
  if (domain.kind === 'grid') {
    const s = domain.samples;
    if (!(Number.isInteger(s) && s >= 1)) throw new UsageError(`Grid has ${s} samples per side when expected a positive whole number.`);
    const out: number[][] = [];
    for (let j = 0; j < s; j++) {
      for (let i = 0; i < s; i++) {
        const list: number[] = [];
        if (i > 0) list.push(j * s + i - 1);
        if (j > 0) list.push((j - 1) * s + i);
        if (i + 1 < s) list.push(j * s + i + 1);
        if (j + 1 < s) list.push((j + 1) * s + i);
        out.push(list);
      }
    }
    return out;
  }
  // triangle order (render/region-map.ts): row j holds U(0,j), D(0,j), U(1,j), ..., U(m-1-j, j);
  // D(i,j) shares its edges with U(i,j), U(i+1,j) and U(i,j+1)
  const m = domain.divisions;
  if (!(Number.isInteger(m) && m >= 1)) throw new UsageError(`Divisions is ${m} when expected a positive whole number.`);
  const up = new Map<string, number>();
  const downs: [number, number, number][] = [];
  let k = 0;
  for (let j = 0; j < m; j++) {
    for (let i = 0; i < m - j; i++) {
      up.set(`${i},${j}`, k++);
      if (i < m - 1 - j) downs.push([i, j, k++]);
    }
  }
  const out: number[][] = Array.from({ length: k }, () => []);
  for (const [i, j, d] of downs) {
    for (const key of [`${i},${j}`, `${i + 1},${j}`, `${i},${j + 1}`]) {
      const u = up.get(key) as number;
      out[d].push(u);
      out[u].push(d);
    }
  }
  for (const list of out) list.sort((a, b) => a - b);
  return out;
}

/**
 * Sweep the areas `formulas` over a grid of two parameters or a triangle of three shares.
 * @throws FormulaError when a formula is not a positive finite area on the domain.
 * @throws UsageError when an option is out of range or there are more cells than a ranking takes.
 */
export function sweepRegion(formulas: readonly AreaFormula[], domain: GridDomain | TriangleDomain, options: SweepOptions = {}): RegionSweep {
  const neighbours = sampleNeighbours(domain);
  const { maxSkip, set, candidates, points, count, slotValues, counts, areasAt, newtonAt } =
    prepareSweep(formulas, domain, options, 'region');

  const states: (TrackedState | null)[][] = candidates.map(() => new Array<TrackedState | null>(count).fill(null));
  const tried: Uint8Array[] = candidates.map(() => new Uint8Array(count));
  const nextTry = new Int32Array(candidates.length);
  const skip = new Int32Array(candidates.length).fill(1);
  const record = (c: number, k: number, areas: Float64Array, eq: Equilibrium): boolean => {
    tried[c][k] = 1;
    if (eq.status !== 'ok') return false;
    states[c][k] = { areas, equilibrium: eq };
    return true;
  };
  for (let k = 0; k < count; k++) {
    for (const cand of candidates) {
      const c = cand.index;
      const from = neighbours[k].find((j) => j < k && states[c][j] !== null);
      if (from === undefined && k < nextTry[c]) continue;
      const areas = areasAt(c, k);
      const start = from === undefined ? null : states[c][from];
      const step = trackStep(cand.cluster.map, areas, start, newtonAt(c, k), counts, start === null ? 'cold' : 'warm');
      if (record(c, k, areas, step.equilibrium)) {
        skip[c] = 1;
        if (start === null) carryBack(c, k);
      } else if (start === null) {
        nextTry[c] = k + skip[c];
        skip[c] = Math.min(2 * skip[c], maxSkip);
      } else nextTry[c] = k + 1;
    }
    options.onProgress?.(k + 1, count);
  }

  // carry a candidate found cold at k into the visited samples around it where it was missing
  function carryBack(c: number, k: number): void {
    const queue = [k];
    for (let head = 0; head < queue.length; head++) {
      const x = queue[head];
      for (const y of neighbours[x]) {
        if (y >= k || states[c][y] !== null) continue;
        const areas = areasAt(c, y);
        const step = trackStep(candidates[c].cluster.map, areas, states[c][x], newtonAt(c, y), counts, 'warm');
        if (record(c, y, areas, step.equilibrium)) queue.push(y);
      }
    }
  }

  const ranked = rankSamples(states, candidates, count, 2);
  const winners = ranked.map((r) => (r.length > 0 ? r[0].candidate : null));
  return {
    kind: 'region',
    formulas,
    domain,
    set,
    names: points.names,
    values: points.values,
    slotValues,
    ranked,
    winnerStates: winners.map((w, k) => (w === null ? null : states[w][k])),
    regions: regionsOf(winners, neighbours, points.values, points.names.length),
    counts: { enumerated: set.enumerated, arrangements: set.arrangements, candidates: candidates.length, relaxations: counts },
    ...(options.typing === undefined ? {} : { typing: options.typing }),
  };
}

/** Connected sets of samples with one winner (over the neighbour graph), in order of their first sample. */
function regionsOf(winners: readonly (number | null)[], neighbours: readonly number[][], values: Float64Array, dims: number): Region[] {
  const count = winners.length;
  const seen = new Uint8Array(count);
  const regions: Region[] = [];
  for (let k = 0; k < count; k++) {
    if (seen[k]) continue;
    seen[k] = 1;
    const members = [k];
    for (let head = 0; head < members.length; head++) {
      for (const y of neighbours[members[head]]) {
        if (!seen[y] && winners[y] === winners[k]) {
          seen[y] = 1;
          members.push(y);
        }
      }
    }
    members.sort((a, b) => a - b);
    const extent: [number, number][] = [];
    for (let j = 0; j < dims; j++) {
      let lo = Infinity;
      let hi = -Infinity;
      for (const x of members) {
        lo = Math.min(lo, values[x * dims + j]);
        hi = Math.max(hi, values[x * dims + j]);
      }
      extent.push([lo, hi]);
    }
    regions.push({ winner: winners[k], members, extent });
  }
  return regions;
}
