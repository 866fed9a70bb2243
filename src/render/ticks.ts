// render stage: axis ticks at nice numbers (1, 2, 5 x 10^k) on linear and logarithmic axes.

import { UsageError } from '../errors.ts';
import { formatValue } from './format.ts';

/** One tick: its value, its label (empty for an unlabelled minor tick) and whether it is major. */
export interface Tick {
  readonly value: number;
  readonly label: string;
  readonly major: boolean;
}

/** Tolerance, in units of the step, for ticks at the very ends of a range. */
const END_SLACK = 1e-9;

/**
 * The nice step, 1, 2 or 5 times a power of ten, nearest (on a log scale) to span / count:
 * the mantissa r of the raw step picks 1 below sqrt 2, 2 below sqrt 10, 5 below sqrt 50, else 10,
 * the geometric midpoints (common practice for graph labels, no source). Returned with its power of ten, so ticks can be built
 * as exact decimals.
 * @throws UsageError when span or count is not positive and finite.
 */
export function niceStep(span: number, count: number): { step: number; mantissa: number; exponent: number } {
  if (!(span > 0 && Number.isFinite(span) && count > 0 && Number.isFinite(count))) {
    throw new UsageError(`Tick span ${span} and count ${count} when expected positive finite numbers.`);
  }
  const raw = span / count;
  let exponent = Math.floor(Math.log10(raw));
  const r = raw / 10 ** exponent;
  let mantissa = r < Math.SQRT2 ? 1 : r < Math.sqrt(10) ? 2 : r < Math.sqrt(50) ? 5 : 10;
  if (mantissa === 10) {
    mantissa = 1;
    exponent += 1;
  }
  return { step: Number(`${mantissa}e${exponent}`), mantissa, exponent };
}

/** The value i * mantissa * 10^exponent written as an exact decimal, then parsed. */
function decimal(i: number, mantissa: number, exponent: number): number {
  return Number(`${i * mantissa}e${exponent}`);
}

/** A linear tick label: the tick's exact decimal, shortest form ("0.2", "1", "20"); an exponent beyond 1e6. */
function linearLabel(value: number): string {
  const magnitude = Math.abs(value);
  if (value !== 0 && (magnitude >= 1e6 || magnitude < 1e-4)) return formatValue(value, 6);
  return String(value);
}

/**
 * About `count` labelled ticks at multiples of a nice step inside [lo, hi] (ends included within a
 * relative 1e-9 of the step). A degenerate range lo = hi is widened to lo -/+ (|lo| / 2 or 1).
 * @throws UsageError when lo or hi is not finite or lo > hi.
 */
export function linearTicks(lo: number, hi: number, count = 5): Tick[] {
  if (!(Number.isFinite(lo) && Number.isFinite(hi) && lo <= hi)) {
    throw new UsageError(`Axis range [${lo}, ${hi}] when expected finite numbers with lo <= hi.`);
  }
  if (lo === hi) {
    const pad = lo === 0 ? 1 : Math.abs(lo) / 2;
    lo -= pad;
    hi += pad;
  }
  const { step, mantissa, exponent } = niceStep(hi - lo, count);
  const first = Math.ceil(lo / step - END_SLACK);
  const last = Math.floor(hi / step + END_SLACK);
  const ticks: Tick[] = [];
  for (let i = first; i <= last; i++) {
    const value = decimal(i, mantissa, exponent);
    ticks.push({ value, label: linearLabel(value), major: true });
  }
  return ticks;
}

/**
 * The range [lo, hi] widened outwards to multiples of the nice step for about `count` ticks,
 * e.g. [0.13, 9.2] -> [0, 10]. Same degenerate-range rule as linearTicks.
 */
export function niceDomain(lo: number, hi: number, count = 5): [number, number] {
  if (lo === hi) {
    const pad = lo === 0 ? 1 : Math.abs(lo) / 2;
    lo -= pad;
    hi += pad;
  }
  const { step, mantissa, exponent } = niceStep(hi - lo, count);
  return [decimal(Math.floor(lo / step + END_SLACK), mantissa, exponent), decimal(Math.ceil(hi / step - END_SLACK), mantissa, exponent)];
}

/**
 * Ticks of a logarithmic axis over [lo, hi], lo > 0:
 * - labelled majors at the powers of ten inside the range (every k-th power when it spans more
 *   than 6 decades, k = ceil(decades / 6));
 * - when the range spans fewer than 3 decades, 2 and 5 times each power are labelled too, and the
 *   other integer multiples (3, 4, 6, 7, 8, 9) are unlabelled minor ticks; up to 6 decades only
 *   the minor ticks 2..9 are added;
 * - when that leaves fewer than two labelled ticks (a range inside one decade such as [1.2, 1.8]),
 *   the linear nice ticks of [lo, hi] are used instead.
 * @throws UsageError when lo is not positive, hi is not finite or lo > hi.
 */
export function logTicks(lo: number, hi: number): Tick[] {
  if (!(lo > 0 && Number.isFinite(hi) && lo <= hi)) {
    throw new UsageError(`Log axis range [${lo}, ${hi}] when expected 0 < lo <= hi, finite.`);
  }
  const decades = Math.log10(hi / lo);
  const k0 = Math.floor(Math.log10(lo)) - 1;
  const k1 = Math.ceil(Math.log10(hi)) + 1;
  const stride = decades > 6 ? Math.ceil(decades / 6) : 1;
  const inside = (v: number): boolean => v >= lo * (1 - END_SLACK) && v <= hi * (1 + END_SLACK);
  const ticks: Tick[] = [];
  for (let k = k0; k <= k1; k++) {
    const power = Number(`1e${k}`);
    if (((k % stride) + stride) % stride === 0 && inside(power)) ticks.push({ value: power, label: formatValue(power, 1), major: true });
    if (decades > 6) continue;
    for (let m = 2; m <= 9; m++) {
      const value = Number(`${m}e${k}`);
      if (!inside(value)) continue;
      const labelled = decades < 3 && (m === 2 || m === 5);
      ticks.push({ value, label: labelled ? formatValue(value, 1) : '', major: labelled });
    }
  }
  if (ticks.filter((tick) => tick.label !== '').length < 2) return linearTicks(lo, hi);
  return ticks;
}
