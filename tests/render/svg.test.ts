// render tests: renderClusterSvg on closed-form clusters, with text snapshots.

import { describe, expect, it } from 'vitest';
import { renderClusterSvg } from '../../src/render/svg.ts';
import type { ClusterDrawing } from '../../src/render/types.ts';
import { doubleBubble, lensInWall, singleBubble, tripleBubble } from './fixtures.ts';
import { expectSnapshot } from './snapshot.ts';
import { CELL_FILLS } from '../../src/render/palette.ts';

/** The d attributes of the cell paths and the walls path of a cluster SVG. */
function paths(svg: string): { cells: string[]; walls: string } {
  const cells = [...svg.matchAll(/<path class="cell" data-cell="\d+" fill="#[0-9a-f]{6}" d="([^"]*)"/g)].map((m) => m[1]);
  const walls = /<path class="walls"[^>]* d="([^"]*)"/.exec(svg);
  if (walls === null) throw new Error('No walls path.');
  return { cells, walls: walls[1] };
}

const count = (text: string, letter: string): number => text.split(letter).length - 1;

/** Equal double bubble with its closed-form pressures: p = 1/R of the outer walls, R = 2s/sqrt3 (Laplace-Young, design §5). */
function labelledDoubleBubble(): ClusterDrawing {
  const { drawing, s } = doubleBubble(0);
  const p = Math.sqrt(3) / (2 * s);
  return { ...drawing, pressures: Float64Array.of(p, p), title: 'double bubble', caption: 'two equal cells' };
}

describe('renderClusterSvg', () => {
  it('renderClusterSvg(equal double bubble) writes 3 walls (2 arcs, the straight middle wall as a line) and 2 filled cells', () => {
    // the middle wall of the equal double bubble is straight (design §6), the documented degenerate case of path.ts
    const { cells, walls } = paths(renderClusterSvg(doubleBubble(0).drawing));
    expect(cells).toHaveLength(2);
    expect(count(walls, 'M')).toBe(3);
    expect(count(walls, 'A')).toBe(2);
    expect(count(walls, 'L')).toBe(1);
    for (const d of cells) {
      expect(count(d, 'A') + count(d, 'L')).toBe(2);
      expect(d.endsWith('Z')).toBe(true);
    }
  });

  it('renderClusterSvg(unequal double bubble) writes exactly 3 walls as A commands and 2 filled cells', () => {
    const svg = renderClusterSvg(doubleBubble(0.3).drawing);
    const { cells, walls } = paths(svg);
    expect(cells).toHaveLength(2);
    expect(count(walls, 'M')).toBe(3);
    expect(count(walls, 'A')).toBe(3);
    expect(count(walls, 'L')).toBe(0);
    expect(svg).not.toContain('<polyline');
  });

  it('renderClusterSvg fits the view box to the arcs, not the junctions: 392 x 272 for the double bubble at 360 px', () => {
    // reference: extent 2 sqrt3 s by 4 s / sqrt3 (cell-shape.test.ts), so 360 px wide and 360 (2/3) = 240 px
    // high, plus 16 px margins; the junctions alone span 0 x 2s
    const svg = renderClusterSvg(doubleBubble(0).drawing, { sizePx: 360, marginPx: 16 });
    expect(svg).toContain('width="392" height="272" viewBox="-196 -136 392 272"');
  });

  it('renderClusterSvg uses a non-scaling stroke of the given pixel width', () => {
    const svg = renderClusterSvg(doubleBubble(0).drawing, { strokeWidthPx: 2.25 });
    expect(svg).toMatch(/<path class="walls"[^>]*stroke-width="2.25"[^>]*vector-effect="non-scaling-stroke"/);
  });

  it('renderClusterSvg labels each cell with its number and area, pressures and junction dots on request', () => {
    const plain = renderClusterSvg(labelledDoubleBubble());
    expect(plain).toContain('font-weight="bold">1</text>');
    expect(plain).toContain('font-weight="bold">2</text>');
    expect(count(plain, '>A = 1</text>')).toBe(2);
    expect(plain).not.toContain('p = ');
    expect(plain).not.toContain('class="junctions"');
    const full = renderClusterSvg(labelledDoubleBubble(), { pressures: true, junctions: true });
    // p = sqrt3 / (2s) = 1.58978... for unit cells, written to 4 significant digits
    expect(count(full, '>p = 1.59</text>')).toBe(2);
    expect(count(full, '<circle ')).toBe(2);
    expect(renderClusterSvg(labelledDoubleBubble(), { labels: false })).not.toContain('<text x');
  });

  it('renderClusterSvg shrinks the label of a small cell to its number when the full label cannot fit', () => {
    // at 200 px the lens of lensInWall (half-width d tan 30 deg = 0.2 of a 3.46-wide drawing) has about
    // 11.7 px of clearance: two label lines would need a font under 7 px, so it shows its number alone
    const svg = renderClusterSvg(lensInWall(), { sizePx: 200 });
    expect(svg).toContain('font-weight="bold">3</text>');
    expect(svg).not.toContain('>A = 0.2</text>');
    expect(count(svg, '>A = 3.27</text>')).toBe(2);
  });

  it('renderClusterSvg is deterministic: same input, same bytes, also from a copy', () => {
    const { drawing } = tripleBubble(1);
    const copy: ClusterDrawing = { ...drawing, coords: Float64Array.from(drawing.coords), bulges: Float64Array.from(drawing.bulges) };
    expect(renderClusterSvg(drawing, { junctions: true })).toBe(renderClusterSvg(copy, { junctions: true }));
  });

  it('renderClusterSvg(circle of area A) draws one cell as two half arcs of radius sqrt(A / pi)', () => {
    const { cells, walls } = paths(renderClusterSvg(singleBubble(Math.PI), { sizePx: 100 }));
    // radius 1 drawn at 100 px per 2 units: 50 px
    expect(cells).toEqual(['M50 0 A50 50 0 0 1 -50 0 A50 50 0 0 1 50 0 Z']);
    expect(walls).toBe(cells[0]);
  });

  it('renderClusterSvg escapes the title and caption', () => {
    const svg = renderClusterSvg({ ...doubleBubble(0).drawing, title: 'a<b & "c"', caption: "it's" });
    expect(svg).toContain('<title>a&lt;b &amp; &quot;c&quot;</title>');
    expect(svg).toContain('>it&apos;s</text>');
  });

  it('renderClusterSvg(double bubble) matches its snapshot', () => {
    expectSnapshot('double-bubble', renderClusterSvg(labelledDoubleBubble(), { pressures: true, junctions: true }));
  });

  it('renderClusterSvg(symmetric triple bubble) matches its snapshot', () => {
    // closed-form pressures: every cell p = 1/rho of its semicircle, rho = r sqrt3 / 2; the inner walls are straight
    const { drawing, r } = tripleBubble(1);
    const p = 2 / (r * Math.sqrt(3));
    const svg = renderClusterSvg({ ...drawing, pressures: Float64Array.of(p, p, p), title: 'triple bubble (K4)' }, { pressures: true, junctions: true });
    const { walls } = paths(svg);
    expect(count(walls, 'A')).toBe(3);
    expect(count(walls, 'L')).toBe(3);
    expectSnapshot('triple-bubble', svg);
  });

  it('renderClusterSvg of typed cells fills each cell by its type, writes the type in its label and, with tensions, labels every wall', () => {
    // the palette's rule: typed cells take their type's colour (type 1 the first), colour never the only cue
    const { drawing } = tripleBubble();
    const typed: ClusterDrawing = {
      ...drawing, cellTypes: [1, 2, 2], typeLabels: ['out', 'plain', 'dyed'], tensions: Float64Array.of(1, 1.3, 1, 1.3, 1, 1),
    };
    const svg = renderClusterSvg(typed, { tensions: true });
    const fills = [...svg.matchAll(/<path class="cell" data-cell="(\d+)" fill="(#[0-9a-f]{6})"/g)].map((m) => m[2]);
    expect(fills).toEqual([CELL_FILLS[0], CELL_FILLS[1], CELL_FILLS[1]]);
    expect(svg).toContain('>1 plain</text>');
    expect(svg).toContain('>3 dyed</text>');
    expect(count(svg, '>1.3</text>')).toBe(2);
    expect(count(renderClusterSvg(typed), '>1.3</text>')).toBe(0);
  });
});
