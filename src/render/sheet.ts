// render stage: a contact sheet, several clusters in a grid, each captioned (rank, id, perimeter).

import type { ClusterDrawing } from './types.ts';
import { checkDrawing } from './types.ts';
import type { ClusterStyle } from './cluster-group.ts';
import { centredPlacement, fitScale, renderClusterGroup } from './cluster-group.ts';
import { drawingBounds } from './cell-shape.ts';
import { INK, SADDLE_FRAME } from './palette.ts';
import { checkDigits, escapeXml, fixed, formatValue } from './format.ts';
import { UsageError } from '../errors.ts';

/** One tile of a contact sheet. Without rank, id and perimeter the caption is the drawing's title and caption. */
export interface SheetItem {
  readonly drawing: ClusterDrawing;
  /** Position in a ranking, shown as "#rank". */
  readonly rank?: number;
  /** The arrangement's id or code. */
  readonly id?: string;
  /** Perimeter, shown as "P = ..." (or an energy, shown as "E = ...", with `energy`). */
  readonly perimeter?: number;
  /** Whether `perimeter` is an energy (sum of tension times length). @default false */
  readonly energy?: boolean;
  /** A short remark after the perimeter, e.g. "index 0". */
  readonly note?: string;
  /**
   * An unstable equilibrium (index >= 1): the tile gets a dashed orange frame and a third caption
   * line "SADDLE". @default false
   */
  readonly saddle?: boolean;
}

/** Options of renderContactSheet. */
export interface ContactSheetOptions extends ClusterStyle {
  /** Tiles per row. @default min(items, 4) */
  readonly columns?: number;
  /** Width and height in pixels of each tile's drawing area. @default 200 */
  readonly tilePx?: number;
  /** Space between tiles and around the sheet, in pixels. @default 12 */
  readonly gapPx?: number;
  /** Caption font size in pixels. @default 12 */
  readonly captionSizePx?: number;
  /**
   * Draw every cluster at the same scale (the largest that fits them all), so sizes compare;
   * otherwise each fills its tile. @default true
   */
  readonly commonScale?: boolean;
  /** Significant digits of perimeters in captions. @default 7 */
  readonly perimeterDigits?: number;
  /** A heading over the whole sheet. */
  readonly title?: string;
  /** Background colour, or null for transparent. @default '#ffffff' */
  readonly background?: string | null;
  /** Decimals of every coordinate (pixel units). @default 2 */
  readonly digits?: number;
}

/** Inner padding of a tile's drawing area, in pixels. */
const TILE_PAD = 8;

/** The caption lines of a tile. */
function captionLines(item: SheetItem, digits: number): string[] {
  const lines: string[] = [];
  const head = [item.rank === undefined ? '' : `#${item.rank}`, item.id ?? ''].filter((part) => part !== '').join('  ');
  if (head !== '') lines.push(head);
  const tail = [item.perimeter === undefined ? '' : `${item.energy === true ? 'E' : 'P'} = ${formatValue(item.perimeter, digits)}`, item.note ?? '']
    .filter((part) => part !== '')
    .join('  ');
  if (tail !== '') lines.push(tail);
  if (item.saddle === true) lines.push('SADDLE (unstable)');
  if (lines.length === 0) {
    if (item.drawing.title !== undefined) lines.push(item.drawing.title);
    if (item.drawing.caption !== undefined) lines.push(item.drawing.caption);
  }
  return lines;
}

/**
 * Draw several clusters on one sheet, in reading order, each in its own tile with a caption of one
 * or two lines (e.g. "#1  3:abc" and "P = 10.38"). Used for the top K drawings of a ranking.
 * Same input, same bytes.
 * @throws UsageError when there are no items or an item's drawing is malformed; UsageError for an
 * option out of range.
 */
export function renderContactSheet(items: readonly SheetItem[], options: ContactSheetOptions = {}): string {
  if (items.length === 0) throw new UsageError('Contact sheet has 0 items when expected at least 1.');
  for (const item of items) checkDrawing(item.drawing);
  const columns = options.columns ?? Math.min(items.length, 4);
  if (!(Number.isInteger(columns) && columns >= 1)) throw new UsageError(`Columns is ${columns} when expected a positive integer.`);
  const tilePx = options.tilePx ?? 200;
  if (!(tilePx > 2 * TILE_PAD && Number.isFinite(tilePx))) {
    throw new UsageError(`Tile size is ${tilePx} px when expected a number above ${2 * TILE_PAD}.`);
  }
  const gap = options.gapPx ?? 12;
  const captionPx = options.captionSizePx ?? 12;
  const digits = checkDigits(options.digits ?? 2);
  const n = (v: number): string => fixed(v, digits);
  const perimeterDigits = options.perimeterDigits ?? 7;

  // scales: each drawing's extent fitted into the tile, then the smallest one for all when common
  const boxes = items.map((item) => drawingBounds(item.drawing));
  const inner = tilePx - 2 * TILE_PAD;
  const fits = boxes.map((box) => fitScale(box, inner));
  const common = Math.min(...fits);
  const captions = items.map((item) => captionLines(item, perimeterDigits));
  const captionRows = Math.max(...captions.map((lines) => lines.length));
  const captionH = captionRows * 1.3 * captionPx + (captionRows > 0 ? 4 : 0);
  const titleH = options.title === undefined ? 0 : 2 * captionPx + 4;
  const rows = Math.ceil(items.length / columns);
  const cellW = tilePx + gap;
  const cellH = tilePx + captionH + gap;
  const width = gap + columns * cellW;
  const height = gap + titleH + rows * cellH;

  const out: string[] = [`<svg xmlns="http://www.w3.org/2000/svg" width="${n(width)}" height="${n(height)}" viewBox="0 0 ${n(width)} ${n(height)}">`];
  if (options.background !== null) out.push(`<rect width="${n(width)}" height="${n(height)}" fill="${options.background ?? '#ffffff'}"/>`);
  const font = `font-family="sans-serif" text-anchor="middle" fill="${INK}"`;
  if (options.title !== undefined) {
    out.push(`<text class="title" x="${n(width / 2)}" y="${n(gap + 1.3 * captionPx)}" ${font} font-size="${n(1.3 * captionPx)}" font-weight="bold">${escapeXml(options.title)}</text>`);
  }
  const style: ClusterStyle = { fontSizePx: 10, ...options };
  items.forEach((item, i) => {
    const left = gap + (i % columns) * cellW;
    const top = gap + titleH + Math.floor(i / columns) * cellH;
    const placement = centredPlacement(boxes[i], (options.commonScale ?? true) ? common : fits[i]);
    // a saddle's tile is framed apart (dashed, thicker, orange), so it is not taken for a stable one
    const frame = item.saddle === true ? `stroke="${SADDLE_FRAME}" stroke-width="2.5" stroke-dasharray="8 4"` : 'stroke="#d0d0d0"';
    out.push(`<g class="tile${item.saddle === true ? ' saddle' : ''}" data-index="${i}">`);
    out.push(`<rect x="${n(left)}" y="${n(top)}" width="${n(tilePx)}" height="${n(tilePx + captionH)}" rx="4" fill="none" ${frame}/>`);
    out.push(`<g transform="translate(${n(left + tilePx / 2)} ${n(top + tilePx / 2)})">`);
    out.push(renderClusterGroup(item.drawing, placement, digits, style));
    out.push('</g>');
    captions[i].forEach((line, k) => {
      const saddleLine = items[i].saddle === true && k === captions[i].length - 1;
      const weight = (k === 0 && captions[i].length > 1) || saddleLine ? ' font-weight="bold"' : '';
      const colour = saddleLine ? ` style="fill:${SADDLE_FRAME}"` : '';
      out.push(`<text class="caption" x="${n(left + tilePx / 2)}" y="${n(top + tilePx + (k + 1) * 1.3 * captionPx - 0.2 * captionPx)}" ${font} font-size="${n(captionPx)}"${weight}${colour}>${escapeXml(line)}</text>`);
    });
    out.push('</g>');
  });
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}
