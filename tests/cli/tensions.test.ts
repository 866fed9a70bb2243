// Cell types and wall tensions on the command line: --types and --tension on relax and sweep.
import { describe, expect, it } from 'vitest';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { relax } from '../../src/solver/newton.ts';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CELL_FILLS } from '../../src/render/palette.ts';
import { lather } from './helpers.ts';

describe('--types and --tension', () => {
  it('lather relax --types --tension relaxes with the walls\' tensions and reports the energy beside the length', async () => {
    // source: the library's relax() with the same wall tensions (the double bubble 2.1: walls by their faces)
    const run = await lather(['relax', '2.1', '--areas', '1,2', '--types', 'a,b', '--tension', 'a:b=1.4,b:out=1.2', '--json']);
    expect(run.status).toBe(0);
    const doc = JSON.parse(run.stdout);
    expect(doc.types).toEqual(['a', 'b']);
    expect(doc.tensions).toEqual({ 'out:b': 1.2, 'a:b': 1.4 });
    const map = clusterFromCode('2:.54').map;
    const tensions = new Float64Array(3);
    const wallOf = map.wallIndex();
    for (let e = 0; e < map.twins.length; e++) {
      if (e > map.twins[e]) continue;
      const faces = [map.faceOf[e], map.faceOf[map.twins[e]]].sort();
      tensions[wallOf[e]] = faces[0] === 0 ? (faces[1] === 2 ? 1.2 : 1) : 1.4;
    }
    const eq = relax(map, Float64Array.of(1, 2), { tensions });
    expect(doc.status).toBe('ok');
    expect(doc.energy).toBe(eq.energy);
    expect(doc.perimeter).toBe(eq.perimeter);
    const text = await lather(['relax', '2.1', '--areas', '1,2', '--types', 'a,b', '--tension', 'a:b=1.4,b:out=1.2']);
    expect(text.stdout).toMatch(/^energy \S+ {2}\(total length \S+\)$/m);
  });

  it('lather relax names a junction whose tensions violate the triangle inequality (junction-unbalanced)', async () => {
    // source: the Neumann triangle exists only if each tension is less than the sum of the other two (design.md §8)
    const run = await lather(['relax', '2.1', '--types', 'a,b', '--tension', 'a:b=2']);
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/status junction-unbalanced: the walls at junction \d have tensions (1, 1, 2|1, 2, 1|2, 1, 1)/);
  });

  it.each([
    [['relax', '2.1', '--types', 'a,b,c'], /^lather: Got 3 types when expected 2, one per area\.\n$/],
    [['relax', '2.1', '--types', 'a,1b'], /^lather: Type "1b" is not valid when expected a label/],
    [['relax', '2.1', '--types', 'a,out'], /^lather: Type "out" of a cell is the outside's/],
    [['relax', '2.1', '--types', 'a,b', '--tension', 'a:c=1'], /^lather: Tension type "c" is unknown when expected one of out, a, b\.\n$/],
    [['relax', '2.1', '--types', 'a,b', '--tension', 'a:b=x'], /^lather: Tension a:b is "x" when expected a positive finite number\.\n$/],
    [['relax', '2.1', '--types', 'a,b', '--tension', 'a:b=0'], /^lather: Tension a:b is "0" when expected a positive finite number\.\n$/],
    [['relax', '2.1', '--types', 'a,b', '--tension', 'a:b=1,b:a=2'], /^lather: Tension b:a is given twice/],
    [['relax', '2.1', '--tension', 'a:b=1'], /^lather: Option --tension given without --types/],
    [['relax', '2.1', '--types', 'a,b', '--tension', 'a-b=1'], /Tension "a-b=1" is not valid when expected type:type=value/],
    [['sweep', '--areas', '1,1,t', '--vary', 't=1:2', '--types', 'a,a,b', '--tension', 'a:b=s'], /^lather: Tension a:b "s"/],
    [['sweep', '--areas', '1,1,t', '--vary', 't=1:3', '--types', 'a,a,b', '--tension', 'a:b=2-t'], /^lather: Tension a:b "2-t" is -0\.02\d+ at t = 2\.02\d+ when expected a positive finite number\.\n$/],
  ])('lather %j: one line naming the bad value, exit status 2', async (args, message) => {
    const run = await lather(args);
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('lather sweep over a tension finds where the winner changes: three cells a, a, b with tension a:b = t', async () => {
    // sources: at t = 1 every tension is 1 and the standard triple bubble (3.3) wins ("Proof of the planar
    // triple bubble conjecture", J. reine angew. Math. 567 (2004)); at t <= 1/2 its junction of walls a:a,
    // a:b, a:b has tensions (1, t, t) with 1 >= 2t, no Neumann triangle (design.md §8), so it cannot exist and
    // another arrangement wins
    const run = await lather(['sweep', '--areas', '1,1,1', '--types', 'a,a,b', '--tension', 'a:b=t', '--vary', 't=0.2:1.9', '--samples', '12', '--json']);
    expect(run.status).toBe(0);
    const doc = JSON.parse(run.stdout);
    expect(doc.query.types).toEqual(['a', 'a', 'b']);
    expect(doc.query.tensions).toEqual({ 'a:b': 't' });
    const idOf = (c: number): string => doc.candidates[c].id;
    const winnerAt = (t: number): string => {
      const interval = doc.intervals.find((i: { from: number; to: number }) => i.from <= t && t <= i.to);
      return idOf(interval.winner);
    };
    expect(winnerAt(1)).toBe('3.3');
    expect(winnerAt(0.2)).not.toBe('3.3');
    const change = doc.transitions.find((x: { from: number; to: number }) => idOf(x.to) === '3.3');
    expect(change.at).toBeGreaterThan(0.5);
    expect(change.at).toBeLessThan(1);
  });

  it('lather rank --areas 1,1,2,2 --types a,a,b,b --tension a:b=1.3 --sheet s.svg ranks by energy and draws the types', async () => {
    // source: the energy order of the table is that of the catalogue written beside it (rank.ts); the
    // palette's rule for typed cells (type 1 the first fill, type 2 the second)
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    const sheet = join(dir, 's.svg');
    const out = join(dir, 'c.json');
    const run = await lather(['rank', '--areas', '1,1,2,2', '--types', 'a,a,b,b', '--tension', 'a:b=1.3', '--sheet', sheet, '--out', out, '--top', '4']);
    expect(run.status).toBe(0);
    expect(run.stdout).toContain('types a a b b by area; tensions a:b 1.3 (others 1); ranked by energy');
    expect(run.stdout).toMatch(/^rank +energy +length +gap %/m);
    const doc = JSON.parse(readFileSync(out, 'utf8'));
    const energies = doc.entries.filter((e: { rank: number | null }) => e.rank !== null).map((e: { energy: number }) => e.energy);
    expect(energies).toEqual([...energies].sort((x: number, y: number) => x - y));
    const svg = readFileSync(sheet, 'utf8');
    const fills = new Set([...svg.matchAll(/<path class="cell" data-cell="\d+" fill="(#[0-9a-f]{6})"/g)].map((m) => m[1]));
    expect(fills).toEqual(new Set([CELL_FILLS[0], CELL_FILLS[1]]));
    expect(svg).toContain('E = ');
    // the built-in typed example of the demo scenario
    const demo = await lather(['rank', '--example', 'tray-dyed', '--top', '3']);
    expect(demo.status).toBe(0);
    expect(demo.stdout).toContain('types plain plain dyed dyed by area; tensions plain:dyed 1.3');
  });

  it('lather rank --types --tension --shard i/2, then merge: the single typed run byte for byte', async () => {
    // source: the sharding contract (design.md §9: the parts merge into what a single run gives)
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    const query = ['--areas', '1,1,2,2', '--types', 'a,a,b,b', '--tension', 'a:b=1.3,b:out=0.9'];
    const single = join(dir, 'single.json');
    expect((await lather(['rank', ...query, '--out', single])).status).toBe(0);
    const parts = [1, 2].map((i) => join(dir, `part-${i}.json`));
    for (const [i, part] of parts.entries()) expect((await lather(['rank', ...query, '--shard', `${i + 1}/2`, '--out', part])).status).toBe(0);
    const merged = join(dir, 'merged.json');
    expect((await lather(['merge', ...parts, '--out', merged])).status).toBe(0);
    expect(readFileSync(merged, 'utf8')).toBe(readFileSync(single, 'utf8'));
  });

  it('lather rank of one typed cell: its circle has the tension of its type against the outside', async () => {
    // source: classical isoperimetric inequality; energy = tension x length (design.md §8)
    const run = await lather(['rank', '--areas', '2', '--types', 'a', '--tension', 'a:out=1.5']);
    expect(run.status).toBe(0);
    const energy = 1.5 * 2 * Math.sqrt(2 * Math.PI);
    expect(run.stdout).toContain(energy.toPrecision(10).slice(0, 9));
  });
});
