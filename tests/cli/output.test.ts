// Nothing lost: output through real pipes (a slow reader, a reader that closes early), output files that
// are checked before any work and replaced whole or not at all, and the same bytes whatever the workers.
// The pipes are real: the run writes into the standard input of a child process (common practice, no source).
import { execFileSync, spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { parse } from 'graphology-graphml';
import { MultiUndirectedGraph } from 'graphology';
import { main } from '../../src/cli/main.ts';
import { lather } from './helpers.ts';

/** A child process reading its standard input with `script`; resolves with what it printed. */
function reader(script: string): { stdin: Writable; printed: Promise<string> } {
  const child = spawn(process.execPath, ['-e', script], { stdio: ['pipe', 'pipe', 'inherit'] });
  let text = '';
  child.stdout.setEncoding('utf8').on('data', (chunk: string) => (text += chunk));
  const printed = new Promise<string>((done) => child.on('close', () => done(text)));
  return { stdin: child.stdin, printed };
}

/** Run lather in this process with its standard output going into `out`. */
async function latherInto(out: Writable, args: string[]): Promise<{ status: number; stderr: string }> {
  let stderr = '';
  const err = new Writable({ write(chunk, _e, done) { stderr += String(chunk); done(); } });
  const status = await main(['node', 'lather', ...args], { out, err });
  return { status, stderr };
}

const dir = mkdtempSync(join(tmpdir(), 'lather-output-'));

/** A file with known old contents, to check that a failed run keeps it byte for byte. */
function keep(name: string): string {
  const path = join(dir, name);
  writeFileSync(path, 'the old contents\n');
  return path;
}
const unchanged = (path: string) => expect(readFileSync(path, 'utf8')).toBe('the old contents\n');
const noTemporaryFiles = () => expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);

describe('output through pipes', () => {
  it('a slow reader gets all 15069 lines of list 8 --format jsonl (the count tests/maps checks against OEIS A000309)', async () => {
    // the reader pauses 20 ms on every chunk, so the 64 KiB pipe fills again and again
    const slow = reader(`let n = 0; process.stdin.on('data', (c) => { for (const b of c) if (b === 10) n++; process.stdin.pause(); setTimeout(() => process.stdin.resume(), 20); }); process.stdin.on('end', () => console.log(n));`);
    const r = await latherInto(slow.stdin, ['list', '8', '--format', 'jsonl']);
    slow.stdin.end();
    expect(r.status, r.stderr).toBe(0);
    expect((await slow.printed).trim()).toBe('15069');
  }, 120000);

  it('a reader that closes after one line ends the run quietly with status 0', async () => {
    for (const args of [['show', 'catalogues/equal-8.json', '--top', '100000'], ['list', '8'], ['draw', 'catalogues/equal-5.json', '--ranks', '1-5']]) {
      const head = reader(`process.stdin.once('data', (c) => { console.log(String(c).split('\\n')[0].length > 0); process.exit(0); });`);
      const r = await latherInto(head.stdin, args);
      expect(r.status, args.join(' ')).toBe(0);
      expect(r.stderr, args.join(' ')).toBe('');
      expect((await head.printed).trim()).toBe('true');
    }
  }, 120000);

  it('a standard output that fails (a full disk) is one line naming it, status 2', async () => {
    const full = new Writable({ write(_c, _e, done) { done(Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC' })); } });
    const r = await latherInto(full, ['rank', '--areas', '1,1']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/standard output \(ENOSPC/);
  });

  it('the GraphML of list 6 is read whole by graphology-graphml (ids unique in the document)', async () => {
    const r = await lather(['list', '6', '--format', 'graphml']);
    expect(r.status).toBe(0);
    const g = parse(MultiUndirectedGraph, r.stdout);
    // 263 arrangements of 6 cells (tests/maps: OEIS A000309 rooting identity), each dual graph with the
    // outside and 6 cells (7 nodes) and one edge per wall, 3(n - 1) = 15 walls (Euler's formula)
    expect(g.order).toBe(263 * 7);
    expect(g.size).toBe(263 * 15);
  });
});

describe('output files', () => {
  it.each([
    ['a sheet in a folder that does not exist', (k: string) => ['rank', '--areas', '1,1,1', '--out', k, '--sheet', join(dir, 'no', 'x.svg')], 'x.svg'],
    ['a plot in a folder that does not exist', (k: string) => ['sweep', '--areas', '1, t', '--vary', 't=1:2', '--samples', '3', '--json', k, '--plot', join(dir, 'no', 'p.svg')], 'p.svg'],
    ['the same file twice', (k: string) => ['rank', '--areas', '1,1', '--out', k, '--sheet', k], 'also the output'],
    ['the same file for the JSON and the plot', (k: string) => ['sweep', '--areas', '1, t', '--vary', 't=1:2', '--samples', '3', '--json', k, '--plot', k], 'also the output'],
    ['an empty path', (k: string) => ['rank', '--areas', '1,1', '--out', k, '--sheet', ''], '--sheet is empty'],
    ['a folder', (k: string) => ['rank', '--areas', '1,1', '--out', k, '--sheet', dir], 'is a folder'],
  ])('%s: refused before any work, status 2, the old file kept byte for byte', async (_what, args, mention) => {
    const k = keep('keep.json');
    const r = await lather(args(k));
    expect(r.status).toBe(2);
    expect(r.stdout).toBe(''); // refused before the work, so no table either
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain(mention);
    unchanged(k);
    noTemporaryFiles();
  });

  it('draw of a catalogue onto itself is refused and the catalogue kept', async () => {
    const catalogue = join(dir, 'same.json');
    writeFileSync(catalogue, readFileSync('catalogues/equal-3.json'));
    const r = await lather(['draw', catalogue, '--out', catalogue]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('is the input');
    expect(readFileSync(catalogue, 'utf8')).toBe(readFileSync('catalogues/equal-3.json', 'utf8'));
  });

  it('a symbolic link is followed: the file it names is replaced, the link stays', async () => {
    const real = keep('real.txt');
    const link = join(dir, 'link.txt');
    symlinkSync(real, link);
    expect((await lather(['list', '3', '--out', link])).status).toBe(0);
    expect(readFileSync(real, 'utf8').split('\n')).toHaveLength(5); // header, 3 rows, final newline
    expect(readFileSync(link, 'utf8')).toBe(readFileSync(real, 'utf8'));
    noTemporaryFiles();
  });

  it('a FIFO is written through, not replaced', async () => {
    const fifo = join(dir, 'fifo');
    execFileSync('mkfifo', [fifo]);
    const cat = spawn('cat', [fifo], { stdio: ['ignore', 'pipe', 'inherit'] });
    let text = '';
    cat.stdout.setEncoding('utf8').on('data', (c: string) => (text += c));
    const closed = new Promise((done) => cat.on('close', done));
    expect((await lather(['list', '5', '--format', 'jsonl', '--out', fifo])).status).toBe(0);
    await closed;
    expect(text.trim().split('\n')).toHaveLength(45); // the count tests/maps checks against OEIS A000309
    noTemporaryFiles();
  });
});

describe('same query, same bytes', () => {
  it('a ranking that runs out of budget is the same search with 1 and 2 workers', async () => {
    const a = join(dir, 'w1.json');
    const b = join(dir, 'w2.json');
    const args = ['rank', '--areas', '1,2,3,4,5', '--budget', '0.2'];
    expect((await lather([...args, '--workers', '1', '--out', a])).status).toBe(0);
    expect((await lather([...args, '--workers', '2', '--out', b])).status).toBe(0);
    const one = readFileSync(a, 'utf8');
    expect(JSON.parse(one).counts.exhaustive).toBe(false); // the budget did decide
    expect(readFileSync(b, 'utf8')).toBe(one);
  }, 120000);
});

describe('signals', () => {
  it('a run stopped by SIGTERM leaves the old file and no temporary file', async () => {
    const old = keep('big.txt');
    const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/lather.ts', 'list', '9', '--format', 'jsonl', '--out', old], { stdio: 'ignore' });
    // wait until the run has created its temporary file, then stop it
    for (let i = 0; i < 200 && !readdirSync(dir).some((f) => f.startsWith('.big.txt.')); i++) await new Promise((r) => setTimeout(r, 50));
    expect(readdirSync(dir).some((f) => f.startsWith('.big.txt.'))).toBe(true);
    child.kill('SIGTERM');
    const ended = await new Promise<string>((done) => child.on('close', (code, sig) => done(sig ?? `status ${code}`)));
    // ended by the signal itself, or (under tsx, which relays signals) by its status 128 + 15
    expect(['SIGTERM', 'status 143']).toContain(ended);
    unchanged(old);
    noTemporaryFiles();
    expect(existsSync(old)).toBe(true);
  }, 60000);
});
