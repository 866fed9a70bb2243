// render stage: how numbers and text are written into SVG; every number is rounded here and only here.

import { UsageError } from '../errors.ts';

/**
 * Write x rounded to `digits` decimals, with no trailing zeros and no negative zero
 * ("1.5", not "1.500"; "0", not "-0"). Same input, same string, on every platform.
 */
export function fixed(x: number, digits: number): string {
  const k = 10 ** digits;
  const r = Math.round(x * k) / k;
  // Is it a negative zero after rounding? Write it as 0.
  return r === 0 ? '0' : String(r);
}

/**
 * Check a digits count for fixed().
 * @throws UsageError when digits is not an integer in 0..15.
 */
export function checkDigits(digits: number): number {
  if (!(Number.isInteger(digits) && digits >= 0 && digits <= 15)) {
    throw new UsageError(`Digits is ${digits} when expected an integer in 0..15.`);
  }
  return digits;
}

/**
 * A value for a label or a table, to `significant` significant digits with trailing zeros removed
 * (kept when `trailingZeros`, so a column of values lines up): 1 -> "1", 0.5 -> "0.5",
 * 2.71828 -> "2.718"; very large or small magnitudes use an exponent ("1.5e-5"), never digits the
 * value does not have. Non-finite values are written as "n/a".
 */
export function formatValue(x: number, significant = 4, trailingZeros = false): string {
  if (!Number.isFinite(x)) return 'n/a';
  if (x === 0) return '0';
  const strip = trailingZeros ? (text: string) => text : stripZeros;
  const magnitude = Math.abs(x);
  if (magnitude >= 1e6 || magnitude < 1e-4) {
    const [mantissa, exponent] = x.toExponential(significant - 1).split('e');
    return `${strip(mantissa)}e${Number(exponent)}`;
  }
  const decimals = Math.max(0, significant - 1 - Math.floor(Math.log10(magnitude)));
  return strip(x.toFixed(decimals));
}

/** Remove trailing zeros after a decimal point ("1.500" -> "1.5", "2.000" -> "2"). */
function stripZeros(text: string): string {
  if (!text.includes('.')) return text;
  const trimmed = text.replace(/0+$/, '').replace(/\.$/, '');
  return trimmed === '-0' ? '0' : trimmed;
}

/** Escape text for SVG character data and attribute values. */
export function escapeXml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/** A count and its noun, the noun with an "s" unless the count is 1: "1 start", "3 starts". */
export function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}
