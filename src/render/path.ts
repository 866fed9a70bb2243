// render stage: SVG path data with fixed digits; the only place where arc flags are derived from bulges.

import { UsageError } from '../errors.ts';
import type { PathContext } from './context.ts';
import { checkDigits, fixed } from './format.ts';

/**
 * Bulges below this magnitude (radians) are drawn as straight segments: the documented degenerate
 * case of a wall of zero curvature (its radius would be c / (2 |sin t|) -> infinity).
 */
export const ZERO_BULGE = 1e-12;

/**
 * SVG arc flags of a wall with bulge t (the angle from chord to tangent at the start, positive to
 * the LEFT of the direction of travel, in a y-up frame):
 * - largeArc: the arc subtends more than 180 degrees, i.e. |t| > pi/2 (central angle 2|t|);
 * - sweep: the direction of increasing angle. A left bulge turns clockwise (the centre lies to
 *   the right of the tangent), so sweep = (t < 0).
 * Source for the flag meanings: "Elliptical arc implementation notes", appendix F.6, W3C SVG 1.1
 * Second Edition (2011).
 */
export function arcFlags(t: number): { largeArc: boolean; sweep: boolean } {
  return { largeArc: Math.abs(t) > Math.PI / 2, sweep: t < 0 };
}

/**
 * Emit one wall from (ax, ay), the current point, to (bx, by) with bulge t.
 * Is |t| below ZERO_BULGE (or the chord of zero length)? Line to (bx, by). Otherwise a circular arc
 * of radius c / (2 |sin t|) ("chord of a circle": c = 2 R sin(half the central angle), with central
 * angle 2|t|, tangent-chord angle theorem).
 */
export function wallTo(context: PathContext, ax: number, ay: number, bx: number, by: number, t: number): void {
  const c = Math.hypot(bx - ax, by - ay);
  if (Math.abs(t) < ZERO_BULGE || c === 0) {
    context.lineTo(bx, by);
    return;
  }
  const { largeArc, sweep } = arcFlags(t);
  context.arcTo(bx, by, c / (2 * Math.abs(Math.sin(t))), largeArc, sweep);
}

/**
 * Emit a whole circle of radius r about (cx, cy) as two half arcs (SVG draws nothing for an arc whose
 * end point equals its start), counter-clockwise in a y-up frame.
 */
export function circlePath(context: PathContext, cx: number, cy: number, r: number): void {
  context.moveTo(cx + r, cy);
  context.arcTo(cx - r, cy, r, false, true);
  context.arcTo(cx + r, cy, r, false, true);
  context.closePath();
}

/**
 * A PathContext that builds SVG path data ("d" attribute), every number rounded to `digits`
 * decimals when written. Commands are absolute (M, L, A, Z) and separated by single spaces.
 */
export class SvgPath implements PathContext {
  private readonly digits: number;
  private text = '';

  /** @throws UsageError when digits is not an integer in 0..15. */
  constructor(digits = 3) {
    this.digits = checkDigits(digits);
  }

  private n(x: number): string {
    return fixed(x, this.digits);
  }

  private push(command: string): void {
    this.text = this.text === '' ? command : `${this.text} ${command}`;
  }

  moveTo(x: number, y: number): void {
    this.push(`M${this.n(x)} ${this.n(y)}`);
  }

  lineTo(x: number, y: number): void {
    this.push(`L${this.n(x)} ${this.n(y)}`);
  }

  arcTo(x: number, y: number, radius: number, largeArc: boolean, sweep: boolean): void {
    const r = this.n(radius);
    this.push(`A${r} ${r} 0 ${largeArc ? 1 : 0} ${sweep ? 1 : 0} ${this.n(x)} ${this.n(y)}`);
  }

  closePath(): void {
    this.push('Z');
  }

  /** The path data written so far. */
  toString(): string {
    return this.text;
  }
}
