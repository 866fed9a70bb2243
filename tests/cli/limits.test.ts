// Limits and messages (issue 9): every count option is capped with a message naming the cap, and every
// refusal is one line naming the bad value and what was expected, with exit status 2, before any work.
import { mkdtempSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { WORKER_LIMIT } from '../../src/catalogue/rank.ts';
import { CODE_CELL_LIMIT, decodeCode } from '../../src/maps/code.ts';
import { SHARD_LIMIT } from '../../src/maps/enumerate.ts';
import { countText, durationText, estimateClusterCount } from '../../src/maps/estimate.ts';
import { SAMPLE_LIMIT } from '../../src/sweep/domain.ts';
import { MapError } from '../../src/errors.ts';
import { lather, type LatherRun } from './helpers.ts';

/** A refusal: status 2, nothing on stdout, one line on stderr containing every mention. */
function refused(r: LatherRun, ...mentions: string[]): void {
  expect(r.status, r.stderr).toBe(2);
  expect(r.stdout).toBe('');
  expect(r.stderr.trim().split('\n')).toHaveLength(1);
  for (const m of mentions) expect(r.stderr).toContain(m);
}

const EQUAL_4 = 'catalogues/equal-4.json'; // 5 ranked equilibria

describe('limits', () => {
  it('draw --ranks 1-1000000000 is refused naming the count and the cap (was a V8 fatal error)', async () => {
    refused(await lather(['draw', EQUAL_4, '--ranks', '1-1000000000']), '1000000000', 'at most 100');
  });

  it('draw --ranks beyond the catalogue names the missing ranks in one line', async () => {
    refused(await lather(['draw', EQUAL_4, '--ranks', '1-100']), 'Ranks 6, 7, 8 and 92 more', '1 to 5');
    refused(await lather(['draw', EQUAL_4, '--ranks', '99999999999999999999999']), '99999999999999999999999');
  });

  it('sweep --shares a,b,c=3 --samples 10000 is refused for its 10^8 samples in total (was heap out of memory)', async () => {
    refused(await lather(['sweep', '--areas', 'a,b,c', '--shares', 'a,b,c=3', '--samples', '10000']), '100000000 samples', `at most ${SAMPLE_LIMIT} in total`);
  });

  it('sweep over a grid counts its samples in total, not per side', async () => {
    refused(await lather(['sweep', '--areas', '1,s,t', '--vary', 's=1:2,t=1:2', '--samples', '101']), '10201 samples', `${SAMPLE_LIMIT}`);
  });

  it('rank --workers 99999999999999999999 is refused naming the value, the cores and the hard limit', async () => {
    refused(await lather(['rank', '--areas', '1,1', '--workers', '99999999999999999999']), '99999999999999999999', `at most ${availableParallelism()}`, `${WORKER_LIMIT}`);
  });

  it('rank --workers above the cores available is refused unless --force-workers', async () => {
    const more = String(availableParallelism() + 1);
    refused(await lather(['rank', '--areas', '1,1', '--workers', more]), `Workers ${more}`, `at most ${availableParallelism()}`, '--force-workers');
    expect((await lather(['rank', '--areas', '1,1', '--workers', more, '--force-workers'])).status).toBe(0);
    refused(await lather(['rank', '--areas', '1,1', '--force-workers']), '--force-workers', '--workers');
  });

  it(`list 201 --large is refused: codes hold at most ${CODE_CELL_LIMIT} cells, and the decoder says the same`, async () => {
    refused(await lather(['list', '201', '--large']), '201', `at most ${CODE_CELL_LIMIT}`);
    refused(await lather(['rank', '--large', '--areas', new Array(CODE_CELL_LIMIT + 1).fill(1).join(',')]), `${CODE_CELL_LIMIT + 1} cells`, `at most ${CODE_CELL_LIMIT}`);
    expect(() => decodeCode(`${CODE_CELL_LIMIT + 1}:`)).toThrow(MapError);
    expect(() => decodeCode(`${CODE_CELL_LIMIT + 1}:`)).toThrow(`1 to ${CODE_CELL_LIMIT}`);
  });

  it('rank of 10 cells with --large --budget 1 is refused before any work, naming the budget and the estimate', async () => {
    const r = await lather(['rank', '--areas', new Array(10).fill(1).join(','), '--large', '--budget', '1', '--workers', '1']);
    refused(r, 'Budget 1 s', 'about 1.29e+6 arrangements', 'at least');
  });
});

describe('messages', () => {
  it('list 99999999999999999999 names the value and the cap (was "Maximum BigInt size exceeded")', async () => {
    refused(await lather(['list', '99999999999999999999']), '99999999999999999999', `at most ${CODE_CELL_LIMIT}`);
  });

  it('list 200 says its estimates beyond a bound in words (was "about Infinity arrangements")', async () => {
    const r = await lather(['list', '200']);
    refused(r, 'more than 10^15 arrangements', 'more than a hundred years');
    expect(r.stderr).not.toMatch(/Infinity|NaN|e\+/);
    // the bounds themselves: A000309(999) overflows a double, and both texts still say something true
    expect(estimateClusterCount(1000).clusters).toBe(Infinity);
    expect(countText(Infinity)).toBe('more than 10^15');
    expect(durationText(Infinity)).toBe('more than a hundred years');
    expect(countText(1325933)).toBe('about 1.33e+6');
  });

  it('--shard 1/99999999999999999999 names the shard and the cap, one-based (was a zero-based message)', async () => {
    const r = await lather(['list', '4', '--shard', '1/99999999999999999999']);
    refused(r, '1/99999999999999999999', `at most ${SHARD_LIMIT}`);
    expect(r.stderr).not.toContain('0 <=');
  });

  it('relax 10.99999999 is refused against the count of 10-cell arrangements, before enumerating them', async () => {
    refused(await lather(['relax', '10.99999999']), '10.99999999', '10.1 to 10.1325933');
  });

  it('an id with a leading zero is refused (4.09 was read as 4.9)', async () => {
    refused(await lather(['relax', '4.09']), '4.09', 'leading zero');
    refused(await lather(['draw', '04.9']), '04.9', 'leading zero');
  });

  it('--budget 0x10 is refused: seconds are decimal', async () => {
    refused(await lather(['rank', '--areas', '1,1', '--budget', '0x10']), '0x10', 'decimal');
    refused(await lather(['rank', '--areas', '1,1', '--budget', 'Infinity']), 'Infinity', 'decimal');
  });

  it('--min-sides above --max-sides is refused in list, rank and sweep (it was silently empty)', async () => {
    const sides = ['--min-sides', '7', '--max-sides', '3'];
    refused(await lather(['list', '4', ...sides]), '--min-sides 7', '--max-sides 3');
    refused(await lather(['rank', '--areas', '1,1,1', ...sides]), '--min-sides 7', '--max-sides 3');
    refused(await lather(['sweep', '--areas', '1,1,t', '--vary', 't=1:2', ...sides]), '--min-sides 7', '--max-sides 3');
  });

  it('options that do not apply are refused, not ignored', async () => {
    refused(await lather(['list', '4', '--count', '--format', 'jsonl']), '--format jsonl', '--count');
    refused(await lather(['draw', EQUAL_4, '--areas', '1,1,1,1']), '--areas', EQUAL_4);
    refused(await lather(['relax', '2.1', '--pressures']), '--pressures', '--svg');
    refused(await lather(['relax', '2.1', '--junctions', '--json']), '--junctions', '--svg');
    expect((await lather(['list', '4', '--count'])).status).toBe(0); // the default format is not "given"
  });

  it('a sweep parameter that no formula uses is refused', async () => {
    refused(await lather(['sweep', '--areas', '1,1,1', '--vary', 't=1:2']), 'Parameter t', '"1,1,1"'.replace(/,/g, ', '));
    refused(await lather(['sweep', '--areas', '1,1,s', '--vary', 's=1:2,t=1:2']), 'Parameter t');
    refused(await lather(['sweep', '--areas', '1,1,a', '--shares', 'a,b,c=3']), 'only a', 'at least two');
  });

  it('rank --top 20 --sheet is refused: a sheet holds 12 drawings (it was silently capped)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    refused(await lather(['rank', '--areas', '1,1,1', '--top', '20', '--sheet', join(dir, 's.svg')]), '--top 20', 'at most 12');
    refused(await lather(['merge', join(dir, 'p.json'), '--out', join(dir, 'c.json'), '--top', '20', '--sheet', join(dir, 's.svg')]), '--top 20', 'at most 12');
  });

  it('rank --shard refuses --top and --stable-only: a part file has no table', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    refused(await lather(['rank', '--areas', '1,1,1', '--shard', '1/2', '--out', join(dir, 'p.json'), '--top', '3']), '--top', '--shard');
    refused(await lather(['rank', '--areas', '1,1,1', '--shard', '1/2', '--out', join(dir, 'p.json'), '--stable-only']), '--stable-only', '--shard');
  });

  it('perimeters of tiny and huge clusters are printed with significant digits, scaled exactly', async () => {
    // the equal double bubble: perimeter (8 pi/3 + sqrt 3) sqrt(A / (2 pi/3 + sqrt(3)/4)) for areas A, A
    // ("The standard double soap bubble in R^2 uniquely minimizes perimeter", Pacific J. Math. 159 (1993))
    const unit = (8 * Math.PI / 3 + Math.sqrt(3)) / Math.sqrt(2 * Math.PI / 3 + Math.sqrt(3) / 4);
    for (const [area, scale] of [[1e-18, 1e-9], [1, 1], [1e12, 1e6]]) {
      const r = await lather(['rank', '--areas', `${area},${area}`, '--workers', '1']);
      expect(r.status).toBe(0);
      const row = r.stdout.split('\n').find((l) => /^\s+1\s/.test(l))!;
      const printed = row.trim().split(/\s+/)[1];
      // ten significant digits, no more and no fewer (was 0.000000001 or digits the value does not have)
      expect(printed.replace(/e.*$/, '').replace('.', '').replace(/^0+/, '')).toHaveLength(10);
      expect(Math.abs(Number(printed) / (unit * scale) - 1)).toBeLessThan(1e-9);
    }
  });
});
