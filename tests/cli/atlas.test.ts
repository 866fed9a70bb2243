// `lather atlas` as a user runs it: bad input refused with one line and exit status 2 before any work; a run
// writes its table, a schema-checked JSON file and a figure.
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readAtlas } from '../../src/atlas/format.ts';
import { lather } from './helpers.ts';

const dir = mkdtempSync(join(tmpdir(), 'lather-atlas-'));

describe('lather atlas', () => {
  it('lather atlas refuses bad cells, sample counts and least shares with one line naming the value, exit status 2', async () => {
    const out = join(dir, 'bad.json');
    const cases: [string[], RegExp][] = [
      [['1', '--samples', '5'], /Cells "1" .* from 2 to 8/],
      [['9', '--samples', '5'], /Cells "9" .* from 2 to 8/],
      [['x', '--samples', '5'], /Cells "x"/],
      [['4', '--samples', '0'], /Samples "0" .* at least 1/],
      [['4', '--samples', '5000000'], /Samples 5000000 is above 1000000/],
      [['4', '--samples', '5', '--workers', '0'], /Workers "0"/],
      [['4', '--samples', '5', '--seed', '4294967296'], /Seed 4294967296 is above 4294967295/],
      [['4', '--samples', '5', '--min-share', '0.25'], /Least share is 0.25 when expected a number in \[0, 1\/4\)/],
      [['4', '--samples', '5', '--min-share', '-1'], /Least share "-1"/],
      [['4'], /--samples/],
    ];
    for (const [args, message] of cases) {
      const r = await lather(['atlas', ...args, '--json', out]);
      expect(r.status, args.join(' ')).toBe(2);
      const lines = r.stderr.trim().split('\n');
      expect(lines, args.join(' ')).toHaveLength(1);
      expect(lines[0]).toMatch(message);
      expect(r.stdout).toBe('');
      expect(existsSync(out)).toBe(false);
    }
  });

  it('lather atlas 3 prints the triple bubble as the one class and writes the JSON file and the figure', async () => {
    // "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004): one class everywhere
    const json = join(dir, 'a.json');
    const svg = join(dir, 'a.svg');
    const r = await lather(['atlas', '3', '--samples', '6', '--json', json, '--plot', svg]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^\s+1\s+6\s+100\.00\s+3\.3\s+333\s/m);
    expect(r.stdout).toMatch(/class changes between a sample and its nearest: 0 pairs/);
    const doc = readAtlas(readFileSync(json, 'utf8'));
    expect((doc.samples as unknown[]).length).toBe(6);
    const picture = readFileSync(svg, 'utf8');
    expect(picture.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(picture).toContain('3.3, sides by rank 333, 100.0%');
    const again = await lather(['atlas', '3', '--samples', '6', '--json']);
    expect(again.stdout).toBe(readFileSync(json, 'utf8'));
  }, 60000);

  it.each([
    [['--types', 'a,a'], /^lather: Got 2 types when expected 3, one per area\.\n$/],
    [['--types', 'a,out,b'], /^lather: Type "out" of a cell is the outside's/],
    [['--types', 'a,a,b', '--tension', 'a:b=-1'], /^lather: Tension "a:b=-1" is not valid|^lather: Tension a:b is "-1" when expected a positive finite number\.\n$/],
    [['--types', 'a,a,b', '--tension', 'a:b=x'], /^lather: Tension a:b is "x" when expected a positive finite number\.\n$/],
    [['--types', 'a,a,b', '--tension', 'a:c=2'], /^lather: Tension type "c" is unknown when expected one of out, a, b\.\n$/],
    [['--tension', 'a:b=1'], /^lather: Option --tension given without --types/],
    [['--types', 'a,a,b', '--plot', join(dir, 'typed.svg')], /^lather: Option --plot given with --types/],
  ])('lather atlas 3 %j refuses with one line naming the value, exit status 2, nothing written', async (args, message) => {
    const out = join(dir, 'typed-bad.json');
    const r = await lather(['atlas', '3', '--samples', '2', ...args, '--json', out]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(message);
    expect(r.stdout).toBe('');
    expect(existsSync(out)).toBe(false);
  });

  it('lather atlas 3 --types a,a,b --tension ...: each sample\'s winner is the one `rank` finds at its areas, types and tensions', async () => {
    // source: an independent path, `lather rank` on each sample's areas (the winner by energy, design.md §8)
    const tension = 'a:b=1.5,b:out=1.2';
    const json = join(dir, 'typed.json');
    const r = await lather(['atlas', '3', '--samples', '3', '--types', 'a,a,b', '--tension', tension, '--json', json]);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('types a a b by position (areas largest first within each type); tensions out:b 1.2, a:b 1.5 (others 1); winners by energy');
    const doc = readAtlas(readFileSync(json, 'utf8')) as { query: Record<string, unknown>; samples: { areas: number[]; winner: { code: string; perimeter: number } }[] };
    expect(doc.query.types).toEqual(['a', 'a', 'b']);
    expect(doc.query.tensions).toEqual({ 'out:b': 1.2, 'a:b': 1.5 });
    // ordered within the type a only: the b cell is the largest at some sample (design.ts)
    for (const s of doc.samples) expect(s.areas[0]).toBeGreaterThanOrEqual(s.areas[1]);
    expect(doc.samples.some((s) => s.areas[2] > s.areas[0])).toBe(true);
    for (const [k, s] of doc.samples.entries()) {
      const cat = join(dir, `typed-rank-${k}.json`);
      const q = await lather(['rank', '--areas', s.areas.join(','), '--types', 'a,a,b', '--tension', tension, '--workers', '1', '--out', cat]);
      expect(q.status).toBe(0);
      const top = JSON.parse(readFileSync(cat, 'utf8')).entries[0] as { code: string; energy: number; rank: number };
      expect(top.rank).toBe(1);
      expect(s.winner.code).toBe(top.code);
      expect(s.winner.perimeter).toBeCloseTo(top.energy, 9);
    }
  }, 120000);

  it('lather atlas 3 with two types and every tension 1 given: the triple bubble wins everywhere, its energy the untyped perimeter', async () => {
    // source: "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004): the standard
    // triple bubble (3.3, sides 333) is the least-perimeter cluster of any three areas; tensions 1 make energy = perimeter
    const r = await lather(['atlas', '3', '--samples', '3', '--types', 'a,b,b', '--tension', 'a:b=1,a:out=1,b:out=1', '--json']);
    expect(r.status).toBe(0);
    const doc = readAtlas(r.stdout) as { summary: { classes: { id: string; sidesByRank: number[]; samples: number }[] }; samples: { areas: number[]; winner: { perimeter: number } }[] };
    expect(doc.summary.classes.filter((c) => c.samples > 0).map((c) => [c.id, c.sidesByRank.join(''), c.samples])).toEqual([['3.3', '333', 3]]);
    const s = doc.samples[0];
    const cat = join(dir, 'untyped-rank.json');
    expect((await lather(['rank', '--areas', s.areas.join(','), '--workers', '1', '--out', cat])).status).toBe(0);
    expect(s.winner.perimeter).toBeCloseTo(JSON.parse(readFileSync(cat, 'utf8')).entries[0].perimeter, 9);
  }, 120000);

  it('lather atlas 4 --types a,b,b,b with every tension 1: each located boundary is where the a area equals a b area', async () => {
    // source: symmetry (exact): with every tension 1 the energy is the perimeter, so where the a cell and a b cell
    // have equal areas, exchanging them gives the same cluster and the two candidates' energies cross there
    const r = await lather(['atlas', '4', '--samples', '16', '--types', 'a,b,b,b', '--tension', 'a:b=1', '--json']);
    expect(r.status).toBe(0);
    const doc = readAtlas(r.stdout) as { summary: { boundaries: { kind: string; areas: number[]; perimeters: number[]; confirmed: boolean }[]; claim: unknown } };
    expect(doc.summary.claim).toBe(null);
    const crossings = doc.summary.boundaries.filter((b) => b.kind === 'crossing');
    expect(crossings.length).toBeGreaterThan(0);
    for (const b of crossings) {
      const gap = Math.min(...b.areas.slice(1).map((v) => Math.abs(v - b.areas[0])));
      expect(gap).toBeLessThan(1e-5);
      expect(Math.abs(b.perimeters[0] - b.perimeters[1])).toBeLessThan(1e-5);
      expect(b.confirmed).toBe(true);
    }
  }, 120000);

  it('lather atlas 4 --types a,b,b,b --tension a:b=1.1: at each located crossing `rank` finds the two best energies tied at the boundary\'s', async () => {
    // source: an independent path, `lather rank` at the boundary's areas, types and tension (design.md §8)
    const r = await lather(['atlas', '4', '--samples', '16', '--types', 'a,b,b,b', '--tension', 'a:b=1.1', '--json']);
    expect(r.status).toBe(0);
    const doc = readAtlas(r.stdout) as { summary: { boundaries: { kind: string; areas: number[]; perimeters: number[] }[] } };
    const crossings = doc.summary.boundaries.filter((b) => b.kind === 'crossing');
    expect(crossings.length).toBeGreaterThan(0);
    for (const [k, b] of crossings.entries()) {
      const cat = join(dir, `boundary-rank-${k}.json`);
      const q = await lather(['rank', '--areas', b.areas.join(','), '--types', 'a,b,b,b', '--tension', 'a:b=1.1', '--workers', '1', '--out', cat]);
      expect(q.status).toBe(0);
      const [first, second] = JSON.parse(readFileSync(cat, 'utf8')).entries as { energy: number }[];
      for (const e of [first.energy, second.energy]) expect(Math.abs(e - b.perimeters[0])).toBeLessThan(1e-7);
      expect(Math.abs(b.perimeters[1] - b.perimeters[0])).toBeLessThan(1e-7);
    }
  }, 120000);
});
