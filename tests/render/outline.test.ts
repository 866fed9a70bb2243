// render tests: traceCell and traceWalls drive any PathContext, flipping bulges on upper darts.

import { describe, expect, it } from 'vitest';
import { traceCell, traceWalls } from '../../src/render/outline.ts';
import type { PathContext } from '../../src/render/context.ts';
import { doubleBubble, singleBubble } from './fixtures.ts';

/** A PathContext that records its calls, rounded to 9 decimals. */
class Recorder implements PathContext {
  readonly calls: string[] = [];
  private r = (v: number): number => Math.round(v * 1e9) / 1e9 + 0;
  moveTo(x: number, y: number): void {
    this.calls.push(`M ${this.r(x)} ${this.r(y)}`);
  }
  lineTo(x: number, y: number): void {
    this.calls.push(`L ${this.r(x)} ${this.r(y)}`);
  }
  arcTo(x: number, y: number, radius: number, largeArc: boolean, sweep: boolean): void {
    this.calls.push(`A ${this.r(x)} ${this.r(y)} r=${this.r(radius)} large=${largeArc} sweep=${sweep}`);
  }
  closePath(): void {
    this.calls.push('Z');
  }
}

describe('traceCell', () => {
  it('traceCell walks the right cell of the double bubble: straight middle wall down, the outer wall back up as an upper dart', () => {
    // face 2 = darts {2, 3}: dart 2 is wall 2 (middle, straight) from J0 = (0, s) to J1 = (0, -s); dart 3 is
    // the upper dart of wall 0 (bulge +2pi/3 along dart 0), so it runs J1 -> J0 with bulge -2pi/3: a
    // major arc (2pi/3 > pi/2) turning counter-clockwise (sweep) with radius 2s / sqrt 3 (design §4)
    const { drawing, s } = doubleBubble(0, 1);
    const recorder = new Recorder();
    traceCell(drawing, 2, recorder);
    const r = (v: number): number => Math.round(v * 1e9) / 1e9 + 0;
    expect(recorder.calls).toEqual([`M 0 ${r(s)}`, `L 0 ${r(-s)}`, `A 0 ${r(s)} r=${r((2 * s) / Math.sqrt(3))} large=true sweep=true`, 'Z']);
  });

  it('traceCell without a context returns SVG path data, the same calls as text', () => {
    expect(traceCell(singleBubble(Math.PI), 1)).toBe('M1 0 A1 1 0 0 1 -1 0 A1 1 0 0 1 1 0 Z');
  });
});

describe('traceWalls', () => {
  it('traceWalls writes each wall once along its lower dart', () => {
    const { drawing } = doubleBubble(0.2, 1);
    const recorder = new Recorder();
    traceWalls(drawing, recorder);
    expect(recorder.calls.filter((c) => c.startsWith('M'))).toHaveLength(3);
    // wall 1 (the left arc, bulge 0.2 - 2pi/3 < 0, |t| > pi/2) is a major arc with sweep
    expect(recorder.calls[3]).toMatch(/large=true sweep=true$/);
    // wall 2 (the middle, bulge +0.2) is a minor arc without sweep
    expect(recorder.calls[5]).toMatch(/large=false sweep=false$/);
  });
});
