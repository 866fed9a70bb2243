// render stage: one cluster as a standalone SVG document, its view box fitted to the walls' exact extent.

import { UsageError } from '../errors.ts';
import type { ClusterDrawing } from './types.ts';
import { checkDrawing } from './types.ts';
import type { ClusterStyle } from './cluster-group.ts';
import { centredPlacement, fitScale, renderClusterGroup } from './cluster-group.ts';
import { drawingBounds } from './cell-shape.ts';
import { INK } from './palette.ts';
import { checkDigits, escapeXml, fixed } from './format.ts';

/** Options of renderClusterSvg. */
export interface ClusterSvgOptions extends ClusterStyle {
  /** Size in pixels of the longer side of the drawing itself (margins and headings excluded). @default 360 */
  readonly sizePx?: number;
  /** Margin around the drawing in pixels. @default 16 */
  readonly marginPx?: number;
  /** Background colour, or null for a transparent background. @default '#ffffff' */
  readonly background?: string | null;
  /** Show drawing.title above and drawing.caption below the drawing, when present. @default true */
  readonly headings?: boolean;
  /** Heading font size in pixels. @default 14 */
  readonly headingSizePx?: number;
  /** Decimals of every coordinate (pixel units). @default 2 */
  readonly digits?: number;
}

/**
 * Draw one cluster as an SVG document: every cell filled and labelled (number, area, optionally its
 * pressure), every wall an exact arc (path 'A' commands; straight walls 'L'), optional junction dots.
 * The longer side of the drawing is `sizePx` pixels; the view box is the exact extent of the walls
 * (arc bounding boxes, not just the junctions) plus margins and headings, centred on the extent's
 * centre; walls keep their pixel width when the picture is zoomed (non-scaling stroke).
 * Same input, same bytes.
 * @throws UsageError when the drawing is malformed (see checkDrawing) or an option is out of range.
 */
export function renderClusterSvg(drawing: ClusterDrawing, options: ClusterSvgOptions = {}): string {
  checkDrawing(drawing);
  const sizePx = options.sizePx ?? 360;
  const marginPx = options.marginPx ?? 16;
  if (!(sizePx > 0 && Number.isFinite(sizePx))) throw new UsageError(`Size is ${sizePx} px when expected a positive number.`);
  if (!(marginPx >= 0 && Number.isFinite(marginPx))) throw new UsageError(`Margin is ${marginPx} px when expected a non-negative number.`);
  const digits = checkDigits(options.digits ?? 2);
  const n = (v: number): string => fixed(v, digits);
  const box = drawingBounds(drawing);
  const s = fitScale(box, sizePx);
  const w = s * (box[2] - box[0]);
  const h = s * (box[3] - box[1]);

  const headings = options.headings ?? true;
  const headingPx = options.headingSizePx ?? 14;
  const title = headings ? drawing.title : undefined;
  const caption = headings ? drawing.caption : undefined;
  // heading strips two font sizes high, so a heading keeps one font size clear of the drawing
  const titlePx = title === undefined ? 0 : 2 * headingPx;
  const captionPx = caption === undefined ? 0 : 2 * headingPx;

  // view box: the drawing's extent centred on (0, 0), then margins and heading strips
  const x0 = -w / 2 - marginPx;
  const y0 = -h / 2 - marginPx - titlePx;
  const vw = w + 2 * marginPx;
  const vh = h + 2 * marginPx + titlePx + captionPx;
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${n(vw)}" height="${n(vh)}" viewBox="${n(x0)} ${n(y0)} ${n(vw)} ${n(vh)}">`,
  ];
  if (drawing.title !== undefined) out.push(`<title>${escapeXml(drawing.title)}</title>`);
  if (options.background !== null) {
    out.push(`<rect x="${n(x0)}" y="${n(y0)}" width="${n(vw)}" height="${n(vh)}" fill="${options.background ?? '#ffffff'}"/>`);
  }
  out.push(renderClusterGroup(drawing, centredPlacement(box, s), digits, options));
  const font = `font-family="sans-serif" text-anchor="middle" fill="${INK}" font-size="${n(headingPx)}"`;
  if (title !== undefined) {
    out.push(`<text class="title" x="0" y="${n(y0 + marginPx + 0.5 * titlePx)}" ${font} font-weight="bold">${escapeXml(title)}</text>`);
  }
  if (caption !== undefined) {
    out.push(`<text class="caption" x="0" y="${n(h / 2 + 0.5 * marginPx + 0.65 * captionPx)}" ${font}>${escapeXml(caption)}</text>`);
  }
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}
