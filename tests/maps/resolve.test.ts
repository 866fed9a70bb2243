// Ids typed by a user: the table of arrangement counts they are checked against, and ids refused before
// any enumeration.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { MapError } from '../../src/errors.ts';
import { enumerateClusters } from '../../src/maps/cluster.ts';
import { ARRANGEMENT_COUNTS, ID_LIMIT, resolveArrangement } from '../../src/maps/resolve.ts';

const oeis = JSON.parse(readFileSync(new URL('../fixtures/oeis-counts.json', import.meta.url), 'utf8'));
const A000309: number[] = oeis.A000309.values;

describe('ARRANGEMENT_COUNTS', () => {
  it('has one count per cell count up to ID_LIMIT', () => {
    expect(ARRANGEMENT_COUNTS).toHaveLength(ID_LIMIT + 1);
  });

  it.each([2, 3, 4, 5, 6, 7, 8])('ARRANGEMENT_COUNTS[%i] is the number of arrangements enumerated, whose rootings sum to (n + 1) A000309(n - 1)', (n) => {
    // OEIS A000309 (tests/fixtures/oeis-counts.json) and the rooting identity of count.ts: every
    // arrangement appears once, so the sum of 4E/|Aut(M, f)| over them is (n + 1) a(n - 1)
    const E = 3 * (n - 1);
    let count = 0;
    let rootings = 0;
    for (const cluster of enumerateClusters(n)) {
      count++;
      rootings += (4 * E) / cluster.symmetry;
    }
    expect(rootings).toBe((n + 1) * A000309[n - 1]);
    expect(ARRANGEMENT_COUNTS[n]).toBe(count);
  });
});

describe('resolveArrangement', () => {
  it('resolveArrangement("4.9") is the ninth arrangement of 4 cells', () => {
    let k = 0;
    for (const cluster of enumerateClusters(4)) if (++k === 9) expect(resolveArrangement('4.9').code).toBe(cluster.code);
  });

  it.each(['4.09', '04.9', '4.010'])('resolveArrangement("%s") refuses the leading zero (4.09 is not 4.9)', (id) => {
    expect(() => resolveArrangement(id)).toThrow(MapError);
  });

  it('resolveArrangement("10.99999999") is refused against the count, before any enumeration', () => {
    // the count comes from ARRANGEMENT_COUNTS (checked above); an enumeration that ran out would not say it
    expect(() => resolveArrangement('10.99999999')).toThrow(MapError);
    expect(() => resolveArrangement('10.99999999')).toThrow(/10\.1 to 10\.1325933/);
  });
});
