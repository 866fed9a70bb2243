// The package as a user gets it: `npm pack`, installed into an empty folder, run from plain Node (no tsx,
// no sources). The only spawned runs of the suite; everything else goes through tests/cli/helpers.ts.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../..', import.meta.url));
const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';
let home = '';

/** Run the installed `lather` binary in `home`. */
function installed(args: string[]): { stdout: string; stderr: string; status: number } {
  const r = spawnSync(join(home, 'node_modules', '.bin', 'lather'), args, { cwd: home, encoding: 'utf8', env: { ...process.env, CI: 'true' } });
  return { stdout: r.stdout, stderr: r.stderr, status: r.status ?? -1 };
}

describe('the packed package, installed', () => {
  beforeAll(() => {
    home = mkdtempSync(join(tmpdir(), 'lather-installed-'));
    // npm pack runs the build (prepare), so the tarball holds what the sources compile to now
    const tarball = execFileSync(npm, ['pack', '--silent', '--pack-destination', home], { cwd: root, encoding: 'utf8' }).trim().split('\n').pop()!;
    writeFileSync(join(home, 'package.json'), JSON.stringify({ name: 'user', version: '1.0.0', private: true, type: 'module' }));
    // from npm's cache (npm ci filled it with every dependency); the registry only if the cache lacks one,
    // and never waiting for ever
    const install = (mode: string, timeout: number) =>
      execFileSync(npm, ['install', mode, '--no-audit', '--no-fund', '--silent', `./${tarball}`], { cwd: home, stdio: 'ignore', timeout });
    try {
      install('--offline', 120000);
    } catch {
      install('--prefer-offline', 180000);
    }
  }, 360000);

  afterAll(() => {
    if (home !== '') rmSync(home, { recursive: true, force: true });
  });

  it('ships compiled JavaScript with declarations and the catalogue schema, no TypeScript sources', () => {
    const pkg = join(home, 'node_modules', 'lather');
    const files = readdirSync(pkg, { recursive: true }).map(String);
    expect(files).toContain(join('dist', 'cli', 'lather.js'));
    expect(files).toContain(join('dist', 'index.d.ts'));
    expect(files).toContain(join('catalogues', 'catalogue.schema.json'));
    expect(files).toContain(join('catalogues', 'atlas.schema.json'));
    expect(files).toContain(join('dist', 'atlas', 'worker.js')); // the atlas's pool runs it
    expect(files.filter((f) => f.endsWith('.ts') && !f.endsWith('.d.ts'))).toEqual([]);
    // tsx and @types/* are for development only (the requirement)
    const manifest = JSON.parse(readFileSync(join(pkg, 'package.json'), 'utf8'));
    expect(Object.keys(manifest.dependencies).filter((d) => d === 'tsx' || d.startsWith('@types/'))).toEqual([]);
  });

  it('the built binary is executable, so npx runs it in a clone (npm sets the mode only when installing)', () => {
    expect(statSync(join(root, 'dist', 'cli', 'lather.js')).mode & 0o111).toBe(0o111);
  });

  it('lather --version prints the version of package.json', () => {
    const r = installed(['--version']);
    expect(r.status).toBe(0);
    expect(r.stdout.trim()).toBe(JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).version);
  });

  it('lather list 4 prints the ten arrangements of four cells (the count tests/maps checks against OEIS A000309)', () => {
    const r = installed(['list', '4', '--format', 'jsonl']);
    expect(r.status).toBe(0);
    expect(r.stdout.trim().split('\n')).toHaveLength(10);
  });

  it('lather rank --out on a pool of worker threads (loaded from dist/) writes the bytes a single thread writes', () => {
    // 1,2,3,4: 64 or more candidates, so two workers do start a pool
    const pooled = join(home, 'pooled.json');
    const single = join(home, 'single.json');
    const r = installed(['rank', '--areas', '1,2,3,4', '--workers', '2', '--out', pooled]);
    expect(r.status, r.stderr).toBe(0);
    expect(installed(['rank', '--areas', '1,2,3,4', '--workers', '1', '--out', single]).status).toBe(0);
    expect(readFileSync(pooled, 'utf8')).toBe(readFileSync(single, 'utf8')); // same input, same bytes (common practice, no source)
    const shown = installed(['show', pooled]); // show validates against the shipped JSON Schema
    expect(shown.status, shown.stderr).toBe(0);
    expect(JSON.parse(readFileSync(pooled, 'utf8')).counts.candidates).toBeGreaterThanOrEqual(64);
  });

  it('lather view writes its page with the page script the package ships (dist/view/client.js; no esbuild installed)', () => {
    const pkg = join(home, 'node_modules', 'lather');
    expect(readdirSync(join(home, 'node_modules'))).not.toContain('esbuild');
    const page = join(home, 'equal-4.html');
    const r = installed(['view', join(root, 'catalogues', 'equal-4.json'), '--out', page]);
    expect(r.status, r.stderr).toBe(0);
    const script = readFileSync(join(pkg, 'dist', 'view', 'client.js'), 'utf8');
    expect(script.length).toBeGreaterThan(10000);
    expect(readFileSync(page, 'utf8')).toContain(`<script type="module">${script.replace(/<\/(script)/gi, '<\\/$1')}</script>`);
  });

  it('bad input is one line and exit status 2', () => {
    const r = installed(['rank', '--areas', '1,0']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('the library and each stage import from plain Node', () => {
    const script = [
      "const all = await import('lather');",
      "for (const s of ['maps', 'solver', 'catalogue', 'sweep', 'atlas', 'render']) await import('lather/' + s);",
      "const eq = all.relax(all.clusterFromCode('3:...b7a').map, new Float64Array([1, 2, 3]));",
      "console.log(JSON.stringify({ status: eq.status, k: [...all.enumerateClusters(4)].length }));",
    ].join('\n');
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { cwd: home, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual({ status: 'ok', k: 10 });
  });

  it('lather/maps loads without mathjs, ajv or piscina installed (each stage loads only what it needs)', () => {
    const modules = join(home, 'node_modules');
    const heavy = ['mathjs', 'ajv', 'piscina'];
    for (const m of heavy) renameSync(join(modules, m), join(modules, `${m}.hidden`));
    try {
      const script = "const m = await import('lather/maps'); console.log([...m.enumerateClusters(5)].length);";
      const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { cwd: home, encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      expect(r.stdout.trim()).toBe('45'); // the count tests/maps checks against OEIS A000309's rooting identity
      const list = installed(['list', '5', '--count']);
      expect(list.status, list.stderr).toBe(0);
    } finally {
      for (const m of heavy) renameSync(join(modules, `${m}.hidden`), join(modules, m));
    }
  });
});
