// render tests: renderRegionMap and triangleSamples on small hand-made winner patterns (invented demo data).

import { describe, expect, it } from 'vitest';
import { renderRegionMap } from '../../src/render/region-map.ts';
import { triangleSamples } from '../../src/sweep/triangle-grid.ts';
import type { RegionArrangement } from '../../src/render/region-map.ts';
import { UsageError } from '../../src/errors.ts';
import { doubleBubble, singleBubble, tripleBubble } from './fixtures.ts';
import { expectSnapshot } from './snapshot.ts';

const arrangements: RegionArrangement[] = [
  { key: 'k4', label: 'standard', drawing: tripleBubble(1).drawing },
  { key: 'theta', label: 'double', drawing: doubleBubble(0.3).drawing },
  { key: 'one', label: 'circle', drawing: singleBubble(1) },
];

describe('triangleSamples', () => {
  it('triangleSamples(2) gives the hand-computed centroids in row order', () => {
    // row 0: U(0,0), D(0,0), U(1,0); row 1: U(0,1); weights (1 - (i+j)/m, i/m, j/m) averaged over corners
    const expected = [2 / 3, 1 / 6, 1 / 6, 1 / 3, 1 / 3, 1 / 3, 1 / 6, 2 / 3, 1 / 6, 1 / 6, 1 / 6, 2 / 3];
    Array.from(triangleSamples(2)).forEach((w, k) => expect(w).toBeCloseTo(expected[k], 15));
  });

  it('triangleSamples(m) has m^2 samples whose weights sum to 1 and average to the centre', () => {
    // the m^2 small triangles have equal areas, so the mean of their centroids is the big triangle's centroid
    for (const m of [1, 3, 7]) {
      const w = triangleSamples(m);
      expect(w.length).toBe(3 * m * m);
      const mean = [0, 0, 0];
      for (let k = 0; k < m * m; k++) {
        expect(w[3 * k] + w[3 * k + 1] + w[3 * k + 2]).toBeCloseTo(1, 14);
        for (let q = 0; q < 3; q++) {
          expect(w[3 * k + q]).toBeGreaterThan(0);
          mean[q] += w[3 * k + q] / (m * m);
        }
      }
      mean.forEach((v) => expect(v).toBeCloseTo(1 / 3, 14));
    }
    expect(() => triangleSamples(0)).toThrow(UsageError);
  });
});

/** Winners on a 4 x 3 rectangle grid: left two columns 'k4', right two 'theta', the top right sample none. */
function rectangleWinners(): (string | null)[] {
  const winners: (string | null)[] = [];
  for (let j = 0; j < 3; j++) for (let i = 0; i < 4; i++) winners.push(j === 2 && i === 3 ? null : i < 2 ? 'k4' : 'theta');
  return winners;
}

describe('renderRegionMap', () => {
  it('renderRegionMap(rectangle) fills every sample, draws the winner boundaries and numbers each region once', () => {
    const svg = renderRegionMap({ grid: { kind: 'rectangle', xs: [1, 2, 3, 4], ys: [0.1, 1, 10], logY: true }, arrangements, winners: rectangleWinners() });
    expect(svg.match(/<polygon points=/g)).toHaveLength(12);
    const boundaries = /<path class="boundaries" d="([^"]*)"/.exec(svg)?.[1] ?? '';
    // hand count: 3 vertical edges between columns 2 and 3, plus 2 edges around the empty corner sample
    expect(boundaries.match(/M/g)).toHaveLength(5);
    const numbers = svg.slice(svg.indexOf('<g class="region-numbers"'), svg.indexOf('</g>', svg.indexOf('<g class="region-numbers"')));
    expect([...numbers.matchAll(/>(\d+)<\/text>/g)].map((m) => m[1]).sort()).toEqual(['1', '2']);
    expect(svg).toContain('>no certified winner</text>');
    expect(svg.match(/class="thumbnail"/g)).toHaveLength(3);
  });

  it('renderRegionMap(triangle) fills m^2 small triangles and draws no boundary where one arrangement wins everywhere', () => {
    const svg = renderRegionMap({ grid: { kind: 'triangle', divisions: 5 }, arrangements, winners: Array(25).fill('k4') });
    expect(svg.match(/<polygon points=/g)).toHaveLength(25 + 1);
    expect(svg).not.toContain('class="boundaries"');
    expect(svg).not.toContain('no certified winner');
    expect(svg).toContain('>a = 1</text>');
  });

  it('renderRegionMap refuses a wrong winner count, an unknown winner and repeated keys with a UsageError', () => {
    const grid = { kind: 'rectangle' as const, xs: [1, 2], ys: [1, 2] };
    expect(() => renderRegionMap({ grid, arrangements, winners: ['k4'] })).toThrow(UsageError);
    expect(() => renderRegionMap({ grid, arrangements, winners: ['k4', 'k4', 'k4', 'nope'] })).toThrow(UsageError);
    expect(() => renderRegionMap({ grid, arrangements: [...arrangements, arrangements[0]], winners: Array(4).fill('k4') })).toThrow(UsageError);
    expect(() => renderRegionMap({ grid: { ...grid, xs: [2, 1] }, arrangements, winners: Array(4).fill('k4') })).toThrow(UsageError);
  });

  it('renderRegionMap(rectangle) matches its snapshot', () => {
    // invented demo pattern on 12 x 8 samples: 'k4' below the line t = s, 'theta' above it, 'one' far up
    const xs = Array.from({ length: 12 }, (_, i) => 0.5 + 0.25 * i);
    const ys = Array.from({ length: 8 }, (_, j) => 0.5 * 1.4 ** j);
    const winners: (string | null)[] = [];
    for (const t of ys) for (const s of xs) winners.push(t > 4 ? (s > 3 ? null : 'one') : t < s ? 'k4' : 'theta');
    expectSnapshot('region-map', renderRegionMap({ grid: { kind: 'rectangle', xs, ys, logY: true }, arrangements, winners, title: 'demo region map' }));
  });

  it('renderRegionMap(triangle) matches its snapshot', () => {
    // invented demo pattern: the winner is the arrangement whose share is largest
    const m = 8;
    const w = triangleSamples(m);
    const keys = ['k4', 'theta', 'one'];
    const winners = Array.from({ length: m * m }, (_, k) => keys[[w[3 * k], w[3 * k + 1], w[3 * k + 2]].indexOf(Math.max(w[3 * k], w[3 * k + 1], w[3 * k + 2]))]);
    expectSnapshot('region-map-triangle', renderRegionMap({ grid: { kind: 'triangle', divisions: m, shareNames: ['a1', 'a2', 'a3'] }, arrangements, winners, title: 'demo triangle' }));
  });
});
