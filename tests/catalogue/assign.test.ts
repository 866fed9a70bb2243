// Assignments of areas to cells up to symmetry, against brute force over all permutations.
import { describe, expect, it } from 'vitest';
import { enumerateClusters, cellPermutations } from '../../src/maps/cluster.ts';
import { areaClasses, areasOf, labelledAssignmentCount, orbitAssignments, orbitCount, orbitRepresentative, typesOf } from '../../src/catalogue/assign.ts';

function* permutations(items: number[]): Generator<number[]> {
  if (items.length <= 1) {
    yield items;
    return;
  }
  for (let i = 0; i < items.length; i++) {
    const rest = [...items.slice(0, i), ...items.slice(i + 1)];
    for (const p of permutations(rest)) yield [items[i], ...p];
  }
}

describe('orbitAssignments', () => {
  const areaSets = [[1, 1, 1, 1, 1], [1, 2, 3, 4, 5], [1, 1, 2, 2, 3], [2.5, 1, 1, 1, 2.5]];
  it('orbitAssignments and orbitCount match the orbits found by brute force (all n! orders) for every 5-cell cluster', () => {
    for (const cluster of enumerateClusters(5)) {
      const group = cellPermutations(cluster);
      for (const areas of areaSets) {
        const classes = areaClasses(areas);
        const orbits = new Set<string>();
        for (const p of permutations(classes.classOf)) orbits.add(orbitRepresentative(Int32Array.from(p), group).join(','));
        const listed: string[] = [];
        for (const s of orbitAssignments(classes, group)) listed.push(s.join(',')); // the array is reused
        expect(new Set(listed)).toEqual(orbits);
        expect(listed.length).toBe(orbits.size);
        expect(orbitCount(classes, group)).toBe(orbits.size); // Burnside's lemma
      }
    }
  });

  it('labelledAssignmentCount is the multinomial n!/prod(m_k!) (closed form)', () => {
    expect(labelledAssignmentCount(areaClasses([1, 2, 3, 4, 5, 6]))).toBe(720);
    expect(labelledAssignmentCount(areaClasses([1, 1, 1, 2.5, 2.5]))).toBe(10);
    expect(labelledAssignmentCount(areaClasses([3, 3, 3, 3]))).toBe(1);
  });

  it('areaClasses(areas, types): cells of one type with equal areas are one class; orbits by brute force for every 5-cell cluster', () => {
    // source: brute force over all n! orders (the orbits of typed classes are those of the pairs (area, type))
    const typed: [number[], number[]][] = [[[1, 1, 1, 1, 1], [1, 1, 2, 2, 2]], [[1, 1, 2, 2, 2], [1, 2, 1, 1, 2]]];
    for (const [areas, types] of typed) {
      const classes = areaClasses(areas, types);
      const pairs = new Set(areas.map((a, i) => `${a}|${types[i]}`));
      expect(classes.values.length).toBe(pairs.size);
      for (const cluster of enumerateClusters(5)) {
        const group = cellPermutations(cluster);
        const orbits = new Set<string>();
        for (const p of permutations(classes.classOf)) orbits.add(orbitRepresentative(Int32Array.from(p), group).join(','));
        const listed: string[] = [];
        for (const s of orbitAssignments(classes, group)) {
          listed.push(s.join(','));
          // each cell gets an area and a type of one of the user's cells
          const cellAreas = areasOf(s, classes);
          const cellTypes = typesOf(s, classes);
          const got = [...cellAreas].map((a, i) => `${a}|${cellTypes[i]}`).sort();
          expect(got).toEqual(areas.map((a, i) => `${a}|${types[i]}`).sort());
        }
        expect(new Set(listed)).toEqual(orbits);
        expect(orbitCount(classes, group)).toBe(orbits.size);
      }
    }
    // untyped classes are today's: typesOf gives type 1 everywhere
    expect([...typesOf(Int32Array.of(0, 0), areaClasses([1, 1]))]).toEqual([1, 1]);
  });
});
