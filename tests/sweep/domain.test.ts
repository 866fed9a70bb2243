// sweep stage: parameter ranges, their samples, the triangle's neighbours, and the refusal of bad areas before any work.
import { describe, expect, it } from 'vitest';
import {
  checkFormulasOnDomain, domainSamples, parseShares, parseVary, rangeSamples,
} from '../../src/sweep/domain.ts';
import { parseAreaFormulas } from '../../src/sweep/formula.ts';
import { sampleNeighbours } from '../../src/sweep/region.ts';
import { triangleSamples } from '../../src/render/plot.ts';
import { FormulaError, UsageError } from '../../src/errors.ts';

describe('parseVary', () => {
  it('parseVary reads one or two named ranges', () => {
    expect(parseVary('t=0.1:10')).toEqual([{ name: 't', from: 0.1, to: 10 }]);
    expect(parseVary('s=0.5:2, t=1e-1:3')).toEqual([{ name: 's', from: 0.5, to: 2 }, { name: 't', from: 0.1, to: 3 }]);
  });

  it('parseVary refuses reversed ranges, bad names, three parameters and repeats', () => {
    for (const text of ['t=2:1', 't=1:x', 'pi=1:2', 'sqrt=1:2', '2t=1:2', 'a=1:2,b=1:2,c=1:2', 't=1:2,t=2:3', 't']) {
      expect(() => parseVary(text), text).toThrow(UsageError);
    }
  });
});

describe('parseShares', () => {
  it('parseShares reads three names and a positive total', () => {
    expect(parseShares('a,b,c=3')).toEqual({ shares: ['a', 'b', 'c'], total: 3 });
    for (const text of ['a,b=3', 'a,b,c=0', 'a,a,c=1', 'a,b,c']) expect(() => parseShares(text), text).toThrow(UsageError);
  });
});

describe('rangeSamples', () => {
  it('rangeSamples hits both ends exactly and spaces log samples geometrically', () => {
    const xs = rangeSamples({ name: 't', from: 0.05, to: 20 }, 100, true);
    expect(xs[0]).toBe(0.05);
    expect(xs[99]).toBe(20);
    // equal ratios: (20 / 0.05)^(1/99) (geometric sequence)
    const ratio = Math.pow(400, 1 / 99);
    for (let i = 1; i < 99; i++) expect(xs[i] / xs[i - 1]).toBeCloseTo(ratio, 12);
    expect(() => rangeSamples({ name: 't', from: 0, to: 1 }, 5, true)).toThrow(UsageError);
  });
});

describe('domainSamples', () => {
  it('domainSamples of a triangle are the region map centroids scaled to the total', () => {
    const points = domainSamples({ kind: 'triangle', shares: ['a', 'b', 'c'], total: 3, divisions: 5 });
    const w = triangleSamples(5);
    expect(points.count).toBe(25);
    for (let k = 0; k < w.length; k++) expect(points.values[k]).toBeCloseTo(3 * w[k], 14);
    for (let k = 0; k < 25; k++) expect(points.values[3 * k] + points.values[3 * k + 1] + points.values[3 * k + 2]).toBeCloseTo(3, 13);
  });
});

describe('sampleNeighbours', () => {
  it('sampleNeighbours of a triangle of m divisions has the 3m(m-1)/2 inner edges, each seen from both sides', () => {
    // a triangle cut into m^2 small triangles has 3m(m+1)/2 edges, 3m of them on the rim (elementary counting, no source)
    for (const m of [1, 2, 5, 8]) {
      const nb = sampleNeighbours({ kind: 'triangle', shares: ['a', 'b', 'c'], total: 1, divisions: m });
      expect(nb).toHaveLength(m * m);
      let links = 0;
      nb.forEach((list, k) => {
        for (const j of list) expect(nb[j]).toContain(k);
        links += list.length;
      });
      expect(links / 2).toBe((3 * m * (m - 1)) / 2);
    }
  });

  it('sampleNeighbours of an s x s grid has the 2s(s-1) lattice edges', () => {
    const nb = sampleNeighbours({ kind: 'grid', parameters: [{ name: 's', from: 0, to: 1 }, { name: 't', from: 0, to: 1 }], samples: 6, log: false });
    expect(nb.reduce((p, l) => p + l.length, 0) / 2).toBe(2 * 6 * 5);
  });
});

describe('checkFormulasOnDomain', () => {
  const path = (from: number, to: number) => ({ kind: 'path' as const, parameter: { name: 't', from, to }, samples: 7, log: false });

  it('checkFormulasOnDomain refuses a non-positive area at a range end, naming the value and the parameter', () => {
    const f = parseAreaFormulas('1, 1, t - 1', ['t']);
    expect(() => checkFormulasOnDomain(f, path(0.5, 2))).toThrow(FormulaError);
    expect(() => checkFormulasOnDomain(f, path(0.5, 2))).toThrow(/^Area 3 "t - 1" is -0\.5 at t = 0\.5 when expected a positive finite area\.$/);
  });

  it('checkFormulasOnDomain refuses a non-positive area inside the range (at a sample)', () => {
    // (t - 1)^2 vanishes at t = 1, the middle sample of 0:2 with 7 samples
    const f = parseAreaFormulas('1, (t - 1)^2 ', ['t']);
    expect(() => checkFormulasOnDomain(f, path(0, 2))).toThrow(/ is 0 at t = 1 /);
  });

  it('checkFormulasOnDomain refuses an area with no real value and an infinite one', () => {
    expect(() => checkFormulasOnDomain(parseAreaFormulas('1, sqrt(t - 2)', ['t']), path(1, 3))).toThrow(/ is NaN at t = 1 /);
    expect(() => checkFormulasOnDomain(parseAreaFormulas('1, 1 / t', ['t']), path(0, 1))).toThrow(/ is Infinity at t = 0 /);
  });

  it('checkFormulasOnDomain accepts positive areas on a grid, corners included', () => {
    const f = parseAreaFormulas('1, s, t', ['s', 't']);
    const grid = { kind: 'grid' as const, parameters: [{ name: 's', from: 0.5, to: 2 }, { name: 't', from: 0.5, to: 2 }] as const, samples: 3, log: true };
    expect(() => checkFormulasOnDomain(f, grid)).not.toThrow();
    const bad = { ...grid, parameters: [{ name: 's', from: -1, to: 2 }, grid.parameters[1]] as const, log: false };
    expect(() => checkFormulasOnDomain(f, bad)).toThrow(FormulaError);
  });
});
