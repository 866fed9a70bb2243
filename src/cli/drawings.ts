// cli stage: contact sheets of catalogue entries and their size limit (the drawings themselves: render/entry.ts).

import type { CatalogueEntry } from '../catalogue/types.ts';
import { entryDrawing, typedDrawing } from '../render/entry.ts';
import { renderContactSheet, type SheetItem } from '../render/sheet.ts';
import { UsageError } from '../errors.ts';
import type { CellTyping } from '../solver/tensions.ts';

export { entryDrawing, equilibriumDrawing, typedDrawing } from '../render/entry.ts';

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

/**
 * A contact sheet of catalogue entries with geometry, captioned with rank, id, perimeter and index;
 * a saddle (index >= 1) is marked as such (render/sheet.ts SheetItem.saddle); with `typing` (the query's cell types), cells are filled by type and walls carry their tensions.
 */
export function entriesSheet(entries: CatalogueEntry[], title: string, typing?: CellTyping): string {
  const items: SheetItem[] = [];
  for (const e of entries) {
    const plain = entryDrawing(e);
    if (plain === null) continue;
    const drawing = typing === undefined ? plain : typedDrawing(plain, e.assignment, typing);
    items.push({
      drawing, rank: e.rank ?? undefined, id: e.id, perimeter: (typing === undefined ? e.perimeter : e.energy) ?? undefined,
      ...(typing === undefined ? {} : { energy: true }),
      note: e.index === null ? undefined : `index ${e.index}`, saddle: e.index !== null && e.index > 0,
    });
  }
  return renderContactSheet(items, { title, ...(typing === undefined ? {} : { tensions: true }) });
}
