// render tests: exact arc extents and segment factors against independent references.

import { describe, expect, it } from 'vitest';
import { arcBoundsInto, emptyBox, segmentMomentFactor, wallDistance } from '../../src/render/arc-geometry.ts';
import { mulberry32, referenceCircle, sampleWall } from './reference.ts';

describe('arcBoundsInto', () => {
  it('arcBoundsInto(a, b, t) equals the extent of a dense sampling of the same circle, for minor and major arcs of both signs', () => {
    // reference: the wall's circle from referenceCircle (bisector and tangent normal), sampled every
    // sweep/20000 radians; the true extreme lies within R (1 - cos(step/2)) <= R step^2 / 8 of a sample
    const random = mulberry32(7);
    const bulges = [0.05, 0.6, Math.PI / 2, 1.9, 2.8, 3.1, -0.05, -0.6, -Math.PI / 2, -1.9, -2.8, -3.1];
    for (let trial = 0; trial < 8; trial++) {
      const ax = 4 * random() - 2;
      const ay = 4 * random() - 2;
      const bx = 4 * random() - 2;
      const by = 4 * random() - 2;
      for (const t of bulges) {
        const count = 20000;
        const points = sampleWall(ax, ay, bx, by, t, count);
        const ref = emptyBox();
        for (let k = 0; k < points.length; k += 2) {
          ref[0] = Math.min(ref[0], points[k]);
          ref[1] = Math.min(ref[1], points[k + 1]);
          ref[2] = Math.max(ref[2], points[k]);
          ref[3] = Math.max(ref[3], points[k + 1]);
        }
        const box = emptyBox();
        arcBoundsInto(ax, ay, bx, by, t, box);
        const { r } = referenceCircle(ax, ay, bx, by, t);
        const step = (2 * Math.abs(t)) / count;
        const slack = (r * step * step) / 8 + 1e-9 * (1 + r);
        // the box holds every sample and is no larger than the sampling error allows
        expect(box[0]).toBeLessThanOrEqual(ref[0] + 1e-9 * (1 + r));
        expect(box[1]).toBeLessThanOrEqual(ref[1] + 1e-9 * (1 + r));
        expect(box[2]).toBeGreaterThanOrEqual(ref[2] - 1e-9 * (1 + r));
        expect(box[3]).toBeGreaterThanOrEqual(ref[3] - 1e-9 * (1 + r));
        expect(ref[0] - box[0]).toBeLessThanOrEqual(slack);
        expect(ref[1] - box[1]).toBeLessThanOrEqual(slack);
        expect(box[2] - ref[2]).toBeLessThanOrEqual(slack);
        expect(box[3] - ref[3]).toBeLessThanOrEqual(slack);
      }
    }
  });

  it('arcBoundsInto of a straight wall is the box of its end points', () => {
    const box = emptyBox();
    arcBoundsInto(1, 2, -3, 5, 0, box);
    expect(Array.from(box)).toEqual([-3, 2, 1, 5]);
  });
});

describe('segmentMomentFactor', () => {
  it('segmentMomentFactor is continuous across its series switch and gives a semicircle its centroid 4R/(3 pi)', () => {
    // reference: semicircle centroid 4R/(3 pi) (standard table value): moment c^3/12 q = area * 4R/(3 pi)
    expect(segmentMomentFactor(Math.PI / 2)).toBeCloseTo(1, 14);
    expect(segmentMomentFactor(0.1 - 1e-12)).toBeCloseTo(segmentMomentFactor(0.1 + 1e-12), 12);
    expect(segmentMomentFactor(-0.3)).toBeCloseTo(segmentMomentFactor(0.3), 15);
    // near 0 the parabolic segment's centroid is at 2/5 of its height: q ~ t^2 / 5
    expect(segmentMomentFactor(1e-4) / 1e-8).toBeCloseTo(0.2, 8);
  });
});

describe('wallDistance', () => {
  it('wallDistance(p, wall) equals the least distance to a dense sampling of the wall', () => {
    const random = mulberry32(11);
    for (const t of [0.4, 2.2, -1.3, -2.9, 1e-9]) {
      const points = sampleWall(0, 0, 1, 0.5, t, 20000);
      for (let k = 0; k < 20; k++) {
        const px = 3 * random() - 1;
        const py = 3 * random() - 1.5;
        let best = Infinity;
        for (let q = 0; q < points.length; q += 2) best = Math.min(best, Math.hypot(px - points[q], py - points[q + 1]));
        expect(wallDistance(px, py, 0, 0, 1, 0.5, t)).toBeCloseTo(best, 5);
      }
    }
  });
});
