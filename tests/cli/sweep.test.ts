// `lather sweep` as a user runs it: tables, JSON, plots, and bad formulas refused before any work.
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { lather } from './helpers.ts';

const dir = mkdtempSync(join(tmpdir(), 'lather-sweep-'));

describe('lather sweep', () => {
  it('lather sweep refuses bad formulas and a missing range with exit status 2 and one line, writing nothing', async () => {
    const out = join(dir, 'bad.json');
    // (run in this process; the other refusals are checked on the library: tests/sweep/formula.test.ts, domain.test.ts)
    const cases: [string[], RegExp][] = [
      [['--areas', '1, 1 +', '--vary', 't=0.5:2'], /does not parse/],
      [['--areas', '1, sqrt(t - 1)', '--vary', 't=0.5:2'], /is NaN at t = 0\.5 /],
      [['--areas', '1, t', '--vary', 't=2:1'], /from < to/],
      [['--areas', '1, 1, u', '--vary', 't=0.5:2'], /unknown symbol "u"/],
      [['--areas', '1, (1', '--vary', 't=0.5:2'], /parenthesis/],
      [['--areas', '1, t - 1', '--vary', 't=0.5:2'], /"t - 1" is -0\.5 at t = 0\.5 /],
      [['--areas', '1, t'], /neither --vary nor --shares/],
    ];
    for (const [args, message] of cases) {
      const r = await lather(['sweep', ...args, '--json', out]);
      expect(r.status, args.join(' ')).toBe(2);
      const lines = r.stderr.trim().split('\n');
      expect(lines, args.join(' ')).toHaveLength(1);
      expect(lines[0]).toMatch(message);
      expect(lines[0]).toMatch(/\.$/);
      expect(r.stdout).toBe('');
      expect(existsSync(out)).toBe(false);
    }
  }, 30000);

  it('lather sweep of three cells prints one interval, no transition, and byte-identical JSON twice', async () => {
    // "Proof of the planar triple bubble conjecture", J. reine angew. Math. 567 (2004): one winner throughout
    const args = ['sweep', '--areas', '1, 2, t', '--vary', 't=0.5:4', '--samples', '6', '--log'];
    const r = await lather([...args, '--json', join(dir, 'a.json'), '--plot', join(dir, 'a.svg')]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/transitions: none/);
    expect(r.stdout).toMatch(/winner by interval/);
    await lather([...args, '--json', join(dir, 'b.json')]);
    const a = readFileSync(join(dir, 'a.json'), 'utf8');
    expect(readFileSync(join(dir, 'b.json'), 'utf8')).toBe(a);
    const doc = JSON.parse(a);
    expect(doc.format).toBe('lather-sweep');
    expect(doc.version).toBe(1);
    expect(doc.samples).toHaveLength(6);
    const winners = new Set(doc.samples.map((x: { winner: { candidate: number } }) => doc.candidates[x.winner.candidate].id));
    expect([...winners]).toEqual(['3.3']);
    expect(doc.transitions).toEqual([]);
    const svg = readFileSync(join(dir, 'a.svg'), 'utf8');
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toMatch(/perimeter above the winner/);
  }, 30000);

  it('lather sweep --shares draws a region map and prints the regions', async () => {
    const r = await lather(['sweep', '--areas', 'a, b, c', '--shares', 'a,b,c=3', '--samples', '3', '--plot', join(dir, 'r.svg')]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/regions \(connected samples with one winner\)/);
    expect(r.stdout).toMatch(/\n\s+1\s+9\s+3\.3\s/);
    expect(readFileSync(join(dir, 'r.svg'), 'utf8')).toMatch(/class="regions"/);
  }, 30000);

  it('lather sweep --json without a file prints the JSON document instead of the table', async () => {
    const r = await lather(['sweep', '--areas', '1, t', '--vary', 't=1:2', '--samples', '3', '--json']);
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.query.areas).toEqual(['1', 't']);
    expect(doc.samples.map((x: { t: number }) => x.t)).toEqual([1, 1.5, 2]);
  }, 30000);
});
