// render stage: plot axes, a value-to-pixel map (linear or logarithmic) with its ticks drawn as SVG.

import { UsageError } from '../errors.ts';
import type { Tick } from './ticks.ts';
import { linearTicks, logTicks } from './ticks.ts';
import { INK } from './palette.ts';
import { escapeXml } from './format.ts';

/** A value-to-pixel map of one axis with its ticks. */
export interface Axis {
  readonly lo: number;
  readonly hi: number;
  readonly log: boolean;
  /** Pixel of lo and of hi (hi may be smaller, as on a y axis). */
  readonly pxLo: number;
  readonly pxHi: number;
  readonly ticks: readonly Tick[];
}

/**
 * An axis from [lo, hi] to [pxLo, pxHi]; logarithmic when `log`, with ticks from ticks.ts.
 * @throws UsageError when the range is not finite, lo > hi, or lo <= 0 on a log axis.
 */
export function makeAxis(lo: number, hi: number, log: boolean, pxLo: number, pxHi: number, count = 6): Axis {
  const ticks = log ? logTicks(lo, hi) : linearTicks(lo, hi, count);
  return { lo, hi, log, pxLo, pxHi, ticks };
}

/** Pixel position of v on an axis (values outside the range map outside the pixel span). */
export function axisPx(axis: Axis, v: number): number {
  const { lo, hi, log, pxLo, pxHi } = axis;
  // Is the range a single point? Put everything in the middle.
  if (hi === lo) return 0.5 * (pxLo + pxHi);
  const s = log ? Math.log(v / lo) / Math.log(hi / lo) : (v - lo) / (hi - lo);
  return pxLo + s * (pxHi - pxLo);
}

/** Ticks inside the axis range, at their pixel positions. */
function placedTicks(axis: Axis): { px: number; tick: Tick }[] {
  const slack = 1e-9 * Math.abs(axis.pxHi - axis.pxLo);
  const a = Math.min(axis.pxLo, axis.pxHi) - slack;
  const b = Math.max(axis.pxLo, axis.pxHi) + slack;
  return axis.ticks.map((tick) => ({ px: axisPx(axis, tick.value), tick })).filter(({ px }) => px >= a && px <= b);
}

/**
 * A horizontal axis drawn along y = `atPx`: the line, tick marks downwards (majors 5 px, minors 3 px),
 * labels under the majors and `title` centred below. Optional gridlines up to `gridTopPx`.
 */
export function xAxisSvg(axis: Axis, atPx: number, title: string, n: (v: number) => string, gridTopPx?: number): string {
  const out: string[] = ['<g class="x-axis" font-family="sans-serif" font-size="11" text-anchor="middle" fill="' + INK + '">'];
  for (const { px, tick } of placedTicks(axis)) {
    if (gridTopPx !== undefined && tick.major) {
      out.push(`<line x1="${n(px)}" y1="${n(gridTopPx)}" x2="${n(px)}" y2="${n(atPx)}" stroke="#000000" stroke-opacity="0.08"/>`);
    }
    out.push(`<line x1="${n(px)}" y1="${n(atPx)}" x2="${n(px)}" y2="${n(atPx + (tick.major ? 5 : 3))}" stroke="${INK}"/>`);
    if (tick.label !== '') out.push(`<text x="${n(px)}" y="${n(atPx + 17)}">${escapeXml(tick.label)}</text>`);
  }
  out.push(`<line x1="${n(axis.pxLo)}" y1="${n(atPx)}" x2="${n(axis.pxHi)}" y2="${n(atPx)}" stroke="${INK}"/>`);
  out.push(`<text class="axis-title" x="${n(0.5 * (axis.pxLo + axis.pxHi))}" y="${n(atPx + 34)}" font-size="12">${escapeXml(title)}</text>`);
  out.push('</g>');
  return out.join('\n');
}

/**
 * A vertical axis drawn along x = `atPx`: the line, tick marks to the left, labels left of the
 * majors and `title` rotated along the axis. Optional gridlines across to `gridRightPx`.
 */
export function yAxisSvg(axis: Axis, atPx: number, title: string, n: (v: number) => string, gridRightPx?: number): string {
  const out: string[] = ['<g class="y-axis" font-family="sans-serif" font-size="11" text-anchor="end" fill="' + INK + '">'];
  for (const { px, tick } of placedTicks(axis)) {
    if (gridRightPx !== undefined && tick.major) {
      out.push(`<line x1="${n(atPx)}" y1="${n(px)}" x2="${n(gridRightPx)}" y2="${n(px)}" stroke="#000000" stroke-opacity="0.08"/>`);
    }
    out.push(`<line x1="${n(atPx - (tick.major ? 5 : 3))}" y1="${n(px)}" x2="${n(atPx)}" y2="${n(px)}" stroke="${INK}"/>`);
    if (tick.label !== '') out.push(`<text x="${n(atPx - 8)}" y="${n(px + 4)}">${escapeXml(tick.label)}</text>`);
  }
  out.push(`<line x1="${n(atPx)}" y1="${n(axis.pxLo)}" x2="${n(atPx)}" y2="${n(axis.pxHi)}" stroke="${INK}"/>`);
  const mid = 0.5 * (axis.pxLo + axis.pxHi);
  out.push(`<text class="axis-title" x="${n(atPx - 44)}" y="${n(mid)}" font-size="12" text-anchor="middle" transform="rotate(-90 ${n(atPx - 44)} ${n(mid)})">${escapeXml(title)}</text>`);
  out.push('</g>');
  return out.join('\n');
}
