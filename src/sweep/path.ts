// sweep stage: sweep one parameter along a path: every candidate tracked from sample to sample, winners, transitions and boundaries.
//
// At each sample a candidate certified at the previous sample starts from that equilibrium (relaxFrom,
// which falls back to a cold start); one that was not starts cold (or from a certified candidate of the
// same arrangement), and after such a failure it is skipped for 1, 2, 4, ... up to maxSkip samples
// before the next try, unless a tracked candidate collapses a wall into its arrangement (a T1 swap),
// which makes it due at once. When a skipped candidate is found
// again, it is followed backwards with warm starts to where it begins. Transitions between samples
// (transitions.ts) and the existence boundaries of the competitors (boundaries.ts) are then located.

import { UsageError } from '../errors.ts';
import { t1Neighbour } from './candidates.ts';
import type { PathDomain } from './domain.ts';
import type { AreaFormula } from './formula.ts';
import { rankSamples } from './order.ts';
import { type KnownState, type PathContext, probeOptionsOf } from './probe.ts';
import { prepareSweep } from './prepare.ts';
import { type TrackedState, trackStep } from './track.ts';
import { locateBoundary } from './boundaries.ts';
import { type PathPoint, locateTransitions } from './transitions.ts';
import type { Boundary, Interval, PathSweep, Placed, SweepOptions, Transition } from './types.ts';

/**
 * Sweep the areas `formulas` (one per cell) along `domain`.
 * @throws FormulaError when a formula is not a positive finite area somewhere on the range.
 * @throws UsageError when an option is out of range or there are more cells than a ranking takes.
 */
export function sweepPath(formulas: readonly AreaFormula[], domain: PathDomain, options: SweepOptions = {}): PathSweep {
  if (!(Number.isInteger(domain.samples) && domain.samples >= 2)) {
    throw new UsageError(`Path has ${domain.samples} samples when expected a whole number of at least 2.`);
  }
  const { competitorCount, maxSkip, tolerance, newton, set, candidates, points, count, slotValues, counts, areasAt, newtonAt } =
    prepareSweep(formulas, domain, options, 'path');
  const xs = points.values;

  // track every candidate along the samples
  const states: (TrackedState | null)[][] = candidates.map(() => new Array<TrackedState | null>(count).fill(null));
  const statuses: string[][] = candidates.map(() => new Array<string>(count).fill('skipped'));
  const linked: Uint8Array[] = candidates.map(() => new Uint8Array(count)); // state k continues state k - 1
  const nextTry = new Int32Array(candidates.length);
  const byCode = new Map<string, number[]>();
  for (const cand of candidates) byCode.set(cand.code, [...(byCode.get(cand.code) ?? []), cand.index]);
  const skip = new Int32Array(candidates.length).fill(1);
  for (let k = 0; k < count; k++) {
    for (const cand of candidates) {
      const c = cand.index;
      const prev = k > 0 ? states[c][k - 1] : null;
      if (prev === null && k < nextTry[c]) continue;
      const areas = areasAt(c, k);
      // no own state: start from a sibling's (same arrangement, other assignment) at this sample, as a ranking does
      const start = prev ?? siblingState(c, k);
      const step = trackStep(cand.cluster.map, areas, start, newtonAt(c, k), counts, prev === null ? 'cold' : 'warm');
      statuses[c][k] = step.equilibrium.status;
      if (step.ok) {
        states[c][k] = { areas, equilibrium: step.equilibrium };
        linked[c][k] = prev !== null && step.continued ? 1 : 0;
        skip[c] = 1;
        if (prev === null && k > 0) backfill(c, k);
        continue;
      }
      if (prev !== null) {
        // the branch ended here; relaxFrom already tried a cold start, so try again at the next sample
        nextTry[c] = k + 1;
        skip[c] = 1;
        // a collapsing wall hands the cluster to its T1 neighbour: try that arrangement's candidates now
        const wall = step.equilibrium.status === 'wall-collapse' ? step.equilibrium.collapsingWall : null;
        const neighbour = wall === null ? null : t1Neighbour(cand, wall, set.ids);
        for (const d of neighbour === null ? [] : byCode.get(neighbour.code) ?? []) {
          if (states[d][k] !== null || (k > 0 && states[d][k - 1] !== null)) continue;
          nextTry[d] = Math.min(nextTry[d], d > c ? k : k + 1);
          skip[d] = 1;
        }
      } else {
        nextTry[c] = k + skip[c];
        skip[c] = Math.min(2 * skip[c], maxSkip);
      }
    }
    options.onProgress?.(k + 1, count);
  }

  // the last certified state at sample k of a candidate before c with the same arrangement
  function siblingState(c: number, k: number): TrackedState | null {
    for (let j = c - 1; j >= 0 && candidates[j].code === candidates[c].code; j--) {
      if (states[j][k] !== null) return states[j][k];
    }
    return null;
  }

  // follow a candidate found at sample k backwards to where its branch begins
  function backfill(c: number, k: number): void {
    for (let j = k - 1; j >= 0; j--) {
      if (states[c][j] !== null) return;
      const areas = areasAt(c, j);
      const step = trackStep(candidates[c].cluster.map, areas, states[c][j + 1], newtonAt(c, j), counts, 'warm');
      statuses[c][j] = step.equilibrium.status;
      if (!step.ok) {
        return;
      }
      states[c][j] = { areas, equilibrium: step.equilibrium };
      linked[c][j + 1] = step.continued ? 1 : 0;
      if (!step.continued) return;
    }
  }

  // rank every sample; the competitors are those ranked within competitorCount somewhere
  const ranked = rankSamples(states, candidates, count, competitorCount);
  const winners = ranked.map((r) => (r.length > 0 ? r[0].candidate : -1));
  const competitors = competitorOrder(ranked, winners);

  const ctx: PathContext = {
    formulas, parameter: domain.parameter.name, set, probeOptions: probeOptionsOf(newton), counts, tolerance,
    typing: options.typing,
  };
  const pointAt = (k: number): PathPoint => {
    const known = new Map<number, KnownState>();
    for (const cand of candidates) {
      const s = states[cand.index][k];
      if (s !== null) known.set(cand.index, { p: xs[k], state: s });
    }
    return { p: xs[k], known };
  };

  // transitions between consecutive samples with different winners
  const transitions: Transition[] = [];
  for (let k = 0; k + 1 < count; k++) {
    if (winners[k] === winners[k + 1]) continue;
    if (winners[k] < 0 || winners[k + 1] < 0) {
      const mid = 0.5 * (xs[k] + xs[k + 1]);
      const c = winners[k] < 0 ? winners[k + 1] : winners[k];
      const P = (states[c][winners[k] < 0 ? k + 1 : k] as TrackedState).equilibrium.energy;
      transitions.push({ at: mid, bracket: [xs[k], xs[k + 1]], from: winners[k], to: winners[k + 1], kind: 'existence', perimeters: [P, P] });
      continue;
    }
    const left = pointAt(k);
    const right = pointAt(k + 1);
    const others = [...new Set([...left.known.keys(), ...right.known.keys()])];
    transitions.push(...locateTransitions(ctx, left, right, winners[k], winners[k + 1], others));
  }

  // existence boundaries of the competitors
  const boundaries: Boundary[] = [];
  for (const c of competitors) {
    for (let k = 0; k + 1 < count; k++) {
      const here = states[c][k];
      const there = states[c][k + 1];
      const joined = here !== null && there !== null && linked[c][k + 1] === 1;
      if (here !== null && !joined) {
        const b = locateBoundary(ctx, c, { p: xs[k], state: here }, xs[k + 1], xs[count - 1]);
        if (b !== null) boundaries.push(b);
      }
      if (there !== null && !joined && statuses[c][k] !== 'skipped') {
        const b = locateBoundary(ctx, c, { p: xs[k + 1], state: there }, xs[k], xs[0]);
        if (b !== null) boundaries.push(b);
      }
    }
  }
  boundaries.sort((a, b) => a.at - b.at || a.candidate - b.candidate);

  return {
    kind: 'path',
    formulas,
    domain,
    set,
    xs,
    slotValues,
    states,
    statuses,
    ranked,
    competitors,
    transitions,
    boundaries,
    intervals: intervalsOf(xs, winners, transitions),
    counts: { enumerated: set.enumerated, arrangements: set.arrangements, candidates: candidates.length, relaxations: counts },
    ...(options.typing === undefined ? {} : { typing: options.typing }),
  };
}

/** Competitors: every sample's winner in order of first win, then the other ranked ones in order of first appearance. */
function competitorOrder(ranked: Placed[][], winners: ArrayLike<number>): number[] {
  const order: number[] = [];
  for (let k = 0; k < winners.length; k++) if (winners[k] >= 0 && !order.includes(winners[k])) order.push(winners[k]);
  for (const r of ranked) for (const p of r) if (!order.includes(p.candidate)) order.push(p.candidate);
  return order;
}

/** The intervals between the range ends and the located transitions, with their winners and sample counts. */
function intervalsOf(xs: Float64Array, winners: ArrayLike<number>, transitions: readonly Transition[]): Interval[] {
  const ends = [xs[0], ...transitions.map((t) => t.at), xs[xs.length - 1]];
  const owners = [winners[0], ...transitions.map((t) => t.to)];
  const intervals: Interval[] = [];
  for (let i = 0; i < owners.length; i++) {
    const from = ends[i];
    const to = ends[i + 1];
    let samples = 0;
    for (let k = 0; k < xs.length; k++) {
      const inside = xs[k] >= from && (xs[k] < to || (i === owners.length - 1 && xs[k] <= to));
      if (inside && winners[k] === owners[i]) samples++;
    }
    intervals.push({ from, to, winner: owners[i] < 0 ? null : owners[i], samples });
  }
  return intervals;
}
