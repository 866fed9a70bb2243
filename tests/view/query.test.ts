// The viewer's settings, their URL fragment, and the rows a view shows, on the committed catalogue of five
// equal cells (every arrangement of 5 cells is in it: 45, the design §2 rooting identity's count).
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCatalogue } from '../../src/catalogue/format.ts';
import { arcLength } from '../../src/arcs/arc.ts';
import { lowerDartOfWall } from '../../src/maps/t1.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { junctionOf } from '../../src/maps/cubic-map.ts';
import { entryFacts } from '../../src/view/facts.ts';
import { wallSwapCode } from '../../src/maps/t1.ts';
import { DEFAULT_VIEW, SORT_KEYS, type ViewRow, type ViewState, readFragment, viewRows, writeFragment } from '../../src/view/query.ts';

const catalogue = readCatalogue(readFileSync(new URL('../../catalogues/equal-5.json', import.meta.url), 'utf8'));
const facts = entryFacts(catalogue.entries);
const rows: ViewRow[] = catalogue.entries.map((entry, position) => ({ entry, facts: facts[position], position }));
const view = (change: Partial<ViewState>): ViewState => ({ ...DEFAULT_VIEW, compare: [], ...change });

describe('writeFragment / readFragment', () => {
  it('writeFragment(DEFAULT_VIEW) is empty and readFragment("") is the default view', () => {
    expect(writeFragment(DEFAULT_VIEW)).toBe('');
    expect(readFragment('')).toEqual(DEFAULT_VIEW);
  });

  it('readFragment(writeFragment(v)) gives v back for any view (a link reproduces the view)', () => {
    const key = fc.string({ minLength: 1, maxLength: 12 }).filter((k) => !k.includes(','));
    const state = fc.record({
      sort: fc.constantFrom(...SORT_KEYS), descending: fc.boolean(), status: fc.constantFrom('all', 'ok', 'failures', 'wall-collapse'),
      stableOnly: fc.boolean(), connectivity: fc.constantFrom('any', '3', 'not3'), lens: fc.constantFrom('any', 'with', 'without'),
      minSides: fc.option(fc.nat(20), { nil: null }), maxSides: fc.option(fc.nat(20), { nil: null }), search: fc.string({ maxLength: 10 }),
      selected: fc.option(key, { nil: null }), compare: fc.array(key, { maxLength: 2 }),
    }) as fc.Arbitrary<ViewState>;
    fc.assert(fc.property(state, (v) => {
      expect(readFragment(`#${writeFragment(v)}`)).toEqual(v);
    }), { numRuns: 300 });
  });

  it('readFragment keeps the default of a setting it cannot read (a hand-edited link still opens)', () => {
    expect(readFragment('#sort=colour&conn=2&lens=maybe&q=%E0%A4%A&sides=x-')).toEqual(DEFAULT_VIEW);
  });
});

describe('viewRows', () => {
  it('sorting by perimeter gives the rank order of the catalogue, failures last; descending reverses the equilibria', () => {
    const up = viewRows(rows, view({})).map((r) => r.entry);
    const ranked = up.filter((e) => e.rank !== null).map((e) => e.rank);
    expect(ranked).toEqual(ranked.map((_, i) => i + 1));
    expect(up.findIndex((e) => e.rank === null)).toBe(catalogue.counts.equilibria);
    const down = viewRows(rows, view({ descending: true })).filter((r) => r.entry.rank !== null).map((r) => r.entry.rank);
    expect(down).toEqual([...ranked].reverse());
  });

  it('sorting by sides orders the side lists, largest counts first, in either direction', () => {
    for (const descending of [false, true]) {
      const order = viewRows(rows, view({ sort: 'sides', descending })).map((r) => [...r.entry.sides].sort((a, b) => b - a).join(','));
      for (let i = 1; i < order.length; i++) {
        const [a, b] = [order[i - 1].split(',').map(Number), order[i].split(',').map(Number)];
        const first = a.findIndex((x, k) => x !== b[k]);
        if (first !== -1) expect(descending ? a[first] > b[first] : a[first] < b[first]).toBe(true);
      }
    }
  });

  it('the status and stability filters count what the catalogue counts', () => {
    const { counts } = catalogue;
    expect(viewRows(rows, view({ status: 'ok' }))).toHaveLength(counts.equilibria);
    expect(viewRows(rows, view({ stableOnly: true }))).toHaveLength(counts.stable);
    expect(viewRows(rows, view({ status: 'failures' }))).toHaveLength(Object.values(counts.failures).reduce((a, b) => a + b, 0));
    for (const [kind, n] of Object.entries(counts.failures)) expect(viewRows(rows, view({ status: kind }))).toHaveLength(n);
  });

  it('3-connected: 4 of the 45 arrangements of five cells (OEIS A005027: 1, 2, 4, 16, ... for n = 3, 4, 5, 6)', () => {
    expect(viewRows(rows, view({ connectivity: '3' }))).toHaveLength(4);
    expect(viewRows(rows, view({ connectivity: 'not3' }))).toHaveLength(41);
  });

  it('lens and side-range filters split the rows by the side counts', () => {
    const withLens = viewRows(rows, view({ lens: 'with' }));
    const without = viewRows(rows, view({ lens: 'without' }));
    expect(withLens.length + without.length).toBe(rows.length);
    expect(withLens.every((r) => r.entry.sides.includes(2))).toBe(true);
    // with five cells no cell has one side, so 'at least 3 sides' is 'no lens'
    expect(viewRows(rows, view({ minSides: 3 })).map((r) => r.position).sort((a, b) => a - b)).toEqual(without.map((r) => r.position).sort((a, b) => a - b));
    const band = viewRows(rows, view({ minSides: 3, maxSides: 5 }));
    expect(band.every((r) => r.entry.sides.every((s) => s >= 3 && s <= 5))).toBe(true);
    expect(band.length).toBe(rows.filter((r) => r.entry.sides.every((s) => s >= 3 && s <= 5)).length);
  });

  it('the text search matches codes and ids, case folded', () => {
    const hit = viewRows(rows, view({ search: '5.44' }));
    expect(hit.map((r) => r.entry.id)).toEqual(['5.44']);
    const code = catalogue.entries[3].code;
    expect(viewRows(rows, view({ search: code.toUpperCase() })).map((r) => r.entry.code)).toContain(code);
  });
});

describe('entryFacts', () => {
  it('the shortest wall of every equilibrium is as long as its certificate says (arc lengths, solver/certificate.ts)', () => {
    let checked = 0;
    for (const [i, e] of catalogue.entries.entries()) {
      if (e.geometry === null) continue;
      const { map } = clusterFromCode(e.code);
      const k = facts[i].shortestWall!;
      const d = lowerDartOfWall(map.twins, k);
      const [a, b] = [junctionOf(d), junctionOf(map.twins[d])];
      const { coords, bulges } = e.geometry;
      const length = arcLength(coords[2 * a], coords[2 * a + 1], coords[2 * b], coords[2 * b + 1], bulges[k]);
      expect(Math.abs(length - e.certificate.minWallLength)).toBeLessThan(1e-9 * e.certificate.minWallLength);
      checked++;
    }
    expect(checked).toBe(catalogue.counts.equilibria);
  });

  it('wallSwapCode(cluster, wall) of a collapsing wall is the arrangement the ranking recorded it becomes', () => {
    let checked = 0;
    for (const e of catalogue.entries) {
      if (e.status !== 'wall-collapse') continue;
      expect(wallSwapCode(clusterFromCode(e.code), e.collapsingWall!)).toBe(e.becomes?.code ?? null);
      checked++;
    }
    expect(checked).toBe(catalogue.counts.failures['wall-collapse']);
  });

  it('the T1 neighbour of an equilibrium (through its shortest wall) is an admissible arrangement of as many cells, or none', () => {
    for (const [i, e] of catalogue.entries.entries()) {
      if (e.status !== 'ok' || facts[i].t1 === null) continue;
      // it may be the arrangement itself: a swap can lead back to the same arrangement, relabelled
      expect(clusterFromCode(facts[i].t1!).cells).toBe(5);
      expect(catalogue.entries.some((other) => other.code === facts[i].t1)).toBe(true); // every 5-cell arrangement is in it
    }
  });

  it('keys are unique and are the ids when the ids are', () => {
    expect(new Set(facts.map((f) => f.key)).size).toBe(facts.length);
    expect(facts.map((f) => f.key)).toEqual(catalogue.entries.map((e) => e.id));
  });
});
