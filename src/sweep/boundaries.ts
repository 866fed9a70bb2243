// sweep stage: where a candidate's equilibrium stops existing along a path, located by bisection with warm starts.
//
// Between a sample where the candidate is certified and one where it is not, halve the bracket: each
// probe starts from the nearest certified state of the same branch, with the small collapse threshold
// of probe.ts, so the bracket closes where the failing wall reaches zero length (or where the branch
// folds, or the cell pinches off). The failure of the last probe on the far side names the kind and,
// for a wall collapse, the arrangement its T1 swap leads to.

import { type CubicMap, junctionOf } from '../maps/cubic-map.ts';
import type { Equilibrium } from '../solver/result.ts';
import { lowerDartOfWall } from '../maps/t1.ts';
import { t1Neighbour } from './candidates.ts';
import { type KnownState, type PathContext, extrapolatedPerimeter, nearest, probe } from './probe.ts';
import type { Boundary } from './types.ts';

/**
 * Relative chord (to sqrt of the smaller neighbouring cell area) under which the shortest wall of the
 * last certified state is taken as the collapsing one when the failing probe names no wall (the
 * relaxer may stall short of its collapse test when the threshold is as small as the probes').
 */
const COLLAPSE_HINT = 1e-2;

/** Farthest an extrapolated zero of the collapsing wall may lie beyond the bracket, as a share of the sample spacing. */
const EXTRAPOLATION_LIMIT = 0.25;

/** Times the bracket is pushed one sample spacing further when the failing sample is certified under the probe threshold. */
const EXTENSIONS = 3;

/**
 * Locate where candidate c stops existing between `ok` (certified) and `failAt` (not certified at
 * the samples' threshold), to ctx.tolerance. `limit` is the end of the parameter range beyond failAt.
 * Returns null when the equilibrium turns out to exist up to `limit` under the probe threshold, or when
 * the probes beyond the last certified one end without convergence (existence unknown, not a boundary).
 */
export function locateBoundary(ctx: PathContext, c: number, ok: KnownState, failAt: number, limit: number): Boundary | null {
  const list: KnownState[] = [ok];
  let a = ok.p;
  let b = failAt;
  // is the far side certified under the probe threshold? then the boundary lies further on
  let r = probe(ctx, c, b, list);
  const spacing = b - a;
  for (let k = 0; r.known !== null; k++) {
    const next = spacing > 0 ? Math.min(limit, b + spacing) : Math.max(limit, b + spacing);
    if (k >= EXTENSIONS || next === b) return null;
    a = b;
    b = next;
    r = probe(ctx, c, b, list);
  }
  let last: Equilibrium = r.equilibrium;
  // bisection: a certified, b not
  while (Math.abs(b - a) > ctx.tolerance) {
    const m = 0.5 * (a + b);
    const q = probe(ctx, c, m, list);
    if (q.known !== null) a = m;
    else {
      b = m;
      last = q.equilibrium;
    }
  }
  let at = 0.5 * (a + b);
  const known = nearest(list, a) as KnownState;
  const map = ctx.set.candidates[c].cluster.map;
  let status: string = last.status;
  let wall = last.status === 'wall-collapse' ? last.collapsingWall : null;
  if (wall === null && status !== 'cell-collapse') {
    const shortest = shortestWall(map, known.state.equilibrium.coords, known.state.areas);
    if (shortest.chord < COLLAPSE_HINT) {
      wall = shortest.wall;
      status = 'wall-collapse';
    }
  }
  // Did the solver merely not converge? That says nothing about existence (the relaxer's status says
  // "existence unknown"): no boundary.
  if (status === 'no-convergence') return null;
  // zero modes counted at the sample (near the collapse a softening mode can pass for one), and at
  // least one per lens: a 2-sided cell slides along its wall of constant curvature
  const lenses = ctx.set.candidates[c].sides.filter((k) => k === 2).length;
  const zeroModes = Math.max(ok.state.equilibrium.zeroModes ?? 0, lenses);
  if (wall !== null && zeroModes === 0) {
    // the bisection stops where the probes' collapse threshold is crossed; the wall's chord vanishes
    // linearly a little further on: extrapolate it to zero from the two nearest certified probes (not
    // with a zero mode, where the wall's length also depends on how far the free part slid)
    const near = [...list].sort((x, y) => Math.abs(x.p - a) - Math.abs(y.p - a));
    const second = near.find((k) => k.p !== near[0].p);
    if (second !== undefined) {
      const c1 = chordOf(map, wall, near[0].state.equilibrium.coords);
      const c2 = chordOf(map, wall, second.state.equilibrium.coords);
      const p0 = near[0].p - (c1 * (near[0].p - second.p)) / (c1 - c2);
      const ahead = (p0 - a) * (b - a) >= 0;
      if (c2 > c1 && Number.isFinite(p0) && ahead && Math.abs(p0 - a) <= EXTRAPOLATION_LIMIT * Math.abs(spacing)) at = p0;
    }
  }
  return {
    candidate: c,
    at,
    bracket: a < b ? [a, b] : [b, a],
    exists: a < b ? 'below' : 'above',
    status,
    collapsingWall: wall,
    becomes: wall === null ? null : t1Neighbour(ctx.set.candidates[c], wall, ctx.set.ids),
    perimeter: extrapolatedPerimeter(ctx, c, known, at),
    zeroModes,
  };
}

/** Chord of wall k (map.wallIndex numbering) in the drawing `coords`. */
function chordOf(map: CubicMap, k: number, coords: Float64Array): number {
  const e = lowerDartOfWall(map.twins, k);
  const u = junctionOf(e);
  const v = junctionOf(map.twins[e]);
  return Math.hypot(coords[2 * v] - coords[2 * u], coords[2 * v + 1] - coords[2 * u + 1]);
}

/** The wall of least chord relative to sqrt of the smaller area beside it (the outside counts as no limit). */
function shortestWall(map: CubicMap, coords: Float64Array, areas: Float64Array): { wall: number; chord: number } {
  const { twins, faceOf } = map;
  let wall = -1;
  let chord = Infinity;
  let k = 0;
  for (let e = 0; e < twins.length; e++) {
    if (e > twins[e]) continue;
    const u = junctionOf(e);
    const v = junctionOf(twins[e]);
    const fl = faceOf[e];
    const fr = faceOf[twins[e]];
    const area = Math.min(fl > 0 ? areas[fl - 1] : Infinity, fr > 0 ? areas[fr - 1] : Infinity);
    const relative = Math.hypot(coords[2 * v] - coords[2 * u], coords[2 * v + 1] - coords[2 * u + 1]) / Math.sqrt(area);
    if (relative < chord) {
      chord = relative;
      wall = k;
    }
    k++;
  }
  return { wall, chord };
}
