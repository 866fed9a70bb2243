// `lather list` as a user runs it: output formats, filters, counts and bad input.
import { mkdtempSync, readdirSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'graphology-graphml';
import { MultiUndirectedGraph } from 'graphology';
import { lather } from './helpers.ts';

describe('lather list', () => {
  it('lather list 3 shows the three arrangements', async () => {
    const r = await lather(['list', '3']);
    expect(r.status).toBe(0);
    const rows = r.stdout.trim().split('\n');
    expect(rows).toHaveLength(4); // header + 3 (design §1)
    expect(rows.slice(1).map((line) => line.split(/\s+/)[0])).toEqual(['3.1', '3.2', '3.3']);
  });

  it('lather list 5 --format jsonl gives one JSON object per arrangement (45, design §2 identity)', async () => {
    const r = await lather(['list', '5', '--format', 'jsonl']);
    const rows = r.stdout.trim().split('\n').map((line) => JSON.parse(line));
    expect(rows).toHaveLength(45);
    for (const row of rows) {
      expect(row.sides).toHaveLength(5);
      expect(row.contacts).toHaveLength(12); // E = 3(n - 1) walls (Euler's formula)
    }
  });

  it('lather list 4 --format graphml is read back by graphology-graphml (reference parser)', async () => {
    const r = await lather(['list', '4', '--format', 'graphml']);
    expect(r.status).toBe(0);
    // the reference parser reads the first graph of a document; check each graph on its own
    const head = r.stdout.split('<graph ')[0];
    const graphs = r.stdout.split('<graph ').slice(1).map((g) => `${head}<graph ${g.replace('</graphml>', '')}</graphml>`);
    expect(graphs).toHaveLength(10);
    for (const doc of graphs) {
      const g = parse(MultiUndirectedGraph, doc);
      expect(g.order).toBe(5);
      expect(g.size).toBe(9);
    }
  });

  it('lather list 6 --three-connected --count reports the OEIS A005027 count', async () => {
    const r = await lather(['list', '6', '--three-connected', '--count']);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('passing the filters: 16'); // OEIS A005027, n = 6
    expect(r.stdout).not.toContain('MISMATCH');
  });

  it('lather list 6 --no-lens --max-sides 5 lists only arrangements meeting the filters', async () => {
    const r = await lather(['list', '6', '--no-lens', '--max-sides', '5', '--format', 'jsonl']);
    const rows = r.stdout.trim().split('\n').map((line) => JSON.parse(line));
    expect(rows.length).toBeGreaterThan(0);
    for (const row of rows) {
      expect(row.lenses).toBe(0);
      expect(Math.max(...row.sides)).toBeLessThanOrEqual(5);
    }
  });

  it('lather list 7 --shard i/3 parts add up to the whole', async () => {
    const whole = (await lather(['list', '7', '--format', 'jsonl'])).stdout.trim().split('\n').map((l) => JSON.parse(l).code);
    const parts: string[] = [];
    for (const s of ['1/3', '2/3', '3/3']) parts.push(...(await lather(['list', '7', '--format', 'jsonl', '--shard', s])).stdout.trim().split('\n').map((l) => JSON.parse(l).code));
    expect(parts.sort()).toEqual([...whole].sort());
  });

  it.each([['0'], ['-3'], ['abc'], ['2.5']])('lather list %s fails with status 2 and one line', async (arg) => {
    const r = await lather(['list', arg]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain(arg);
  });

  it('lather list 3 --bogus fails with status 2', async () => {
    const r = await lather(['list', '3', '--bogus']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('--bogus');
  });

  it('lather list 11 without --large is refused with an estimate', async () => {
    const r = await lather(['list', '11']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/about .* arrangements/);
  });

  it('lather list --out into a missing directory fails with status 2 and leaves no file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    const r = await lather(['list', '4', '--out', join(dir, 'missing', 'x.txt')]);
    expect(r.status).toBe(2);
    expect(readdirSync(dir)).toEqual([]);
    const ok = await lather(['list', '4', '--out', join(dir, 'x.txt')]);
    expect(ok.status).toBe(0);
    expect(existsSync(join(dir, 'x.txt'))).toBe(true);
    expect(readdirSync(dir)).toEqual(['x.txt']);
  });
});
