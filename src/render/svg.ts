// render stage: one cluster as a standalone SVG document, its view box fitted to the walls' exact extent.

import type { ClusterDrawing } from './types.ts';
import { checkDrawing } from './types.ts';
import type { ClusterStyle } from './cluster-group.ts';
import { renderClusterGroup } from './cluster-group.ts';
import { drawingBounds } from './cell-shape.ts';
import { INK } from './palette.ts';
import { checkDigits, escapeXml, fixed } from './format.ts';

/** Options of renderClusterSvg. */
export interface ClusterSvgOptions extends ClusterStyle {
  /** Size in pixels of the longer side of the drawing itself (margins and heading excluded). @default 360 */
  readonly sizePx?: number;
  /** Margin around the drawing in pixels. @default 16 */
  readonly marginPx?: number;
  /** Background colour, or null for a transparent background. @default '#ffffff' */
  readonly background?: string | null;
  /** Show drawing.title above and drawing.caption below the drawing, when present. @default true */
  readonly headings?: boolean;
  /** Heading font size in pixels. @default 14 */
  readonly headingSizePx?: number;
  /** Decimals of coordinates; by default enough for 1/20 pixel at the drawing's scale, at least 3. */
  readonly digits?: number;
}

/** Decimals that resolve 1/20 of a pixel at `pxPerUnit`, between 3 and 12. */
export function digitsForScale(pxPerUnit: number): number {
  return Math.min(12, Math.max(3, Math.ceil(Math.log10(20 * pxPerUnit))));
}

/**
 * Draw one cluster as an SVG document: every cell filled and labelled (number, area, optionally its
 * pressure), every wall an exact arc (path 'A' commands; straight walls 'L'), optional junction dots.
 * User units are the drawing's units (y flipped), the view box is the exact extent of the walls
 * plus margins, and the stroke width is in screen pixels (non-scaling stroke), so the picture
 * scales freely. Same input, same bytes.
 * @throws UsageError or RangeError when the drawing is malformed (see checkDrawing) or an option is out of range.
 */
export function renderClusterSvg(drawing: ClusterDrawing, options: ClusterSvgOptions = {}): string {
  checkDrawing(drawing);
  const sizePx = options.sizePx ?? 360;
  const marginPx = options.marginPx ?? 16;
  if (!(sizePx > 0 && Number.isFinite(sizePx))) throw new RangeError(`Size is ${sizePx} px when expected a positive number.`);
  if (!(marginPx >= 0 && Number.isFinite(marginPx))) throw new RangeError(`Margin is ${marginPx} px when expected a non-negative number.`);
  const box = drawingBounds(drawing);
  const w = box[2] - box[0];
  const h = box[3] - box[1];
  const extent = Math.max(w, h);
  const s = extent > 0 ? sizePx / extent : 1;
  const digits = options.digits === undefined ? digitsForScale(s) : checkDigits(options.digits);
  const n = (v: number): string => fixed(v, digits);

  const headings = options.headings ?? true;
  const headingPx = options.headingSizePx ?? 14;
  const title = headings ? drawing.title : undefined;
  const caption = headings ? drawing.caption : undefined;
  const titlePx = title === undefined ? 0 : 1.6 * headingPx;
  const captionPx = caption === undefined ? 0 : 1.6 * headingPx;

  // view box in user units: x as drawn, y flipped (top edge at -maxY)
  const x0 = box[0] - marginPx / s;
  const y0 = -box[3] - (marginPx + titlePx) / s;
  const vw = w + (2 * marginPx) / s;
  const vh = h + (2 * marginPx + titlePx + captionPx) / s;
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fixed(vw * s, 2)}" height="${fixed(vh * s, 2)}" viewBox="${n(x0)} ${n(y0)} ${n(vw)} ${n(vh)}">`,
  ];
  if (drawing.title !== undefined) out.push(`<title>${escapeXml(drawing.title)}</title>`);
  if (options.background !== null) {
    out.push(`<rect x="${n(x0)}" y="${n(y0)}" width="${n(vw)}" height="${n(vh)}" fill="${options.background ?? '#ffffff'}"/>`);
  }
  out.push(renderClusterGroup(drawing, s, digits, options));
  const cx = 0.5 * (box[0] + box[2]);
  const font = `font-family="sans-serif" text-anchor="middle" fill="${INK}" font-size="${n(headingPx / s)}"`;
  if (title !== undefined) {
    out.push(`<text class="title" x="${n(cx)}" y="${n(y0 + (marginPx + 0.8 * titlePx) / s)}" ${font} font-weight="bold">${escapeXml(title)}</text>`);
  }
  if (caption !== undefined) {
    out.push(`<text class="caption" x="${n(cx)}" y="${n(-box[1] + (0.5 * marginPx + 0.8 * captionPx) / s)}" ${font}>${escapeXml(caption)}</text>`);
  }
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}
