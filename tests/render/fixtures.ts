// render tests: hand-built cluster geometries from closed forms, shared by the drawing tests.

import { CubicMap, circleMap, thetaMap } from '../../src/maps/cubic-map.ts';
import type { ClusterDrawing } from '../../src/render/types.ts';

/**
 * The standard double bubble on thetaMap(), junction 0 at (0, s) and junction 1 at (0, -s), chord c = 2s.
 * Plateau's laws (design §5): the three tangents at a junction are 120 degrees apart, and by the
 * mirror symmetry of the cluster in the chord's perpendicular bisector each wall has the same angle
 * to the chord at both ends. Measured from the chord J0 -> J1, the middle wall's tangent is at delta and
 * the outer walls' at delta +- 2pi/3. In thetaMap(), junction 0 lists its darts 0, 1, 2
 * counter-clockwise and the outside is the face of darts 0 and 5, so wall 0 (dart 0) is the right arc
 * (bulge delta + 2pi/3, to the left of J0 -> J1 = +x side), wall 1 (dart 1) the left arc
 * (delta - 2pi/3) and wall 2 (dart 2) the middle wall (delta). Face 1 = darts {1, 4} is the left cell,
 * face 2 = darts {2, 3} the right cell.
 * Equal areas A (delta = 0): each cell is a circular segment on the chord with t = 2pi/3, of area
 * (c^2/4)(t - sin t cos t)/sin^2 t = (4 s^2 / 3)(2pi/3 + sqrt(3)/4) (design §4), hence
 * s = (sqrt(3)/2) sqrt(A / (2pi/3 + sqrt(3)/4)).
 */
export function doubleBubble(delta = 0, area = 1): { drawing: ClusterDrawing; s: number } {
  const s = (Math.sqrt(3) / 2) * Math.sqrt(area / ((2 * Math.PI) / 3 + Math.sqrt(3) / 4));
  const third = (2 * Math.PI) / 3;
  const bulges = Float64Array.of(delta + third, delta - third, delta);
  // the areas of the two cells, from the classical circular segment area R^2 (theta - sin theta) / 2
  const c = 2 * s;
  const segment = (t: number): number => {
    if (t === 0) return 0;
    const r = c / (2 * Math.abs(Math.sin(t)));
    const theta = 2 * Math.abs(t);
    return Math.sign(t) * 0.5 * r * r * (theta - Math.sin(theta));
  };
  const left = segment(delta) - segment(delta - third);
  const right = segment(delta + third) - segment(delta);
  return {
    drawing: { map: thetaMap(), coords: Float64Array.of(0, s, 0, -s), bulges, areas: Float64Array.of(left, right) },
    s,
  };
}

/**
 * The symmetric triple bubble on K4 with three cells of area A (design §6: its inner walls are straight
 * and meet at 120 degrees at the centre). Centre junction 3 at the origin, outer junctions 0, 1, 2 at
 * distance r in directions 90, 210, 330 degrees. At an outer junction P_k (direction theta) the inner
 * wall leaves at theta + 180 and, 120 degrees either side, the outer walls at theta + 60 and
 * theta - 60; the chord P_k -> P_k+1 points at theta + 150, perpendicular to the tangent theta + 60,
 * so every outer wall is a semicircle (t = -pi/2 going counter-clockwise round the cluster) on a chord
 * of r sqrt 3. Cell area = triangle (sqrt(3)/4) r^2 + half disc (3 pi / 8) r^2, so
 * r = sqrt(A / (sqrt(3)/4 + 3 pi/8)); perimeter 3 r + 3 pi (sqrt(3)/2) r.
 * Darts: at P_k, dart 3k goes to P_k-1 (outside on its left), 3k+1 to P_k+1, 3k+2 to the centre;
 * at the centre dart 9+k goes to P_k.
 */
export function tripleBubble(area = 1): { drawing: ClusterDrawing; r: number } {
  const r = Math.sqrt(area / (Math.sqrt(3) / 4 + (3 * Math.PI) / 8));
  const map = new CubicMap(Int32Array.from([7, 3, 9, 1, 6, 10, 4, 0, 11, 2, 5, 8]));
  const coords = new Float64Array(8);
  for (let k = 0; k < 3; k++) {
    const angle = ((90 + 120 * k) * Math.PI) / 180;
    coords[2 * k] = r * Math.cos(angle);
    coords[2 * k + 1] = r * Math.sin(angle);
  }
  const walls = map.wallIndex();
  const bulges = new Float64Array(6);
  for (let e = 0; e < 12; e++) {
    if (e > map.twins[e]) continue;
    // lower darts: 3k is clockwise round the outside (+pi/2), 3k+1 counter-clockwise (-pi/2), 3k+2 inner (0)
    bulges[walls[e]] = e % 3 === 0 ? Math.PI / 2 : e % 3 === 1 ? -Math.PI / 2 : 0;
  }
  return { drawing: { map, coords, bulges, areas: Float64Array.of(area, area, area) }, r };
}

/** One cell of area A: the circle, no junctions. */
export function singleBubble(area = 1): ClusterDrawing {
  return { map: circleMap(), coords: new Float64Array(0), bulges: new Float64Array(0), areas: Float64Array.of(area) };
}

/**
 * A lens cell sitting in the middle wall of a double bubble (the third arrangement of three cells,
 * design §1), hand-built: junctions J0 = (0, 1), J1 = (0, -1) as in doubleBubble, lens junctions
 * J2 = (0, d), J3 = (0, -d) on the middle line. At J2 the darts 6, 7, 8 leave at 90, 210 and 330
 * degrees (up to J0, then the lens's left and right walls), at J3 the darts 9, 10, 11 at 30, 150 and
 * 270 degrees; so the lens walls make +-60 degrees with their chord and all four junctions have
 * 120-degree angles. The outer walls are those of the equal double bubble; areas are whatever this
 * geometry has (it is not an equilibrium: only the drawing is tested). Face 3 is the lens.
 */
export function lensInWall(d = 0.35): ClusterDrawing {
  const map = new CubicMap(Int32Array.from([3, 5, 6, 0, 11, 1, 2, 10, 9, 8, 7, 4]));
  const walls = map.wallIndex();
  const bulges = new Float64Array(6);
  const byLowerDart: [number, number][] = [
    [0, (2 * Math.PI) / 3],
    [1, (-2 * Math.PI) / 3],
    [2, 0],
    [4, 0],
    [7, -Math.PI / 3],
    [8, Math.PI / 3],
  ];
  for (const [e, t] of byLowerDart) bulges[walls[e]] = t;
  return { map, coords: Float64Array.of(0, 1, 0, -1, 0, d, 0, -d), bulges, areas: Float64Array.of(3.27, 3.27, 0.2) };
}
