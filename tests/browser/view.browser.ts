// The page `lather view` writes, in headless Chromium (the system's browser through playwright-core):
// offline, one card per entry, sorting and filtering, the fragment, keyboard, details, comparison,
// live relax against the library's relax(), 200% zoom, ten thousand entries, and a screenshot.
// Run by `npm run test:browser` (tests/browser/run.sh), which skips itself where no browser can be had.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { type Browser, type BrowserContext, type Page, chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCatalogue } from '../../src/catalogue/format.ts';
import type { Catalogue } from '../../src/catalogue/types.ts';
import { clusterFromCode } from '../../src/maps/cluster.ts';
import { relax } from '../../src/solver/newton.ts';
import { CELL_FILLS } from '../../src/render/palette.ts';
import { lather } from '../cli/helpers.ts';

const dir = mkdtempSync(join(tmpdir(), 'lather-browser-'));
let browser: Browser;
let context: BrowserContext;
const pages: Record<string, { url: string; catalogue: Catalogue }> = {};

/** Write the page of a committed catalogue with `lather view` (in-process, from the sources). */
async function makePage(name: string): Promise<void> {
  const file = `catalogues/${name}.json`;
  const out = join(dir, `${name}.html`);
  const r = await lather(['view', file, '--out', out]);
  expect(r.status).toBe(0);
  pages[name] = { url: pathToFileURL(out).href, catalogue: readCatalogue(readFileSync(file, 'utf8')) };
}

/** Requests the page made other than for its own file, and errors it raised. */
interface Watch {
  requests: string[];
  errors: string[];
}

async function open(name: string, fragment = '', viewport = { width: 1280, height: 900 }): Promise<{ page: Page; watch: Watch }> {
  const page = await context.newPage();
  await page.setViewportSize(viewport);
  const watch: Watch = { requests: [], errors: [] };
  page.on('request', (request) => {
    if (request.url().split('#')[0] !== pages[name].url) watch.requests.push(request.url());
  });
  page.on('pageerror', (error) => watch.errors.push(error.message));
  page.on('console', (message) => {
    if (message.type() === 'error') watch.errors.push(message.text());
  });
  await page.goto(pages[name].url + fragment);
  await page.waitForSelector('html[data-ready=true]');
  return { page, watch };
}

/**
 * The keys of every card each section shows, in order: the window is scrolled from top to bottom and
 * the cards in the document read at each stop (the grid puts in only the cards near the view).
 */
async function shownKeys(page: Page): Promise<{ equilibria: string[]; failures: string[]; mostInDocument: number }> {
  return page.evaluate(async () => {
    const frame = (): Promise<void> => new Promise((done) => requestAnimationFrame(() => requestAnimationFrame(() => done())));
    const found: Record<string, Map<number, string>> = { equilibria: new Map(), failures: new Map() };
    let most = 0;
    window.scrollTo(0, 0);
    await frame();
    for (;;) {
      const cards = document.querySelectorAll<HTMLElement>('.card');
      most = Math.max(most, cards.length);
      for (const card of cards) {
        const section = card.closest('section')!.id;
        found[section].set(Number(card.getAttribute('aria-posinset')), card.dataset.key!);
      }
      const before = window.scrollY;
      window.scrollBy(0, window.innerHeight * 0.8);
      await frame();
      if (window.scrollY === before) break;
    }
    const ordered = (m: Map<number, string>): string[] => [...m.entries()].sort((a, b) => a[0] - b[0]).map((e) => e[1]);
    return { equilibria: ordered(found.equilibria), failures: ordered(found.failures), mostInDocument: most };
  });
}

beforeAll(async () => {
  await makePage('equal-5');
  browser = await chromium.launch({ executablePath: process.env.LATHER_CHROMIUM ?? '/usr/bin/chromium', args: ['--no-sandbox'] });
  // offline: the page must need nothing from a network
  context = await browser.newContext({ offline: true });
});

afterAll(async () => {
  await browser?.close();
});

describe('the viewer page of catalogues/equal-5.json in Chromium', () => {
  it('loads offline from its file with no other request and no error', async () => {
    const { page, watch } = await open('equal-5');
    expect(await page.title()).toContain('equal-5.json');
    expect(watch.requests).toEqual([]);
    expect(watch.errors).toEqual([]);
    await page.close();
  });

  it('shows one card per entry, each with the data-code of its arrangement: certified ones by rank, failures apart', async () => {
    const { page } = await open('equal-5');
    const { catalogue } = pages['equal-5'];
    const shown = await shownKeys(page);
    const ok = catalogue.entries.filter((e) => e.status === 'ok');
    expect(shown.equilibria).toEqual(ok.map((e) => e.id)); // perimeter order is the rank order
    expect(shown.failures.sort()).toEqual(catalogue.entries.filter((e) => e.status !== 'ok').map((e) => e.id).sort());
    const codes = await page.$$eval('.card', (cards) => cards.map((c) => (c as HTMLElement).dataset.code));
    for (const code of codes) expect(catalogue.entries.some((e) => e.code === code)).toBe(true);
    await page.close();
  });

  it('sorting changes the order and the fragment; the fragment reopens the same view', async () => {
    const { page } = await open('equal-5');
    const before = (await shownKeys(page)).equilibria;
    await page.selectOption('select[name=sort]', 'sides');
    await page.check('input[name=desc]');
    const after = (await shownKeys(page)).equilibria;
    expect(after).not.toEqual(before);
    expect([...after].sort()).toEqual([...before].sort());
    // largest side counts first: sides sorted descending, compared in turn
    const { catalogue } = pages['equal-5'];
    const sides = after.map((id) => [...catalogue.entries.find((e) => e.id === id)!.sides].sort((a, b) => b - a));
    for (let i = 1; i < sides.length; i++) {
      const k = sides[i].findIndex((s, j) => s !== sides[i - 1][j]);
      if (k !== -1) expect(sides[i][k]).toBeLessThan(sides[i - 1][k]);
    }
    const hash = await page.evaluate(() => location.hash);
    expect(hash).toBe('#sort=sides&desc');
    const again = await open('equal-5', hash);
    expect((await shownKeys(again.page)).equilibria).toEqual(after);
    expect(await again.page.inputValue('select[name=sort]')).toBe('sides');
    await again.page.close();
    // a status this catalogue does not have (a link made for another file) shows every status
    const other = await open('equal-5', '#status=cell-collapse');
    const all = await shownKeys(other.page);
    expect(all.equilibria.length + all.failures.length).toBe(45);
    expect(await other.page.inputValue('select[name=status]')).toBe('all');
    await other.page.close();
    await page.close();
  });

  it('filters change the count: stable only, lenses, 3-connected, sides, text search', async () => {
    const { page } = await open('equal-5');
    const { catalogue } = pages['equal-5'];
    const count = async (): Promise<number> => {
      const s = await shownKeys(page);
      return s.equilibria.length + s.failures.length;
    };
    expect(await count()).toBe(45);
    await page.check('input[name=stable]');
    expect(await count()).toBe(catalogue.counts.stable);
    await page.uncheck('input[name=stable]');
    await page.selectOption('select[name=lens]', 'without');
    expect(await count()).toBe(catalogue.entries.filter((e) => !e.sides.includes(2)).length);
    await page.selectOption('select[name=lens]', 'any');
    await page.selectOption('select[name=conn]', '3');
    expect(await count()).toBe(4); // OEIS A005027: 4 three-connected clusters of five cells
    await page.selectOption('select[name=conn]', 'any');
    await page.fill('input[name=maxSides]', '4');
    expect(await count()).toBe(catalogue.entries.filter((e) => Math.max(...e.sides) <= 4).length);
    await page.fill('input[name=maxSides]', '');
    await page.fill('input[name=search]', '5.44');
    expect(await shownKeys(page)).toMatchObject({ equilibria: ['5.44'], failures: [] });
    expect(await page.evaluate(() => location.hash)).toBe('#q=5.44');
    await page.click('button[name=reset]');
    expect(await count()).toBe(45);
    await page.close();
  });

  it('keyboard: the grid takes focus, arrows move, Enter opens the details, Space picks for comparison', async () => {
    const { page } = await open('equal-5');
    await page.focus('#equilibria .grid');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('Enter');
    expect(await page.textContent('#details-heading')).toContain('5.33'); // rank 2
    await page.keyboard.press('Space');
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('Space');
    expect(await page.evaluate(() => location.hash)).toBe('#sel=5.33&cmp=5.33%2C5.44');
    expect(await page.textContent('#compare')).toContain('Perimeter difference');
    await page.close();
  });

  it('the details give pressures and certificate, and the T1 neighbour links to its card', async () => {
    const { page } = await open('equal-5');
    const { catalogue } = pages['equal-5'];
    const failure = catalogue.entries.find((e) => e.status === 'wall-collapse' && e.becomes !== null)!;
    await page.fill('input[name=search]', failure.id);
    await page.click(`.card[data-key="${failure.id}"]`);
    expect(await page.textContent('#details')).toContain(`wall ${failure.collapsingWall} shrinks to zero`);
    // the link was written while the search hid its target: following it drops the filters
    await page.click(`#details a[data-link="${failure.becomes!.id}"]`);
    await page.waitForFunction((id) => document.getElementById('details-heading')?.textContent?.includes(id), failure.becomes!.id);
    const target = catalogue.entries.find((e) => e.id === failure.becomes!.id)!;
    const details = await page.textContent('#details');
    if (target.pressures !== null) expect(details).toContain('pressure');
    expect(details).toContain('Laplace-Young residual');
    expect(await page.getAttribute('.card[aria-selected=true]', 'data-code')).toBe(target.code);
    expect(await page.evaluate(() => location.hash)).toBe(`#sel=${target.id}`);
    await page.goBack();
    await page.waitForFunction((id) => document.getElementById('details-heading')?.textContent?.includes(id), failure.id);
    await page.close();
  });

  it('live relax: a slider move gives the perimeter relax() gives at those areas (to 1e-9), and a failure its verdict', async () => {
    const { catalogue } = pages['equal-5'];
    const entry = catalogue.entries.find((e) => e.status === 'ok' && !e.sides.includes(2))!;
    const { page } = await open('equal-5', `#sel=${entry.id}`);
    await page.fill('.live input[data-cell="0"]', '1.3');
    await page.waitForSelector('#live-result[data-perimeter]');
    const areas = JSON.parse((await page.getAttribute('#live-result', 'data-areas'))!) as number[];
    expect(areas[0]).toBe(1.3);
    const shown = Number(await page.getAttribute('#live-result', 'data-perimeter'));
    const expected = relax(clusterFromCode(entry.code).map, Float64Array.from(areas));
    expect(expected.status).toBe('ok');
    expect(Math.abs(shown - expected.perimeter)).toBeLessThan(1e-9 * expected.perimeter);
    expect(Math.abs(shown - entry.perimeter!)).toBeGreaterThan(1e-3);
    expect(await page.textContent('#live-result')).toContain(expected.perimeter.toPrecision(12).slice(0, 10));
    // a failure relaxed at its own areas gives the catalogue's verdict
    const failure = catalogue.entries.find((e) => e.status === 'wall-collapse')!;
    await page.evaluate((id) => (location.hash = `#sel=${id}`), failure.id);
    await page.waitForFunction((id) => document.getElementById('details-heading')?.textContent?.includes(id), failure.id);
    await page.click('.live button[data-action=restore]');
    await page.waitForSelector('#live-result[data-status]');
    expect(await page.getAttribute('#live-result', 'data-status')).toBe(relax(clusterFromCode(failure.code).map, Float64Array.from(failure.cellAreas)).status);
    await page.close();
  });

  it('at 200% zoom (a 1280 x 900 window seen as 640 x 450) nothing runs off the side', async () => {
    const { page } = await open('equal-5', '#sel=5.44', { width: 640, height: 450 });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    expect(await page.isVisible('#details')).toBe(true);
    expect((await shownKeys(page)).equilibria).toHaveLength(pages['equal-5'].catalogue.counts.equilibria);
    await page.close();
  });

  it('a screenshot is not blank: walls in ink and cells in the palette\'s colours cover much of it', async () => {
    const { page } = await open('equal-5', '#sel=5.44&cmp=5.44,5.33');
    const png = await page.screenshot();
    if (process.env.LATHER_SCREENSHOT !== undefined) writeFileSync(process.env.LATHER_SCREENSHOT, png);
    // decode the PNG in the page itself (a canvas), and count its colours
    const counts = await page.evaluate(async ({ data, fills }) => {
      const image = new Image();
      image.src = `data:image/png;base64,${data}`;
      await image.decode();
      const canvas = document.createElement('canvas');
      canvas.width = image.width;
      canvas.height = image.height;
      const g = canvas.getContext('2d')!;
      g.drawImage(image, 0, 0);
      const pixels = g.getImageData(0, 0, image.width, image.height).data;
      const rgb = fills.map((c) => [1, 3, 5].map((k) => Number.parseInt(c.slice(k, k + 2), 16)));
      let ink = 0;
      let fill = 0;
      for (let i = 0; i < pixels.length; i += 4) {
        const [r, gr, b] = [pixels[i], pixels[i + 1], pixels[i + 2]];
        if (r < 80 && gr < 80 && b < 80) ink++;
        if (rgb.some(([x, y, z]) => Math.abs(r - x) + Math.abs(gr - y) + Math.abs(b - z) < 6)) fill++;
      }
      return { ink: ink / (pixels.length / 4), fill: fill / (pixels.length / 4), width: image.width };
    }, { data: png.toString('base64'), fills: CELL_FILLS.slice(0, 5) });
    expect(counts.width).toBe(1280);
    expect(counts.ink).toBeGreaterThan(0.005);
    expect(counts.fill).toBeGreaterThan(0.1);
    await page.close();
  });
});

describe('every committed catalogue', () => {
  const names = ['equal-1', 'equal-2', 'equal-3', 'equal-4', 'equal-6', 'equal-7', 'tray-pair', 'tray-trio', 'tray-mixed', 'tray-six'];

  beforeAll(async () => {
    for (const name of names) await makePage(name);
  });

  it('opens with one card per entry (the circle, lenses, unequal areas and repeated ids included) and no error', async () => {
    for (const name of names) {
      const { page, watch } = await open(name);
      const { catalogue } = pages[name];
      const shown = await shownKeys(page);
      expect(shown.equilibria.length, name).toBe(catalogue.counts.equilibria);
      expect(shown.equilibria.length + shown.failures.length, name).toBe(catalogue.entries.length);
      expect(new Set([...shown.equilibria, ...shown.failures]).size, name).toBe(catalogue.entries.length);
      expect(watch.errors, name).toEqual([]);
      await page.close();
    }
  });
});

describe('ten thousand entries (catalogues/equal-8.json: 15069)', () => {
  beforeAll(async () => {
    await makePage('equal-8');
  });

  it('opens with only the cards near the view in the document, and reaches the last entry by scrolling', async () => {
    const { page, watch } = await open('equal-8');
    const inDocument = await page.$$eval('.card', (cards) => cards.length);
    expect(inDocument).toBeGreaterThan(0);
    expect(inDocument).toBeLessThan(200);
    await page.evaluate(() => window.scrollTo(0, document.documentElement.scrollHeight));
    const { catalogue } = pages['equal-8'];
    const last = catalogue.entries[catalogue.entries.length - 1];
    await page.waitForSelector(`#failures .card[data-key="${last.id}"]`);
    expect(await page.$$eval('.card', (cards) => cards.length)).toBeLessThan(200);
    // a filter over all of them answers
    await page.check('input[name=stable]');
    expect(await page.textContent('#counts')).toContain(`Showing ${catalogue.counts.stable} of ${catalogue.counts.equilibria} certified`);
    expect(watch.errors).toEqual([]);
    await page.close();
  });
});
