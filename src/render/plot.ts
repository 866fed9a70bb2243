// render stage: the sweep's path plot: each arrangement's perimeter above the winner along a parameter.

import type { ClusterDrawing } from './types.ts';
import { checkDrawing } from './types.ts';
import { renderThumbnail } from './cluster-group.ts';
import { axisPx, makeAxis, xAxisSvg, yAxisSvg } from './axis.ts';
import { niceDomain } from './ticks.ts';
import { INK, markerSvg, seriesLine, seriesMarker, tint } from './palette.ts';
import { checkDigits, escapeXml, fixed, formatValue } from './format.ts';
import { UsageError } from '../errors.ts';

export { renderRegionMap } from './region-map.ts';
export { triangleSamples } from '../sweep/triangle-grid.ts';
export type { RegionMapOptions, RegionArrangement, RectangleGrid, TriangleGrid } from './region-map.ts';

/** One competing arrangement along the path. */
export interface PathSeries {
  /** Unique key (e.g. the arrangement's id); bands refer to it. */
  readonly key: string;
  /** Legend text. */
  readonly label: string;
  /** Perimeter at each sample of `xs`; null where the arrangement has no certified equilibrium. */
  readonly perimeters: ReadonlyArray<number | null>;
  /** A small drawing of the arrangement, for the legend and above the bands it wins. */
  readonly drawing?: ClusterDrawing;
}

/** A parameter interval [from, to] won by the series `key`. */
export interface WinnerBand {
  readonly from: number;
  readonly to: number;
  readonly key: string;
}

/** A marked parameter value that is not a change of winner, e.g. where an arrangement stops existing. */
export interface PathEvent {
  readonly x: number;
  readonly label: string;
}

/** Options of renderPathPlot. */
export interface PathPlotOptions {
  /** Sample positions of the parameter, strictly increasing (positive on a log axis). At least 2. */
  readonly xs: ArrayLike<number>;
  /** The competing arrangements. At least 1. */
  readonly series: readonly PathSeries[];
  /**
   * Winner intervals, e.g. with the sweep's located transitions as ends. Every boundary between
   * two bands of different keys is drawn as a transition. @default bandsFromSamples(xs, series, logX)
   */
  readonly bands?: readonly WinnerBand[];
  /** Other marked values (dotted lines with labels), e.g. existence boundaries. @default [] */
  readonly events?: readonly PathEvent[];
  /** Name of the parameter, the x axis title. @default 't' */
  readonly parameter?: string;
  /** Logarithmic x axis. @default false */
  readonly logX?: boolean;
  /** Heading over the plot. */
  readonly title?: string;
  /** What the series measure, in the y axis title ('energy' when tensions are not all 1). @default 'perimeter' */
  readonly measure?: string;
  /** Width of the picture in pixels. @default 760 */
  readonly widthPx?: number;
  /** Height of the picture in pixels. @default 460 */
  readonly heightPx?: number;
  /** Top of the y axis in percent; larger values are clipped. @default the nice ceiling of the data */
  readonly yMaxPercent?: number;
  /** Size in pixels of the winners' drawings above their bands. @default 56 */
  readonly thumbPx?: number;
  /** Prefix of the ids inside the SVG (clip paths), for pages holding several plots. @default 'lather-plot' */
  readonly idPrefix?: string;
  /** Decimals of every coordinate (pixel units). @default 2 */
  readonly digits?: number;
}

/**
 * Winner bands read off the samples: at each sample the series of least perimeter wins (ties go
 * to the earlier series); runs of equal winners form bands whose ends are the midpoints between
 * samples (geometric midpoints on a log axis), the first and last ends the sample range. Samples
 * where no series has a perimeter belong to no band.
 */
export function bandsFromSamples(xs: ArrayLike<number>, series: readonly PathSeries[], logX = false): WinnerBand[] {
  const winners: (string | null)[] = [];
  for (let i = 0; i < xs.length; i++) {
    let best: string | null = null;
    let least = Infinity;
    for (const s of series) {
      const p = s.perimeters[i];
      if (p !== null && p < least) {
        least = p;
        best = s.key;
      }
    }
    winners.push(best);
  }
  const middle = (i: number): number => (logX ? Math.sqrt(xs[i] * xs[i + 1]) : 0.5 * (xs[i] + xs[i + 1]));
  const bands: WinnerBand[] = [];
  let start = 0;
  for (let i = 1; i <= xs.length; i++) {
    if (i < xs.length && winners[i] === winners[start]) continue;
    const key = winners[start];
    if (key !== null) bands.push({ from: start === 0 ? xs[0] : middle(start - 1), to: i === xs.length ? xs[xs.length - 1] : middle(i - 1), key });
    start = i;
  }
  return bands;
}

/** Check the plot's input once. */
function checkPlot(options: PathPlotOptions): void {
  const { xs, series } = options;
  if (xs.length < 2) throw new UsageError(`Path plot has ${xs.length} samples when expected at least 2.`);
  for (let i = 0; i < xs.length; i++) {
    if (!Number.isFinite(xs[i]) || (i > 0 && !(xs[i] > xs[i - 1]))) {
      throw new UsageError(`Sample ${i} is at ${xs[i]} when expected finite values increasing strictly.`);
    }
  }
  if (options.logX === true && !(xs[0] > 0)) throw new UsageError(`First sample is at ${xs[0]} when expected a positive value on a log axis.`);
  if (series.length === 0) throw new UsageError('Path plot has 0 series when expected at least 1.');
  const keys = new Set<string>();
  for (const s of series) {
    if (keys.has(s.key)) throw new UsageError(`Series key ${s.key} appears twice when expected unique keys.`);
    keys.add(s.key);
    if (s.perimeters.length !== xs.length) {
      throw new UsageError(`Series ${s.key} has ${s.perimeters.length} perimeters when expected ${xs.length} (1 per sample).`);
    }
    for (const p of s.perimeters) {
      if (p !== null && !(p > 0 && Number.isFinite(p))) throw new UsageError(`Series ${s.key} has perimeter ${p} when expected a positive number or null.`);
    }
    if (s.drawing !== undefined) checkDrawing(s.drawing);
  }
  for (const band of options.bands ?? []) {
    if (!keys.has(band.key)) throw new UsageError(`Band key ${band.key} names no series when expected one of the series keys.`);
    if (!(band.from <= band.to)) throw new UsageError(`Band of ${band.key} runs from ${band.from} to ${band.to} when expected from <= to.`);
  }
}

/**
 * The path plot of a sweep: x = the parameter (linear or log axis), y = each arrangement's perimeter
 * above the sample's winner, in percent (the winner sits on 0); the winner's bands shaded in a tint
 * of its line colour, transitions (band boundaries where the winner changes) as dashed lines labelled
 * with their parameter value, events as dotted lines, a small drawing of each winner above its band
 * (when the band is at least 18 px wide), and a legend with every series' line, marker and drawing;
 * drawings are filled with a tint of their series' line colour, so drawing, band and line match.
 * Same input, same bytes.
 * @throws UsageError when the input is inconsistent (see the option docs).
 */
export function renderPathPlot(options: PathPlotOptions): string {
  checkPlot(options);
  const { xs, series } = options;
  const logX = options.logX ?? false;
  const digits = checkDigits(options.digits ?? 2);
  const n = (v: number): string => fixed(v, digits);
  const width = options.widthPx ?? 760;
  const height = options.heightPx ?? 460;
  const thumbPx = options.thumbPx ?? 56;
  const id = `${options.idPrefix ?? 'lather-plot'}-area`;
  const bands = [...(options.bands ?? bandsFromSamples(xs, series, logX))].sort((a, b) => a.from - b.from);
  const index = new Map(series.map((s, i) => [s.key, i]));

  // relative excess over the sample's least perimeter, in percent
  const count = xs.length;
  const least = new Float64Array(count).fill(Infinity);
  for (const s of series) s.perimeters.forEach((p, i) => { if (p !== null && p < least[i]) least[i] = p; });
  const excess = (p: number, i: number): number => 100 * (p / least[i] - 1);
  let top = 0;
  for (const s of series) s.perimeters.forEach((p, i) => { if (p !== null) top = Math.max(top, excess(p, i)); });
  const yMax = options.yMaxPercent ?? (top > 0 ? niceDomain(0, top, 5)[1] : 1);

  // layout
  const legendW = 200;
  const titleH = options.title === undefined ? 0 : 26;
  const stripH = thumbPx + 22;
  const left = 70;
  const right = width - legendW - 20;
  const plotTop = 10 + titleH + stripH;
  const plotBottom = height - 52;
  const xAxis = makeAxis(xs[0], xs[count - 1], logX, left, right);
  const yAxis = makeAxis(0, yMax, false, plotBottom, plotTop, 5);
  const X = (v: number): number => axisPx(xAxis, v);
  const Y = (v: number): number => axisPx(yAxis, v);

  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${n(width)}" height="${n(height)}" viewBox="0 0 ${n(width)} ${n(height)}">`,
    `<rect width="${n(width)}" height="${n(height)}" fill="#ffffff"/>`,
    `<defs><clipPath id="${escapeXml(id)}"><rect x="${n(left)}" y="${n(plotTop - 6)}" width="${n(right - left)}" height="${n(plotBottom - plotTop + 12)}"/></clipPath></defs>`,
  ];
  if (options.title !== undefined) {
    out.push(`<text class="title" x="${n((left + right) / 2)}" y="${n(10 + 17)}" font-family="sans-serif" font-size="15" font-weight="bold" text-anchor="middle" fill="${INK}">${escapeXml(options.title)}</text>`);
  }

  // bands, each with its winner's drawing and name above it
  out.push('<g class="bands">');
  for (const band of bands) {
    const i = index.get(band.key) ?? 0;
    const x0 = X(band.from);
    const x1 = X(band.to);
    out.push(`<rect x="${n(x0)}" y="${n(plotTop)}" width="${n(x1 - x0)}" height="${n(plotBottom - plotTop)}" fill="${tint(seriesLine(i))}"/>`);
    const size = Math.min(thumbPx, x1 - x0 - 4);
    const drawing = series[i].drawing;
    if (drawing !== undefined && size >= 18) out.push(renderThumbnail(drawing, 0.5 * (x0 + x1), plotTop - 16 - thumbPx / 2, size, digits, tint(seriesLine(i), 0.45)));
    if (series[i].label.length * 6.5 <= x1 - x0) {
      out.push(`<text x="${n(0.5 * (x0 + x1))}" y="${n(plotTop - 4)}" font-family="sans-serif" font-size="10" text-anchor="middle" fill="${seriesLine(i)}">${escapeXml(series[i].label)}</text>`);
    }
  }
  out.push('</g>');
  out.push(yAxisSvg(yAxis, left, `${options.measure ?? 'perimeter'} above the winner (%)`, n, right));
  out.push(xAxisSvg(xAxis, plotBottom, options.parameter ?? 't', n));

  // transitions and events
  const halo = 'stroke="#ffffff" stroke-width="3" paint-order="stroke"';
  out.push(`<g class="transitions" font-family="sans-serif" font-size="10" fill="${INK}">`);
  for (let b = 1; b < bands.length; b++) {
    if (bands[b].key === bands[b - 1].key) continue;
    const x = X(bands[b].from);
    out.push(`<line x1="${n(x)}" y1="${n(plotTop)}" x2="${n(x)}" y2="${n(plotBottom)}" stroke="${INK}" stroke-dasharray="5 3"/>`);
    out.push(`<text x="${n(x + 3)}" y="${n(plotTop + 12)}" ${halo}>${escapeXml(formatValue(bands[b].from, 5))}</text>`);
  }
  for (const event of options.events ?? []) {
    const x = X(event.x);
    out.push(`<line x1="${n(x)}" y1="${n(plotTop)}" x2="${n(x)}" y2="${n(plotBottom)}" stroke="#666666" stroke-dasharray="1.5 2.5"/>`);
    out.push(`<text x="${n(x + 3)}" y="${n(plotBottom - 6)}" fill="#555555" ${halo}>${escapeXml(event.label)}</text>`);
  }
  out.push('</g>');

  // series: a polyline per run of samples with a perimeter, a marker at each sample
  out.push(`<g class="series" clip-path="url(#${escapeXml(id)})">`);
  series.forEach((s, k) => {
    const colour = seriesLine(k);
    const runs: string[][] = [];
    let run: string[] = [];
    const marks: string[] = [];
    s.perimeters.forEach((p, i) => {
      if (p === null) {
        if (run.length > 0) runs.push(run);
        run = [];
        return;
      }
      const x = X(xs[i]);
      const y = Y(excess(p, i));
      run.push(`${n(x)},${n(y)}`);
      marks.push(markerSvg(seriesMarker(k), x, y, 2.6, colour, n));
    });
    if (run.length > 0) runs.push(run);
    out.push(`<g class="series-${k}" data-key="${escapeXml(s.key)}">`);
    for (const points of runs) {
      out.push(`<polyline points="${points.join(' ')}" fill="none" stroke="${colour}" stroke-width="1.5" stroke-linejoin="round"/>`);
    }
    out.push(...marks, '</g>');
  });
  out.push('</g>');

  // legend
  const legendX = right + 24;
  const rowH = series.some((s) => s.drawing !== undefined) ? 38 : 20;
  out.push(`<g class="legend" font-family="sans-serif" font-size="11" fill="${INK}">`);
  series.forEach((s, k) => {
    const y = plotTop + k * rowH + rowH / 2;
    const colour = seriesLine(k);
    out.push(`<line x1="${n(legendX)}" y1="${n(y)}" x2="${n(legendX + 22)}" y2="${n(y)}" stroke="${colour}" stroke-width="1.5"/>`);
    out.push(markerSvg(seriesMarker(k), legendX + 11, y, 3, colour, n));
    if (s.drawing !== undefined) out.push(renderThumbnail(s.drawing, legendX + 44, y, rowH - 6, digits, tint(colour, 0.45)));
    out.push(`<text x="${n(legendX + (s.drawing === undefined ? 30 : 66))}" y="${n(y + 4)}">${escapeXml(s.label)}</text>`);
  });
  out.push('</g>');
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}
