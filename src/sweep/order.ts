// sweep stage: the ranking order at one sample, the same as the catalogue's: perimeter, then code, then assignment.

import { ORDER_DIGITS } from '../catalogue/rank.ts';
import type { SweepCandidate } from './candidates.ts';
import type { TrackedState } from './track.ts';
import type { Placed } from './types.ts';

/** Negative when `a` ranks before `b` (perimeters compared at ORDER_DIGITS significant digits). */
export function comparePlaced(a: Placed, b: Placed, candidates: readonly SweepCandidate[]): number {
  const pa = Number(a.perimeter.toPrecision(ORDER_DIGITS));
  const pb = Number(b.perimeter.toPrecision(ORDER_DIGITS));
  if (pa !== pb) return pa - pb;
  const ca = candidates[a.candidate];
  const cb = candidates[b.candidate];
  if (ca.code !== cb.code) return ca.code < cb.code ? -1 : 1;
  if (ca.assignmentKey !== cb.assignmentKey) return ca.assignmentKey < cb.assignmentKey ? -1 : 1;
  return a.candidate - b.candidate;
}

/** The `limit` best of the placed candidates, in ranking order. */
export function rankPlaced(placed: Placed[], candidates: readonly SweepCandidate[], limit: number): Placed[] {
  placed.sort((a, b) => comparePlaced(a, b, candidates));
  return placed.slice(0, limit);
}

/** At each of `count` samples, the `limit` best candidates with a state there (states[c][k]), in ranking order. */
export function rankSamples(
  states: readonly (readonly (TrackedState | null)[])[], candidates: readonly SweepCandidate[], count: number, limit: number,
): Placed[][] {
  const ranked: Placed[][] = [];
  for (let k = 0; k < count; k++) {
    const placed: Placed[] = [];
    for (const cand of candidates) {
      const s = states[cand.index][k];
      if (s !== null) placed.push({ candidate: cand.index, perimeter: s.equilibrium.energy });
    }
    ranked.push(rankPlaced(placed, candidates, limit));
  }
  return ranked;
}
