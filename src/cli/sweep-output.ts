// cli stage: what `lather sweep` prints and draws: tables of intervals, transitions, boundaries and regions; the path plot and the region map.

import { cellFormulasText, type SweepCandidate } from '../sweep/candidates.ts';
import type { PathSweep, RegionSweep } from '../sweep/types.ts';
import type { SweepTyping } from '../sweep/tensions.ts';
import type { TrackedState } from '../sweep/track.ts';
import { renderPathPlot, renderRegionMap, type PathSeries, type WinnerBand, type PathEvent } from '../render/plot.ts';
import type { RegionArrangement } from '../render/plot.ts';
import type { ClusterDrawing } from '../render/types.ts';
import { tableNumber, tableValue } from './table.ts';
import { plural } from '../render/format.ts';

function num(x: number): string {
  return Number.isFinite(x) ? tableNumber(x) : '-';
}

/** Lay rows out in columns; columns in `right` are right-aligned. */
function columns(rows: string[][], right: ReadonlySet<number> = new Set()): string[] {
  const widths = rows[0].map((_, j) => Math.max(...rows.map((r) => r[j].length)));
  return rows.map((r) => r.map((c, j) => (right.has(j) ? c.padStart(widths[j]) : c.padEnd(widths[j]))).join('  ').trimEnd());
}

function who(c: SweepCandidate): string {
  return `${c.id} ${cellFormulasText(c)}`;
}

function relaxationText(s: PathSweep | RegionSweep): string {
  const r = s.counts.relaxations;
  return `${r.cold + r.warm + r.probe} relaxations (${r.cold} cold, ${r.warm} warm, ${r.probe} probes)`;
}

/** "types a a b b; tensions a:b = t" of a typed sweep (every pair not named has tension 1). */
function typingText(typing: SweepTyping): string {
  const pairs = typing.tensions.map(({ i, j, formula }) => `${typing.labels[i]}:${typing.labels[j]} = ${formula.source}`);
  return `types ${typing.types.map((t) => typing.labels[t]).join(' ')} by area; tensions ${pairs.length > 0 ? pairs.join(', ') : 'all 1'} (others 1); ranked by energy`;
}

/** The lines `lather sweep` prints for a path: header, intervals, transitions, boundaries. */
export function pathTable(s: PathSweep): string[] {
  const C = s.set.candidates;
  const { parameter, samples, log } = s.domain;
  const lines = [
    `${plural(s.formulas.length, 'cell')}, areas ${s.formulas.map((f) => f.source).join(', ')}; ${parameter.name} from ${parameter.from} to ${parameter.to} ` +
      `(${samples} samples${log ? ', log spacing' : ''}): ${plural(s.counts.arrangements, 'arrangement')}, ${plural(s.counts.candidates, 'candidate')}, ${relaxationText(s)}`,
    '',
    'winner by interval',
  ];
  const measure = s.typing === undefined ? 'perimeter' : 'energy';
  if (s.typing !== undefined) lines.splice(1, 0, typingText(s.typing));
  const rows: string[][] = [['from', 'to', 'samples', 'id', 'sides', 'areas by cell', `${measure} from`, `${measure} to`]];
  s.intervals.forEach((iv, i) => {
    if (iv.winner === null) {
      rows.push([tableValue(iv.from), tableValue(iv.to), String(iv.samples), '-', '-', 'no certified equilibrium', '-', '-']);
      return;
    }
    const c = C[iv.winner];
    const first = i === 0 ? s.ranked[0][0]?.perimeter : s.transitions[i - 1].perimeters[1];
    const last = i === s.intervals.length - 1 ? s.ranked[s.xs.length - 1][0]?.perimeter : s.transitions[i].perimeters[0];
    rows.push([tableValue(iv.from), tableValue(iv.to), String(iv.samples), c.id, c.sides.join(''), cellFormulasText(c), num(first ?? NaN), num(last ?? NaN)]);
  });
  lines.push(...columns(rows, new Set([0, 1, 2, 6, 7])));
  lines.push('');
  if (s.transitions.length === 0) lines.push('transitions: none (one winner on the whole range)');
  else {
    lines.push(`transitions (located to ${s.domain.parameter.name} +- the half-width shown)`);
    const t: string[][] = [[parameter.name, '+-', 'from', 'to', 'kind', `${measure} from`, `${measure} to`]];
    for (const x of s.transitions) {
      const from = x.from >= 0 ? who(C[x.from]) : '-';
      const to = x.to >= 0 ? who(C[x.to]) : '-';
      t.push([num(x.at), (0.5 * (x.bracket[1] - x.bracket[0])).toExponential(1), from, to, x.kind, num(x.perimeters[0]), num(x.perimeters[1])]);
    }
    lines.push(...columns(t, new Set([0, 1, 5, 6])));
  }
  lines.push('');
  if (s.boundaries.length === 0) lines.push('existence boundaries of the competitors: none');
  else {
    lines.push(`existence boundaries of the ${s.competitors.length} competitors (ranked within the top ${Math.max(...s.ranked.map((r) => r.length))} somewhere)`);
    const b: string[][] = [[parameter.name, 'id', 'sides', 'areas by cell', 'exists', measure, 'failure beyond']];
    for (const x of s.boundaries) {
      const c = C[x.candidate];
      let failure = x.status === 'wall-collapse'
        ? `wall ${x.collapsingWall} collapses; T1 to ${x.becomes === null ? 'no admissible arrangement' : x.becomes.id}`
        : x.status;
      if (x.zeroModes > 0) failure += ` (${x.zeroModes} zero mode${x.zeroModes > 1 ? 's' : ''}: depends on where it slid)`;
      b.push([num(x.at), c.id, c.sides.join(''), cellFormulasText(c), x.exists, num(x.perimeter), failure]);
    }
    lines.push(...columns(b, new Set([0, 5])));
  }
  return lines;
}

/** The lines `lather sweep` prints for a grid or a triangle: header and regions. */
export function regionTable(s: RegionSweep): string[] {
  const C = s.set.candidates;
  const d = s.domain;
  const where = d.kind === 'grid'
    ? d.parameters.map((p) => `${p.name} from ${p.from} to ${p.to}`).join(', ') + ` (${d.samples} x ${d.samples} samples${d.log ? ', log spacing' : ''})`
    : `${d.shares.join(' + ')} = ${d.total} (${d.divisions * d.divisions} triangles, ${d.divisions} per side)`;
  const lines = [
    `${plural(s.formulas.length, 'cell')}, areas ${s.formulas.map((f) => f.source).join(', ')}; ${where}: ` +
      `${plural(s.counts.arrangements, 'arrangement')}, ${plural(s.counts.candidates, 'candidate')}, ${relaxationText(s)}`,
    ...(s.typing === undefined ? [] : [typingText(s.typing)]),
    '',
    'regions (connected samples with one winner)',
  ];
  const rows: string[][] = [['region', 'samples', 'id', 'sides', 'areas by cell', ...s.names.map((n) => `${n} range`)]];
  s.regions.forEach((g, i) => {
    const c = g.winner === null ? null : C[g.winner];
    rows.push([
      String(i + 1), String(g.members.length), c?.id ?? '-', c?.sides.join('') ?? '-', c === null ? 'no certified equilibrium' : cellFormulasText(c),
      ...g.extent.map(([lo, hi]) => `${tableValue(lo)}..${tableValue(hi)}`),
    ]);
  });
  lines.push(...columns(rows, new Set([0, 1])));
  const totals = new Map<number | null, number>();
  for (const g of s.regions) totals.set(g.winner, (totals.get(g.winner) ?? 0) + g.members.length);
  lines.push('', 'samples won');
  const t: string[][] = [['samples', 'id', 'areas by cell']];
  for (const [w, n] of [...totals].sort((a, b) => b[1] - a[1])) t.push([String(n), w === null ? '-' : C[w].id, w === null ? 'no certified equilibrium' : cellFormulasText(C[w])]);
  lines.push(...columns(t, new Set([0])));
  return lines;
}

function drawingOf(c: SweepCandidate, state: TrackedState): ClusterDrawing {
  return {
    map: c.cluster.map,
    coords: state.equilibrium.coords,
    bulges: state.equilibrium.bulges,
    areas: state.areas,
    pressures: state.equilibrium.pressures,
    title: c.id,
  };
}

/** The path plot (renderPathPlot) of a path sweep: the competitors against the parameter. */
export function pathPlot(s: PathSweep): string {
  const C = s.set.candidates;
  const count = s.xs.length;
  const winnerAt = s.ranked.map((r) => (r.length > 0 ? r[0].candidate : -1));
  const series: PathSeries[] = s.competitors.map((c) => {
    // a drawing where it wins (middle of its longest run), else where it comes closest to the winner
    let best = -1;
    let bestScore = -Infinity;
    let run = 0;
    for (let k = 0; k < count; k++) {
      run = winnerAt[k] === c ? run + 1 : 0;
      const state = s.states[c][k];
      if (state === null) continue;
      const score = run > 0 ? run : -(state.equilibrium.energy / (s.ranked[k][0]?.perimeter ?? 1));
      if (score > bestScore) {
        bestScore = score;
        best = run > 0 ? k - ((run - 1) >> 1) : k;
      }
    }
    const state = best >= 0 ? s.states[c][best] : null;
    return {
      key: `c${c}`,
      label: who(C[c]),
      perimeters: s.states[c].map((st) => (st === null ? null : st.equilibrium.energy)),
      drawing: state === null ? undefined : drawingOf(C[c], state),
    };
  });
  const bands: WinnerBand[] = s.intervals.filter((i) => i.winner !== null).map((i) => ({ from: i.from, to: i.to, key: `c${i.winner}` }));
  const events: PathEvent[] = s.boundaries.map((b) => ({ x: b.at, label: C[b.candidate].id }));
  return renderPathPlot({
    xs: s.xs, series, bands, events, parameter: s.domain.parameter.name, logX: s.domain.log,
    ...(s.typing === undefined ? {} : { measure: 'energy' }),
    title: `areas ${s.formulas.map((f) => f.source).join(', ')}`,
  });
}

/** The region map (renderRegionMap) of a grid or triangle sweep, a legend entry per winner. */
export function regionPlot(s: RegionSweep): string {
  const C = s.set.candidates;
  const winners = s.ranked.map((r) => (r.length > 0 ? r[0].candidate : null));
  const order: number[] = [];
  for (const w of winners) if (w !== null && !order.includes(w)) order.push(w);
  const arrangements: RegionArrangement[] = order.map((c) => {
    const k = winners.indexOf(c);
    const state = s.winnerStates[k] as TrackedState;
    return { key: `c${c}`, label: who(C[c]), drawing: drawingOf(C[c], state) };
  });
  const d = s.domain;
  const grid = d.kind === 'grid'
    ? {
      kind: 'rectangle' as const,
      xs: [...Array(d.samples).keys()].map((i) => s.values[2 * i]),
      ys: [...Array(d.samples).keys()].map((j) => s.values[2 * j * d.samples + 1]),
      xParameter: d.parameters[0].name, yParameter: d.parameters[1].name, logX: d.log, logY: d.log,
    }
    : { kind: 'triangle' as const, divisions: d.divisions, shareNames: [...d.shares] as [string, string, string] };
  return renderRegionMap({
    grid, arrangements, winners: winners.map((w) => (w === null ? null : `c${w}`)),
    title: `areas ${s.formulas.map((f) => f.source).join(', ')}`,
  });
}
