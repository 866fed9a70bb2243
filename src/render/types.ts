// render stage: the geometry a drawing is made from, and its one-time check at the public boundary.

import type { CubicMap } from '../maps/cubic-map.ts';
import { UsageError } from '../errors.ts';

/**
 * One relaxed (or hand-built) cluster, ready to draw.
 *
 * Frame: coordinates are in a right-handed frame, x to the right and y UP, so the cells of
 * `map` are walked counter-clockwise (map convention). The SVG writers flip y when they draw.
 *
 * Walls: wall k (numbered by `map.wallIndex()`) is drawn along its lower dart e (e < twins[e]),
 * from junction `junctionOf(e)` to junction `map.headOf(e)`. `bulges[k]` is the angle t in
 * (-pi, pi) from that chord to the wall's tangent at its start; t > 0 bulges to the LEFT of the
 * direction of travel, i.e. into the face `map.faceOf[e]`. The wall is a circular arc of radius
 * c / (2 |sin t|) for chord length c; |t| > pi/2 is a major arc; t = 0 is a straight wall.
 */
export interface ClusterDrawing {
  /** The arrangement: face 0 is the outside and faces 1..n are cells 1..n. Zero darts: the circle. */
  readonly map: CubicMap;
  /** Junction v is at (coords[2v], coords[2v + 1]). Length 2V. */
  readonly coords: Float64Array;
  /** Bulge angle of every wall, by wall index, in radians in (-pi, pi). Length E. */
  readonly bulges: Float64Array;
  /** Area of cell i + 1 at areas[i] (the target areas, as labelled). Length n. */
  readonly areas: Float64Array;
  /** Pressure of cell i + 1 at pressures[i], when known. Length n. */
  readonly pressures?: Float64Array;
  /** A heading, e.g. the arrangement's id. */
  readonly title?: string;
  /** A line under the drawing, e.g. its perimeter. */
  readonly caption?: string;
  /**
   * Cell types (walls of different tension): cell i + 1 has type cellTypes[i], an index into
   * typeLabels (never 0, the outside). Typed cells are filled by type and labelled with it.
   */
  readonly cellTypes?: ArrayLike<number>;
  /** Type labels, typeLabels[0] the outside's ('out'). */
  readonly typeLabels?: readonly string[];
  /** Tension of each wall by wall index, for labels on the walls (style.tensions). Length E. */
  readonly tensions?: Float64Array;
}

/** Number of cells n of a drawing (1 for the circle). */
export function cellCountOf(drawing: ClusterDrawing): number {
  return drawing.map.faceCount - 1;
}

/**
 * Check the array lengths and values of a drawing once, before any drawing work.
 * @throws UsageError when an array has the wrong length for the map.
 * @throws UsageError when a coordinate is not finite, a bulge is outside (-pi, pi) or an area is
 * not positive and finite.
 */
export function checkDrawing(drawing: ClusterDrawing): void {
  const { map, coords, bulges, areas, pressures } = drawing;
  const n = cellCountOf(drawing);
  const junctions = map.junctionCount;
  const walls = map.twins.length / 2;
  if (coords.length !== 2 * junctions) {
    throw new UsageError(`Drawing has ${coords.length} coordinates when expected ${2 * junctions} (2 per junction).`);
  }
  if (bulges.length !== walls) {
    throw new UsageError(`Drawing has ${bulges.length} bulges when expected ${walls} (1 per wall).`);
  }
  if (areas.length !== n) {
    throw new UsageError(`Drawing has ${areas.length} areas when expected ${n} (1 per cell).`);
  }
  const { cellTypes, typeLabels, tensions } = drawing;
  if (cellTypes !== undefined) {
    if (cellTypes.length !== n) throw new UsageError(`Drawing has ${cellTypes.length} cell types when expected ${n} (1 per cell).`);
    for (let i = 0; i < n; i++) {
      const t = cellTypes[i];
      if (!(Number.isInteger(t) && t >= 1 && (typeLabels === undefined || t < typeLabels.length))) {
        throw new UsageError(`Type of cell ${i + 1} is ${t} when expected a type index from 1${typeLabels === undefined ? '' : ` to ${typeLabels.length - 1}`}.`);
      }
    }
  }
  if (tensions !== undefined && tensions.length !== walls) {
    throw new UsageError(`Drawing has ${tensions.length} tensions when expected ${walls} (1 per wall).`);
  }
  if (pressures !== undefined && pressures.length !== n) {
    throw new UsageError(`Drawing has ${pressures.length} pressures when expected ${n} (1 per cell).`);
  }
  for (let i = 0; i < coords.length; i++) {
    if (!Number.isFinite(coords[i])) throw new UsageError(`Coordinate ${i} is ${coords[i]} when expected a finite number.`);
  }
  for (let k = 0; k < walls; k++) {
    const t = bulges[k];
    if (!(t > -Math.PI && t < Math.PI)) throw new UsageError(`Bulge of wall ${k} is ${t} when expected a number in (-pi, pi).`);
  }
  for (let i = 0; i < n; i++) {
    const a = areas[i];
    if (!(a > 0 && Number.isFinite(a))) throw new UsageError(`Area of cell ${i + 1} is ${a} when expected a positive finite number.`);
  }
  if (pressures !== undefined) {
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(pressures[i])) {
        throw new UsageError(`Pressure of cell ${i + 1} is ${pressures[i]} when expected a finite number.`);
      }
    }
  }
}

/** The bulge of dart e in its own direction: the wall's bulge, sign flipped for the upper dart. */
export function dartBulge(map: CubicMap, walls: Int32Array, bulges: Float64Array, e: number): number {
  const t = bulges[walls[e]];
  return e < map.twins[e] ? t : -t;
}
