// `lather rank`, `show`, `relax` and `draw` as a user runs them, with bad input refused in one line.
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { lather } from './helpers.ts';

function oneLineFailure(r: { status: number; stderr: string; stdout: string }, mention: string) {
  expect(r.status).toBe(2);
  expect(r.stderr.trim().split('\n')).toHaveLength(1);
  expect(r.stderr).toContain(mention);
}

describe('lather relax', () => {
  it('lather relax says a solver that did not converge leaves existence unknown', async () => {
    // the double bubble exists for any two areas (Pacific J. Math. 159 (1993)); at areas 1e-20 apart
    // (far beyond the 1e-12 the solver is held to, tests/solver/ratios.test.ts) the solver does not
    // reach it: that is not a statement that it does not exist
    const r = await lather(['relax', '2.1', '--areas', '1,1e-20']);
    expect(r.stdout).toContain('status no-convergence: the solver did not converge (existence unknown)');
    expect(r.stdout).not.toContain('no equilibrium');
  });
});

describe('lather rank', () => {
  it('lather rank --areas 1,1,1,1 lists every four-cell arrangement with the standard one first', async () => {
    const r = await lather(['rank', '--areas', '1,1,1,1', '--workers', '1']);
    expect(r.status).toBe(0);
    const rows = r.stdout.split('\n').filter((l) => /^\s+(\d+|-)\s/.test(l));
    expect(rows).toHaveLength(10); // every arrangement of 4 cells (design §2 identity: 10)
    expect(rows[0]).toMatch(/^\s+1\s+11\.18/);
    expect(rows[0]).toContain('4343'); // two 3-sided and two 4-sided cells ("Calc. Var. PDE 59 (2020)")
  });

  it('lather rank --out writes a catalogue that show and draw read back; same input, same bytes', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    const a = join(dir, 'a.json');
    const b = join(dir, 'b.json');
    expect((await lather(['rank', '--areas', '1,2,2', '--out', a, '--sheet', join(dir, 's.svg'), '--workers', '1'])).status).toBe(0);
    expect((await lather(['rank', '--areas', '1,2,2', '--out', b, '--workers', '1'])).status).toBe(0);
    expect(readFileSync(a, 'utf8')).toBe(readFileSync(b, 'utf8'));
    const shown = await lather(['show', a]);
    expect(shown.status).toBe(0);
    expect(shown.stdout).toContain('exhaustive');
    const drawn = await lather(['draw', a, '--ranks', '1-2']);
    expect(drawn.status).toBe(0);
    expect(drawn.stdout).toMatch(/^<svg/);
    expect(readFileSync(join(dir, 's.svg'), 'utf8')).toMatch(/^<svg/);
  });

  it.each([
    ['0', '--areas', '1,0,1'],
    ['-2', '--areas', '1,-2'],
    ['abc', '--areas', '1,abc'],
    ['NaN', '--areas', 'NaN,1'],
    ['Infinity', '--areas', '1,Infinity'],
    ['missing', '--areas', '1,,2'],
  ])('lather rank refuses an area that is %s', async (mention, ...args) => {
    oneLineFailure(await lather(['rank', ...args]), mention === 'missing' ? 'missing' : mention);
  });

  it('lather rank refuses more cells than its limit, with an estimate', async () => {
    const r = await lather(['rank', '--areas', new Array(11).fill(1).join(',')]);
    oneLineFailure(r, '11 cells is above 9');
    expect(r.stderr).toMatch(/about [0-9.e+]+ arrangements, about [0-9]+ (minutes|hours|days) of work/);
  });

  it('lather rank --out to an unwritable path fails with status 2 and leaves no file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    oneLineFailure(await lather(['rank', '--areas', '1,1', '--out', join(dir, 'no', 'c.json')]), 'c.json');
    expect(readdirSync(dir)).toEqual([]);
  });

  it('lather show refuses a corrupt or foreign catalogue with status 2', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    writeFileSync(join(dir, 'bad.json'), '{"format": "lather-catalogue", "version": 1, "entries": [');
    oneLineFailure(await lather(['show', join(dir, 'bad.json')]), 'bad.json');
    writeFileSync(join(dir, 'v9.json'), '{"format": "lather-catalogue", "version": 9}');
    oneLineFailure(await lather(['show', join(dir, 'v9.json')]), 'v9');
    oneLineFailure(await lather(['show', join(dir, 'absent.json')]), 'absent.json');
  });
});

describe('lather relax', () => {
  it('lather relax 2.1 --json gives the double bubble with its certificate', async () => {
    const r = await lather(['relax', '2.1', '--areas', '1,1', '--json']);
    expect(r.status).toBe(0);
    const answer = JSON.parse(r.stdout);
    expect(answer.status).toBe('ok');
    // (8 pi/3 + sqrt 3) sqrt(A / (2 pi/3 + sqrt(3)/4)), design §6
    expect(answer.perimeter).toBeCloseTo((8 * Math.PI / 3 + Math.sqrt(3)) / Math.sqrt(2 * Math.PI / 3 + Math.sqrt(3) / 4), 9);
    expect(Object.keys(answer.certificate)).toContain('areaResidual'); // the answer carries its certificate
    expect(answer.index).toBe(0);
  });

  it('lather relax --svg writes a drawing with exact arcs', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-'));
    expect((await lather(['relax', '3:...b7a', '--areas', '1,2,3', '--svg', join(dir, 'k4.svg')])).status).toBe(0);
    const svg = readFileSync(join(dir, 'k4.svg'), 'utf8');
    expect(svg).toMatch(/ A[-0-9.]/);
  });

  it.each([
    ['an unknown id', ['relax', '4.99'], '4.99'],
    ['a malformed code', ['relax', '3:zz'], '3:zz'],
    ['a non-admissible code', ['relax', '2:.45'], '2:.45'],
    ['the wrong number of areas', ['relax', '4.9', '--areas', '1,1,1'], '3 areas'],
    ['a zero area', ['relax', '4.9', '--areas', '1,1,0,1'], '"0"'],
    ['ranks with an arrangement', ['draw', '4.9', '--ranks', '1-2'], '--ranks'],
  ])('lather %s is refused with status 2', async (_what, args, mention) => {
    oneLineFailure(await lather(args as string[]), mention as string);
  });
});
