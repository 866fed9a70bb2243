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
});
