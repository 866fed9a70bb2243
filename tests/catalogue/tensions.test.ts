// Rankings of typed cells (walls of different tension): by energy, recorded in the catalogue and read back.
import { describe, expect, it } from 'vitest';
import { rankAreas } from '../../src/catalogue/rank.ts';
import { readCatalogue, writeCatalogue } from '../../src/catalogue/format.ts';
import { cellTyping } from '../../src/solver/tensions.ts';
import type { CatalogueEntry } from '../../src/catalogue/types.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { CatalogueFormatError } from '../../src/errors.ts';

const key = (e: CatalogueEntry): string => `${e.code}|${e.assignment.join(',')}`;

describe('rankAreas with cell types and tensions', () => {
  it('rankAreas with every tension c ranks as with unit tension, each energy c times the perimeter', async () => {
    // source: design.md §8 (scaling all tensions by c scales the energy by c and leaves the shapes unchanged)
    const areas = [1, 1, 2, 2];
    const plain = await rankAreas(areas, { workers: 1 });
    const c = 1.7;
    const typing = cellTyping(['a', 'a', 'b', 'b'], [
      { a: 'a', b: 'a', value: c }, { a: 'a', b: 'b', value: c }, { a: 'b', b: 'b', value: c },
      { a: 'a', b: 'out', value: c }, { a: 'b', b: 'out', value: c },
    ], 4);
    const typed = await rankAreas(areas, { workers: 1, typing });
    const ranked = (cat: typeof plain) => cat.entries.filter((e) => e.rank !== null);
    // the same certified candidates in the same order (types a, b follow the two area values)
    expect(ranked(typed).map(key)).toEqual(ranked(plain).map(key));
    for (const [e, f] of ranked(typed).map((e, i) => [e, ranked(plain)[i]] as const)) {
      expect(Math.abs((e.energy as number) - c * (f.perimeter as number))).toBeLessThan(1e-9 * c * (f.perimeter as number));
      expect(Math.abs((e.perimeter as number) - (f.perimeter as number))).toBeLessThan(1e-9 * (f.perimeter as number));
    }
  });

  it('rankAreas scaled areas: every energy times sqrt(s)', async () => {
    // source: design.md §4 (lengths scale with the square root of the areas), so does sum s L
    const typing = cellTyping(['a', 'a', 'b'], [{ a: 'a', b: 'b', value: 1.3 }, { a: 'b', b: 'out', value: 0.8 }], 3);
    const one = await rankAreas([1, 1, 2], { workers: 1, typing });
    const four = await rankAreas([4, 4, 8], { workers: 1, typing });
    const best = (cat: typeof one) => cat.entries.filter((e) => e.rank !== null);
    expect(best(four).map(key)).toEqual(best(one).map(key));
    best(one).forEach((e, i) => {
      expect(Math.abs((best(four)[i].energy as number) - 2 * (e.energy as number))).toBeLessThan(1e-9 * (e.energy as number));
    });
  });

  it('rank by energy: with tension a:b = 1.3 the two b cells keep together in the winner; the catalogue records types and tensions and reads back', async () => {
    // source: the ranking's order is the energy's (design.md §8); round trip of the format
    const typing = cellTyping(['a', 'a', 'b', 'b'], [{ a: 'a', b: 'b', value: 1.3 }], 4);
    const cat = await rankAreas([1, 1, 2, 2], { workers: 1, typing });
    const certified = cat.entries.filter((e) => e.rank !== null);
    for (let i = 1; i < certified.length; i++) expect(certified[i].energy as number).toBeGreaterThanOrEqual((certified[i - 1].energy as number) * (1 - 1e-10));
    expect(cat.query.types).toEqual(['a', 'a', 'b', 'b']);
    expect(cat.query.tensions).toEqual({ 'a:b': 1.3 });
    // the winner's two b cells (the query's areas 2 and 3) share a wall: the costly a:b walls are fewest so
    const winner = certified[0];
    const map = clusterFromCode(winner.code).map;
    const [f, g] = [winner.assignment.indexOf(2) + 1, winner.assignment.indexOf(3) + 1];
    let touch = false;
    for (let e = 0; e < map.twins.length; e++) if (map.faceOf[e] === f && map.faceOf[map.twins[e]] === g) touch = true;
    expect(touch).toBe(true);
    const back = readCatalogue(writeCatalogue(cat));
    expect(back.query.types).toEqual(cat.query.types);
    expect(back.entries[0].energy).toBeCloseTo(certified[0].energy as number, 9);
  });

  it('readCatalogue refuses a typed catalogue whose energy or tensions do not match its geometry (CatalogueFormatError)', async () => {
    // source: the certificate's Neumann triangle and Laplace-Young law with tension (design.md §8)
    const typing = cellTyping(['a', 'b'], [{ a: 'a', b: 'b', value: 1.5 }], 2);
    const cat = await rankAreas([1, 2], { workers: 1, typing });
    const text = writeCatalogue(cat);
    expect(readCatalogue(text).entries[0].energy).toBeGreaterThan(0);
    expect(() => readCatalogue(text.replace('"energy":', '"energy":1e-3+'))).toThrow();
    const doc = JSON.parse(text);
    doc.entries[0].energy *= 1.01;
    expect(() => readCatalogue(JSON.stringify(doc))).toThrow(CatalogueFormatError);
    const other = JSON.parse(text);
    other.query.tensions = { 'a:b': 1.2 };
    expect(() => readCatalogue(JSON.stringify(other))).toThrow(CatalogueFormatError);
  });
});
