// Catalogues that pass their schema but contradict themselves are refused with one line naming the file
// and the entry; every committed catalogue, and every fresh ranking written to 12 digits, is accepted.
//
// The corrupt files are made here from catalogues/equal-4.json by editing one field each (the edits an
// audit of the command line found to crash `show` or mislead `draw`).
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readCatalogue, writeCatalogue } from '../../src/catalogue/format.ts';
import { WRITE_ROUNDING, roundingSlack } from '../../src/catalogue/consistency.ts';
import { rankAreas } from '../../src/catalogue/rank.ts';
import { type Catalogue, type CatalogueEntry, roundWritten } from '../../src/catalogue/types.ts';
import { CatalogueFormatError } from '../../src/errors.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { checkEquilibrium } from '../../src/solver/certificate.ts';
import { lather } from '../cli/helpers.ts';

const CATALOGUES = new URL('../../catalogues/', import.meta.url);
const original = readFileSync(new URL('equal-4.json', CATALOGUES), 'utf8');

/** equal-4.json with one edit made to its parsed data (a fresh copy each time). */
function edited(edit: (c: Catalogue) => void): string {
  const data = JSON.parse(original) as Catalogue;
  edit(data);
  return JSON.stringify(data);
}

const entry = (c: Catalogue, k: number): CatalogueEntry => c.entries[k];

// [finding, the edited text, what the one-line refusal must say]
const corrupt: [string, string, RegExp][] = [
  ['a null perimeter (show crashed)', edited((c) => (entry(c, 0).perimeter = null)), /entry 1 \(rank 1, code "4:\.\.\.b\.e\.hg"\): perimeter is null when expected/],
  ['a null geometry (draw crashed)', edited((c) => (entry(c, 0).geometry = null)), /entry 1 \(rank 1, code "4:\.\.\.b\.e\.hg"\): geometry is null when expected/],
  ['a coordinate of 1e308 (an SVG full of NaN)', edited((c) => (entry(c, 0).geometry!.coords[3] = 1e308)), /entry 1 \(rank 1, code "4:\.\.\.b\.e\.hg"\): geometry spans 1e\+308 in y when expected at most the perimeter/],
  ["an entry's code swapped for another's (drawn on the wrong map)", edited((c) => (entry(c, 0).code = entry(c, 1).code)),
    /entry 1 \(rank 1, code "4:\.\.4\.\.\.hdg"\): sides are \[4,3,4,3\] when expected \[5,2,3,3\]/],
  ['counts that contradict the entries ("-89 failures")', edited((c) => (c.counts.equilibria = 94)), /equal-4\.json, counts: equilibria is 94 when expected 5/],
  ['a version given as a string ("Got v1 when expected v1")', edited((c) => ((c as { version: unknown }).version = '1')), /version "1" is a string when expected the number 2\./], // the number 2 since format version 2 (issue 11),
  // the same findings, edited more carefully so that the cheap checks pass
  ['two entries swapping code, id and sides: the geometry belongs to another map', edited((c) => {
    const [a, b] = [entry(c, 2), entry(c, 3)]; // 4.10 and 4.5: both 4 cells, 6 junctions, 9 walls
    [a.code, b.code, a.id, b.id, a.sides, b.sides] = [b.code, a.code, b.id, a.id, b.sides, a.sides];
  }), /entry 3 \(rank 3, code "4:\.\.4\.\.e\.hg"\): perimeter is 11\.8333731861 when expected 15\.22\d+, the length of its walls/],
  // edits far below what a drawing shows, still far above what writing to 12 digits does
  ['a coordinate moved by 1e-9 of itself', edited((c) => (entry(c, 0).geometry!.coords[0] *= 1 + 1e-9)),
    /entry 1 \(rank 1, code "4:\.\.\.b\.e\.hg"\): perimeter is 11\.1878021982 when expected 11\.18780220\d+, the length of its walls/],
  ['a pressure moved by 1e-8 of itself', edited((c) => (entry(c, 0).pressures![0] *= 1 + 1e-8)),
    /entry 1 \(rank 1, code "4:\.\.\.b\.e\.hg"\): re-checked curvatureResidual is 1\.\d+e-8 when expected at most 1\.\d+e-10 for an equilibrium/],
  ['a bulge moved by 1e-9 of itself', edited((c) => (entry(c, 4).geometry!.bulges[0] *= 1 + 1e-9)),
    /entry 5 \(rank 5, code "4:\.\.4\.\.a\.hg"\): (perimeter is|re-checked \w+Residual is)/],
  ['a perimeter 1% short', edited((c) => (entry(c, 0).perimeter! *= 0.99)), /entry 1 .*: perimeter is 11\.07.* when expected 11\.1878021982, the length of its walls/],
  ['a pressure edited', edited((c) => (entry(c, 1).pressures![0] += 0.01)), /entry 2 \(rank 2, code "4:\.\.4\.\.\.hdg"\): re-checked curvatureResidual is/],
  ['a cell area that is not the query\'s', edited((c) => (entry(c, 0).cellAreas[0] = 2)), /entry 1 .*: cellAreas are \[2,1,1,1\] when expected \[1,1,1,1\]/],
  ['an assignment with a cell too many', edited((c) => entry(c, 0).assignment.push(0)), /entry 1 .*: assignment has 5 numbers when expected 4, one per cell/],
  ['ranks out of order', edited((c) => ([c.entries[0], c.entries[1]] = [c.entries[1], c.entries[0]])), /entry 1 \(rank 2, code "4:\.\.4\.\.\.hdg"\): rank is 2 when expected 1/],
  ['ranks renumbered out of perimeter order', edited((c) => {
    [c.entries[0], c.entries[1]] = [c.entries[1], c.entries[0]];
    [entry(c, 0).rank, entry(c, 1).rank, entry(c, 0).gapPercent] = [1, 2, 0];
  }), /entry 2 \(rank 2, code "4:\.\.\.b\.e\.hg"\): perimeter is 11\.1878021982, below rank 1's 11\.5373806748 when expected ranks ordered by perimeter/],
  ['a failure counted under another kind', edited((c) => (c.counts.failures = { 'walls-cross': 5 })), /counts: failures is \{"walls-cross":5\} when expected \{"wall-collapse":5\}/],
  ['an entry left out', edited((c) => c.entries.pop()), /counts: tried is 10 when expected 9/],
  ['a stored certificate that does not pass', edited((c) => (entry(c, 0).certificate.crossings = 1)), /entry 1 .*: certificate .* does not pass when expected/],
  ['pressures of the wrong length', edited((c) => entry(c, 0).pressures!.pop()), /entry 1 .*: pressures has 3 numbers when expected 4 for code/],
  ['a failure with a rank', edited((c) => (entry(c, 9).rank = 6)), /entry 10 \(code "4:\.5\.\.\.e\.hg", wall-collapse\): status is "wall-collapse" with rank 6 when expected no rank/],
  ['a code that does not decode', edited((c) => (entry(c, 9).code = '4:.5...e.hz')), /entry 10 \(code "4:\.5\.\.\.e\.hz", wall-collapse\): code does not decode/],
  ['an id of another arrangement', edited((c) => (entry(c, 9).id = '4.9')), /entry 10 .*: id "4\.9" is also that of code "4:\.\.\.b\.e\.hg" when expected one id per arrangement/],
];

describe('readCatalogue: consistency after the schema', () => {
  it('refuses a candidate listed twice (tray-trio.json, a failure repeated under its second entry)', () => {
    const data = JSON.parse(readFileSync(new URL('tray-trio.json', CATALOGUES), 'utf8')) as Catalogue;
    Object.assign(entry(data, 4), { assignment: [0, 1, 2], cellAreas: [1, 1, 2.5] });
    expect(() => readCatalogue(JSON.stringify(data), 'tray-trio.json')).toThrow(
      /^tray-trio\.json, entry 5 \(code "3:\.5\.\.ba", wall-collapse\): assignment \[0,1,2\] repeats the candidate of an earlier entry when expected each candidate/,
    );
  });

  it.each(corrupt)('refuses %s with one line naming the file and the entry', (_finding, text, says) => {
    let error: unknown = null;
    try {
      readCatalogue(text, 'catalogues/equal-4.json');
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(CatalogueFormatError);
    const message = (error as Error).message;
    expect(message).toMatch(says);
    expect(message.startsWith('catalogues/equal-4.json')).toBe(true);
    expect(message.split('\n')).toHaveLength(1);
  });

  it('readCatalogue accepts a UTF-8 byte-order mark and reads the same catalogue', () => {
    expect(readCatalogue(`\uFEFF${original}`)).toEqual(readCatalogue(original));
  });

  it('readCatalogue accepts every committed catalogue in catalogues/', () => {
    const files = readdirSync(CATALOGUES).filter((f) => f.endsWith('.json') && !f.endsWith('.schema.json'));
    expect(files.length).toBeGreaterThanOrEqual(12);
    for (const file of files) {
      const text = readFileSync(new URL(file, CATALOGUES), 'utf8');
      expect(() => readCatalogue(text, file), file).not.toThrow();
    }
  });

  it('readCatalogue accepts fresh rankings written to 12 digits (distinct, repeated and equal areas)', async () => {
    // writing to 12 significant digits moves each number by at most half a unit in its last digit
    // (common practice, no source); the reader allows for what that can do to a certificate
    expect(WRITE_ROUNDING).toBe(5e-12);
    for (const areas of [[1, 2, 3, 4], [1, 1, 2.5, 4], [3, 3, 3, 3, 3], [0.001, 0.002, 0.003], [1000, 3000, 2000]]) {
      const text = writeCatalogue(await rankAreas(areas));
      expect(() => readCatalogue(text, `areas ${areas}`)).not.toThrow();
    }
    // areas equal to 12 digits but not equal: other classes, other candidates; the query keeps every digit
    const close = await rankAreas([1, 1, 1.0000000000001]);
    expect(close.counts.candidates).toBe(5); // 3 arrangements of 3 cells: 3:...b7a (K4) 1, chain 2, lens 2
    const written = writeCatalogue(close);
    expect(JSON.parse(written).query.areas).toEqual([1, 1, 1.0000000000001]);
    expect(() => readCatalogue(written)).not.toThrow();
    // a filtered ranking, and a search (not exhaustive: at most one candidate per arrangement)
    const filtered = await rankAreas([1, 1, 1, 1, 1], { filter: { lens: false, maxSides: 5 } });
    expect(filtered.counts.arrangements).toBeLessThan(filtered.counts.enumerated);
    expect(() => readCatalogue(writeCatalogue(filtered))).not.toThrow();
    for (const budgetSeconds of [0.01, 0.2]) {
      // a search writes the assignments it tried, not always the smallest of their orbits
      const search = await rankAreas([1, 2, 3, 4, 5], { budgetSeconds });
      expect(search.counts.exhaustive).toBe(false);
      expect(() => readCatalogue(writeCatalogue(search))).not.toThrow();
    }
  }, 60_000);
});

describe('roundingSlack', () => {
  it('roundingSlack bounds what writing to 12 digits does to each certificate entry, measured on the unrounded answers', async () => {
    // first-order propagation of the rounding error (common practice, no source), checked against the
    // certificates of the relaxer's own answers before and after rounding every number to 12 digits
    for (const areas of [[1, 1.5, 2, 2.5], [0.01, 1, 1, 100]]) {
      const catalogue = await rankAreas(areas);
      let checked = 0;
      for (const e of catalogue.entries) {
        if (e.status !== 'ok') continue;
        const cluster = clusterFromCode(e.code);
        const cellAreas = Float64Array.from(e.assignment, (i) => areas[i]);
        const exact = { coords: Float64Array.from(e.geometry!.coords), bulges: Float64Array.from(e.geometry!.bulges), pressures: Float64Array.from(e.pressures!) };
        const written = { coords: exact.coords.map(roundWritten), bulges: exact.bulges.map(roundWritten), pressures: exact.pressures.map(roundWritten) };
        const before = checkEquilibrium(cluster.map, cellAreas, exact);
        const after = checkEquilibrium(cluster.map, cellAreas, written);
        const slack = roundingSlack(cluster, cellAreas, written);
        expect(Math.abs(after.areaResidual - before.areaResidual), e.code).toBeLessThanOrEqual(slack.area);
        expect(Math.abs(after.tangentResidual - before.tangentResidual), e.code).toBeLessThanOrEqual(slack.tangent);
        expect(Math.abs(after.curvatureResidual - before.curvatureResidual), e.code).toBeLessThanOrEqual(slack.curvature);
        checked++;
      }
      expect(checked).toBeGreaterThan(10);
    }
  }, 60_000);
});

describe('show and draw refuse a corrupt catalogue', () => {
  const folder = mkdtempSync(join(tmpdir(), 'lather-corrupt-'));
  afterAll(() => rmSync(folder, { recursive: true, force: true }));
  const findings = corrupt.slice(0, 6);

  it.each(findings)('%s: lather show and lather draw print one line naming the entry, exit status 2', async (_finding, text, says) => {
    const file = join(folder, 'equal-4.json');
    writeFileSync(file, text);
    for (const verb of ['show', 'draw']) {
      const r = await lather([verb, file]);
      expect(r.status, verb).toBe(2);
      expect(r.stdout, verb).toBe('');
      const lines = r.stderr.trimEnd().split('\n');
      expect(lines, verb).toHaveLength(1);
      expect(lines[0], verb).toContain(file);
      expect(lines[0], verb).toMatch(says);
    }
  });

  it('lather show reads a catalogue that starts with a byte-order mark', async () => {
    const file = join(folder, 'bom.json');
    writeFileSync(file, `\uFEFF${original}`);
    const withMark = await lather(['show', file]);
    const plain = await lather(['show', new URL('equal-4.json', CATALOGUES).pathname]);
    expect(withMark.status).toBe(0);
    expect(withMark.stdout).toBe(plain.stdout);
  });
});
