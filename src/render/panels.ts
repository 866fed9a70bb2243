// render stage: several finished SVG pictures placed side by side on one page, in rows.

import { UsageError } from '../errors.ts';
import { checkDigits, escapeXml, fixed } from './format.ts';
import { INK } from './palette.ts';

/** Width and height of a picture written by this stage (read off its root element). */
function sizeOf(svg: string): [number, number] {
  const m = /^<svg [^>]*width="([0-9.]+)" height="([0-9.]+)"/.exec(svg);
  if (m === null) throw new UsageError('Panel does not start with an <svg> element with width and height when expected a picture of this stage.');
  return [Number(m[1]), Number(m[2])];
}

/**
 * Pictures (each a whole `<svg>` document from this stage) laid out in rows: rows[r] is one row, left
 * to right; each picture is nested as an `<svg>` element at its place. Same input, same bytes.
 * @throws UsageError when there is no picture or one has no size.
 */
export function renderPanels(rows: readonly (readonly string[])[], options: { title?: string; gapPx?: number; digits?: number } = {}): string {
  if (rows.every((r) => r.length === 0)) throw new UsageError('Panels have 0 pictures when expected at least 1.');
  const digits = checkDigits(options.digits ?? 2);
  const n = (v: number): string => fixed(v, digits);
  const gap = options.gapPx ?? 8;
  const titleH = options.title === undefined ? 0 : 30;
  const placed: string[] = [];
  let y = gap + titleH;
  let width = 0;
  for (const row of rows) {
    let x = gap;
    let rowH = 0;
    for (const svg of row) {
      const [w, h] = sizeOf(svg);
      placed.push(svg.trimEnd().replace(/^<svg /, `<svg x="${n(x)}" y="${n(y)}" `));
      x += w + gap;
      rowH = Math.max(rowH, h);
    }
    width = Math.max(width, x);
    y += rowH + gap;
  }
  const head = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${n(width)}" height="${n(y)}" viewBox="0 0 ${n(width)} ${n(y)}">`,
    `<rect width="${n(width)}" height="${n(y)}" fill="#ffffff"/>`,
  ];
  if (options.title !== undefined) {
    head.push(`<text class="title" x="${n(width / 2)}" y="${n(gap + 18)}" font-family="sans-serif" font-size="17" font-weight="bold" text-anchor="middle" fill="${INK}">${escapeXml(options.title)}</text>`);
  }
  return `${[...head, ...placed, '</svg>'].join('\n')}\n`;
}
