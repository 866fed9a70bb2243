// view stage (page script): the catalogue viewer in the browser. Reads the page's data block, keeps the
// view in the URL fragment, draws the cards of the rows the view shows (render/), opens one entry's
// details and relaxes it again at the areas its sliders give (solver/, the same relax() as the CLI's).

import type { CatalogueEntry } from '../../catalogue/types.ts';
import { clusterFromCode, type Cluster } from '../../maps/cluster.ts';
import { relax } from '../../solver/newton.ts';
import type { Equilibrium } from '../../solver/result.ts';
import { entryDrawing as plainDrawing, equilibriumDrawing, typedDrawing } from '../../render/entry.ts';
import { typingOfPairs, wallTensions } from '../../solver/tensions.ts';
import type { ClusterDrawing } from '../../render/types.ts';
import { renderClusterSvg } from '../../render/svg.ts';
import { renderContactSheet, type SheetItem } from '../../render/sheet.ts';
import { escapeXml, formatValue, plural } from '../../render/format.ts';
import { wallSwapCode } from '../../maps/t1.ts';
import { DATA_ELEMENT_ID, type ViewData } from '../page.ts';
import { DEFAULT_VIEW, type ViewRow, type ViewState, passesView, readFragment, viewRows, writeFragment } from '../query.ts';
import { CardGrid } from './grid.ts';

const data = JSON.parse(document.getElementById(DATA_ELEMENT_ID)!.textContent!) as ViewData;
// a catalogue of typed cells (walls of different tension): cells drawn by type, live relaxations with the tensions
const { types: queryTypes, tensions: queryTensions } = data.catalogue.query;
const typing = queryTypes === undefined ? undefined : typingOfPairs(queryTypes, queryTensions ?? {}, queryTypes.length);

/** An entry's drawing, its cells by type in a typed catalogue. */
function entryDrawing(entry: CatalogueEntry): ClusterDrawing | null {
  const drawing = plainDrawing(entry);
  return drawing === null || typing === undefined ? drawing : typedDrawing(drawing, entry.assignment, typing);
}

/** The wall tensions of an entry's cells, or null (untyped, or every tension 1). */
function entryTensions(entry: CatalogueEntry, cluster: Cluster): Float64Array | null {
  return typing === undefined ? null : wallTensions(cluster.map, entry.assignment.map((i) => typing.types[i]), typing.table);
}
const rows: ViewRow[] = data.catalogue.entries.map((entry, position) => ({ entry, facts: data.facts[position], position }));
const byKey = new Map(rows.map((row) => [row.facts.key, row]));
// the card a code links to: its first certified entry, else its first failure
const byCode = new Map<string, ViewRow>();
for (const row of rows) if (!byCode.has(row.entry.code) || (row.entry.status === 'ok' && byCode.get(row.entry.code)!.entry.status !== 'ok')) byCode.set(row.entry.code, row);

let view: ViewState = readFragment(location.hash);
const drawings = new Map<number, string>();
const clusters = new Map<string, Cluster>();

function clusterOfCode(code: string): Cluster {
  let cluster = clusters.get(code);
  if (cluster === undefined) {
    cluster = clusterFromCode(code);
    clusters.set(code, cluster);
  }
  return cluster;
}

const html = escapeXml;
const num = (x: number | null, digits = 10): string => (x === null ? '–' : formatValue(x, digits));
const exp = (x: number): string => (x === 0 ? '0' : x.toExponential(1));

/** The view with `key`'s entry open: the present one, or its sorting alone when its filters hide that entry. */
function viewWith(key: string): ViewState {
  const row = byKey.get(key);
  const next = { ...view, selected: key };
  if (row === undefined || passesView(row, next)) return next;
  return { ...DEFAULT_VIEW, sort: view.sort, descending: view.descending, selected: key, compare: view.compare };
}

/** The link to a view with `key`'s entry open. */
function linkTo(key: string): string {
  return `#${writeFragment(viewWith(key))}`;
}

// a link to a card is followed with the view of the moment (the link was written with an earlier one)
document.addEventListener('click', (event) => {
  const link = (event.target as HTMLElement).closest<HTMLAnchorElement>('a[data-link]');
  if (link === null || event.button !== 0 || event.ctrlKey || event.metaKey || event.shiftKey) return;
  event.preventDefault();
  location.hash = writeFragment(viewWith(link.dataset.link!));
});

/** A link to the card of an arrangement's code, or the code alone when the catalogue does not hold it. */
function codeLink(code: string | null): string {
  if (code === null) return 'none (the swap leaves no admissible arrangement)';
  const target = byCode.get(code);
  if (target === undefined) return `<span class="mono">${html(code)}</span> (not in this catalogue)`;
  return `<a href="${html(linkTo(target.facts.key))}" data-link="${html(target.facts.key)}">${html(target.entry.id || code)}</a> <span class="mono">${html(code)}</span>`;
}

function stability(entry: CatalogueEntry): string {
  if (entry.status !== 'ok') return `<span class="badge failure">${html(entry.status)}</span>`;
  return entry.index === 0 ? '<span class="badge stable">stable</span>' : `<span class="badge saddle">index ${entry.index}</span>`;
}

/** The verdict of a failure in words, with what was tried (`tried` is absent for a live relaxation). */
function verdict(entry: { status: string; collapsingWall: number | null; collapsingCell: number | null; tried?: number }, t1: string | null): string {
  const from = entry.tried === undefined ? '' : `no equilibrium from ${plural(entry.tried, 'start')}: `;
  if (entry.status === 'wall-collapse') return `${from}wall ${entry.collapsingWall} shrinks to zero; its T1 swap gives ${codeLink(t1)}`;
  if (entry.status === 'cell-collapse') return `${from}cell ${entry.collapsingCell} pinches off from the others`;
  if (entry.status === 'walls-cross') return `${from}the equations hold but walls cross`;
  if (entry.status === 'no-convergence') {
    return `the relaxer reached no verdict${entry.tried === undefined ? '' : ` from ${plural(entry.tried, 'start')}`} (existence unknown)`;
  }
  return html(entry.status);
}

/** How the search found a certified entry: the starts that reached it, and its lens family's range. */
function searchFacts(entry: CatalogueEntry): string {
  const parts = [`reached by ${entry.reached} of ${plural(entry.tried, 'start')}`];
  const f = entry.family;
  if (f !== null) parts.push(`a lens family: lens ${f.cell} slides ${num(f.from, 3)} to ${num(f.to, 3)} of walls ${f.walls[0]} and ${f.walls[1]} (at ${num(f.at, 3)})`);
  return parts.join('; ');
}

function cardDrawing(row: ViewRow): string {
  let svg = drawings.get(row.position);
  if (svg === undefined) {
    const drawing = entryDrawing(row.entry);
    svg = drawing === null ? '' : renderClusterSvg(drawing, { sizePx: 150, marginPx: 4, headings: false, background: null, labels: false, strokeWidthPx: 1.25 });
    drawings.set(row.position, svg);
  }
  return svg;
}

function fillCard(card: HTMLElement, row: ViewRow): void {
  const { entry, facts } = row;
  const picked = view.compare.includes(facts.key);
  const pick = `<label><input type="checkbox" tabindex="-1" data-pick${picked ? ' checked' : ''}> compare</label>`;
  if (entry.status === 'ok') {
    card.innerHTML = `<div class="head"><span>#${entry.rank}</span><span>${html(entry.id)}</span></div>
<div class="drawing">${cardDrawing(row)}</div>
<div class="code">${html(entry.code)}</div>
<dl>${entry.energy === undefined ? '' : `<dt>energy</dt><dd>${num(entry.energy)}</dd>`}<dt>perimeter</dt><dd data-perimeter="${entry.perimeter}">${num(entry.perimeter)}</dd><dt>gap</dt><dd>${num(entry.gapPercent, 4)} %</dd>
<dt>index</dt><dd>${entry.index}, zero modes ${entry.zeroModes}</dd>${entry.family === null ? '' : `<dt>family</dt><dd>lens ${entry.family.cell}</dd>`}</dl>
<div class="row">${stability(entry)} ${pick}</div>`;
  } else {
    card.innerHTML = `<div class="head"><span>${html(entry.id)}</span>${stability(entry)}</div>
<div class="code">${html(entry.code)}</div>
<p class="verdict-text">${verdict(entry, facts.t1)}</p>
<div class="row">${pick}</div>`;
    for (const a of card.querySelectorAll('a')) a.tabIndex = -1;
  }
  card.querySelector<HTMLInputElement>('input[data-pick]')!.addEventListener('change', () => togglePick(row));
}

const hooks = {
  fill: fillCard,
  choose: (row: ViewRow) => {
    setView({ ...view, selected: row.facts.key });
    showDetailsFirst();
  },
  pick: (row: ViewRow) => togglePick(row),
  isChosen: (row: ViewRow) => view.selected === row.facts.key,
  isPicked: (row: ViewRow) => view.compare.includes(row.facts.key),
};
const equilibria = new CardGrid(document.querySelector<HTMLElement>('#equilibria .grid')!, hooks);
const failures = new CardGrid(document.querySelector<HTMLElement>('#failures .grid')!, hooks);

function togglePick(row: ViewRow): void {
  const key = row.facts.key;
  const compare = view.compare.includes(key) ? view.compare.filter((k) => k !== key) : [...view.compare, key].slice(-2);
  setView({ ...view, compare });
}

// ---------------------------------------------------------------------------------------------- controls

const form = document.getElementById('controls') as HTMLFormElement;
const field = <T extends HTMLElement>(name: string): T => form.elements.namedItem(name) as unknown as T;

function showControls(): void {
  field<HTMLSelectElement>('sort').value = view.sort;
  field<HTMLInputElement>('desc').checked = view.descending;
  const status = field<HTMLSelectElement>('status');
  status.value = view.status;
  field<HTMLInputElement>('stable').checked = view.stableOnly;
  field<HTMLSelectElement>('conn').value = view.connectivity;
  field<HTMLSelectElement>('lens').value = view.lens;
  field<HTMLInputElement>('minSides').value = view.minSides === null ? '' : String(view.minSides);
  field<HTMLInputElement>('maxSides').value = view.maxSides === null ? '' : String(view.maxSides);
  const search = field<HTMLInputElement>('search');
  if (search.value !== view.search) search.value = view.search;
}

function readControls(): ViewState {
  const sides = (name: string): number | null => {
    const v = field<HTMLInputElement>(name).value.trim();
    return /^[0-9]+$/.test(v) ? Number(v) : null;
  };
  return {
    ...view,
    sort: field<HTMLSelectElement>('sort').value as ViewState['sort'],
    descending: field<HTMLInputElement>('desc').checked,
    status: field<HTMLSelectElement>('status').value,
    stableOnly: field<HTMLInputElement>('stable').checked,
    connectivity: field<HTMLSelectElement>('conn').value as ViewState['connectivity'],
    lens: field<HTMLSelectElement>('lens').value as ViewState['lens'],
    minSides: sides('minSides'),
    maxSides: sides('maxSides'),
    search: field<HTMLInputElement>('search').value,
  };
}

form.addEventListener('input', () => setView(readControls()));
form.addEventListener('change', () => setView(readControls()));
form.addEventListener('submit', (event) => event.preventDefault());
field<HTMLButtonElement>('reset').addEventListener('click', () => setView({ ...DEFAULT_VIEW, compare: [] }));

// ---------------------------------------------------------------------------------------------- the view

let shownKey = '';

/** Take a new view: the fragment, the controls, the rows, the panels. */
function setView(next: ViewState, fromFragment = false): void {
  const before = view;
  // a status no entry of this catalogue has (a link made for another file) shows every status
  const statuses = [...field<HTMLSelectElement>('status').options].map((o) => o.value);
  view = statuses.includes(next.status) ? next : { ...next, status: 'all' };
  const fragment = writeFragment(view);
  if (!fromFragment && location.hash.slice(1) !== fragment) history.replaceState(null, '', fragment === '' ? location.pathname + location.search : `#${fragment}`);
  showControls();
  const filterKey = JSON.stringify([view.sort, view.descending, view.status, view.stableOnly, view.connectivity, view.lens, view.minSides, view.maxSides, view.search]);
  if (filterKey !== shownKey) {
    shownKey = filterKey;
    const shown = viewRows(rows, view);
    equilibria.setRows(shown.filter((row) => row.entry.status === 'ok'));
    failures.setRows(shown.filter((row) => row.entry.status !== 'ok'));
    showCounts();
  } else if (before.selected !== view.selected || before.compare.join() !== view.compare.join()) {
    equilibria.refresh();
    failures.refresh();
  }
  if (before.selected !== view.selected || !detailsShown) showDetails();
  if (before.compare.join() !== view.compare.join() || !compareShown) showCompare();
}

function showCounts(): void {
  const okTotal = rows.filter((row) => row.entry.status === 'ok').length;
  const failTotal = rows.length - okTotal;
  const ok = equilibria.shown().length;
  const fail = failures.shown().length;
  document.getElementById('counts')!.textContent = `Showing ${ok} of ${okTotal} certified equilibria and ${fail} of ${failTotal} entries without an equilibrium.`;
  document.querySelector('#equilibria .count')!.textContent = `(${ok})`;
  document.querySelector('#failures .count')!.textContent = `(${fail})`;
  document.getElementById('failures')!.hidden = failTotal === 0;
  for (const [id, n] of [['equilibria', ok], ['failures', fail]] as const) {
    const section = document.getElementById(id)!;
    let note = section.querySelector<HTMLElement>('.empty');
    if (note === null) {
      note = document.createElement('p');
      note.className = 'empty';
      note.textContent = 'No entry here passes the filters.';
      section.querySelector('h2')!.after(note);
    }
    note.hidden = n > 0;
  }
}

// ---------------------------------------------------------------------------------------------- details

let detailsShown = false;
let compareShown = false;
const detailsPanel = document.getElementById('details')!;
const comparePanel = document.getElementById('compare')!;

function showDetails(): void {
  detailsShown = true;
  const row = view.selected === null ? undefined : byKey.get(view.selected);
  if (row === undefined) {
    detailsPanel.hidden = true;
    detailsPanel.innerHTML = '';
    return;
  }
  const { entry, facts } = row;
  const cluster = clusterOfCode(entry.code);
  const drawing = entryDrawing(entry);
  const c = entry.certificate;
  const cells = entry.sides.map((s, i) => `<tr><td>${i + 1}</td><td>${s}</td><td>${num(entry.cellAreas[i], 6)}</td><td>${entry.pressures === null ? '–' : num(entry.pressures[i], 8)}</td></tr>`).join('');
  const t1 = entry.status === 'ok'
    ? `<p>T1 neighbour through its shortest wall (${facts.shortestWall}): ${facts.t1 === entry.code ? 'this arrangement again (the swap gives it back, relabelled)' : codeLink(facts.t1)}</p>`
    : `<p>Verdict: ${verdict(entry, facts.t1)}.</p>`;
  const facts3 = `${facts.threeConnected ? '3-connected' : 'not 3-connected'}, ${facts.lens ? 'with a lens' : 'no lens'}, ${cluster.cells} cells`;
  detailsPanel.innerHTML = `<h2 id="details-heading">${entry.rank === null ? '' : `#${entry.rank} `}${html(entry.id)} ${stability(entry)}</h2>
<p class="mono">${html(entry.code)}</p>
<p>${facts3}</p>
${drawing === null ? '' : `<div class="drawing">${renderClusterSvg(drawing, { sizePx: 300, headings: false, pressures: true })}</div>`}
<p>${entry.status === 'ok' ? `Perimeter <strong>${num(entry.perimeter, 12)}</strong>, gap ${num(entry.gapPercent, 4)} %, index ${entry.index}, zero modes ${entry.zeroModes}, ${searchFacts(entry)}, ` : ''}${entry.iterations} Newton iterations.</p>
${t1}
<table><caption>Cells</caption><thead><tr><th>cell</th><th>sides</th><th>area</th><th>pressure</th></tr></thead><tbody>${cells}</tbody></table>
<table><caption>Certificate${entry.status === 'ok' ? '' : ' (the last state reached)'}</caption><tbody>
<tr><td>area residual</td><td>${exp(c.areaResidual)}</td></tr><tr><td>tangent sums</td><td>${exp(c.tangentResidual)}</td></tr>
<tr><td>Laplace-Young residual</td><td>${exp(c.curvatureResidual)}</td></tr><tr><td>shortest wall</td><td>${num(c.minWallLength, 4)}</td></tr>
<tr><td>smallest cell</td><td>${num(c.minCellArea, 4)}</td></tr><tr><td>crossings</td><td>${c.crossings}</td></tr><tr><td>misordered junctions</td><td>${c.misorderedJunctions}</td></tr>
</tbody></table>
<div class="row"><button type="button" data-action="pick">${view.compare.includes(facts.key) ? 'Drop from comparison' : 'Pick for comparison'}</button><button type="button" data-action="close">Close</button></div>
${liveControls(entry)}`;
  detailsPanel.hidden = false;
  detailsPanel.querySelector('[data-action=pick]')!.addEventListener('click', () => togglePick(row));
  detailsPanel.querySelector('[data-action=close]')!.addEventListener('click', () => setView({ ...view, selected: null }));
  attachLive(detailsPanel, row, cluster);
}

// ---------------------------------------------------------------------------------------------- live relax

function liveControls(entry: CatalogueEntry): string {
  const sliders = entry.cellAreas.map((a, i) =>
    `<label><span>cell ${i + 1}</span><input type="range" data-cell="${i}" min="${a / 4}" max="${4 * a}" step="${a / 100}" value="${a}" aria-label="area of cell ${i + 1}"><output>${formatValue(a, 4)}</output></label>`).join('');
  return `<section class="live" aria-labelledby="live-heading"><h3 id="live-heading">Relax at other areas</h3>
<p class="hint">Move a slider: the arrangement is relaxed again in this page.</p>${sliders}
<div class="row"><button type="button" data-action="restore">Back to the catalogue's areas</button></div>
<p id="live-result" class="verdict" role="status" aria-live="polite"></p><div class="drawing" id="live-drawing"></div></section>`;
}

function attachLive(panel: HTMLElement, row: ViewRow, cluster: Cluster): void {
  const sliders = [...panel.querySelectorAll<HTMLInputElement>('.live input[type=range]')];
  const result = panel.querySelector<HTMLElement>('#live-result')!;
  const picture = panel.querySelector<HTMLElement>('#live-drawing')!;
  let pending = false;
  const run = (): void => {
    pending = false;
    const areas = Float64Array.from(sliders, (s) => Number(s.value));
    sliders.forEach((s, i) => (s.nextElementSibling!.textContent = formatValue(areas[i], 4)));
    const eq = relax(cluster.map, areas, { tensions: entryTensions(row.entry, cluster) });
    showLive(result, picture, row, cluster, areas, eq);
  };
  const schedule = (): void => {
    if (pending) return;
    pending = true;
    requestAnimationFrame(run);
  };
  for (const s of sliders) s.addEventListener('input', schedule);
  panel.querySelector('[data-action=restore]')!.addEventListener('click', () => {
    sliders.forEach((s, i) => (s.value = String(row.entry.cellAreas[i])));
    schedule();
  });
}

function showLive(result: HTMLElement, picture: HTMLElement, row: ViewRow, cluster: Cluster, areas: Float64Array, eq: Equilibrium): void {
  result.dataset.areas = JSON.stringify([...areas]);
  result.dataset.status = eq.status;
  if (eq.status === 'ok') {
    result.dataset.perimeter = String(eq.perimeter);
    result.classList.remove('failure');
    const measure = typing === undefined ? `Perimeter <strong>${formatValue(eq.perimeter, 12)}</strong>` : `Energy <strong>${formatValue(eq.energy, 12)}</strong>, length ${formatValue(eq.perimeter, 12)}`;
    result.innerHTML = `${measure} (certified, index ${eq.index}, zero modes ${eq.zeroModes})`;
    const typed = typing === undefined ? undefined
      : { cellTypes: row.entry.assignment.map((i) => typing.types[i]), typeLabels: typing.table.labels, tensions: entryTensions(row.entry, cluster) };
    picture.innerHTML = renderClusterSvg(equilibriumDrawing(cluster, areas, eq, row.entry.id, typed), { sizePx: 300, headings: false, pressures: true });
  } else {
    delete result.dataset.perimeter;
    result.classList.add('failure');
    const t1 = eq.status === 'wall-collapse' && eq.collapsingWall !== null ? wallSwapCode(cluster, eq.collapsingWall) : null;
    result.innerHTML = `No equilibrium at these areas: ${verdict(eq, t1)}.`;
    picture.innerHTML = '';
  }
}

// ---------------------------------------------------------------------------------------------- compare

function showCompare(): void {
  compareShown = true;
  const picked = view.compare.map((k) => byKey.get(k)).filter((row): row is ViewRow => row !== undefined);
  if (picked.length === 0) {
    comparePanel.hidden = true;
    comparePanel.innerHTML = '';
    return;
  }
  const items: SheetItem[] = [];
  for (const { entry } of picked) {
    const drawing = entryDrawing(entry);
    if (drawing !== null) items.push({ drawing, rank: entry.rank ?? undefined, id: entry.id, perimeter: entry.perimeter ?? undefined });
  }
  const cell = (f: (e: CatalogueEntry) => string): string => picked.map(({ entry }) => `<td>${f(entry)}</td>`).join('');
  const [a, b] = picked.map((row) => row.entry);
  const difference = picked.length === 2 && a.perimeter !== null && b.perimeter !== null
    ? `<p>Perimeter difference ${formatValue(b.perimeter - a.perimeter, 6)} (${formatValue((100 * (b.perimeter - a.perimeter)) / a.perimeter, 4)} % of the first).</p>`
    : '';
  comparePanel.innerHTML = `<h2 id="compare-heading">Comparison</h2>
${picked.length < 2 ? '<p>Pick one more entry (Space on a card, or its compare box).</p>' : ''}
${items.length === 0 ? '' : `<div class="drawing">${renderContactSheet(items, { columns: items.length, tilePx: 180, gapPx: 6, commonScale: true })}</div>`}
<table><thead><tr><th></th>${picked.map(({ entry, facts }) => `<th><a href="${html(linkTo(facts.key))}" data-link="${html(facts.key)}">${html(entry.id)}</a></th>`).join('')}</tr></thead><tbody>
<tr><td>rank</td>${cell((e) => (e.rank === null ? '–' : String(e.rank)))}</tr>
<tr><td>perimeter</td>${cell((e) => num(e.perimeter))}</tr>
<tr><td>gap %</td>${cell((e) => num(e.gapPercent, 4))}</tr>
<tr><td>index</td>${cell((e) => (e.index === null ? '–' : String(e.index)))}</tr>
<tr><td>zero modes</td>${cell((e) => (e.zeroModes === null ? '–' : String(e.zeroModes)))}</tr>
<tr><td>sides</td>${cell((e) => e.sides.join(' '))}</tr>
<tr><td>status</td>${cell((e) => html(e.status))}</tr>
</tbody></table>${difference}
<div class="row"><button type="button" data-action="clear">Clear the comparison</button></div>`;
  comparePanel.hidden = false;
  comparePanel.querySelector('[data-action=clear]')!.addEventListener('click', () => setView({ ...view, compare: [] }));
}

// ---------------------------------------------------------------------------------------------- start

let frame = 0;
function relayout(): void {
  if (frame !== 0) return;
  frame = requestAnimationFrame(() => {
    frame = 0;
    equilibria.update();
    failures.update();
  });
}

/** In one column the details sit above the cards: bring them into view. */
function showDetailsFirst(): void {
  if (!detailsPanel.hidden && matchMedia('(max-width: 64rem)').matches) detailsPanel.scrollIntoView({ block: 'start' });
}

/** Bring the selected card into view (a link followed, or a page opened on one), or its details in one column. */
function revealSelected(focus: boolean): void {
  if (view.selected === null) return;
  if (!equilibria.reveal(view.selected, focus)) failures.reveal(view.selected, focus);
  showDetailsFirst();
}

window.addEventListener('scroll', relayout, { passive: true });
window.addEventListener('resize', relayout);
new ResizeObserver(relayout).observe(document.getElementById('lists')!);
window.addEventListener('hashchange', () => {
  setView(readFragment(location.hash), true);
  revealSelected(true);
});
setView(view, true);
revealSelected(false);
document.documentElement.dataset.ready = 'true';
