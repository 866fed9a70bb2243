// solver stage: the stability of a certified equilibrium, its index and zero modes, counted at the
// cluster's own scales.
//
// The index is the number of negative eigenvalues of the second variation on the tangent space of the
// area constraints less the rigid motions; by the inertia of the bordered KKT matrix it is the number of
// its negative eigenvalues less the n + 3 of the constraints (design.md §5), and its zero eigenvalues
// are the zero modes. Inertia does not depend on the basis (Sylvester's law of inertia), but telling a
// zero eigenvalue from a small one does: the entries of a cell's rows scale like 1/length in the
// Hessian and like length in the area gradients, so a cell 1e-6 the size of another has rows a
// million times apart, and a threshold relative to the largest entry calls its modes zero. So the
// reduced step matrix of kkt.ts (the bulges eliminated wall by wall, their pivots counted with their
// signs: Haynsworth inertia additivity) is first equilibrated, D A D with every row's largest entry 1
// ("Matrix Computations", 4th ed., 2013, §3.5.2, symmetric scaling; the iteration of "A scaling
// algorithm to equilibrate both rows and columns norms in matrices", RAL-TR-2001-034), which is a
// congruence and keeps the inertia; its eigenvalues are then compared with its largest one
// (design.md §7: never with a fixed number). Lengths are already in units of sqrt(mean area), so the
// counts are the same at every scale of the areas.

import { tridiagonalEigenvaluesInto, tridiagonaliseInto } from '../linalg/symmetric-eigen.ts';
import { assembleStepInto, rigidInto } from './kkt.ts';
import { penaltyGradientInto } from './penalty.ts';
import type { ClusterProblem } from './problem.ts';
import { perimeterInto } from './wall-terms.ts';
import type { Workspace } from './workspace.ts';

/** Index and zero modes of an equilibrium (see the file header). */
export interface Stability {
  /** Negative directions of the second variation less the constraints'; negative when they do not add up. */
  index: number;
  /** Zero eigenvalues of the equilibrated KKT matrix. */
  zeroModes: number;
}

// Passes of the symmetric equilibration (each halves the distance of every row's largest entry from 1
// in the logarithm; ten bring it within a factor 1.001).
const SCALING_PASSES = 10;

interface Scratch {
  a: Float64Array;
  scale: Float64Array;
  diagonal: Float64Array;
  offDiagonal: Float64Array;
  vectors: Float64Array;
}
const SCRATCH = new Map<number, Scratch>();

function scratchFor(order: number): Scratch {
  let s = SCRATCH.get(order);
  if (!s) {
    s = {
      a: new Float64Array(order * order),
      scale: new Float64Array(order),
      diagonal: new Float64Array(order),
      offDiagonal: new Float64Array(order),
      vectors: new Float64Array(2 * order),
    };
    SCRATCH.set(order, s);
  }
  return s;
}

/**
 * The index and zero modes of the equilibrium in ws.z (normalised units, its pressures as the Lagrange
 * multipliers): eigenvalues of the equilibrated reduced KKT matrix at most `zeroTolerance` times its
 * largest in magnitude count as zero. Uses ws's scratch (cache, areas, mult, gradients, rigid, kkt).
 */
export function stabilityOf(problem: ClusterProblem, ws: Workspace, zeroTolerance: number): Stability {
  const { cells, junctions, walls } = problem;
  const p0 = 2 * junctions + walls;
  const { z, cache, areas, targets, mult, mu, grad, lengthGrad, rigid, shift, change, kkt } = ws;
  perimeterInto(problem, z, cache, areas);
  for (let f = 0; f < cells; f++) {
    mult[f] = z[p0 + f];
    change[f] = 0;
  }
  penaltyGradientInto(problem, z, targets, mult, 0, cache, areas, mu, grad, lengthGrad);
  rigidInto(z, junctions, rigid);
  const n = assembleStepInto(problem, z, cache, mult, 0, shift, lengthGrad, change, rigid, kkt);
  const s = scratchFor(n);
  const { a, scale, diagonal, offDiagonal } = s;
  // the full symmetric matrix from the lower triangle
  const m = kkt.matrix;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const v = m[i * n + j];
      a[i * n + j] = v;
      a[j * n + i] = v;
    }
  }
  // equilibrate: D A D with every row's largest |entry| 1 (D positive diagonal, a congruence)
  for (let pass = 0; pass < SCALING_PASSES; pass++) {
    for (let i = 0; i < n; i++) {
      let most = 0;
      const ri = i * n;
      for (let j = 0; j < n; j++) {
        const v = Math.abs(a[ri + j]);
        if (v > most) most = v;
      }
      scale[i] = most > 0 && Number.isFinite(most) ? 1 / Math.sqrt(most) : 1;
    }
    for (let i = 0; i < n; i++) {
      const ri = i * n;
      const si = scale[i];
      for (let j = 0; j < n; j++) a[ri + j] *= si * scale[j];
    }
  }
  tridiagonaliseInto(a, n, diagonal, offDiagonal, s.vectors);
  if (!tridiagonalEigenvaluesInto(diagonal, offDiagonal, n)) return { index: -1, zeroModes: 0 };
  let largest = 0;
  for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(diagonal[i]));
  const level = zeroTolerance * largest;
  let negative = kkt.negativePivots;
  let zeroModes = 0;
  for (let i = 0; i < n; i++) {
    const v = diagonal[i];
    if (!Number.isFinite(v)) return { index: -1, zeroModes: 0 };
    if (Math.abs(v) <= level) zeroModes++;
    else if (v < 0) negative++;
  }
  return { index: negative - (cells + 3), zeroModes };
}
