// cli stage: what `lather atlas` prints and draws: the table of winner classes, changes and the claim; the
// figure of slices of the simplex (four cells), the whole triangle (three), or the two most telling
// coordinates (two, five and more), with a histogram of margins.

import type { Atlas, AtlasSample } from '../atlas/types.ts';
import { clusterFromCode } from '../maps/cluster.ts';
import { relax } from '../solver/newton.ts';
import { renderRegionMap, type RegionArrangement } from '../render/region-map.ts';
import { renderHistogram } from '../render/histogram.ts';
import { renderPanels } from '../render/panels.ts';
import { triangleSamples } from '../sweep/triangle-grid.ts';
import { tableNumber } from './table.ts';
import { formatValue } from '../render/format.ts';

function value(x: number | null, digits = 4): string {
  return x === null ? '-' : tableNumber(x, digits);
}

function columns(rows: string[][], right: ReadonlySet<number>): string[] {
  const widths = rows[0].map((_, j) => Math.max(...rows.map((r) => r[j].length)));
  return rows.map((r) => r.map((c, j) => (right.has(j) ? c.padStart(widths[j]) : c.padEnd(widths[j]))).join('  ').trimEnd());
}

/** "0-1 1-2 ..." of walls by rank. */
function wallsText(walls: readonly [number, number][]): string {
  return walls.map(([a, b]) => `${a}-${b}`).join(' ');
}

function areasText(s: AtlasSample): string {
  return s.areas.map((a) => value(a, 5)).join(', ');
}

/** The lines `lather atlas` prints. */
export function atlasTable(a: Atlas): string[] {
  const K = a.samples.length;
  const ratio = Number.isFinite(a.reachableRatio) ? `1:${formatValue(a.reachableRatio, 5)}` : 'any ratio';
  const lines = [
    `${a.cells} cells, ${K} samples of the simplex of areas (seed ${a.seed}; least share ${a.minShare}: ${ratio} reachable, ` +
      `largest ratio sampled 1:${formatValue(a.largestRatio, 5)}); ${a.candidates} candidates per sample, ` +
      `${a.exhaustive ? 'exhaustive' : 'NOT exhaustive at some samples (local search within rank\'s budget)'}; ` +
      (a.warmShare > 0 ? `${(100 * a.warmShare).toFixed(1)}% of relaxations warm from the nearest solved sample` : 'rank\'s own starts at every sample'),
    ...(a.types === undefined ? [] : [
      `types ${a.types.join(' ')} by position (areas largest first within each type); tensions ` +
        `${Object.keys(a.tensions ?? {}).length > 0 ? Object.entries(a.tensions ?? {}).map(([k, v]) => `${k} ${v}`).join(', ') : 'all 1'} (others 1); winners by energy`,
    ]),
    '',
    a.types === undefined
      ? 'winner classes (arrangement + area-rank pattern; rank 1 = largest area, 0 = the outside)'
      : 'winner classes (arrangement + position pattern; "rank" k = the k-th area of the query\'s order, 0 = the outside; margins in energy)',
  ];
  const rows: string[][] = [['class', 'samples', 'share %', 'id', 'sides by rank', 'walls by rank', 'smallest margin', 'at sample']];
  for (const c of a.classes) {
    if (c.samples === 0) continue;
    rows.push([String(c.class + 1), String(c.samples), (100 * c.share).toFixed(2), c.id, c.sidesByRank.join(''), wallsText(c.wallsByRank), value(c.smallestMargin), c.smallestMarginAt === null ? '-' : String(c.smallestMarginAt)]);
  }
  lines.push(...columns(rows, new Set([0, 1, 2, 6, 7])));
  if (a.noWinner > 0) lines.push(`no certified candidate at ${a.noWinner} samples`);
  lines.push('');
  if (a.smallestMarginAt !== null) {
    const s = a.samples[a.smallestMarginAt];
    lines.push(
      `smallest margin ${value(a.smallestMargin)} at sample ${s.index} (areas ${areasText(s)}): ` +
        `winner ${s.winner?.id} ${s.winner?.sidesByRank.join('')}, runner-up ${s.runnerUp?.id} ${s.runnerUp?.sidesByRank.join('')}`,
    );
  } else lines.push('smallest margin: none (no sample has two certified candidates)');
  if (a.smallestArrangementMarginAt !== null) {
    const s = a.samples[a.smallestArrangementMarginAt];
    const o = s.otherArrangement as NonNullable<AtlasSample['otherArrangement']>;
    lines.push(
      `closest other arrangement: margin ${value(a.smallestArrangementMargin)} at sample ${s.index} (areas ${areasText(s)}): ` +
        `winner ${s.winner?.id} ${s.winner?.sidesByRank.join('')}, best of another arrangement ${o.id} ${o.sidesByRank.join('')}`,
    );
  }
  lines.push(`class changes between a sample and its nearest: ${a.changes.length} pairs`);
  if (a.cells === 4) {
    const confirmed = a.boundaries.filter((b) => b.confirmed).length;
    lines.push(`boundaries located by bisection to 1e-6 along those segments: ${a.boundaries.length} (${confirmed} confirmed by a full ranking there)`);
    if (a.boundaries.length > 0) {
      const b: string[][] = [['from', 'to', 'classes', 't', 'areas at the boundary', 'kind', 'confirmed']];
      for (const x of a.boundaries.slice(0, 20)) {
        b.push([String(x.from), String(x.to), `${x.fromClass + 1} -> ${x.toClass + 1}`, value(x.t, 7), x.areas.map((v) => value(v, 7)).join(', '), x.kind, x.confirmed ? 'yes' : 'no']);
      }
      lines.push(...columns(b, new Set([0, 1, 3])));
      if (a.boundaries.length > 20) lines.push(`... ${a.boundaries.length - 20} more (all are in the JSON file)`);
    }
  }
  if (a.claim !== null) {
    const c = a.claim;
    lines.push('', `claim: ${c.statement}`);
    lines.push(
      `holds at ${c.holds} of ${K} samples, fails at ${c.fails}` + (c.undecided > 0 ? `, undecided at ${c.undecided}` : '') +
        `; smallest claim margin ${value(c.smallestMargin)}` + (c.smallestMarginAt === null ? '' : ` at sample ${c.smallestMarginAt} (areas ${areasText(a.samples[c.smallestMarginAt])})`),
    );
    if (c.fails > 0) lines.push(`fails at samples ${c.failures.join(', ')}${c.fails > c.failures.length ? ', ...' : ''}`);
  }
  return lines;
}

/** A drawing of each winning class, relaxed at the sample where it wins by the widest margin (none when that fails). */
function legendOf(a: Atlas): RegionArrangement[] {
  // classes are ordered by wins, so the winning ones come first and keep their colours
  return a.classes.filter((c) => c.samples > 0).map((c) => {
    let best: AtlasSample | null = null;
    for (const s of a.samples) {
      if (s.winner?.class === c.class && (best === null || (s.margin ?? 0) > (best.margin ?? 0))) best = s;
    }
    const label = `${c.id}, sides by rank ${c.sidesByRank.join('')}, ${(100 * c.share).toFixed(1)}%`;
    if (best === null) return { key: `k${c.class}`, label };
    const at = best;
    const map = clusterFromCode(c.code).map;
    const areas = Float64Array.from(c.ranks, (r) => at.areas[r - 1]);
    const eq = relax(map, areas);
    if (eq.status !== 'ok') return { key: `k${c.class}`, label };
    return { key: `k${c.class}`, label, drawing: { map, coords: eq.coords, bulges: eq.bulges, areas, pressures: eq.pressures } };
  });
}

/** Triangle divisions of a slice map. */
const DIVISIONS = 24;

/**
 * Winner classes on a triangle of three weights (w0, w1, w2) summing to 1: every small triangle takes
 * the class of the nearest point (points given once per permutation of their weights, since a class by
 * area rank does not change when areas are permuted), none beyond `reach` or where `inside` says no.
 */
function triangleWinners(points: { w: number[]; cls: number }[], reach: number, inside: (w: number[]) => boolean): (string | null)[] {
  const centres = triangleSamples(DIVISIONS);
  const unfolded: { w: number[]; cls: number }[] = [];
  const perms = [[0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0]];
  for (const p of points) for (const q of perms) unfolded.push({ w: q.map((i) => p.w[i]), cls: p.cls });
  const out: (string | null)[] = [];
  for (let k = 0; k < DIVISIONS * DIVISIONS; k++) {
    const w = [centres[3 * k], centres[3 * k + 1], centres[3 * k + 2]];
    if (!inside(w)) {
      out.push(null);
      continue;
    }
    let best = -1;
    let d2 = reach * reach;
    for (const u of unfolded) {
      const d = (u.w[0] - w[0]) ** 2 + (u.w[1] - w[1]) ** 2 + (u.w[2] - w[2]) ** 2;
      if (d < d2) {
        d2 = d;
        best = u.cls;
      }
    }
    out.push(best < 0 ? null : `k${best}`);
  }
  return out;
}

/** Largest shares at which four-cell slices are drawn, and the half-width of the slab of samples shown on each. */
const SLICES = [0.3, 0.4, 0.55, 0.75];
const SLAB = 0.025;

/** Histograms of the margins over the runner-up and over the best candidate of another arrangement. */
function marginHistograms(a: Atlas): string[] {
  const one = (margins: number[], xTitle: string, title: string): string => {
    const none = margins.filter((m) => !(m > 0)).length;
    return renderHistogram({
      values: margins, xTitle, title, widthPx: 480,
      note: none > 0 ? `${none} samples without a positive margin left out` : `${margins.length} samples`,
    });
  };
  return [
    one(a.samples.map((s) => s.margin ?? 0), '(runner-up - winner) / winner perimeter', 'margin over the runner-up'),
    one(a.samples.map((s) => s.otherArrangement?.margin ?? 0), '(best other arrangement - winner) / winner perimeter', 'margin over any other arrangement'),
  ];
}

/** The figure `lather atlas --plot` writes. */
export function atlasPlot(a: Atlas): string {
  const n = a.cells;
  const arrangements = legendOf(a);
  const noWinnerLabel = n === 4 ? 'outside slice / no sample near' : n === 3 ? 'no sample near' : 'no sample in the bin';
  const title = `lather atlas: ${n} cells, ${a.samples.length} samples (seed ${a.seed})`;
  const winners = a.samples.filter((s) => s.winner !== null);
  if (n === 3 || n === 4) {
    const maps: string[] = [];
    const slices = n === 3 ? [null] : SLICES;
    slices.forEach((s, k) => {
      const slab = s === null ? winners : winners.filter((x) => Math.abs(x.areas[0] / n - s) <= SLAB);
      // the other three shares, scaled to sum to 1 (the slice's own triangle)
      const points = slab.map((x) => {
        const rest = n === 3 ? x.areas : x.areas.slice(1);
        const sum = rest.reduce((p, q) => p + q, 0);
        return { w: rest.map((v) => v / sum), cls: (x.winner as NonNullable<AtlasSample['winner']>).class };
      });
      const limit = s === null ? 1 : s / (1 - s);
      maps.push(renderRegionMap({
        grid: { kind: 'triangle', divisions: DIVISIONS, shareNames: n === 3 ? ['a', 'b', 'c'] : ['b', 'c', 'd'] },
        arrangements, winners: triangleWinners(points, 3 / DIVISIONS, (w) => Math.max(...w) <= limit + 1e-12),
        title: s === null ? `shares a : b : c (${slab.length} samples)` : `largest share a = ${s} ± ${SLAB} (${slab.length} samples); b : c : d`,
        sizePx: 300, thumbPx: 36, legend: k === Math.min(1, slices.length - 1), noWinnerLabel,
      }));
    });
    const rows = n === 3 ? [[maps[0]], marginHistograms(a)] : [[maps[0], maps[1]], [maps[2], maps[3]], marginHistograms(a)];
    return renderPanels(rows, { title });
  }
  const [i, j] = tellingPair(a);
  const G = Math.max(4, Math.min(30, Math.round(Math.sqrt(a.samples.length / 2))));
  const coord = (s: AtlasSample, c: number): number => s.areas[c] / n;
  const lo = [i, j].map((c) => Math.min(...a.samples.map((s) => coord(s, c))));
  const hi = [i, j].map((c) => Math.max(...a.samples.map((s) => coord(s, c))));
  // bins of equal width in the logarithm of each share; the majority class of each bin
  const bin = (v: number, d: number): number => {
    if (hi[d] <= lo[d]) return 0;
    return Math.min(G - 1, Math.floor((G * Math.log(v / lo[d])) / Math.log(hi[d] / lo[d])));
  };
  const tallies: Map<number, number>[] = Array.from({ length: G * G }, () => new Map());
  for (const s of winners) {
    const b = bin(coord(s, j), 1) * G + bin(coord(s, i), 0);
    const cls = (s.winner as NonNullable<AtlasSample['winner']>).class;
    tallies[b].set(cls, (tallies[b].get(cls) ?? 0) + 1);
  }
  const majority = tallies.map((t) => {
    let best: number | null = null;
    for (const [cls, c] of t) if (best === null || c > (t.get(best) as number) || (c === t.get(best) && cls < best)) best = cls;
    return best === null ? null : `k${best}`;
  });
  const centre = (d: number): number[] => {
    const span = hi[d] > lo[d] ? hi[d] / lo[d] : 2;
    const base = hi[d] > lo[d] ? lo[d] : lo[d] / Math.SQRT2;
    return Array.from({ length: G }, (_, k) => base * span ** ((k + 0.5) / G));
  };
  const map = renderRegionMap({
    grid: { kind: 'rectangle', xs: centre(0), ys: centre(1), xParameter: `share of the area of rank ${i + 1}`, yParameter: `share of the area of rank ${j + 1}`, logX: true, logY: true },
    arrangements, winners: majority, title: `winner class by bin (majority of its samples)`, sizePx: 420, thumbPx: 36, noWinnerLabel,
  });
  return renderPanels([[map], marginHistograms(a)], { title });
}

/**
 * The two most telling coordinates: of the shares by area rank, the pair in whose plane (log shares,
 * scaled to [0, 1]) the most samples have a nearest neighbour of the same winner class (ties to the
 * first pair).
 */
export function tellingPair(a: Atlas): [number, number] {
  const n = a.cells;
  // at most 2000 samples (the first of the design) keep it quadratic but quick
  const won = a.samples.filter((s) => s.winner !== null).slice(0, 2000);
  if (n < 3 || won.length < 2) return [0, n - 1];
  const logs = won.map((s) => s.areas.map((v) => Math.log(v)));
  let best: [number, number] = [0, n - 1];
  let bestScore = -1;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const span = [i, j].map((c) => {
        const v = logs.map((l) => l[c]);
        return [Math.min(...v), Math.max(...v) - Math.min(...v) || 1];
      });
      const x = logs.map((l) => (l[i] - span[0][0]) / span[0][1]);
      const y = logs.map((l) => (l[j] - span[1][0]) / span[1][1]);
      let score = 0;
      for (let p = 0; p < won.length; p++) {
        let q = -1;
        let d2 = Infinity;
        for (let r = 0; r < won.length; r++) {
          if (r === p) continue;
          const d = (x[p] - x[r]) ** 2 + (y[p] - y[r]) ** 2;
          if (d < d2) {
            d2 = d;
            q = r;
          }
        }
        if (won[q].winner?.class === won[p].winner?.class) score++;
      }
      if (score > bestScore) {
        bestScore = score;
        best = [i, j];
      }
    }
  }
  return best;
}
