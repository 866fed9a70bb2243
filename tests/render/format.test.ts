// render tests: how numbers and text are written into SVG.

import { describe, expect, it } from 'vitest';
import { escapeXml, fixed, formatValue } from '../../src/render/format.ts';

describe('formatValue', () => {
  it('formatValue writes significant digits without trailing zeros, exponents for extreme magnitudes', () => {
    expect(formatValue(1)).toBe('1');
    expect(formatValue(0.5)).toBe('0.5');
    expect(formatValue(2.718281828)).toBe('2.718');
    expect(formatValue(1234.5678)).toBe('1235');
    expect(formatValue(-0.00012346)).toBe('-0.0001235');
    expect(formatValue(1.5e-5)).toBe('1.5e-5');
    expect(formatValue(2.5e7, 3)).toBe('2.5e7');
    expect(formatValue(0)).toBe('0');
    expect(formatValue(Number.NaN)).toBe('n/a');
  });
});

describe('fixed', () => {
  it('fixed rounds to the given decimals and writes the shortest form', () => {
    expect(fixed(0.1 + 0.2, 3)).toBe('0.3');
    expect(fixed(-1.23456, 2)).toBe('-1.23');
    expect(fixed(-0.004, 2)).toBe('0');
  });
});

describe('escapeXml', () => {
  it('escapeXml escapes the five XML special characters', () => {
    expect(escapeXml(`<a href="x">salt & pepper's</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;salt &amp; pepper&apos;s&lt;/a&gt;');
  });
});
