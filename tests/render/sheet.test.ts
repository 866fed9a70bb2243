// render tests: renderContactSheet layout, captions and snapshot.

import { describe, expect, it } from 'vitest';
import { renderContactSheet } from '../../src/render/sheet.ts';
import type { SheetItem } from '../../src/render/sheet.ts';
import { UsageError } from '../../src/errors.ts';
import { doubleBubble, singleBubble, tripleBubble } from './fixtures.ts';
import { expectSnapshot } from './snapshot.ts';

/**
 * Three cells of area 1 drawn three ways, with closed-form perimeters: the triple bubble
 * 3r (1 + pi sqrt(3) / 2) (fixtures.ts), the double bubble of cells 1 and 2 (design §6 formula,
 * area 1 each), and the circle of area 1, 2 sqrt(pi) (isoperimetric inequality, design §6).
 */
function items(): SheetItem[] {
  const triple = tripleBubble(1);
  const k = (2 * Math.PI) / 3 + Math.sqrt(3) / 4;
  return [
    { drawing: triple.drawing, rank: 1, id: 'K4', perimeter: 3 * triple.r * (1 + (Math.PI * Math.sqrt(3)) / 2) },
    { drawing: doubleBubble(0).drawing, rank: 2, id: 'theta', perimeter: ((8 * Math.PI) / 3 + Math.sqrt(3)) * Math.sqrt(1 / k) },
    { drawing: singleBubble(1), rank: 3, id: 'circle', perimeter: 2 * Math.sqrt(Math.PI), note: 'n = 1' },
    { drawing: { ...doubleBubble(0.3).drawing, title: 'unequal', caption: 'from the drawing' } },
  ];
}

describe('renderContactSheet', () => {
  it('renderContactSheet lays out one tile per item in rows of `columns`, with rank, id and perimeter captions', () => {
    const svg = renderContactSheet(items(), { columns: 3, tilePx: 150, gapPx: 10 });
    expect(svg.match(/<g class="tile"/g)).toHaveLength(4);
    expect(svg).toContain('>#1  K4</text>');
    // 2 sqrt(pi) = 3.5449077... to 7 significant digits
    expect(svg).toContain('>P = 3.544908  n = 1</text>');
    expect(svg).toContain('>unequal</text>');
    expect(svg).toContain('>from the drawing</text>');
    // two rows of three columns: width 10 + 3 (150 + 10); caption 2 lines of 1.3 * 12 px + 4
    expect(svg).toMatch(/^<svg xmlns="http:\/\/www.w3.org\/2000\/svg" width="490" height="(\d+(\.\d+)?)"/);
    const height = Number(/height="([\d.]+)"/.exec(svg)?.[1]);
    expect(height).toBeCloseTo(10 + 2 * (150 + 2 * 1.3 * 12 + 4 + 10), 6);
  });

  it('renderContactSheet draws every cluster at one common scale unless asked not to', () => {
    // with a common scale the circle of area 1 (diameter 1.128) is drawn smaller than its tile allows
    const radius = (svg: string): number => Number(/<path class="cell" data-cell="1" fill="[^"]+" d="M([\d.]+) /.exec(svg.slice(svg.indexOf('data-index="2"')))?.[1]);
    const common = renderContactSheet(items(), { tilePx: 150 });
    const own = renderContactSheet(items(), { tilePx: 150, commonScale: false });
    expect(radius(own)).toBeCloseTo((150 - 16) / 2, 6);
    expect(radius(common)).toBeLessThan(radius(own));
  });

  it('renderContactSheet marks a saddle: its own frame and a caption line saying so; the others unchanged', () => {
    // issue 11: a sheet may show saddles, marked as such (the geometry here is only a stand-in tile)
    const plain = renderContactSheet(items(), { columns: 2 });
    const marked = items();
    marked[1] = { ...marked[1], note: 'index 1', saddle: true };
    const svg = renderContactSheet(marked, { columns: 2 });
    expect(svg.match(/<g class="tile saddle"/g)).toHaveLength(1);
    expect(svg.match(/<g class="tile"/g)).toHaveLength(3);
    expect(svg).toMatch(/<g class="tile saddle" data-index="1">\n<rect [^>]*stroke-dasharray="8 4"/);
    expect(svg).toContain('>SADDLE (unstable)</text>');
    expect(plain).not.toContain('SADDLE');
    expect(plain).not.toContain('stroke-dasharray');
  });

  it('renderContactSheet refuses an empty list with a UsageError and bad columns with one too', () => {
    expect(() => renderContactSheet([])).toThrow(UsageError);
    expect(() => renderContactSheet(items(), { columns: 0 })).toThrow(UsageError);
  });

  it('renderContactSheet matches its snapshot', () => {
    expectSnapshot('contact-sheet', renderContactSheet(items(), { title: 'cells of area 1, best first', columns: 2 }));
  });
});
