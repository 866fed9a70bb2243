// `lather view` as a user runs it: one self-contained page per catalogue, bad input refused in one line.
// (The page in a real browser: tests/browser/, `npm run test:browser`.)
import { mkdtempSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readCatalogue } from '../../src/catalogue/format.ts';
import { bundlePageScript } from '../../src/cli/page-script.ts';
import { DATA_ELEMENT_ID, type ViewData } from '../../src/view/page.ts';
import { lather } from './helpers.ts';

const EQUAL_5 = 'catalogues/equal-5.json';

/** The page's data block, parsed. */
function pageData(page: string): ViewData {
  const m = new RegExp(`<script type="application/json" id="${DATA_ELEMENT_ID}">(.*?)</script>`, 's').exec(page);
  expect(m).not.toBeNull();
  return JSON.parse(m![1]) as ViewData;
}

describe('lather view', () => {
  it('lather view FILE --out page.html writes one page holding the whole catalogue, with nothing to fetch', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-view-'));
    const out = join(dir, 'page.html');
    const r = await lather(['view', EQUAL_5, '--out', out]);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe('');
    const page = readFileSync(out, 'utf8');
    expect(page.startsWith('<!doctype html>')).toBe(true);
    // the data block is the catalogue as the reader reads it, with a fact row per entry
    const data = pageData(page);
    expect(data.catalogue).toEqual(readCatalogue(readFileSync(EQUAL_5, 'utf8')));
    expect(data.facts).toHaveLength(data.catalogue.entries.length);
    // self-contained: no element loads anything (scripts and styles inline), and the page's own policy
    // forbids every fetch (common practice, no source: Content-Security-Policy default-src 'none')
    expect(page).not.toMatch(/<(script|img|iframe|link|embed|object)\b[^>]*\s(src|href)=/i);
    expect(page).not.toMatch(/@import|url\(/i);
    expect(page).toContain(`content="default-src 'none'; script-src 'unsafe-inline'`);
    expect(page.match(/<script\b/g)).toHaveLength(2);
    expect(page.match(/<\/script>/g)).toHaveLength(2);
  });

  it('same catalogue, same bytes: standard output and --out give one page', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-view-'));
    const out = join(dir, 'page.html');
    expect((await lather(['view', EQUAL_5, '--out', out])).status).toBe(0);
    const r = await lather(['view', EQUAL_5]);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe(readFileSync(out, 'utf8'));
  });

  it('refuses in one line, status 2: a missing file, a file that is not a catalogue, an output that is a folder', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-view-'));
    const missing = await lather(['view', join(dir, 'none.json'), '--out', join(dir, 'p.html')]);
    expect(missing.status).toBe(2);
    expect(missing.stderr.trim().split('\n')).toHaveLength(1);
    expect(missing.stderr).toContain('none.json');
    writeFileSync(join(dir, 'other.json'), '{"format": "something-else"}');
    const other = await lather(['view', join(dir, 'other.json')]);
    expect(other.status).toBe(2);
    expect(other.stderr).toContain('something-else');
    mkdirSync(join(dir, 'folder'));
    const folder = await lather(['view', EQUAL_5, '--out', join(dir, 'folder')]);
    expect(folder.status).toBe(2);
    expect(folder.stderr).toContain('is a folder');
  });
});

describe('bundlePageScript', () => {
  it('the page script is one browser module with no Node module in it', async () => {
    const script = await bundlePageScript();
    expect(script).not.toMatch(/\bnode:|\brequire\(|\bprocess\.|\bBuffer\b/);
    expect(script).not.toMatch(/^\s*import\s/m);
  });

  it('a module that needs Node cannot reach the bundle: bundling fails', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lather-bundle-'));
    const entry = join(dir, 'entry.ts');
    writeFileSync(entry, "import { readFileSync } from 'node:fs';\nexport const text = readFileSync('x', 'utf8');\n");
    await expect(bundlePageScript(pathToFileURL(entry))).rejects.toThrow();
  });
});
