// solver stage: the equilibrium (KKT) residual and its Jacobian for a cluster of circular-arc walls.
//
// Unknowns, in this order in one Float64Array z of length size = 2V + E + n:
//   z[2v], z[2v + 1]   junction v's coordinates,
//   z[2V + k]          wall k's bulge (see arcs/arc.ts; positive bulges into the face LEFT of wall k's
//                      lower dart, the face map.faceOf[e] of the dart e < twins[e]),
//   z[2V + E + f - 1]  cell f's pressure (the outside, face 0, has pressure 0 and no unknown).
// Lagrangian (design.md §5): F = sum_k L_k - sum_f p_f (A_f - T_f). The residual is the gradient of F,
//   out[z-part] = dF/d(x, t),   out[2V + E + f - 1] = dF/dp_f = T_f - A_f,
// and the Jacobian is F's Hessian [[H, -J^T], [-J, 0]], bordered by three rows fixing the rigid motions
// of the step (two translations and the rotation about the centroid): it is symmetric, of order size + 3.
//
// Per wall k from a to b with bulge t, left face l, right face r and D = p_l - p_r:
//   Q_k = (a x b)/2 - S_k        signed area wall k adds to face l (and subtracts from face r),
//   phi_k = L_k - D Q_k          so F = sum_k phi_k + sum_f p_f T_f.
// dphi/dt = 0 is the Laplace-Young law 2 sin t / c = p_r - p_l; dF/dx = 0 then is Plateau's tangent
// balance (the end terms of the area variation cancel around each face).

import type { CubicMap } from '../maps/cubic-map.ts';
import * as arc from '../arcs/arc.ts';

/** The topology of a cluster as flat arrays, shared by the residual, the Jacobian and the solver. */
export interface ClusterProblem {
  /** Number of cells n. */
  cells: number;
  /** Number of junctions V. */
  junctions: number;
  /** Number of walls E. */
  walls: number;
  /** starts[k]: junction wall k's lower dart leaves. */
  starts: Int32Array;
  /** ends[k]: junction wall k's lower dart points to. */
  ends: Int32Array;
  /** lefts[k]: cell index (face - 1) on the left of wall k's lower dart, -1 for the outside. */
  lefts: Int32Array;
  /** rights[k]: cell index on the right of wall k's lower dart, -1 for the outside. */
  rights: Int32Array;
  /** wallOf[e]: the wall of dart e (map.wallIndex()). */
  wallOf: Int32Array;
  /** twins of the map, for walks around junctions. */
  twins: Int32Array;
  /** Number of unknowns 2V + E + n. */
  size: number;
  /** Order of the bordered Jacobian, size + 3. */
  order: number;
  /** Unknowns of cell f (its junctions' coordinates and its walls' bulges) are cellVars[cellVarStarts[f] .. cellVarStarts[f + 1]). */
  cellVarStarts: Int32Array;
  /** Unknown indices per cell, see cellVarStarts (3 per side: a 2-connected cell meets each junction once). */
  cellVars: Int32Array;
}

const PROBLEMS = new WeakMap<CubicMap, ClusterProblem>();

/** The flat topology of `map` (cached per map object). */
export function problemOf(map: CubicMap): ClusterProblem {
  const cached = PROBLEMS.get(map);
  if (cached) return cached;
  const { twins, faceOf } = map;
  const junctions = map.junctionCount;
  const walls = twins.length / 2;
  const cells = map.faceCount - 1;
  const starts = new Int32Array(walls);
  const ends = new Int32Array(walls);
  const lefts = new Int32Array(walls);
  const rights = new Int32Array(walls);
  let k = 0;
  for (let e = 0; e < twins.length; e++) {
    const t = twins[e];
    if (e > t) continue;
    starts[k] = (e / 3) | 0;
    ends[k] = (t / 3) | 0;
    lefts[k] = faceOf[e] - 1;
    rights[k] = faceOf[t] - 1;
    k++;
  }
  const size = 2 * junctions + walls + cells;
  const wallOf = map.wallIndex();
  // each dart of a cell's walk contributes its junction (2 unknowns) and its wall's bulge
  const { faceStarts, faceDarts } = map;
  const cellVarStarts = new Int32Array(cells + 1);
  const cellVars = new Int32Array(3 * (faceStarts[cells + 1] - faceStarts[1]));
  let m = 0;
  for (let f = 1; f <= cells; f++) {
    cellVarStarts[f - 1] = m;
    for (let i = faceStarts[f]; i < faceStarts[f + 1]; i++) {
      const e = faceDarts[i];
      const v = (e / 3) | 0;
      cellVars[m++] = 2 * v;
      cellVars[m++] = 2 * v + 1;
      cellVars[m++] = 2 * junctions + wallOf[e];
    }
  }
  cellVarStarts[cells] = m;
  const problem = {
    cells, junctions, walls, starts, ends, lefts, rights, wallOf, twins, size, order: size + 3, cellVarStarts, cellVars,
  };
  PROBLEMS.set(map, problem);
  return problem;
}

// NOTE: local copies of the imported bindings (under some loaders every use of an import is a getter call).
const bulgeFactorsInto = arc.bulgeFactorsInto;
const G = arc.G;
const G1 = arc.G1;
const G2 = arc.G2;
const H = arc.H;
const H1 = arc.H1;
const H2 = arc.H2;
const FACTORS = new Float64Array(arc.BULGE_FACTORS);

/**
 * Write the cell areas of state z into areas[0..n) (signed polygon area of each cell's junctions plus
 * the signed segment areas of its walls, design.md §4).
 */
export function cellAreasInto(problem: ClusterProblem, z: Float64Array, areas: Float64Array): void {
  const { walls, starts, ends, lefts, rights, cells, junctions } = problem;
  areas.fill(0, 0, cells);
  const t0 = 2 * junctions;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const ax = z[a];
    const ay = z[a + 1];
    const bx = z[b];
    const by = z[b + 1];
    const dx = bx - ax;
    const dy = by - ay;
    bulgeFactorsInto(z[t0 + k], FACTORS);
    const q = 0.5 * (ax * by - ay * bx) - (dx * dx + dy * dy) * FACTORS[H];
    if (lefts[k] >= 0) areas[lefts[k]] += q;
    if (rights[k] >= 0) areas[rights[k]] -= q;
  }
}

/**
 * Write the residual (gradient of the Lagrangian) at z for normalised targets into out[0..size).
 * Returns the largest scaled entry (Infinity when a value is not finite): junction rows as they are
 * (at Laplace-Young balance they are the sums of unit tangents), bulge rows as the relative
 * Laplace-Young error |kappa - (p_r - p_l)| / (1 + |p_l - p_r|), area rows relative to the target.
 */
export function residualInto(
  problem: ClusterProblem, z: Float64Array, targets: Float64Array, out: Float64Array,
): number {
  const { walls, starts, ends, lefts, rights, cells, junctions, size } = problem;
  const t0 = 2 * junctions;
  const p0 = t0 + walls;
  out.fill(0, 0, size);
  for (let f = 0; f < cells; f++) out[p0 + f] = targets[f];
  let worst = 0;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const ax = z[a];
    const ay = z[a + 1];
    const bx = z[b];
    const by = z[b + 1];
    const dx = bx - ax;
    const dy = by - ay;
    const c2 = dx * dx + dy * dy;
    const c = Math.sqrt(c2);
    const l = lefts[k];
    const r = rights[k];
    const pressure = (l >= 0 ? z[p0 + l] : 0) - (r >= 0 ? z[p0 + r] : 0);
    bulgeFactorsInto(z[t0 + k], FACTORS);
    const g = FACTORS[G];
    const h = FACTORS[H];
    // Is the chord zero? Its direction is undefined; the length gradient is taken as zero.
    const gc = c > 0 ? g / c : 0;
    // dphi/db = g u - D (dX/db - 2 h d), dphi/da = -g u - D (dX/da + 2 h d)
    out[a] += -gc * dx - pressure * (0.5 * by + 2 * h * dx);
    out[a + 1] += -gc * dy - pressure * (-0.5 * bx + 2 * h * dy);
    out[b] += gc * dx - pressure * (-0.5 * ay - 2 * h * dx);
    out[b + 1] += gc * dy - pressure * (0.5 * ax - 2 * h * dy);
    const rt = c * FACTORS[G1] + pressure * c2 * FACTORS[H1];
    out[t0 + k] = rt;
    // dphi/dt = c^2 h' (kappa - (p_r - p_l)): its scaled form is the relative Laplace-Young error
    const ly = Math.abs(rt) / (c2 * FACTORS[H1] * (1 + Math.abs(pressure)));
    if (!(ly <= worst)) worst = Number.isNaN(ly) ? Infinity : ly;
    const q = 0.5 * (ax * by - ay * bx) - c2 * h;
    if (l >= 0) out[p0 + l] -= q;
    if (r >= 0) out[p0 + r] += q;
  }
  // tangent balance rows as they are, area rows relative to their targets
  for (let i = 0; i < t0; i++) {
    const v = Math.abs(out[i]);
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  for (let f = 0; f < cells; f++) {
    const v = Math.abs(out[p0 + f]) / targets[f];
    if (!(v <= worst)) worst = Number.isNaN(v) ? Infinity : v;
  }
  return worst;
}

const LOCAL = new Float64Array(25);
const INDEX = new Int32Array(5);

/**
 * Write the bordered Jacobian (order size + 3, row-major) of the residual at z into jac. Rows and
 * columns size..size+2 hold the unit-norm rigid-motion constraints on a step: sum of x moves, sum of
 * y moves, and the infinitesimal rotation about the junctions' centroid.
 */
export function jacobianInto(problem: ClusterProblem, z: Float64Array, jac: Float64Array): void {
  const { walls, starts, ends, lefts, rights, junctions, size, order } = problem;
  const t0 = 2 * junctions;
  const p0 = t0 + walls;
  jac.fill(0, 0, order * order);
  const m = LOCAL;
  for (let k = 0; k < walls; k++) {
    const a = 2 * starts[k];
    const b = 2 * ends[k];
    const ax = z[a];
    const ay = z[a + 1];
    const bx = z[b];
    const by = z[b + 1];
    const dx = bx - ax;
    const dy = by - ay;
    const c2 = dx * dx + dy * dy;
    const c = Math.sqrt(c2);
    const l = lefts[k];
    const r = rights[k];
    const pressure = (l >= 0 ? z[p0 + l] : 0) - (r >= 0 ? z[p0 + r] : 0);
    bulgeFactorsInto(z[t0 + k], FACTORS);
    const g = FACTORS[G];
    const g1 = FACTORS[G1];
    const h = FACTORS[H];
    const h1 = FACTORS[H1];
    const ux = c > 0 ? dx / c : 0;
    const uy = c > 0 ? dy / c : 0;
    const gc = c > 0 ? g / c : 0;
    // chord block of phi = L - D X + D S:  g (I - u u^T)/c + 2 D h I
    const mxx = gc * (1 - ux * ux) + 2 * pressure * h;
    const mxy = -gc * ux * uy;
    const myy = gc * (1 - uy * uy) + 2 * pressure * h;
    // mixed chord-bulge: g' u + 2 D h' d ; bulge-bulge: c g'' + D c^2 h''
    const mxt = g1 * ux + 2 * pressure * h1 * dx;
    const myt = g1 * uy + 2 * pressure * h1 * dy;
    const mtt = c * FACTORS[G2] + pressure * c2 * FACTORS[H2];
    // local layout (ax, ay, bx, by, t)
    m[0] = mxx; m[1] = mxy; m[2] = -mxx; m[3] = -mxy; m[4] = -mxt;
    m[5] = mxy; m[6] = myy; m[7] = -mxy; m[8] = -myy; m[9] = -myt;
    m[10] = -mxx; m[11] = -mxy; m[12] = mxx; m[13] = mxy; m[14] = mxt;
    m[15] = -mxy; m[16] = -myy; m[17] = mxy; m[18] = myy; m[19] = myt;
    m[20] = -mxt; m[21] = -myt; m[22] = mxt; m[23] = myt; m[24] = mtt;
    // cross-product term -D X: d2X/(dax dby) = 1/2, d2X/(day dbx) = -1/2
    m[3] -= 0.5 * pressure; m[15] -= 0.5 * pressure;
    m[7] += 0.5 * pressure; m[11] += 0.5 * pressure;
    INDEX[0] = a; INDEX[1] = a + 1; INDEX[2] = b; INDEX[3] = b + 1; INDEX[4] = t0 + k;
    for (let i = 0; i < 5; i++) {
      const row = INDEX[i] * order;
      for (let j = 0; j < 5; j++) jac[row + INDEX[j]] += m[i * 5 + j];
    }
    // mixed with pressures: d2F/(dz dp_l) = -dQ/dz, d2F/(dz dp_r) = +dQ/dz
    // dQ/da = (by/2 + 2 h dx, -bx/2 + 2 h dy), dQ/db = (-ay/2 - 2 h dx, ax/2 - 2 h dy), dQ/dt = -c^2 h'
    const qax = 0.5 * by + 2 * h * dx;
    const qay = -0.5 * bx + 2 * h * dy;
    const qbx = -0.5 * ay - 2 * h * dx;
    const qby = 0.5 * ax - 2 * h * dy;
    const qt = -c2 * h1;
    for (let side = 0; side < 2; side++) {
      const f = side === 0 ? l : r;
      if (f < 0) continue;
      const s = side === 0 ? -1 : 1;
      const col = p0 + f;
      jac[a * order + col] += s * qax;
      jac[(a + 1) * order + col] += s * qay;
      jac[b * order + col] += s * qbx;
      jac[(b + 1) * order + col] += s * qby;
      jac[(t0 + k) * order + col] += s * qt;
      jac[col * order + a] += s * qax;
      jac[col * order + a + 1] += s * qay;
      jac[col * order + b] += s * qbx;
      jac[col * order + b + 1] += s * qby;
      jac[col * order + t0 + k] += s * qt;
    }
  }
  // rigid-motion border: translations and rotation about the centroid, each of unit norm
  let cx = 0;
  let cy = 0;
  for (let v = 0; v < junctions; v++) {
    cx += z[2 * v];
    cy += z[2 * v + 1];
  }
  cx /= junctions;
  cy /= junctions;
  let rot = 0;
  for (let v = 0; v < junctions; v++) rot += (z[2 * v] - cx) ** 2 + (z[2 * v + 1] - cy) ** 2;
  const tn = 1 / Math.sqrt(junctions);
  const rn = rot > 0 ? 1 / Math.sqrt(rot) : 0;
  for (let v = 0; v < junctions; v++) {
    const x = 2 * v;
    const y = x + 1;
    const wx = -(z[y] - cy) * rn;
    const wy = (z[x] - cx) * rn;
    jac[size * order + x] = jac[x * order + size] = tn;
    jac[(size + 1) * order + y] = jac[y * order + size + 1] = tn;
    jac[(size + 2) * order + x] = jac[x * order + size + 2] = wx;
    jac[(size + 2) * order + y] = jac[y * order + size + 2] = wy;
  }
}
