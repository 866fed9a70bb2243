// render tests: nice axis ticks on linear and logarithmic axes, against hand-computed lists.

import { UsageError } from '../../src/errors.ts';
import { describe, expect, it } from 'vitest';
import { linearTicks, logTicks, niceDomain, niceStep } from '../../src/render/ticks.ts';

const labels = (ticks: { label: string }[]): string[] => ticks.map((tick) => tick.label).filter((label) => label !== '');

describe('niceStep', () => {
  it('niceStep picks 1, 2 or 5 times a power of ten nearest to span / count on a log scale', () => {
    // common practice for graph labels (no source); thresholds at the geometric midpoints sqrt 2, sqrt 10, sqrt 50
    expect(niceStep(10, 10).step).toBe(1);
    expect(niceStep(14, 10).step).toBe(1);
    expect(niceStep(15, 10).step).toBe(2);
    expect(niceStep(31, 10).step).toBe(2);
    expect(niceStep(32, 10).step).toBe(5);
    expect(niceStep(70, 10).step).toBe(5);
    expect(niceStep(71, 10).step).toBe(10);
    expect(niceStep(0.003, 6).step).toBe(0.0005);
    expect(() => niceStep(0, 5)).toThrow(UsageError);
  });
});

describe('linearTicks', () => {
  it('linearTicks gives exact decimals at nice multiples inside the range', () => {
    expect(labels(linearTicks(0, 1))).toEqual(['0', '0.2', '0.4', '0.6', '0.8', '1']);
    expect(labels(linearTicks(0.13, 9.2))).toEqual(['2', '4', '6', '8']);
    expect(labels(linearTicks(-3.7, 12.1))).toEqual(['-2', '0', '2', '4', '6', '8', '10', '12']);
    expect(linearTicks(0.1, 0.3, 2).map((tick) => tick.value)).toEqual([0.1, 0.2, 0.3]);
  });

  it('linearTicks widens a single-point range and refuses a reversed one', () => {
    expect(labels(linearTicks(4, 4))).toEqual(['2', '3', '4', '5', '6']);
    expect(() => linearTicks(2, 1)).toThrow(UsageError);
    expect(() => linearTicks(Number.NaN, 1)).toThrow(UsageError);
  });
});

describe('niceDomain', () => {
  it('niceDomain widens a range outwards to nice multiples', () => {
    expect(niceDomain(0.13, 9.2)).toEqual([0, 10]);
    expect(niceDomain(0, 4.6, 5)).toEqual([0, 5]);
    expect(niceDomain(-0.31, 0.42, 4)).toEqual([-0.4, 0.6]);
  });
});

describe('logTicks', () => {
  it('logTicks labels powers of ten, and 2 and 5 between them when the range is short', () => {
    expect(labels(logTicks(0.1, 10))).toEqual(['0.1', '0.2', '0.5', '1', '2', '5', '10']);
    expect(labels(logTicks(0.05, 20))).toEqual(['0.05', '0.1', '0.2', '0.5', '1', '2', '5', '10', '20']);
    // three or more decades: powers of ten only, the other multiples as minor ticks
    const ticks = logTicks(1e-3, 1e3);
    expect(labels(ticks)).toEqual(['0.001', '0.01', '0.1', '1', '10', '100', '1000']);
    expect(ticks.filter((tick) => !tick.major)).toHaveLength(6 * 8);
  });

  it('logTicks thins the powers of ten beyond six decades and falls back to linear ticks inside one', () => {
    expect(labels(logTicks(1e-10, 1e5))).toEqual(['1e-9', '1e-6', '0.001', '1', '1000']);
    expect(labels(logTicks(1.2, 1.8))).toEqual(['1.2', '1.3', '1.4', '1.5', '1.6', '1.7', '1.8']);
    expect(() => logTicks(0, 1)).toThrow(UsageError);
  });
});
