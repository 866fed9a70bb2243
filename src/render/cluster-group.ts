// render stage: one cluster as an SVG group in pixel units about a chosen drawing point, y pointing down.

import type { ClusterDrawing } from './types.ts';
import { cellCountOf } from './types.ts';
import { traceCell, traceWalls } from './outline.ts';
import type { LabelPoint } from './cell-shape.ts';
import { drawingBounds, labelPoint } from './cell-shape.ts';
import { CELL_FILLS, INK, cellFill } from './palette.ts';
import { escapeXml, fixed, formatValue } from './format.ts';

/** How a cluster is styled; shared by the single drawing, the contact sheet and the plots' thumbnails. */
export interface ClusterStyle {
  /** Label each cell with its number and area. @default true */
  readonly labels?: boolean;
  /** Add each cell's pressure to its label, when the drawing has pressures. @default false */
  readonly pressures?: boolean;
  /** Mark every junction with a dot. @default false */
  readonly junctions?: boolean;
  /** Wall stroke width in screen pixels, whatever the scale (non-scaling stroke). @default 1.5 */
  readonly strokeWidthPx?: number;
  /** Radius of junction dots in screen pixels. @default 2.5 */
  readonly junctionRadiusPx?: number;
  /** Largest label font size in screen pixels; labels shrink to fit small cells. @default 12 */
  readonly fontSizePx?: number;
  /** Cell fills, cell i takes palette[(i - 1) % length]. @default CELL_FILLS */
  readonly palette?: readonly string[];
  /** Significant digits of areas and pressures in labels. @default 4 */
  readonly labelDigits?: number;
  /** Label every wall with its tension at its middle, when the drawing has tensions. @default false */
  readonly tensions?: boolean;
}

/** Smallest label font size in screen pixels before the label falls back to the cell number alone. */
const MIN_FULL_LABEL_PX = 7;
/** Smallest font size in screen pixels of a number-only label. */
const MIN_LABEL_PX = 5;
/** Label line height in em. */
const LINE_HEIGHT = 1.2;

/**
 * Where a cluster group goes: drawing units are scaled by `pxPerUnit` about the drawing point
 * (originX, originY), which lands on the group's (0, 0).
 */
export interface Placement {
  readonly pxPerUnit: number;
  readonly originX: number;
  readonly originY: number;
}

/** The scale in pixels per unit that fits a box [minX, minY, maxX, maxY] into a `sizePx` square (1 for an empty box). */
export function fitScale(box: Float64Array, sizePx: number): number {
  const extent = Math.max(box[2] - box[0], box[3] - box[1]);
  return extent > 0 ? sizePx / extent : 1;
}

/** A placement at `pxPerUnit` that puts the centre of a box [minX, minY, maxX, maxY] at the group's (0, 0). */
export function centredPlacement(box: Float64Array, pxPerUnit: number): Placement {
  return { pxPerUnit, originX: 0.5 * (box[0] + box[2]), originY: 0.5 * (box[1] + box[3]) };
}

/**
 * Write `drawing` as an SVG `<g>` in pixel units: the drawing point (x, y) is at
 * (pxPerUnit (x - originX), -pxPerUnit (y - originY)), y pointing down as on screen. Paths are
 * written with y up inside a `scale(1 -1)` group, so the arc flags of path.ts apply as computed
 * (a uniform flip leaves stroke widths alone); labels and dots sit outside it so text stays
 * upright. Stroke widths and font sizes are pixels at that scale, and the stroke stays that wide
 * when the picture is zoomed (non-scaling stroke). `digits` are the decimals of every coordinate.
 * Assumes checkDrawing passed.
 */
export function renderClusterGroup(drawing: ClusterDrawing, placement: Placement, digits: number, style: ClusterStyle = {}): string {
  const { map, areas, pressures } = drawing;
  const { pxPerUnit, originX, originY } = placement;
  const palette = style.palette ?? CELL_FILLS;
  const n = (v: number): string => fixed(v, digits);
  // the drawing in pixels, y still up: junctions moved and scaled, areas scaled to match
  const coords = new Float64Array(drawing.coords.length);
  for (let v = 0; v < coords.length; v += 2) {
    coords[v] = pxPerUnit * (drawing.coords[v] - originX);
    coords[v + 1] = pxPerUnit * (drawing.coords[v + 1] - originY);
  }
  const scaled: ClusterDrawing = { ...drawing, coords, areas: areas.map((a) => a * pxPerUnit * pxPerUnit) };
  const strokeWidth = style.strokeWidthPx ?? 1.5;
  const cells = cellCountOf(drawing);
  // Is it the circle? It has no junctions to move: it lies about the drawing's origin, shifted as a whole.
  const circle = map.twins.length === 0;
  const shift = circle && (originX !== 0 || originY !== 0) ? `translate(${n(-pxPerUnit * originX)} ${n(pxPerUnit * originY)}) ` : '';
  const out: string[] = ['<g class="cluster">', `<g transform="${shift}scale(1 -1)">`];
  const wallStyle = `fill="none" stroke="${INK}" stroke-width="${fixed(strokeWidth, 2)}" stroke-linejoin="round" stroke-linecap="round" vector-effect="non-scaling-stroke"`;
  const walls = map.wallIndex();
  const labels: LabelPoint[] = [];
  // typed cells take their type's colour (type 1 the palette's first), untyped ones their number's
  const types = drawing.cellTypes;
  for (let f = 1; f <= cells; f++) {
    const fill = cellFill(types === undefined ? f : types[f - 1], palette);
    out.push(`<path class="cell" data-cell="${f}" fill="${fill}" d="${traceCell(scaled, f, undefined, digits)}"/>`);
    // the circle's label goes at its centre, with its radius as clearance
    const centre = { x: -pxPerUnit * originX, y: -pxPerUnit * originY, clearance: Math.sqrt(scaled.areas[0] / Math.PI) };
    labels.push(circle ? centre : labelPoint(scaled, walls, f));
  }
  out.push(`<path class="walls" ${wallStyle} d="${traceWalls(scaled, undefined, digits)}"/>`);
  out.push('</g>');

  if (style.junctions === true && map.junctionCount > 0) {
    const r = n(style.junctionRadiusPx ?? 2.5);
    out.push(`<g class="junctions" fill="${INK}">`);
    for (let v = 0; v < map.junctionCount; v++) {
      out.push(`<circle cx="${n(coords[2 * v])}" cy="${n(-coords[2 * v + 1])}" r="${r}"/>`);
    }
    out.push('</g>');
  }

  if (style.labels ?? true) {
    const fontPx = style.fontSizePx ?? 12;
    const significant = style.labelDigits ?? 4;
    out.push(`<g class="labels" font-family="sans-serif" text-anchor="middle" fill="${INK}">`);
    for (let i = 0; i < cells; i++) {
      // (the type is written in the label too: colour is never the only cue)
      const type = types === undefined || drawing.typeLabels === undefined ? '' : ` ${drawing.typeLabels[types[i]]}`;
      const lines = [`${i + 1}${type}`, `A = ${formatValue(areas[i], significant)}`];
      if (style.pressures === true && pressures !== undefined) lines.push(`p = ${formatValue(pressures[i], significant)}`);
      out.push(labelSvg(lines, labels[i], fontPx, n));
    }
    out.push('</g>');
  }
  if (style.tensions === true && drawing.tensions !== undefined && map.junctionCount > 0) {
    const fontPx = 0.8 * (style.fontSizePx ?? 12);
    out.push(`<g class="tensions" font-family="sans-serif" font-style="italic" text-anchor="middle" fill="${INK}">`);
    for (let e = 0; e < map.twins.length; e++) {
      if (e > map.twins[e]) continue;
      const k = walls[e];
      const a = 2 * ((e / 3) | 0);
      const b = 2 * ((map.twins[e] / 3) | 0);
      // the arc's middle: the chord's middle moved by the sagitta (c/2) tan(t/2) along the left normal
      const dx = coords[b] - coords[a];
      const dy = coords[b + 1] - coords[a + 1];
      const s = 0.5 * Math.tan(0.5 * drawing.bulges[k]);
      const x = 0.5 * (coords[a] + coords[b]) - s * dy;
      const y = 0.5 * (coords[a + 1] + coords[b + 1]) + s * dx;
      out.push(`<text x="${n(x)}" y="${n(-y + 0.35 * fontPx)}" font-size="${n(fontPx)}" stroke="#ffffff" stroke-width="3" paint-order="stroke">${formatValue(drawing.tensions[k], 3)}</text>`);
    }
    out.push('</g>');
  }
  out.push('</g>');
  return out.join('\n');
}

/**
 * A centred block of label lines at a cell's label point, the font shrunk so the block fits in the
 * point's clearance (half-width about 0.3 em per character, half-height 0.6 em per line), and
 * reduced to the cell number alone when even that would be under MIN_FULL_LABEL_PX.
 */
function labelSvg(
  lines: string[],
  at: LabelPoint,
  fontPx: number,
  n: (v: number) => string,
): string {
  const clearancePx = at.clearance;
  const fit = (rows: string[]): number => {
    const widest = Math.max(...rows.map((row) => row.length));
    return clearancePx / Math.max(0.6 * LINE_HEIGHT * rows.length, 0.3 * widest);
  };
  let rows = lines;
  let px = Math.min(fontPx, fit(rows));
  if (px < MIN_FULL_LABEL_PX) {
    rows = lines.slice(0, 1);
    px = Math.max(MIN_LABEL_PX, Math.min(fontPx, fit(rows)));
  }
  const size = px;
  const top = -at.y - ((rows.length - 1) * LINE_HEIGHT * size) / 2 + 0.35 * size;
  const parts = rows.map((row, k) => {
    const weight = k === 0 ? ' font-weight="bold"' : '';
    return `<text x="${n(at.x)}" y="${n(top + k * LINE_HEIGHT * size)}" font-size="${n(size)}"${weight}>${escapeXml(row)}</text>`;
  });
  return parts.join('\n');
}

/**
 * A small unlabelled drawing fitted into a `sizePx` square centred at (cx, cy) of the caller's pixel
 * space: a `<g>` with its own translate transform around renderClusterGroup. With `fill`, every cell
 * takes that one colour (so the drawing doubles as its legend swatch); otherwise the cell palette.
 * Assumes checkDrawing passed.
 */
export function renderThumbnail(drawing: ClusterDrawing, cx: number, cy: number, sizePx: number, digits: number, fill?: string): string {
  const box = drawingBounds(drawing);
  const placement = centredPlacement(box, fitScale(box, sizePx));
  const style: ClusterStyle = { labels: false, strokeWidthPx: 1, ...(fill === undefined ? {} : { palette: [fill] }) };
  return `<g class="thumbnail" transform="translate(${fixed(cx, digits)} ${fixed(cy, digits)})">\n${renderClusterGroup(drawing, placement, digits, style)}\n</g>`;
}
