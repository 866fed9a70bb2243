// solver stage: an independent check of an equilibrium, recomputed from junction coordinates and bulges.
//
// NOTE: an independent re-derivation on purpose: nothing here calls the solver's code (its per-wall
// kernel, its areas, its junction-order test). Every wall is rebuilt as a circle (centre, radius) or a
// segment, tangents are taken perpendicular to the radius (and the order at a junction from them),
// segment areas as sector minus triangle, and the cells are walked through map.faceDarts; only the
// search for crossing walls, a plane-geometry question, is shared (arcs/crossings.ts), and so is the
// reading of a bulge coordinate (arcs/arc.ts bulgeOf and bulgeSine: a wall near a full circle may come
// with its gap to a full circle held to full precision, so its radius c / (2 |sin t|) keeps it). The
// certificate's entries are dimensionless: areas relative to each cell's target, curvatures relative to
// |pressure difference| + 1/sqrt(A), A the smaller target area of the wall's two sides. With wall
// tensions s (design.md §8) the junction law is the Neumann triangle, sum s_i u_i = 0 (measured relative
// to the largest of the three), and the wall law s kappa = pressure difference (relative to
// |pressure difference| + s/sqrt(A)).

import type { CubicMap } from '../maps/cubic-map.ts';
import { bulgeOf, bulgeSine } from '../arcs/arc.ts';
import { STRAIGHT_BULGE, countCrossings } from '../arcs/crossings.ts';

/** What checkEquilibrium measured. Lengths and areas are in the caller's units. */
export interface Certificate {
  /** Largest |achieved - target| / target over the cells. */
  areaResidual: number;
  /**
   * Largest |sum of the three unit tangents times their walls' tensions| / (largest of the three
   * tensions) over the junctions (Plateau's 120-degree law at unit tension; the Neumann triangle).
   */
  tangentResidual: number;
  /**
   * Largest |tension x curvature - pressure difference| / (|pressure difference| + tension/sqrt(A)) over
   * the walls, A the smaller target area of the wall's two sides (Laplace-Young law with tension,
   * relative to the wall's own scale).
   */
  curvatureResidual: number;
  /** Shortest wall (arc length). */
  minWallLength: number;
  /** Smallest achieved cell area. */
  minCellArea: number;
  /** Number of pairs of walls that cross or touch away from their shared junctions. */
  crossings: number;
  /** Number of junctions whose walls are not in the map's counter-clockwise order. */
  misorderedJunctions: number;
}

/** The geometry checkEquilibrium reads: any relax() result has these fields. */
export interface EquilibriumGeometry {
  /** Junction coordinates, length 2V. */
  coords: Float64Array;
  /**
   * Wall bulges, length E (positive into the face left of the wall's lower dart), as bulge coordinates
   * (arcs/arc.ts: a plain bulge t, or a wall near a full circle in the gap form).
   */
  bulges: Float64Array;
  /** Cell pressures, length n. */
  pressures: Float64Array;
}

// Below this |bulge| a wall is checked as a straight segment (as the crossing search takes it).
const STRAIGHT = STRAIGHT_BULGE;

// Scratch of the check, grown to the largest wall count seen (one check runs at a time).
let LOWER = new Int32Array(0);
let WALL_OF = new Int32Array(0);
let CX = new Float64Array(0);
let CY = new Float64Array(0);
let RADIUS = new Float64Array(0);
let BOX = new Float64Array(0);
let BULGE = new Float64Array(0);
let SINE = new Float64Array(0);
const ANGLE = new Float64Array(3);

function scratchFor(walls: number): void {
  if (LOWER.length >= walls) return;
  LOWER = new Int32Array(walls);
  WALL_OF = new Int32Array(2 * walls);
  CX = new Float64Array(walls);
  CY = new Float64Array(walls);
  RADIUS = new Float64Array(walls);
  BOX = new Float64Array(4 * walls);
  BULGE = new Float64Array(walls);
  SINE = new Float64Array(walls);
}

/** Whether every residual entry is at most `tolerance` and the drawing is a valid cluster drawing. */
export function certificatePasses(certificate: Certificate, tolerance: number): boolean {
  return (
    certificate.areaResidual <= tolerance &&
    certificate.tangentResidual <= tolerance &&
    certificate.curvatureResidual <= tolerance &&
    certificate.minWallLength > 0 &&
    certificate.minCellArea > 0 &&
    certificate.crossings === 0 &&
    certificate.misorderedJunctions === 0
  );
}

/**
 * Recompute the certificate of `result` for `map` and target `areas` (areas[i] for cell i + 1), with
 * wall `tensions` by map.wallIndex() (null or absent: every wall 1). Non-finite inputs give Infinity
 * residuals, never NaN.
 */
export function checkEquilibrium(
  map: CubicMap, areas: Float64Array, result: EquilibriumGeometry, tensions: Float64Array | null = null,
): Certificate {
  // At areas far from 1 (1e300 or 1e-300) squares of lengths and areas overflow or underflow: check at
  // lengths divided by the power of two nearest the cluster's unit (exact, so the residuals are those
  // at scale 1) and give the lengths and areas back in the caller's units (tensions do not scale).
  let total = 0;
  for (let i = 0; i < areas.length; i++) total += areas[i];
  const shift = Math.round(Math.log2(Math.sqrt(total / areas.length)));
  if (!Number.isFinite(shift) || shift === 0) return checkAtScale(map, areas, result, tensions);
  const length = 2 ** -shift;
  const area = length * length;
  const scaled = checkAtScale(map, areas.map((x) => x * area), {
    coords: result.coords.map((x) => x * length),
    bulges: result.bulges,
    pressures: result.pressures.map((x) => x / length),
  }, tensions);
  scaled.minWallLength /= length;
  scaled.minCellArea /= area;
  return scaled;
}

function checkAtScale(
  map: CubicMap, areas: Float64Array, result: EquilibriumGeometry, tensions: Float64Array | null,
): Certificate {
  const { twins, faceStarts, faceDarts } = map;
  const cells = areas.length;
  let total = 0;
  for (let i = 0; i < cells; i++) total += areas[i];
  const unit = Math.sqrt(total / cells);
  const { coords, pressures } = result;
  // Is it the circle? One wall, no junctions: perimeter 2 pi R, area pi R^2, curvature 1/R.
  if (twins.length === 0) {
    const p = pressures[0];
    const radius = Math.sqrt(areas[0] / Math.PI);
    const s = tensions === null ? 1 : tensions[0];
    return finite({
      areaResidual: 0,
      tangentResidual: 0,
      curvatureResidual: Math.abs(s / radius - p) / (Math.abs(p) + s / unit),
      minWallLength: 2 * Math.PI * radius,
      minCellArea: areas[0],
      crossings: 0,
      misorderedJunctions: 0,
    });
  }
  const walls = twins.length / 2;
  scratchFor(walls);
  const wallOf = WALL_OF;
  const lower = LOWER;
  for (let e = 0, k = 0; e < twins.length; e++) {
    if (e < twins[e]) {
      wallOf[e] = k;
      wallOf[twins[e]] = k;
      lower[k++] = e;
    }
  }

  // each wall's bulge t and sin t from its coordinate
  const bulges = BULGE;
  const sines = SINE;
  for (let k = 0; k < walls; k++) {
    bulges[k] = bulgeOf(result.bulges[k]);
    sines[k] = bulgeSine(result.bulges[k]);
  }

  // rebuild each wall: centre, radius, arc length, signed curvature
  const cx = CX;
  const cy = CY;
  const radius = RADIUS;
  let minWallLength = Infinity;
  let curvatureResidual = 0;
  for (let k = 0; k < walls; k++) {
    const e = lower[k];
    const a = (e / 3) | 0;
    const b = (twins[e] / 3) | 0;
    const t = bulges[k];
    const dx = coords[2 * b] - coords[2 * a];
    const dy = coords[2 * b + 1] - coords[2 * a + 1];
    const chord = Math.hypot(dx, dy);
    let length = chord;
    // (a nearly straight wall: the circle's curvature 2 sin t / c, which its centre, too far away, would
    // give with a rounding error of the order of t)
    let curvature = chord > 0 ? (2 * sines[k]) / chord : 0;
    if (Math.abs(t) >= STRAIGHT) {
      // centre on the chord's perpendicular bisector, at (c/2) cot t on the side opposite the left normal
      const cot = Math.cos(t) / sines[k];
      cx[k] = coords[2 * a] + 0.5 * dx + 0.5 * cot * dy;
      cy[k] = coords[2 * a + 1] + 0.5 * dy - 0.5 * cot * dx;
      radius[k] = Math.hypot(coords[2 * a] - cx[k], coords[2 * a + 1] - cy[k]);
      length = 2 * Math.abs(t) * radius[k]; // central angle 2|t|
      curvature = Math.sign(t) / radius[k];
    }
    minWallLength = Math.min(minWallLength, length);
    const fl = map.faceOf[e];
    const fr = map.faceOf[twins[e]];
    const jump = (fr > 0 ? pressures[fr - 1] : 0) - (fl > 0 ? pressures[fl - 1] : 0);
    // relative to the wall's own scale: the smaller target area of its two sides (a wall between two
    // cells a billionth of the rest is judged at their size, not at the cluster's)
    const local = Math.min(fl > 0 ? areas[fl - 1] : Infinity, fr > 0 ? areas[fr - 1] : Infinity);
    const s = tensions === null ? 1 : tensions[k];
    curvatureResidual = Math.max(curvatureResidual, Math.abs(s * curvature - jump) / (Math.abs(jump) + s / Math.sqrt(local)));
  }

  // unit tangents at each junction, away from it, and their order
  let tangentResidual = 0;
  let misorderedJunctions = 0;
  const angle = ANGLE;
  const turn = (x: number): number => ((x % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
  for (let v = 0; v < map.junctionCount; v++) {
    let sx = 0;
    let sy = 0;
    let most = 0;
    for (let i = 0; i < 3; i++) {
      const e = 3 * v + i;
      const k = wallOf[e];
      const s = tensions === null ? 1 : tensions[k];
      if (s > most) most = s;
      const forward = e < twins[e];
      const t = forward ? bulges[k] : -bulges[k];
      let tx: number;
      let ty: number;
      if (Math.abs(t) < STRAIGHT) {
        // a nearly straight wall leaves its junction at the angle t from its chord, to the side it bulges
        // (the chord direction alone would be off by t, as much as the tolerance at small bulges)
        const w = (twins[e] / 3) | 0;
        const dx = coords[2 * w] - coords[2 * v];
        const dy = coords[2 * w + 1] - coords[2 * v + 1];
        const cos = Math.cos(t);
        const sin = Math.sin(t);
        tx = dx * cos - dy * sin;
        ty = dx * sin + dy * cos;
      } else {
        // perpendicular to the radius; a wall bulging left of its dart turns clockwise about its centre
        const rx = coords[2 * v] - cx[k];
        const ry = coords[2 * v + 1] - cy[k];
        tx = t > 0 ? ry : -ry;
        ty = t > 0 ? -rx : rx;
      }
      const norm = Math.hypot(tx, ty);
      sx += (s * tx) / norm;
      sy += (s * ty) / norm;
      angle[i] = Math.atan2(ty, tx);
    }
    tangentResidual = Math.max(tangentResidual, Math.hypot(sx, sy) / most);
    const d1 = turn(angle[1] - angle[0]);
    const d2 = turn(angle[2] - angle[0]);
    if (!(d1 > 0 && d1 < d2 && d2 < 2 * Math.PI)) misorderedJunctions++;
  }

  // cell areas: polygon of the face's junctions plus, per dart, the segment on its left taken away
  let areaResidual = 0;
  let minCellArea = Infinity;
  for (let f = 1; f <= cells; f++) {
    let sum = 0;
    let comp = 0;
    for (let i = faceStarts[f]; i < faceStarts[f + 1]; i++) {
      const e = faceDarts[i];
      const a = (e / 3) | 0;
      const b = (twins[e] / 3) | 0;
      const k = wallOf[e];
      const t = e < twins[e] ? bulges[k] : -bulges[k];
      const sine = e < twins[e] ? sines[k] : -sines[k];
      // compensated summation of the two terms: keep the low-order part lost by each addition
      for (let term = 0; term < 2; term++) {
        const x = term === 0
          ? 0.5 * (coords[2 * a] * coords[2 * b + 1] - coords[2 * a + 1] * coords[2 * b])
          : -segmentArea(Math.hypot(coords[2 * b] - coords[2 * a], coords[2 * b + 1] - coords[2 * a + 1]), t, sine);
        const s = sum + x;
        comp += Math.abs(sum) >= Math.abs(x) ? sum - s + x : x - s + sum;
        sum = s;
      }
    }
    const achieved = sum + comp;
    minCellArea = Math.min(minCellArea, achieved);
    areaResidual = Math.max(areaResidual, Math.abs(achieved - areas[f - 1]) / areas[f - 1]);
  }

  const crossings = countCrossings(twins, coords, bulges, lower, cx, cy, radius, 1e-9 * unit, BOX);
  return finite({
    areaResidual,
    tangentResidual,
    curvatureResidual,
    minWallLength,
    minCellArea,
    crossings,
    misorderedJunctions,
  });
}

// Replace NaN by Infinity so that a certificate is never NaN and never passes by accident.
function finite(c: Certificate): Certificate {
  for (const key of Object.keys(c) as (keyof Certificate)[]) {
    if (Number.isNaN(c[key])) c[key] = key === 'minWallLength' || key === 'minCellArea' ? -Infinity : Infinity;
  }
  return c;
}

// Signed area between a chord of length c and the arc of bulge t (sine = sin t): sector minus triangle
// of the circle, R^2 (theta - sin theta) / 2 with central angle theta = 2|t| and R = c / (2 |sin t|); a
// series for small theta, where the difference cancels (theta - sin theta = theta^3/6 - theta^5/120 + ...).
function segmentArea(c: number, t: number, sine: number): number {
  const theta = 2 * Math.abs(t);
  const r = c / (2 * Math.abs(sine));
  if (t === 0) return 0;
  let diff: number;
  if (theta < 0.05) {
    const q = theta * theta;
    diff = theta * q * (1 / 6 - q * (1 / 120 - q * (1 / 5040 - q / 362880)));
  } else {
    diff = theta - Math.sin(theta);
  }
  return Math.sign(t) * 0.5 * r * r * diff;
}
