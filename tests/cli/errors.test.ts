// One error family: the same bad input raises the same kind of error through the library and through the
// command line, and the command line turns the family into one line and exit status 2.
import { describe, expect, it } from 'vitest';
import { LatherError, UsageError } from '../../src/errors.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { relax } from '../../src/solver/newton.ts';
import { rankAreas } from '../../src/catalogue/rank.ts';
import { lather } from './helpers.ts';

const bad: [string, number[]][] = [
  ['a zero area', [1, 0]],
  ['a negative area', [1, -2]],
  ['a NaN area', [Number.NaN, 1]],
  ['an infinite area', [1, Number.POSITIVE_INFINITY]],
];

describe('the error family', () => {
  it.each(bad)('%s: relax() and rankAreas() both raise a UsageError, a LatherError', async (_what, areas) => {
    const doubleBubble = clusterFromCode('2:.54').map; // 2.1, the double bubble
    let fromRelax: unknown = null;
    try {
      relax(doubleBubble, Float64Array.from(areas));
    } catch (error) {
      fromRelax = error;
    }
    const fromRank = await rankAreas(areas, { workers: 1 }).then(() => null, (error: unknown) => error);
    for (const error of [fromRelax, fromRank]) {
      expect(error).toBeInstanceOf(UsageError);
      expect(error).toBeInstanceOf(LatherError);
    }
  });

  it.each(bad)('%s: relax and rank on the command line say so in one line, exit status 2', async (_what, areas) => {
    const text = areas.map(String).join(',');
    for (const args of [['relax', '2.1', '--areas', text], ['rank', '--areas', text]]) {
      const r = await lather(args);
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    }
  });
});
