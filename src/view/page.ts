// view stage: the catalogue viewer as one self-contained HTML document: the catalogue's entries and
// their facts as inline JSON, the page script (the bundle of src/view/client/) and the styles inline,
// no reference to anything outside the file.

import type { Catalogue } from '../catalogue/types.ts';
import { escapeXml, plural } from '../render/format.ts';
import { CELL_FILLS, INK } from '../render/palette.ts';
import { entryFacts } from './facts.ts';
import type { EntryFacts } from './query.ts';
import { SORT_KEYS } from './query.ts';
import { VIEW_STYLES } from './style.ts';

/** What the page script reads from the page's data block. */
export interface ViewData {
  /** Where the catalogue came from (its file name as given). */
  source: string;
  catalogue: Catalogue;
  facts: EntryFacts[];
}

/** The id of the element that carries the page's data. */
export const DATA_ELEMENT_ID = 'lather-data';

/** JSON safe inside a script element: no '<' (so no closing tag), no line separators. */
function inlineJson(value: unknown): string {
  return JSON.stringify(value).replace(/</g, '\\u003c').replace(/\u2028/g, '\\u2028').replace(/\u2029/g, '\\u2029');
}

/** A script safe inside a script element: a closing tag in it is written with an escaped slash. */
function inlineScript(script: string): string {
  return script.replace(/<\/(script)/gi, '<\\/$1');
}

const SORT_LABELS: Record<(typeof SORT_KEYS)[number], string> = {
  perimeter: 'perimeter', gap: 'gap to the best', sides: 'side counts', index: 'stability index',
};

/** The controls of the view; their names are the page script's (a typed catalogue sorts by energy). */
function controls(statuses: string[], typed: boolean): string {
  const option = (value: string, label: string): string => `<option value="${escapeXml(value)}">${escapeXml(label)}</option>`;
  const statusOptions = [option('all', 'every status'), option('ok', 'certified'), option('failures', 'every failure')]
    .concat(statuses.filter((s) => s !== 'ok').map((s) => option(s, s)));
  return `<form id="controls" role="search" aria-label="Sort and filter the entries">
<label>Sort by <select name="sort">${SORT_KEYS.map((k) => option(k, typed && k === 'perimeter' ? 'energy' : SORT_LABELS[k])).join('')}</select></label>
<label><input type="checkbox" name="desc"> descending</label>
<label>Status <select name="status">${statusOptions.join('')}</select></label>
<label><input type="checkbox" name="stable"> stable only</label>
<label>Connectivity <select name="conn">${option('any', 'any')}${option('3', '3-connected')}${option('not3', 'not 3-connected')}</select></label>
<label>Lenses <select name="lens">${option('any', 'any')}${option('with', 'with a lens')}${option('without', 'without lenses')}</select></label>
<fieldset><legend>Sides of every cell</legend><label>from <input type="number" name="minSides" min="1" max="99" inputmode="numeric"></label> <label>to <input type="number" name="maxSides" min="1" max="99" inputmode="numeric"></label></fieldset>
<label>Search <input type="search" name="search" placeholder="code or id" spellcheck="false"></label>
<button type="button" name="reset">Reset view</button>
</form>`;
}

/**
 * The viewer page of a catalogue. `script` is the page script (the bundle of src/view/client/main.ts);
 * `source` names the catalogue in the heading. Same input, same bytes.
 */
export function renderViewPage(catalogue: Catalogue, script: string, source: string): string {
  const facts = entryFacts(catalogue.entries);
  const data: ViewData = { source, catalogue, facts };
  const statuses = [...new Set(catalogue.entries.map((e) => e.status))].sort();
  const { counts, query } = catalogue;
  const failures = Object.values(counts.failures).reduce((a, b) => a + b, 0);
  const palette = CELL_FILLS.map((c, i) => `--cell-${i + 1}:${c};`).join('');
  const typesText = query.types === undefined ? ''
    : ` (types ${query.types.join(', ')}; tensions ${Object.entries(query.tensions ?? {}).map(([k, v]) => `${k} ${v}`).join(', ') || 'all 1'}, others 1; ranked by energy)`;
  const summary = `Areas ${query.areas.join(', ')}${typesText}: ${counts.candidates} candidate${counts.candidates === 1 ? '' : 's'}` +
    ` in ${counts.arrangements} arrangement${counts.arrangements === 1 ? '' : 's'}, ${counts.equilibria} certified (${counts.stable} stable${counts.saddles > 0 ? `, ${plural(counts.saddles, 'saddle')}` : ''}), ${failures} without an equilibrium` +
    (counts.exhaustive ? '.' : `; ${counts.skipped} not tried.`);
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; script-src 'unsafe-inline'; style-src 'unsafe-inline'; img-src data:">
<title>${escapeXml(source)}: catalogue</title>
<style>:root{--ink:${INK};${palette}}
${VIEW_STYLES}</style>
</head>
<body>
<a class="skip" href="#lists">Skip to the entries</a>
<header>
<h1>${escapeXml(source)}</h1>
<p class="summary">${escapeXml(summary)}</p>
</header>
${controls(statuses, query.types !== undefined)}
<p id="counts" role="status" aria-live="polite"></p>
<main>
<div id="lists">
<section id="equilibria" aria-labelledby="equilibria-heading">
<h2 id="equilibria-heading">Certified equilibria <span class="count"></span></h2>
<p class="hint">Arrow keys move between cards, Enter opens one, Space picks it for comparison.</p>
<div class="grid" role="listbox" tabindex="0" aria-labelledby="equilibria-heading"></div>
</section>
<section id="failures" aria-labelledby="failures-heading">
<h2 id="failures-heading">No equilibrium <span class="count"></span></h2>
<div class="grid" role="listbox" tabindex="0" aria-labelledby="failures-heading"></div>
</section>
</div>
<aside id="panel" aria-label="Details and comparison">
<section id="compare" aria-labelledby="compare-heading" hidden></section>
<section id="details" aria-labelledby="details-heading" hidden></section>
</aside>
</main>
<noscript><p>This page draws its entries with its own inline script: allow scripts for this file to see them.</p></noscript>
<script type="application/json" id="${DATA_ELEMENT_ID}">${inlineJson(data)}</script>
<script type="module">${inlineScript(script)}</script>
</body>
</html>
`;
}
