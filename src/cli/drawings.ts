// cli stage: turn catalogue entries and relaxer answers into drawings, and drawings into files.

import { clusterFromCode } from '../maps/cluster.ts';
import type { Cluster } from '../maps/cluster.ts';
import type { CatalogueEntry } from '../catalogue/types.ts';
import type { Equilibrium } from '../solver/result.ts';
import type { ClusterDrawing } from '../render/types.ts';
import { renderContactSheet, type SheetItem } from '../render/sheet.ts';
import { UsageError } from '../errors.ts';

/** Most drawings on the contact sheet of `rank --sheet` and `merge --sheet` (the top ranks, fewer with a smaller --top). */
export const SHEET_LIMIT = 12;

/**
 * Refuse --top above SHEET_LIMIT given with --sheet, which would draw fewer than asked.
 * @throws UsageError naming --top and the limit.
 */
export function checkSheetTop(top: number, topGiven: boolean, sheet: string | undefined): void {
  if (sheet !== undefined && topGiven && top > SHEET_LIMIT) {
    throw new UsageError(`--top ${top} with --sheet is above ${SHEET_LIMIT} when expected at most ${SHEET_LIMIT} (the most drawings on a sheet).`);
  }
}

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

/** The drawing of a relaxer answer. */
export function equilibriumDrawing(cluster: Cluster, areas: Float64Array, eq: Equilibrium, title: string): ClusterDrawing {
  return {
    map: cluster.map,
    coords: eq.coords,
    bulges: eq.bulges,
    areas,
    pressures: eq.pressures,
    title,
    caption: `perimeter ${eq.perimeter.toPrecision(10)}  (${eq.status})`,
  };
}

/** A contact sheet of catalogue entries with geometry, captioned with rank, id, perimeter and index. */
export function entriesSheet(entries: CatalogueEntry[], title: string): string {
  const items: SheetItem[] = [];
  for (const e of entries) {
    const drawing = entryDrawing(e);
    if (drawing === null) continue;
    items.push({
      drawing, rank: e.rank ?? undefined, id: e.id, perimeter: e.perimeter ?? undefined,
      note: e.index === null ? undefined : `index ${e.index}`,
    });
  }
  return renderContactSheet(items, { title });
}
