// A ranking cut into shards (rank --shard i/k) and put back together (merge) is the single run's catalogue,
// byte for byte; parts that do not belong together are refused in one line before anything is written.
// Sharding must not change a ranking: common practice, no source.
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { planRanking } from '../../src/catalogue/rank.ts';
import { shardTasks } from '../../src/catalogue/shard.ts';
import { slurmShard } from '../../src/cli/rank.ts';
import { UsageError } from '../../src/errors.ts';
import { lather } from './helpers.ts';

const dir = mkdtempSync(join(tmpdir(), 'lather-merge-'));

/** Rank `areas` whole and in `k` shards; returns the single catalogue's path and the parts' paths. */
async function rankBothWays(name: string, areas: string, k: number, extra: string[] = []): Promise<{ single: string; parts: string[] }> {
  const single = join(dir, `${name}.json`);
  expect((await lather(['rank', '--areas', areas, '--workers', '1', ...extra, '--out', single])).status).toBe(0);
  const parts: string[] = [];
  for (let i = 1; i <= k; i++) {
    const part = join(dir, `${name}.part${i}.json`);
    const r = await lather(['rank', '--areas', areas, '--workers', '1', ...extra, '--shard', `${i}/${k}`, '--out', part]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(new RegExp(`^shard ${i}/${k}: `));
    parts.push(part);
  }
  return { single, parts };
}

describe('shards of a ranking', () => {
  it.each([
    ['equal areas, 5 cells', [1, 1, 1, 1, 1]],
    ['distinct areas, 5 cells', [1, 2, 3, 4, 5]],
    ['equal areas, 6 cells', [1, 1, 1, 1, 1, 1]],
    ['two area classes, 6 cells', [1, 1, 1, 2, 2, 2]],
  ])('%s: the shards are disjoint, cover every arrangement, and are balanced by candidates', (_what, areas) => {
    const plan = planRanking(areas);
    for (const k of [1, 2, 3, 7]) {
      const shards = shardTasks(plan.work, k);
      const all = shards.flat().sort((a, b) => a - b);
      expect(all).toEqual(plan.tasks.map((_, i) => i)); // disjoint and complete
      const loads = shards.map((s) => s.reduce((p, t) => p + plan.work[t], 0));
      // greedy largest-first: no shard exceeds the lightest by more than the largest single task
      expect(Math.max(...loads) - Math.min(...loads)).toBeLessThanOrEqual(Math.max(...plan.work));
      expect(shardTasks(plan.work, k)).toEqual(shards); // the same cut every time
    }
  });

  it('merge of 3 shards in any order writes the single run byte for byte (1,2,3,4,5)', async () => {
    const { single, parts } = await rankBothWays('distinct', '1,2,3,4,5', 3);
    for (const order of [[0, 1, 2], [2, 0, 1]]) {
      const merged = join(dir, `merged-${order.join('')}.json`);
      const r = await lather(['merge', ...order.map((i) => parts[i]), '--out', merged]);
      expect(r.status, r.stderr).toBe(0);
      expect(readFileSync(merged, 'utf8')).toBe(readFileSync(single, 'utf8'));
    }
  }, 120000);

  it('merge of a searched ranking (budget exceeded) writes the single run byte for byte', async () => {
    const { single, parts } = await rankBothWays('searched', '1,2,3,4,5', 2, ['--budget', '0.2']);
    expect(JSON.parse(readFileSync(single, 'utf8')).counts.exhaustive).toBe(false);
    const merged = join(dir, 'searched-merged.json');
    expect((await lather(['merge', ...parts, '--out', merged])).status).toBe(0);
    expect(readFileSync(merged, 'utf8')).toBe(readFileSync(single, 'utf8'));
  }, 120000);

  it('missing, duplicated and foreign parts are refused in one line, writing nothing', async () => {
    const { parts } = await rankBothWays('equal', '1,1,1,1,1', 3);
    const other = join(dir, 'other.part.json');
    expect((await lather(['rank', '--areas', '1,1,1,1,2', '--shard', '3/3', '--out', other])).status).toBe(0);
    const forged = join(dir, 'forged.part.json');
    const text = JSON.parse(readFileSync(parts[2], 'utf8'));
    text.program = '0.0.1';
    writeFileSync(forged, JSON.stringify(text));
    const notPart = join(dir, 'not-a-part.json');
    writeFileSync(notPart, readFileSync('catalogues/equal-5.json'));
    const out = join(dir, 'refused.json');
    const cases: [string[], string][] = [
      [[parts[0], parts[1]], 'Shard 3/3 is missing'],
      [[parts[0], parts[1], parts[1], parts[2]], 'again'],
      [[parts[0], parts[1], other], 'another query'],
      [[parts[0], parts[1], forged], 'was written by lather 0.0.1'],
      [[parts[0], parts[1], notPart], 'not-a-part.json has format "lather-catalogue"'],
      [[parts[0], parts[1], join(dir, 'absent.json')], 'absent.json'],
    ];
    for (const [given, mention] of cases) {
      const r = await lather(['merge', ...given, '--out', out]);
      expect(r.status, mention).toBe(2);
      expect(r.stderr.trim().split('\n'), mention).toHaveLength(1);
      expect(r.stderr).toContain(mention);
    }
    expect(readdirSync(dir).filter((f) => f.startsWith('refused') || f.endsWith('.tmp'))).toEqual([]);
  }, 120000);

  it('rank --shard needs --out, and "slurm" reads the array task from the environment', async () => {
    expect((await lather(['rank', '--areas', '1,1', '--shard', '1/2'])).stderr).toMatch(/--shard given without --out/);
    expect(slurmShard({ SLURM_ARRAY_TASK_ID: '3', SLURM_ARRAY_TASK_MIN: '0', SLURM_ARRAY_TASK_COUNT: '4' })).toEqual({ index: 4, count: 4 });
    expect(slurmShard({ SLURM_ARRAY_TASK_ID: '1', SLURM_ARRAY_TASK_MIN: '1', SLURM_ARRAY_TASK_COUNT: '2' })).toEqual({ index: 1, count: 2 });
    expect(() => slurmShard({})).toThrow(UsageError);
    expect(() => slurmShard({})).toThrow(/SLURM_ARRAY_TASK_ID is not set/);
  });
});
