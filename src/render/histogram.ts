// render stage: a histogram of positive values on a logarithmic axis (e.g. the margins of an atlas).

import { axisPx, makeAxis, xAxisSvg, yAxisSvg } from './axis.ts';
import { niceDomain } from './ticks.ts';
import { INK, seriesLine, tint } from './palette.ts';
import { checkDigits, escapeXml, fixed } from './format.ts';
import { UsageError } from '../errors.ts';

/** Options of renderHistogram. */
export interface HistogramOptions {
  /** The values; only positive finite ones are counted (the others are reported in the note). */
  readonly values: ArrayLike<number>;
  /** Bins per factor of ten. @default 4 */
  readonly binsPerDecade?: number;
  /** x axis title. @default 'value' */
  readonly xTitle?: string;
  /** Heading over the plot. */
  readonly title?: string;
  /** A line under the heading, e.g. what was left out. */
  readonly note?: string;
  /** Size in pixels. @default 520 x 320 */
  readonly widthPx?: number;
  readonly heightPx?: number;
  /** Decimals of every coordinate (pixel units). @default 2 */
  readonly digits?: number;
}

/**
 * A histogram of the positive values on a log x axis: bins of equal width in log10 (edges at
 * multiples of 1/binsPerDecade, so they line up with the decade ticks), bar heights the counts.
 * Same input, same bytes. @throws UsageError when binsPerDecade is not a positive whole number.
 */
export function renderHistogram(options: HistogramOptions): string {
  const perDecade = options.binsPerDecade ?? 4;
  if (!(Number.isInteger(perDecade) && perDecade >= 1)) throw new UsageError(`Bins per decade is ${perDecade} when expected a positive whole number.`);
  const digits = checkDigits(options.digits ?? 2);
  const n = (v: number): string => fixed(v, digits);
  const width = options.widthPx ?? 520;
  const height = options.heightPx ?? 320;
  const logs: number[] = [];
  for (let i = 0; i < options.values.length; i++) {
    const v = options.values[i];
    if (v > 0 && Number.isFinite(v)) logs.push(Math.log10(v));
  }
  // bins: k covers [k, k + 1) / perDecade in log10
  const lo = logs.length === 0 ? -1 : Math.floor(Math.min(...logs) * perDecade);
  const hi = logs.length === 0 ? 0 : Math.floor(Math.max(...logs) * perDecade) + 1;
  const counts = new Int32Array(hi - lo);
  for (const x of logs) counts[Math.min(hi - lo - 1, Math.floor(x * perDecade) - lo)]++;
  const top = Math.max(1, ...counts);

  const titleH = options.title === undefined ? 0 : 24;
  const noteH = options.note === undefined ? 0 : 16;
  const left = 64;
  const right = width - 20;
  const plotTop = 14 + titleH + noteH;
  const plotBottom = height - 50;
  const xAxis = makeAxis(10 ** (lo / perDecade), 10 ** (hi / perDecade), true, left, right);
  // counts are whole numbers: at least 5 on the axis keeps its ticks whole
  const yAxis = makeAxis(0, niceDomain(0, Math.max(5, top), 5)[1], false, plotBottom, plotTop, 5);
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${n(width)}" height="${n(height)}" viewBox="0 0 ${n(width)} ${n(height)}">`,
    `<rect width="${n(width)}" height="${n(height)}" fill="#ffffff"/>`,
  ];
  if (options.title !== undefined) {
    out.push(`<text class="title" x="${n((left + right) / 2)}" y="${n(20)}" font-family="sans-serif" font-size="15" font-weight="bold" text-anchor="middle" fill="${INK}">${escapeXml(options.title)}</text>`);
  }
  if (options.note !== undefined) {
    out.push(`<text class="note" x="${n((left + right) / 2)}" y="${n(20 + titleH - 4 + 12)}" font-family="sans-serif" font-size="11" text-anchor="middle" fill="${INK}">${escapeXml(options.note)}</text>`);
  }
  out.push(yAxisSvg(yAxis, left, 'samples', n, right));
  out.push(xAxisSvg(xAxis, plotBottom, options.xTitle ?? 'value', n));
  out.push(`<g class="bars" fill="${tint(seriesLine(0), 0.6)}" stroke="${seriesLine(0)}" stroke-width="0.75">`);
  counts.forEach((c, k) => {
    if (c === 0) return;
    const x0 = axisPx(xAxis, 10 ** ((lo + k) / perDecade));
    const x1 = axisPx(xAxis, 10 ** ((lo + k + 1) / perDecade));
    const y = axisPx(yAxis, c);
    out.push(`<rect x="${n(x0)}" y="${n(y)}" width="${n(x1 - x0)}" height="${n(plotBottom - y)}"/>`);
  });
  out.push('</g>', '</svg>');
  return `${out.join('\n')}\n`;
}
