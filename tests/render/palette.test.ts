// render tests: the palettes stay apart under simulated colour-vision deficiencies and keep text legible.

import { describe, expect, it } from 'vitest';
import { CELL_FILLS, INK, SERIES_LINES, cellFill, tint } from '../../src/render/palette.ts';

/** sRGB '#rrggbb' to linear RGB (IEC 61966-2-1:1999 transfer function). */
function linear(colour: string): number[] {
  const v = Number.parseInt(colour.slice(1), 16);
  return [(v >> 16) & 255, (v >> 8) & 255, v & 255].map((c) => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  });
}

/** Linear sRGB to CIELAB under D65 (sRGB primaries matrix of IEC 61966-2-1; CIELAB of CIE 15:2004). */
function lab([r, g, b]: number[]): number[] {
  const x = (0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047;
  const y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
  const z = (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883;
  const f = (t: number): number => (t > (6 / 29) ** 3 ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29);
  return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}

/**
 * Severity-1 simulation matrices in linear RGB from "A physiologically-based model for simulation of
 * color vision deficiency", IEEE Trans. Visualization and Computer Graphics 15 (2009), values
 * quoted from memory (each row sums to 1, which they do).
 */
const VISIONS: [string, number[][]][] = [
  ['normal', [[1, 0, 0], [0, 1, 0], [0, 0, 1]]],
  ['protanopia', [[0.152286, 1.052583, -0.204868], [0.114503, 0.786281, 0.099216], [-0.003882, -0.048116, 1.051998]]],
  ['deuteranopia', [[0.367322, 0.860646, -0.227968], [0.280085, 0.672501, 0.047413], [-0.01182, 0.04294, 0.968881]]],
  ['tritanopia', [[1.255528, -0.076749, -0.178779], [-0.078411, 0.930809, 0.147602], [0.004733, 0.691367, 0.3039]]],
];

function seen(colour: string, m: number[][]): number[] {
  const c = linear(colour);
  return lab(m.map((row) => Math.min(1, Math.max(0, row[0] * c[0] + row[1] * c[1] + row[2] * c[2]))));
}

function leastDifference(colours: readonly string[], m: number[][]): number {
  let least = Infinity;
  for (let i = 0; i < colours.length; i++) {
    for (let j = i + 1; j < colours.length; j++) {
      const a = seen(colours[i], m);
      const b = seen(colours[j], m);
      least = Math.min(least, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]));
    }
  }
  return least;
}

/** WCAG 2.1 contrast ratio (W3C Recommendation, 2018, definition of relative luminance and contrast ratio). */
function contrast(a: string, b: string): number {
  const luminance = (colour: string): number => {
    const [r, g, bl] = linear(colour);
    return 0.2126 * r + 0.7152 * g + 0.0722 * bl;
  };
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('CELL_FILLS', () => {
  it('CELL_FILLS stay at least 10 CIELAB units apart with normal vision and each simulated dichromacy', () => {
    // 10 units: clearly distinguishable side by side (common practice, no source; about 2.3 is "just
    // noticeable"); the design reached 11.6 (deuteranopia) at worst
    for (const [, m] of VISIONS) expect(leastDifference(CELL_FILLS, m)).toBeGreaterThan(10);
  });

  it('CELL_FILLS keep the ink of labels at WCAG 2.1 text contrast 4.5:1 or more', () => {
    for (const fill of CELL_FILLS) expect(contrast(INK, fill)).toBeGreaterThanOrEqual(4.5);
  });

  it('cellFill(i) cycles through the palette by cell number', () => {
    expect(cellFill(1)).toBe(CELL_FILLS[0]);
    expect(cellFill(9)).toBe(CELL_FILLS[0]);
    expect(cellFill(3, ['#000000', '#ffffff'])).toBe('#000000');
  });
});

describe('SERIES_LINES', () => {
  it('SERIES_LINES stay at least 14 CIELAB units apart with normal vision and each simulated dichromacy', () => {
    // the design reached 15.4 (deuteranopia) at worst
    for (const [, m] of VISIONS) expect(leastDifference(SERIES_LINES, m)).toBeGreaterThan(14);
  });

  it('SERIES_LINES reach the WCAG 2.1 non-text contrast 3:1 on white and on their own band tint', () => {
    for (const line of SERIES_LINES) {
      expect(contrast(line, '#ffffff')).toBeGreaterThanOrEqual(3);
      expect(contrast(line, tint(line))).toBeGreaterThanOrEqual(3);
    }
  });

  it('tint(colour, share) mixes the colour over white channel by channel', () => {
    expect(tint('#000000', 0.5)).toBe('#808080');
    expect(tint('#ff0000', 0.2)).toBe('#ffcccc');
    expect(tint('#123456', 1)).toBe('#123456');
  });
});
