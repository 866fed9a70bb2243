// Compact catalogues for a census: only the certified entries, the failures as counts by kind; gzip when
// the file's name ends in .gz. A compact catalogue is the full one with the failure entries left out
// (common practice, no source: the same ranking, written shorter).
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { lather } from './helpers.ts';

const dir = mkdtempSync(join(tmpdir(), 'lather-compact-'));

describe('compact catalogues', () => {
  it('rank --compact writes the full catalogue without its failure entries, and show reads it', async () => {
    const full = join(dir, 'full.json');
    const compact = join(dir, 'compact.json');
    expect((await lather(['rank', '--areas', '1,1,1,1,1,1', '--workers', '1', '--out', full])).status).toBe(0);
    expect((await lather(['rank', '--areas', '1,1,1,1,1,1', '--workers', '1', '--compact', '--out', compact])).status).toBe(0);
    const a = JSON.parse(readFileSync(full, 'utf8'));
    const b = JSON.parse(readFileSync(compact, 'utf8'));
    expect(b.compact).toBe(true);
    expect(b.counts).toEqual(a.counts);
    expect(b.entries).toEqual(a.entries.filter((e: { status: string }) => e.status === 'ok'));
    expect(b.entries.length).toBe(a.counts.equilibria);
    const shown = await lather(['show', compact]);
    expect(shown.status, shown.stderr).toBe(0);
    expect(shown.stdout).toContain('compact catalogue');
  });

  it('a .gz name gives the same text gzip-compressed, read by show and draw', async () => {
    const plain = join(dir, 'five.json');
    const packed = join(dir, 'five.json.gz');
    expect((await lather(['rank', '--areas', '1,1,1,1,1', '--compact', '--out', plain])).status).toBe(0);
    expect((await lather(['rank', '--areas', '1,1,1,1,1', '--compact', '--out', packed])).status).toBe(0);
    const bytes = readFileSync(packed);
    expect([bytes[0], bytes[1]]).toEqual([0x1f, 0x8b]); // the gzip magic number (RFC 1952)
    expect(gunzipSync(bytes).toString('utf8')).toBe(readFileSync(plain, 'utf8'));
    expect((await lather(['show', packed])).stdout).toBe((await lather(['show', plain])).stdout);
    expect((await lather(['draw', packed])).stdout).toMatch(/^<svg/);
  });

  it('merge --compact of shards equals rank --compact, byte for byte', async () => {
    const single = join(dir, 'single.json');
    expect((await lather(['rank', '--areas', '1,2,2,3', '--compact', '--out', single])).status).toBe(0);
    const parts = [1, 2].map((i) => join(dir, `p${i}.json`));
    for (const [i, p] of parts.entries()) expect((await lather(['rank', '--areas', '1,2,2,3', '--shard', `${i + 1}/2`, '--out', p])).status).toBe(0);
    const merged = join(dir, 'merged.json');
    expect((await lather(['merge', ...parts, '--compact', '--out', merged])).status).toBe(0);
    expect(readFileSync(merged, 'utf8')).toBe(readFileSync(single, 'utf8'));
  });

  it('a compact catalogue that lists a failure, or whose counts do not add up, is refused in one line', async () => {
    const good = join(dir, 'good.json');
    expect((await lather(['rank', '--areas', '1,1,1,1,1', '--compact', '--out', good])).status).toBe(0);
    const text = readFileSync(good, 'utf8');
    const withFailure = JSON.parse(text);
    const full = JSON.parse(readFileSync('catalogues/equal-5.json', 'utf8'));
    withFailure.entries.push(full.entries.find((e: { status: string }) => e.status !== 'ok'));
    const badCounts = JSON.parse(text);
    badCounts.counts.tried += 1;
    for (const [name, doc, mention] of [['failure.json', withFailure, 'compact catalogue'], ['counts.json', badCounts, 'tried']] as const) {
      const path = join(dir, name);
      writeFileSync(path, JSON.stringify(doc));
      const r = await lather(['show', path]);
      expect(r.status, name).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toContain(mention);
    }
  });
});
