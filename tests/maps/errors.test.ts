// Bad codes and non-admissible maps are refused with MapError (tested by class, not by message).
import { describe, expect, it } from 'vitest';
import { MapError, UsageError } from '../../src/errors.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { CubicMap } from '../../src/maps/cubic-map.ts';
import { enumerateMaps } from '../../src/maps/enumerate.ts';

describe('clusterFromCode', () => {
  it.each([
    ['empty', ''],
    ['no colon', '3'],
    ['zero cells', '0:'],
    ['bad characters', '3:..4.B!'],
    ['too short', '3:..4'],
    ['too long', '3:..4.ba7'],
    ['dangling reference', '3:..z.ba'],
    ['loops (a dumbbell)', '2:1.5'],
    ['a torus (Euler characteristic 0)', '2:.45'],
    ['walls for one cell', '1:.'],
  ])('clusterFromCode refuses %s', (_what, code) => {
    expect(() => clusterFromCode(code)).toThrow(MapError);
  });

  it('clusterFromCode accepts a code written in another labelling and canonicalises it', () => {
    // the theta graph with the rotation at junction 1 read from another dart
    expect(clusterFromCode('2:.54').code).toBe('2:.54');
  });
});

describe('CubicMap', () => {
  it('new CubicMap(twins) refuses a twins array that is not an involution', () => {
    expect(() => new CubicMap(Int32Array.from([1, 2, 0]))).toThrow(MapError);
    expect(() => new CubicMap(Int32Array.from([1, 0]))).toThrow(MapError);
  });
});

describe('enumerateMaps', () => {
  it('enumerateMaps refuses a cell count that is not a whole number >= 1', () => {
    expect(() => [...enumerateMaps(0)]).toThrow(UsageError);
    expect(() => [...enumerateMaps(2.5)]).toThrow(UsageError);
  });
});
