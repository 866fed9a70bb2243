// render tests: cell areas, centroids, inside tests, label points and drawing extents.

import { describe, expect, it } from 'vitest';
import { cellContains, cellMoments, drawingBounds, labelPoint } from '../../src/render/cell-shape.ts';
import { thetaMap } from '../../src/maps/cubic-map.ts';
import type { ClusterDrawing } from '../../src/render/types.ts';
import { doubleBubble, lensInWall, singleBubble, tripleBubble } from './fixtures.ts';
import { cellPolygon, mulberry32, polygonContains, polygonMoments } from './reference.ts';

/** A theta-map drawing whose right cell is a crescent: the middle wall bulges deep into it (not an equilibrium). */
function crescent(): ClusterDrawing {
  return { map: thetaMap(), coords: Float64Array.of(0, 1, 0, -1), bulges: Float64Array.of(2.8, -0.5, 2.7), areas: Float64Array.of(1, 1) };
}

const drawings: [string, ClusterDrawing][] = [
  ['equal double bubble', doubleBubble(0).drawing],
  ['unequal double bubble', doubleBubble(0.3).drawing],
  ['unequal double bubble, other side', doubleBubble(-0.5, 2).drawing],
  ['triple bubble', tripleBubble(1.5).drawing],
  ['crescent', crescent()],
  ['lens in the middle wall', lensInWall()],
];

describe('cellMoments', () => {
  it('cellMoments of the equal double bubble gives each cell the closed-form area A', () => {
    // reference: design §4-6 closed form, derived in fixtures.ts
    for (const area of [1, 0.01, 250]) {
      const { drawing } = doubleBubble(0, area);
      const walls = drawing.map.wallIndex();
      expect(cellMoments(drawing, walls, 1).area).toBeCloseTo(area, 12 - Math.max(0, Math.ceil(Math.log10(area))));
      expect(cellMoments(drawing, walls, 2).area / area).toBeCloseTo(1, 12);
    }
  });

  it('cellMoments of the unequal double bubble gives the classical segment-area differences', () => {
    // reference: fixtures.ts areas from R^2 (theta - sin theta) / 2 of each wall's segment
    const { drawing } = doubleBubble(0.3, 1);
    const walls = drawing.map.wallIndex();
    expect(cellMoments(drawing, walls, 1).area).toBeCloseTo(drawing.areas[0], 12);
    expect(cellMoments(drawing, walls, 2).area).toBeCloseTo(drawing.areas[1], 12);
    expect(drawing.areas[0]).toBeLessThan(drawing.areas[1]);
  });

  it('cellMoments of the symmetric triple bubble gives area A and the closed-form centroid distance', () => {
    // reference: cell = triangle (sqrt(3)/4) r^2, centroid r/3 from the centre, plus a half disc of
    // radius rho = r sqrt(3)/2 on the chord (at distance r/2), centroid 4 rho / (3 pi) beyond it
    const { drawing, r } = tripleBubble(1);
    const walls = drawing.map.wallIndex();
    const rho = (r * Math.sqrt(3)) / 2;
    const triangle = (Math.sqrt(3) / 4) * r * r;
    const half = (Math.PI * rho * rho) / 2;
    const distance = (triangle * (r / 3) + half * (r / 2 + (4 * rho) / (3 * Math.PI))) / (triangle + half);
    for (let f = 1; f <= 3; f++) {
      const m = cellMoments(drawing, walls, f);
      expect(m.area).toBeCloseTo(1, 12);
      expect(Math.hypot(m.cx, m.cy)).toBeCloseTo(distance, 12);
    }
  });

  it('cellMoments equals the shoelace moments of a dense polygon of the same cell', () => {
    // reference: each wall sampled on its own circle (reference.ts), 2000 chords per wall: the shoelace
    // area and centroid then differ from the exact ones by O(1/2000^2)
    for (const [, drawing] of drawings) {
      const walls = drawing.map.wallIndex();
      for (let f = 1; f < drawing.map.faceCount; f++) {
        const exact = cellMoments(drawing, walls, f);
        const ref = polygonMoments(cellPolygon(drawing, f));
        const scale = Math.sqrt(Math.abs(ref.area));
        expect(Math.abs(exact.area - ref.area) / Math.abs(ref.area)).toBeLessThan(1e-5);
        expect(Math.abs(exact.cx - ref.cx) / scale).toBeLessThan(1e-5);
        expect(Math.abs(exact.cy - ref.cy) / scale).toBeLessThan(1e-5);
      }
    }
  });
});

describe('cellContains', () => {
  it('cellContains agrees with point-in-polygon on a dense polygon of the cell, at random points', () => {
    const random = mulberry32(3);
    for (const [, drawing] of drawings) {
      const walls = drawing.map.wallIndex();
      const box = drawingBounds(drawing);
      for (let f = 1; f < drawing.map.faceCount; f++) {
        const polygon = cellPolygon(drawing, f, 4000);
        let inside = 0;
        for (let k = 0; k < 400; k++) {
          const x = box[0] + (box[2] - box[0]) * random();
          const y = box[1] + (box[3] - box[1]) * random();
          const expected = polygonContains(polygon, x, y);
          if (expected) inside++;
          expect(cellContains(drawing, walls, f, x, y)).toBe(expected);
        }
        expect(inside).toBeGreaterThan(0);
      }
    }
  });
});

describe('labelPoint', () => {
  it('labelPoint lies inside its cell, also for a crescent whose centroid is outside it', () => {
    for (const [, drawing] of drawings) {
      const walls = drawing.map.wallIndex();
      for (let f = 1; f < drawing.map.faceCount; f++) {
        const p = labelPoint(drawing, walls, f);
        expect(cellContains(drawing, walls, f, p.x, p.y)).toBe(true);
        expect(p.clearance).toBeGreaterThan(0);
      }
    }
    const drawing = crescent();
    const walls = drawing.map.wallIndex();
    const m = cellMoments(drawing, walls, 2);
    expect(cellContains(drawing, walls, 2, m.cx, m.cy)).toBe(false);
  });

  it('labelPoint of the equal double bubble is the centroid (symmetric, well inside)', () => {
    const { drawing } = doubleBubble(0);
    const walls = drawing.map.wallIndex();
    const m = cellMoments(drawing, walls, 1);
    const p = labelPoint(drawing, walls, 1);
    expect([p.x, p.y]).toEqual([m.cx, m.cy]);
    expect(p.x).toBeLessThan(0);
  });
});

describe('cellMoments of a lens', () => {
  it('cellMoments of a lens with 60-degree walls on a chord of length 2d is two segments of t = pi/3', () => {
    // reference: classical segment area R^2 (theta - sin theta) / 2 with theta = 2pi/3, R = 2d / sqrt 3
    const d = 0.35;
    const drawing = lensInWall(d);
    const r = (2 * d) / Math.sqrt(3);
    const theta = (2 * Math.PI) / 3;
    const m = cellMoments(drawing, drawing.map.wallIndex(), 3);
    expect(drawing.map.faceSize(3)).toBe(2);
    expect(m.area).toBeCloseTo(r * r * (theta - Math.sin(theta)), 14);
    expect(m.cx).toBeCloseTo(0, 14);
    expect(m.cy).toBeCloseTo(0, 14);
  });
});

describe('drawingBounds', () => {
  it('drawingBounds of the equal double bubble is [-sqrt3 s, -2s/sqrt3, sqrt3 s, 2s/sqrt3], wider than its junctions', () => {
    // reference: the right wall's circle has centre (s/sqrt3, 0) and radius 2s/sqrt3 (chord 2s, t = 2pi/3),
    // and the arc passes through its top, right and bottom points
    const { drawing, s } = doubleBubble(0);
    const box = Array.from(drawingBounds(drawing));
    const expected = [-Math.sqrt(3) * s, (-2 * s) / Math.sqrt(3), Math.sqrt(3) * s, (2 * s) / Math.sqrt(3)];
    box.forEach((v, k) => expect(v).toBeCloseTo(expected[k], 14));
  });

  it('drawingBounds of the triple bubble is the closed-form extent of its three semicircles', () => {
    // reference: semicircles of radius r sqrt3/2 centred at r/2 in directions 150, 270 and 30 degrees
    const { drawing, r } = tripleBubble(1);
    const box = Array.from(drawingBounds(drawing));
    const rho = (r * Math.sqrt(3)) / 2;
    const expected = [(-3 * Math.sqrt(3) * r) / 4, -r / 2 - rho, (3 * Math.sqrt(3) * r) / 4, r / 4 + rho];
    box.forEach((v, k) => expect(v).toBeCloseTo(expected[k], 14));
  });

  it('drawingBounds of the circle of area A is the square of half-side sqrt(A / pi)', () => {
    const r = Math.sqrt(3 / Math.PI);
    expect(Array.from(drawingBounds(singleBubble(3)))).toEqual([-r, -r, r, r]);
  });
});
