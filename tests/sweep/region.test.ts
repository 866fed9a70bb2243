// sweep stage: sweepRegion over a triangle of shares and a grid, against the triple bubble theorem and direct rankings.
import { describe, expect, it } from 'vitest';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { rankAreas } from '../../src/catalogue/rank.ts';
import { parseAreaFormulas } from '../../src/sweep/formula.ts';
import { sweepRegion } from '../../src/sweep/region.ts';

describe('sweepRegion', () => {
  it('sweepRegion of three shares: the standard triple bubble wins the whole triangle', () => {
    // "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004): the standard
    // cluster (the 3-connected map, K4) minimises perimeter for any three areas
    const standard = [...enumerateClusters(3)].find((c) => c.threeConnected)!.code;
    const s = sweepRegion(parseAreaFormulas('a, b, c', ['a', 'b', 'c']), { kind: 'triangle', shares: ['a', 'b', 'c'], total: 3, divisions: 4 });
    expect(s.regions).toHaveLength(1);
    expect(s.regions[0].members).toHaveLength(16);
    expect(s.set.candidates[s.regions[0].winner!].code).toBe(standard);
  }, 60_000);

  it('sweepRegion of a grid: every sample\'s winner and perimeter equal those of rankAreas there', async () => {
    // reference: rankAreas, relaxed from scratch at each sample's areas
    const f = parseAreaFormulas('1, 1, s, t', ['s', 't']);
    const s = sweepRegion(f, { kind: 'grid', parameters: [{ name: 's', from: 0.5, to: 2 }, { name: 't', from: 0.5, to: 2 }], samples: 3, log: true });
    for (let k = 0; k < s.ranked.length; k++) {
      const areas = [...s.slotValues.subarray(4 * k, 4 * k + 4)];
      const best = (await rankAreas(areas)).entries[0];
      const w = s.ranked[k][0];
      expect(s.set.candidates[w.candidate].code).toBe(best.code);
      expect(Math.abs(w.perimeter - best.perimeter!) / best.perimeter!).toBeLessThan(1e-10);
    }
    expect(s.regions.reduce((p, g) => p + g.members.length, 0)).toBe(9);
  });
});
