// An independent check of an equilibrium for the tests: every wall is traced as a fine polyline from its
// end points and bulge (the arc's tangent at its start is the chord turned by the bulge), and the cells'
// areas (shoelace formula, Richardson-extrapolated in the number of points), the total length, the
// angles at the junctions and the curvature of each wall (the circle through three of its points) are
// measured on the polylines. Nothing here calls lather's geometry, residual or certificate code.
//
// Plateau's laws (three walls at 120 degrees: unit tangents summing to zero) and the Laplace-Young law
// (curvature = pressure difference for unit tension) are the laws checked: common practice, no source.
import type { CubicMap } from '../../src/maps/cubic-map.ts';

/** What the polylines measured; each entry is a largest deviation over the cells, junctions or walls. */
export interface PolylineCheck {
  /** Largest |area - target| / target over the cells. */
  area: number;
  /** |sum of wall lengths - reported perimeter| / perimeter. */
  perimeter: number;
  /** Largest |sum of the three unit tangents| over the junctions. */
  tangent: number;
  /** Largest |curvature - pressure difference| / (|pressure difference| + 1/sqrt(mean area)) over the walls. */
  curvature: number;
  /** Largest distance from the traced end of a wall to its end junction, relative to sqrt(mean area). */
  closure: number;
}

interface Answer {
  coords: Float64Array;
  bulges: Float64Array;
  pressures: Float64Array;
  perimeter: number;
}

/** Point at arc length s of the circle leaving (x, y) in direction phi, turning at rate kappa. */
function along(x: number, y: number, phi: number, kappa: number, s: number): [number, number] {
  if (Math.abs(kappa * s) < 1e-9) return [x + s * Math.cos(phi), y + s * Math.sin(phi)];
  return [x + (Math.sin(phi + kappa * s) - Math.sin(phi)) / kappa, y - (Math.cos(phi + kappa * s) - Math.cos(phi)) / kappa];
}

/** Trace the wall from (ax, ay) to (bx, by) with bulge t as `points` + 1 points. */
function trace(ax: number, ay: number, bx: number, by: number, t: number, points: number): Float64Array {
  const c = Math.hypot(bx - ax, by - ay);
  const length = Math.abs(t) < 1e-12 ? c : (c * t) / Math.sin(t);
  const phi = Math.atan2(by - ay, bx - ax) + t;
  const kappa = -2 * t / length; // a left bulge turns clockwise by 2t over the wall
  const out = new Float64Array(2 * (points + 1));
  for (let i = 0; i <= points; i++) {
    const [x, y] = along(ax, ay, phi, kappa, (length * i) / points);
    out[2 * i] = x;
    out[2 * i + 1] = y;
  }
  return out;
}

/** Measure an answer of the relaxer for `map` at `areas` on polylines of `points` segments per wall. */
export function polylineCheck(map: CubicMap, areas: Float64Array, answer: Answer, points = 2000): PolylineCheck {
  const scale = Math.sqrt(areas.reduce((p, q) => p + q, 0) / areas.length);
  const m = map.twins.length;
  // the wall of each lower dart e (e < twins[e]) runs from junction floor(e/3) to junction floor(twins[e]/3)
  const wallOf = new Int32Array(m);
  const lower: number[] = [];
  for (let e = 0; e < m; e++) if (e < map.twins[e]) { wallOf[e] = wallOf[map.twins[e]] = lower.length; lower.push(e); }
  const traced = (n: number) => lower.map((e, k) => {
    const a = Math.floor(e / 3);
    const b = Math.floor(map.twins[e] / 3);
    return trace(answer.coords[2 * a], answer.coords[2 * a + 1], answer.coords[2 * b], answer.coords[2 * b + 1], answer.bulges[k], n);
  });
  const coarse = traced(points);
  const fine = traced(2 * points);
  const polyLength = (p: Float64Array) => {
    let s = 0;
    for (let i = 2; i < p.length; i += 2) s += Math.hypot(p[i] - p[i - 2], p[i + 1] - p[i - 1]);
    return s;
  };
  // Richardson: the polyline's errors fall as the square of the step
  const extrapolate = (a: number, b: number) => (4 * b - a) / 3;
  let total = 0;
  let closure = 0;
  lower.forEach((e, k) => {
    total += extrapolate(polyLength(coarse[k]), polyLength(fine[k]));
    const b = Math.floor(map.twins[e] / 3);
    const p = fine[k];
    closure = Math.max(closure, Math.hypot(p[p.length - 2] - answer.coords[2 * b], p[p.length - 1] - answer.coords[2 * b + 1]) / scale);
  });
  // cells: walk each face's darts; a dart that is not its wall's lower dart runs the polyline backwards
  const cellArea = (walls: Float64Array[], f: number) => {
    let twice = 0;
    for (let i = map.faceStarts[f]; i < map.faceStarts[f + 1]; i++) {
      const d = map.faceDarts[i];
      const p = walls[wallOf[d]];
      const forward = d < map.twins[d];
      const count = p.length / 2;
      for (let j = 0; j + 1 < count; j++) {
        const u = forward ? j : count - 1 - j;
        const v = forward ? j + 1 : count - 2 - j;
        twice += p[2 * u] * p[2 * v + 1] - p[2 * v] * p[2 * u + 1];
      }
    }
    return twice / 2;
  };
  let area = 0;
  for (let f = 1; f < map.faceCount; f++) {
    const a = extrapolate(cellArea(coarse, f), cellArea(fine, f));
    area = Math.max(area, Math.abs(a - areas[f - 1]) / areas[f - 1]);
  }
  // junctions: the unit tangent of each wall leaving the junction, from its first polyline step
  let tangent = 0;
  for (let v = 0; v < m / 3; v++) {
    let sx = 0;
    let sy = 0;
    for (let d = 3 * v; d < 3 * v + 3; d++) {
      const p = fine[wallOf[d]];
      const n = p.length;
      const [x0, y0, x1, y1] = d < map.twins[d] ? [p[0], p[1], p[2], p[3]] : [p[n - 2], p[n - 1], p[n - 4], p[n - 3]];
      // the chord of one step leaves at half the step's turning from the tangent; undo it with the
      // chord of two steps (the same Richardson idea, exact for circles to first order)
      const [x2, y2] = d < map.twins[d] ? [p[4], p[5]] : [p[n - 6], p[n - 5]];
      const a1 = Math.atan2(y1 - y0, x1 - x0);
      const a2 = Math.atan2(y2 - y0, x2 - x0);
      let turn = a2 - a1;
      turn = Math.atan2(Math.sin(turn), Math.cos(turn));
      const angle = a1 - turn; // tangent = one-step chord angle minus its offset (half a step's turning)
      sx += Math.cos(angle);
      sy += Math.sin(angle);
    }
    tangent = Math.max(tangent, Math.hypot(sx, sy));
  }
  // walls: the circle through the start, middle and end points; its signed curvature is positive when the
  // middle point lies left of the chord, which must equal p(right face) - p(left face)
  let curvature = 0;
  const pressure = (f: number) => (f === 0 ? 0 : answer.pressures[f - 1]);
  lower.forEach((e, k) => {
    const p = fine[k];
    const mid = 2 * ((p.length / 2 - 1) >> 1); // the middle point (the polyline has an odd number of points)
    const [ax, ay, bx, by] = [p[0], p[1], p[p.length - 2], p[p.length - 1]];
    const [mx, my] = [p[mid], p[mid + 1]];
    const cross = (mx - ax) * (by - ay) - (my - ay) * (bx - ax);
    const sides = Math.hypot(mx - ax, my - ay) * Math.hypot(bx - mx, by - my) * Math.hypot(bx - ax, by - ay);
    const signed = (-2 * cross) / sides; // 1/R with R = abc / (4 * triangle area), left positive
    const jump = pressure(map.faceOf[map.twins[e]]) - pressure(map.faceOf[e]);
    curvature = Math.max(curvature, Math.abs(signed - jump) / (Math.abs(jump) + 1 / scale));
  });
  return { area, perimeter: Math.abs(total - answer.perimeter) / answer.perimeter, tangent, curvature, closure };
}

/**
 * True when every measured deviation is below tolerances the extrapolated polylines resolve (measured on
 * the relaxer's answers for n <= 6: areas and lengths to about 1e-13, tangents and curvatures to 1e-10).
 */
export function polylinePasses(c: PolylineCheck): boolean {
  return c.area < 1e-9 && c.perimeter < 1e-10 && c.tangent < 1e-8 && c.curvature < 1e-8 && c.closure < 1e-10;
}
