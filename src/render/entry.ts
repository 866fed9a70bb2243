// render stage: the drawing of a catalogue entry or of a relaxer answer (shared by the CLI and the
// catalogue viewer's page script).

import { clusterFromCode } from '../maps/cluster.ts';
import type { Cluster } from '../maps/cluster.ts';
import type { CatalogueEntry } from '../catalogue/types.ts';
import type { Equilibrium } from '../solver/result.ts';
import type { ClusterDrawing } from './types.ts';
import { type CellTyping, wallTensions } from '../solver/tensions.ts';

/** The drawing of a certified catalogue entry (null for a failure, which has no geometry). */
export function entryDrawing(entry: CatalogueEntry): ClusterDrawing | null {
  if (entry.geometry === null) return null;
  const cluster = clusterFromCode(entry.code);
  return {
    map: cluster.map,
    coords: Float64Array.from(entry.geometry.coords),
    bulges: Float64Array.from(entry.geometry.bulges),
    areas: Float64Array.from(entry.cellAreas),
    pressures: entry.pressures === null ? undefined : Float64Array.from(entry.pressures),
    title: entry.id,
  };
}

/**
 * The drawing of a relaxer answer (for a failure: where the solve stopped); with `typed`, its cells'
 * types and walls' tensions (the caption then gives the energy).
 */
export function equilibriumDrawing(
  cluster: Cluster, areas: Float64Array, eq: Equilibrium, title: string,
  typed?: { cellTypes: ArrayLike<number>; typeLabels: readonly string[]; tensions: Float64Array | null },
): ClusterDrawing {
  const caption = typed?.tensions
    ? `energy ${eq.energy.toPrecision(10)}, length ${eq.perimeter.toPrecision(10)}  (${eq.status})`
    : `perimeter ${eq.perimeter.toPrecision(10)}  (${eq.status})`;
  return {
    map: cluster.map,
    coords: eq.coords,
    bulges: eq.bulges,
    areas,
    pressures: eq.pressures,
    title,
    caption,
    ...(typed === undefined ? {} : { cellTypes: typed.cellTypes, typeLabels: typed.typeLabels }),
    ...(typed?.tensions ? { tensions: typed.tensions } : {}),
  };
}

/** A drawing with the types of its cells (cell i + 1 holds the query's area assignment[i]) and its walls' tensions. */
export function typedDrawing(drawing: ClusterDrawing, assignment: readonly number[], typing: CellTyping): ClusterDrawing {
  const cellTypes = assignment.map((i) => typing.types[i]);
  const tensions = wallTensions(drawing.map, cellTypes, typing.table);
  return { ...drawing, cellTypes, typeLabels: typing.table.labels, ...(tensions === null ? {} : { tensions }) };
}
