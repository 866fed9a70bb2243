// render tests: malformed drawings and options are refused once, by error class.

import { describe, expect, it } from 'vitest';
import { renderClusterSvg } from '../../src/render/svg.ts';
import { checkDrawing } from '../../src/render/types.ts';
import { UsageError } from '../../src/errors.ts';
import { doubleBubble } from './fixtures.ts';

describe('checkDrawing', () => {
  const { drawing } = doubleBubble(0);

  it('checkDrawing refuses arrays of the wrong length with a UsageError', () => {
    expect(() => checkDrawing({ ...drawing, coords: new Float64Array(3) })).toThrow(UsageError);
    expect(() => checkDrawing({ ...drawing, bulges: new Float64Array(2) })).toThrow(UsageError);
    expect(() => checkDrawing({ ...drawing, areas: new Float64Array(3) })).toThrow(UsageError);
    expect(() => checkDrawing({ ...drawing, pressures: new Float64Array(1) })).toThrow(UsageError);
  });

  it('checkDrawing refuses non-finite coordinates, bulges outside (-pi, pi) and non-positive areas with a UsageError', () => {
    expect(() => checkDrawing({ ...drawing, coords: Float64Array.of(0, Number.NaN, 0, -1) })).toThrow(UsageError);
    expect(() => checkDrawing({ ...drawing, bulges: Float64Array.of(Math.PI, 0, 0) })).toThrow(UsageError);
    expect(() => checkDrawing({ ...drawing, bulges: Float64Array.of(-4, 0, 0) })).toThrow(UsageError);
    expect(() => checkDrawing({ ...drawing, areas: Float64Array.of(1, 0) })).toThrow(UsageError);
    expect(() => checkDrawing({ ...drawing, areas: Float64Array.of(1, Number.POSITIVE_INFINITY) })).toThrow(UsageError);
    expect(() => checkDrawing({ ...drawing, pressures: Float64Array.of(1, Number.NaN) })).toThrow(UsageError);
  });

  it('checkDrawing messages say what was found and what was expected, on one line ending with a period', () => {
    expect(() => checkDrawing({ ...drawing, bulges: new Float64Array(2) })).toThrow(/^Drawing has 2 bulges when expected 3 \(1 per wall\)\.$/);
  });
});

describe('renderClusterSvg', () => {
  it('renderClusterSvg checks the drawing and its options before drawing', () => {
    const { drawing } = doubleBubble(0);
    expect(() => renderClusterSvg({ ...drawing, areas: new Float64Array(1) })).toThrow(UsageError);
    expect(() => renderClusterSvg(drawing, { sizePx: 0 })).toThrow(UsageError);
    expect(() => renderClusterSvg(drawing, { marginPx: -1 })).toThrow(UsageError);
    expect(() => renderClusterSvg(drawing, { digits: 20 })).toThrow(UsageError);
  });
});
