// render tests: renderPathPlot and bandsFromSamples on a small synthetic path (invented demo data).

import { describe, expect, it } from 'vitest';
import { bandsFromSamples, renderPathPlot } from '../../src/render/plot.ts';
import type { PathPlotOptions, PathSeries } from '../../src/render/plot.ts';
import { UsageError } from '../../src/errors.ts';
import { doubleBubble, singleBubble, tripleBubble } from './fixtures.ts';
import { expectSnapshot } from './snapshot.ts';

/**
 * A demo path, invented: three arrangements along t = 0.1 .. 10 (log spaced, 21 samples); 'a' wins
 * in the middle, 'b' at both ends, 'c' exists only for t <= 2 and never wins.
 */
function demo(): PathPlotOptions {
  const xs = Array.from({ length: 21 }, (_, i) => 0.1 * 100 ** (i / 20));
  const series: PathSeries[] = [
    { key: 'a', label: 'standard', perimeters: xs.map((t) => 10 + 0.3 * Math.log(t) ** 2), drawing: tripleBubble(1).drawing },
    { key: 'b', label: 'chain', perimeters: xs.map((t) => 10.4 + 0.01 * Math.log(t)), drawing: doubleBubble(0.3).drawing },
    { key: 'c', label: 'lens', perimeters: xs.map((t) => (t <= 2 ? 10.9 + 0.1 * Math.log(t) ** 2 : null)), drawing: singleBubble(1) },
  ];
  return { xs, series, logX: true, parameter: 't', title: 'demo path', events: [{ x: 2.2, label: 'lens ends' }] };
}

describe('bandsFromSamples', () => {
  it('bandsFromSamples splits at the midpoints between samples where the least perimeter changes series', () => {
    // hand-computed: winners a, a, b, b; the boundary is the midpoint 2.5 (sqrt 6 on a log axis)
    const xs = [1, 2, 3, 4];
    const series: PathSeries[] = [
      { key: 'a', label: 'a', perimeters: [1, 1, 3, 3] },
      { key: 'b', label: 'b', perimeters: [2, 2, 2, null] },
      { key: 'c', label: 'c', perimeters: [null, null, null, 2.5] },
    ];
    expect(bandsFromSamples(xs, series)).toEqual([
      { from: 1, to: 2.5, key: 'a' },
      { from: 2.5, to: 3.5, key: 'b' },
      { from: 3.5, to: 4, key: 'c' },
    ]);
    expect(bandsFromSamples(xs, series, true)[0].to).toBeCloseTo(Math.sqrt(6), 15);
  });

  it('bandsFromSamples leaves samples without any perimeter out of every band', () => {
    const bands = bandsFromSamples([0, 1, 2], [{ key: 'a', label: 'a', perimeters: [1, null, 1] }]);
    expect(bands).toEqual([
      { from: 0, to: 0.5, key: 'a' },
      { from: 1.5, to: 2, key: 'a' },
    ]);
  });
});

describe('renderPathPlot', () => {
  it('renderPathPlot shades one band per winner run and marks each change of winner', () => {
    const svg = renderPathPlot(demo());
    const bands = svg.slice(svg.indexOf('<g class="bands">'), svg.indexOf('</g>\n<g class="y-axis"'));
    // winners b, a, b along the path: three bands, two transitions, a drawing above each band
    expect(bands.match(/<rect /g)).toHaveLength(3);
    expect(bands.match(/class="thumbnail"/g)).toHaveLength(3);
    expect(svg.match(/stroke-dasharray="5 3"/g)).toHaveLength(2);
    expect(svg.match(/stroke-dasharray="1.5 2.5"/g)).toHaveLength(1);
    expect(svg).toContain('>lens ends</text>');
  });

  it('renderPathPlot breaks a series where it has no perimeter and puts every winner on the zero line', () => {
    const options = demo();
    const svg = renderPathPlot(options);
    const group = (k: number): string => svg.slice(svg.indexOf(`<g class="series-${k}"`), svg.indexOf('</g>', svg.indexOf(`<g class="series-${k}"`)));
    expect(group(2).match(/<polyline /g)).toHaveLength(1);
    expect(group(0).match(/<polyline /g)).toHaveLength(1);
    // the y axis: 0 at the plot's bottom (height 460 - 52 = 408)
    const zeros = [...group(0).matchAll(/<circle cx="[^"]+" cy="([^"]+)"/g)].filter((m) => m[1] === '408');
    expect(zeros.length).toBeGreaterThan(0);
  });

  it('renderPathPlot places a point at its excess over the winner in percent', () => {
    // two series, the second 5 % above the first everywhere: y = 5 on a 0..5 axis (nice ceiling of 5) = the plot top
    const svg = renderPathPlot({
      xs: [1, 2],
      series: [
        { key: 'a', label: 'a', perimeters: [2, 4] },
        { key: 'b', label: 'b', perimeters: [2.1, 4.2] },
      ],
    });
    const plotTop = 10 + 56 + 22;
    expect(svg).toContain(`points="70,${plotTop} 540,${plotTop}"`);
    expect(svg).toContain('>5</text>');
  });

  it('renderPathPlot writes a log axis with ticks at powers of ten and 2, 5 between', () => {
    const svg = renderPathPlot(demo());
    const axis = svg.slice(svg.indexOf('<g class="x-axis"'), svg.indexOf('</g>', svg.indexOf('<g class="x-axis"')));
    const labels = [...axis.matchAll(/<text x="[^"]+" y="[^"]+">([^<]+)<\/text>/g)].map((m) => m[1]);
    expect(labels).toEqual(['0.1', '0.2', '0.5', '1', '2', '5', '10']);
  });

  it('renderPathPlot refuses inconsistent input with UsageError', () => {
    const base = demo();
    expect(() => renderPathPlot({ ...base, xs: [1] , series: [] })).toThrow(UsageError);
    expect(() => renderPathPlot({ ...base, xs: base.xs.length === 21 ? [...Array.from(base.xs)].reverse() : base.xs })).toThrow(UsageError);
    expect(() => renderPathPlot({ ...base, series: [{ key: 'a', label: 'a', perimeters: [1, 2] }] })).toThrow(UsageError);
    expect(() => renderPathPlot({ ...base, bands: [{ from: 0.1, to: 1, key: 'zz' }] })).toThrow(UsageError);
    expect(() => renderPathPlot({ ...base, series: [{ key: 'a', label: 'a', perimeters: Array.from(base.xs, () => -1) }] })).toThrow(UsageError);
  });

  it('renderPathPlot(demo path) matches its snapshot', () => {
    expectSnapshot('path-plot', renderPathPlot(demo()));
  });
});
