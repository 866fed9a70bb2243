// sweep stage: a sweep as a JSON document (every sample, every transition and boundary), numbers rounded once when written.

import type { SweepDomain } from './domain.ts';
import type { PathSweep, Placed, RegionSweep } from './types.ts';

/** Format name written into every sweep file. */
export const SWEEP_FORMAT = 'lather-sweep';
/** Version of the sweep file format. */
export const SWEEP_VERSION = 1;

/** Significant digits of every float written (the relaxer certifies to about 1e-10 relative). */
const DIGITS = 12;

function round(x: number): number {
  return Number(x.toPrecision(DIGITS));
}

function placed(p: Placed | undefined): { candidate: number; perimeter: number } | null {
  return p === undefined ? null : { candidate: p.candidate, perimeter: round(p.perimeter) };
}

function domainJson(domain: SweepDomain): Record<string, unknown> {
  if (domain.kind === 'path') return { kind: 'path', parameter: { ...domain.parameter }, samples: domain.samples, log: domain.log };
  if (domain.kind === 'grid') return { kind: 'grid', parameters: domain.parameters.map((p) => ({ ...p })), samples: domain.samples, log: domain.log };
  return { kind: 'triangle', shares: [...domain.shares], total: domain.total, divisions: domain.divisions };
}

// A typed sweep's types (by area) and tensions ("a:b" -> formula), and that its perimeters are energies.
function typingJson(sweep: PathSweep | RegionSweep): Record<string, unknown> {
  const t = sweep.typing;
  if (t === undefined) return {};
  const tensions: Record<string, string> = {};
  for (const { i, j, formula } of t.tensions) tensions[`${t.labels[i]}:${t.labels[j]}`] = formula.source;
  return { types: t.types.map((k) => t.labels[k]), tensions, ranking: 'energy' };
}

function head(sweep: PathSweep | RegionSweep, extra: Record<string, unknown>): Record<string, unknown> {
  return {
    format: SWEEP_FORMAT,
    version: SWEEP_VERSION,
    query: { areas: sweep.formulas.map((f) => f.source), domain: domainJson(sweep.domain), ...typingJson(sweep), ...extra },
    counts: sweep.counts,
    candidates: sweep.set.candidates.map((c) => ({ index: c.index, id: c.id, code: c.code, sides: [...c.sides], cellAreas: [...c.cellFormulas], ...(c.cellTypes === undefined ? {} : { cellTypes: [...c.cellTypes] }) })),
  };
}

/** The JSON text of a path sweep (2-space indented, ends with a newline). Same sweep, same bytes. */
export function pathSweepJson(sweep: PathSweep, query: Record<string, unknown> = {}): string {
  const m = sweep.formulas.length;
  const name = sweep.domain.parameter.name;
  const doc = {
    ...head(sweep, query),
    competitors: sweep.competitors,
    samples: [...sweep.xs].map((x, k) => ({
      [name]: round(x),
      areas: [...sweep.slotValues.subarray(k * m, (k + 1) * m)].map(round),
      winner: placed(sweep.ranked[k][0]),
      runnerUp: placed(sweep.ranked[k][1]),
      ranked: sweep.ranked[k].map((p) => placed(p)),
    })),
    intervals: sweep.intervals.map((i) => ({ from: round(i.from), to: round(i.to), winner: i.winner, samples: i.samples })),
    transitions: sweep.transitions.map((t) => ({
      at: round(t.at), bracket: t.bracket.map(round), from: t.from, to: t.to, kind: t.kind, perimeters: t.perimeters.map(round),
    })),
    boundaries: sweep.boundaries.map((b) => ({
      candidate: b.candidate, at: round(b.at), bracket: b.bracket.map(round), exists: b.exists, status: b.status,
      collapsingWall: b.collapsingWall, becomes: b.becomes, perimeter: round(b.perimeter),
    })),
  };
  return `${JSON.stringify(doc, null, 2)}\n`;
}

/** The JSON text of a grid or triangle sweep. Same sweep, same bytes. */
export function regionSweepJson(sweep: RegionSweep, query: Record<string, unknown> = {}): string {
  const m = sweep.formulas.length;
  const dims = sweep.names.length;
  const doc = {
    ...head(sweep, query),
    samples: sweep.ranked.map((r, k) => {
      const at: Record<string, number> = {};
      sweep.names.forEach((n, j) => (at[n] = round(sweep.values[k * dims + j])));
      return {
        ...at,
        areas: [...sweep.slotValues.subarray(k * m, (k + 1) * m)].map(round),
        winner: placed(r[0]),
        runnerUp: placed(r[1]),
      };
    }),
    regions: sweep.regions.map((g) => ({
      winner: g.winner, samples: g.members.length, members: g.members, extent: g.extent.map((e) => e.map(round)),
    })),
  };
  return `${JSON.stringify(doc, null, 2)}\n`;
}
