// render stage: the sweep's region map: a grid over two parameters (or a barycentric triangle) coloured by winner.
//
// Triangle layout: corner V0 bottom left, V1 bottom right, V2 top; lattice point P(i, j) =
// V0 + (i/m)(V1 - V0) + (j/m)(V2 - V0), barycentric weights (1 - (i+j)/m, i/m, j/m). Row j holds,
// left to right, U(0,j), D(0,j), U(1,j), ..., U(m-1-j, j):
//
//        P(0,j+1) ____ P(1,j+1)        U(i,j) = P(i,j) P(i+1,j) P(i,j+1)       (points up)
//              /\ D(0,j)/\             D(i,j) = P(i+1,j) P(i+1,j+1) P(i,j+1)   (points down)
//             /  \    /  \
//            /U(0,j)\/U(1,j)\
//      P(0,j) ---- P(1,j) ---- P(2,j)

import { checkDivisions, triangleCells, triangleSamples } from '../sweep/triangle-grid.ts';
import type { ClusterDrawing } from './types.ts';
import { checkDrawing } from './types.ts';
import { renderThumbnail } from './cluster-group.ts';
import type { Axis } from './axis.ts';
import { axisPx, makeAxis, xAxisSvg, yAxisSvg } from './axis.ts';
import { CELL_FILLS, INK, NO_WINNER_FILL } from './palette.ts';
import { checkDigits, escapeXml, fixed } from './format.ts';
import { UsageError } from '../errors.ts';

/** One arrangement that may win somewhere on the map. */
export interface RegionArrangement {
  /** Unique key; `winners` refers to it. */
  readonly key: string;
  /** Legend text. */
  readonly label: string;
  /** A small drawing for the legend. */
  readonly drawing?: ClusterDrawing;
}

/** A rectangular grid of samples over two parameters; winners[j * xs.length + i] is at (xs[i], ys[j]). */
export interface RectangleGrid {
  readonly kind: 'rectangle';
  /** Samples of the first parameter, strictly increasing (positive on a log axis). */
  readonly xs: ArrayLike<number>;
  /** Samples of the second parameter, strictly increasing (positive on a log axis). */
  readonly ys: ArrayLike<number>;
  /** x axis title. @default 's' */
  readonly xParameter?: string;
  /** y axis title. @default 't' */
  readonly yParameter?: string;
  /** Logarithmic x axis. @default false */
  readonly logX?: boolean;
  /** Logarithmic y axis. @default false */
  readonly logY?: boolean;
}

/**
 * A barycentric triangle of three shares with a fixed total, cut into divisions^2 small triangles;
 * winners follow the order of triangleSamples(divisions).
 */
export interface TriangleGrid {
  readonly kind: 'triangle';
  /** Small triangles per side, m >= 1. */
  readonly divisions: number;
  /** Names of the three shares, at corners V0 (bottom left), V1 (bottom right), V2 (top). @default ['a', 'b', 'c'] */
  readonly shareNames?: readonly [string, string, string];
}

/** Options of renderRegionMap. */
export interface RegionMapOptions {
  readonly grid: RectangleGrid | TriangleGrid;
  /** Arrangements in legend order; arrangement k is filled with CELL_FILLS[k % 8] and numbered k + 1. */
  readonly arrangements: readonly RegionArrangement[];
  /** The winner's key at every sample, or null where no arrangement has a certified equilibrium. */
  readonly winners: ReadonlyArray<string | null>;
  /** Heading over the map. */
  readonly title?: string;
  /** Size in pixels of the map's longer side. @default 420 */
  readonly sizePx?: number;
  /** Size in pixels of the legend's drawings. @default 40 */
  readonly thumbPx?: number;
  /** Decimals of every coordinate (pixel units). @default 2 */
  readonly digits?: number;
  /** Draw the legend beside the map (panels of one figure may share one). @default true */
  readonly legend?: boolean;
  /** Legend text of the places with no winner. @default 'no certified winner' */
  readonly noWinnerLabel?: string;
}

/** A grid cell on screen: its polygon (pixels) and its neighbours with the shared edge. */
interface MapCell {
  readonly polygon: number[];
  readonly neighbours: { cell: number; edge: [number, number, number, number] }[];
}

/** Cell edges of a sample axis: midpoints between samples (geometric on a log axis), ends mirrored. */
function sampleEdges(values: ArrayLike<number>, log: boolean): number[] {
  const count = values.length;
  const mid = (a: number, b: number): number => (log ? Math.sqrt(a * b) : 0.5 * (a + b));
  if (count === 1) return log ? [values[0] / Math.SQRT2, values[0] * Math.SQRT2] : [values[0] - 0.5, values[0] + 0.5];
  const edges = [log ? (values[0] * values[0]) / mid(values[0], values[1]) : 2 * values[0] - mid(values[0], values[1])];
  for (let i = 0; i + 1 < count; i++) edges.push(mid(values[i], values[i + 1]));
  edges.push(log ? (values[count - 1] * values[count - 1]) / mid(values[count - 2], values[count - 1]) : 2 * values[count - 1] - mid(values[count - 2], values[count - 1]));
  return edges;
}

function checkSamples(values: ArrayLike<number>, log: boolean, name: string): void {
  if (values.length < 1) throw new UsageError(`Region map has 0 ${name} samples when expected at least 1.`);
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]) || (i > 0 && !(values[i] > values[i - 1])) || (log && !(values[i] > 0))) {
      throw new UsageError(`Sample ${i} of ${name} is ${values[i]} when expected finite values increasing strictly${log ? ', positive' : ''}.`);
    }
  }
}

/**
 * A map of which arrangement wins over a region of area space: every sample's cell filled with its
 * winner's colour (light grey where none), boundaries between different winners drawn dark, each
 * connected region numbered with its winner's legend number at its most interior cell (so the map
 * reads without colour), axes with ticks for a rectangle grid or share ticks and names for a
 * triangle, and a legend of colours, numbers, names and small drawings filled with their region's
 * colour. Same input, same bytes.
 * @throws UsageError when the input is inconsistent (see the option docs).
 */
export function renderRegionMap(options: RegionMapOptions): string {
  const { grid, arrangements, winners } = options;
  const digits = checkDigits(options.digits ?? 2);
  const n = (v: number): string => fixed(v, digits);
  const sizePx = options.sizePx ?? 420;
  const thumbPx = options.thumbPx ?? 40;
  const index = new Map<string, number>();
  arrangements.forEach((a, k) => {
    if (index.has(a.key)) throw new UsageError(`Arrangement key ${a.key} appears twice when expected unique keys.`);
    index.set(a.key, k);
    if (a.drawing !== undefined) checkDrawing(a.drawing);
  });

  const titleH = options.title === undefined ? 0 : 28;
  const left = grid.kind === 'rectangle' ? 76 : 40;
  const top = 16 + titleH;
  const layout = grid.kind === 'rectangle'
    ? rectangleLayout(grid, winners.length, sizePx, left, top)
    : triangleLayout(grid, winners.length, sizePx, left, top);
  const { cells, mapW, mapH } = layout;
  const axes = frameSvg(layout, n);
  const out: string[] = [];
  for (const w of winners) {
    if (w !== null && !index.has(w)) throw new UsageError(`Winner ${w} names no arrangement when expected one of the arrangement keys.`);
  }

  // fills, then boundaries between different winners, then region numbers
  const fillOf = (w: string | null): string => (w === null ? NO_WINNER_FILL : CELL_FILLS[(index.get(w) as number) % CELL_FILLS.length]);
  out.push('<g class="regions" stroke-width="0.5" stroke-linejoin="round">');
  cells.forEach((cell, c) => {
    const fill = fillOf(winners[c]);
    out.push(`<polygon points="${pairs(cell.polygon, n)}" fill="${fill}" stroke="${fill}"/>`);
  });
  out.push('</g>');
  const edges: string[] = [];
  cells.forEach((cell, c) => {
    for (const { cell: d, edge } of cell.neighbours) {
      if (winners[c] !== winners[d]) edges.push(`M${n(edge[0])} ${n(edge[1])} L${n(edge[2])} ${n(edge[3])}`);
    }
  });
  if (edges.length > 0) out.push(`<path class="boundaries" d="${edges.join(' ')}" fill="none" stroke="${INK}" stroke-width="1.5" stroke-linecap="round"/>`);
  out.push(`<g class="region-numbers" font-family="sans-serif" font-size="11" font-weight="bold" text-anchor="middle" fill="${INK}">`);
  for (const [c, w] of regionLabelCells(cells, winners)) {
    const [x, y] = centroid(cells[c].polygon);
    out.push(`<text x="${n(x)}" y="${n(y + 4)}">${(index.get(w) as number) + 1}</text>`);
  }
  out.push('</g>');

  // legend
  const legendX = left + mapW + 40;
  const rowH = Math.max(thumbPx + 6, 22);
  const legend: string[] = [`<g class="legend" font-family="sans-serif" font-size="11" fill="${INK}">`];
  const rows: [string, string, ClusterDrawing | undefined][] = arrangements.map((a, k) => [fillOf(a.key), `${k + 1}  ${a.label}`, a.drawing]);
  if (winners.includes(null)) rows.push([NO_WINNER_FILL, options.noWinnerLabel ?? 'no certified winner', undefined]);
  const textX = arrangements.some((a) => a.drawing !== undefined) ? 36 + thumbPx : 28;
  rows.forEach(([fill, label, drawing], k) => {
    const y = top + k * rowH + rowH / 2;
    legend.push(`<rect x="${n(legendX)}" y="${n(y - 8)}" width="16" height="16" fill="${fill}" stroke="${INK}" stroke-width="0.75"/>`);
    if (drawing !== undefined) legend.push(renderThumbnail(drawing, legendX + 28 + thumbPx / 2, y, thumbPx, digits, fill));
    legend.push(`<text x="${n(legendX + textX)}" y="${n(y + 4)}">${escapeXml(label)}</text>`);
  });
  legend.push('</g>');
  const withLegend = options.legend ?? true;

  const width = withLegend ? legendX + 240 : left + mapW + 40;
  const height = Math.max(top + mapH + (grid.kind === 'rectangle' ? 52 : 24), withLegend ? top + rows.length * rowH + 16 : 0);
  const head = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${n(width)}" height="${n(height)}" viewBox="0 0 ${n(width)} ${n(height)}">`,
    `<rect width="${n(width)}" height="${n(height)}" fill="#ffffff"/>`,
  ];
  if (options.title !== undefined) {
    head.push(`<text class="title" x="${n(left + mapW / 2)}" y="${n(16 + 17)}" font-family="sans-serif" font-size="15" font-weight="bold" text-anchor="middle" fill="${INK}">${escapeXml(options.title)}</text>`);
  }
  return `${[...head, ...out, axes, ...(withLegend ? legend : []), '</svg>'].join('\n')}\n`;
}

/** Where the map's cells go on the page: polygons and shared edges, the map's size, and its frame. */
interface MapLayout {
  cells: MapCell[];
  mapW: number;
  mapH: number;
  frame:
    | { kind: 'rectangle'; xAxis: Axis; yAxis: Axis; bottom: number; left: number; xName: string; yName: string }
    | { kind: 'triangle'; point: (i: number, j: number) => [number, number]; m: number; names: readonly string[] };
}

// The layout of a rectangle grid: one cell per sample, its edges halfway between samples.
function rectangleLayout(grid: RectangleGrid, winnerCount: number, sizePx: number, left: number, top: number): MapLayout {
  const logX = grid.logX ?? false;
  const logY = grid.logY ?? false;
  checkSamples(grid.xs, logX, 'x');
  checkSamples(grid.ys, logY, 'y');
  const nx = grid.xs.length;
  const ny = grid.ys.length;
  if (winnerCount !== nx * ny) throw new UsageError(`Region map has ${winnerCount} winners when expected ${nx * ny} (${nx} x ${ny}).`);
  const ex = sampleEdges(grid.xs, logX);
  const ey = sampleEdges(grid.ys, logY);
  const mapW = sizePx;
  const mapH = sizePx;
  const xAxis: Axis = makeAxis(ex[0], ex[nx], logX, left, left + mapW);
  const yAxis: Axis = makeAxis(ey[0], ey[ny], logY, top + mapH, top, 6);
  const px = ex.map((v) => axisPx(xAxis, v));
  const py = ey.map((v) => axisPx(yAxis, v));
  const cells: MapCell[] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const neighbours: MapCell['neighbours'] = [];
      if (i + 1 < nx) neighbours.push({ cell: j * nx + i + 1, edge: [px[i + 1], py[j], px[i + 1], py[j + 1]] });
      if (j + 1 < ny) neighbours.push({ cell: (j + 1) * nx + i, edge: [px[i], py[j + 1], px[i + 1], py[j + 1]] });
      cells.push({ polygon: [px[i], py[j], px[i + 1], py[j], px[i + 1], py[j + 1], px[i], py[j + 1]], neighbours });
    }
  }
  return {
    cells, mapW, mapH,
    frame: { kind: 'rectangle', xAxis, yAxis, bottom: top + mapH, left, xName: grid.xParameter ?? 's', yName: grid.yParameter ?? 't' },
  };
}

// The layout of a triangle of shares: m^2 small triangles in triangleCells' order.
function triangleLayout(grid: TriangleGrid, winnerCount: number, sizePx: number, left: number, top: number): MapLayout {
  const m = checkDivisions(grid.divisions);
  if (winnerCount !== m * m) throw new UsageError(`Region map has ${winnerCount} winners when expected ${m * m} (${m}^2 triangles).`);
  const side = sizePx;
  const rise = (sizePx * Math.sqrt(3)) / 2;
  const names = grid.shareNames ?? ['a', 'b', 'c'];
  const point = (i: number, j: number): [number, number] => [left + (side * (i + 0.5 * j)) / m, top + 14 + rise - (rise * j) / m];
  const list = triangleCells(m);
  // neighbours: a down triangle D(i,j) shares its three edges with U(i,j), U(i+1,j) and U(i,j+1)
  const upAt = new Map<string, number>();
  list.forEach(([i, j, , up], c) => { if (up) upAt.set(`${i},${j}`, c); });
  const cells: MapCell[] = [];
  list.forEach(([i, j, corners, up]) => {
    const polygon = corners.flatMap(([a, b]) => point(a, b));
    const neighbours: MapCell['neighbours'] = [];
    if (!up) {
      const edge = (a: [number, number], b: [number, number]): [number, number, number, number] => [...point(...a), ...point(...b)];
      neighbours.push({ cell: upAt.get(`${i},${j}`) as number, edge: edge([i + 1, j], [i, j + 1]) });
      neighbours.push({ cell: upAt.get(`${i + 1},${j}`) as number, edge: edge([i + 1, j], [i + 1, j + 1]) });
      neighbours.push({ cell: upAt.get(`${i},${j + 1}`) as number, edge: edge([i, j + 1], [i + 1, j + 1]) });
    }
    cells.push({ polygon, neighbours });
  });
  return { cells, mapW: side, mapH: rise + 14 + 28, frame: { kind: 'triangle', point, m, names } };
}

// The frame of a laid-out map as SVG: axes of a rectangle, the labelled corners of a triangle.
function frameSvg(layout: MapLayout, n: (v: number) => string): string {
  const f = layout.frame;
  if (f.kind === 'rectangle') return `${xAxisSvg(f.xAxis, f.bottom, f.xName, n)}\n${yAxisSvg(f.yAxis, f.left, f.yName, n)}`;
  return triangleFrame(f.point, f.m, f.names, n);
}

function pairs(polygon: number[], n: (v: number) => string): string {
  const parts: string[] = [];
  for (let k = 0; k < polygon.length; k += 2) parts.push(`${n(polygon[k])},${n(polygon[k + 1])}`);
  return parts.join(' ');
}

function centroid(polygon: number[]): [number, number] {
  let x = 0;
  let y = 0;
  for (let k = 0; k < polygon.length; k += 2) {
    x += polygon[k];
    y += polygon[k + 1];
  }
  return [(2 * x) / polygon.length, (2 * y) / polygon.length];
}

/**
 * For every connected region of one winner (cells joined across shared edges), the cell farthest
 * from the region's boundary in steps (breadth-first from the boundary cells; ties to the lowest
 * cell index), with its winner. Regions of no winner get no number.
 */
function regionLabelCells(cells: readonly MapCell[], winners: ReadonlyArray<string | null>): [number, string][] {
  const count = cells.length;
  const adjacency: number[][] = cells.map(() => []);
  cells.forEach((cell, c) => {
    for (const { cell: d } of cell.neighbours) {
      adjacency[c].push(d);
      adjacency[d].push(c);
    }
  });
  // depth: steps to the nearest cell with a different winner or on the map's rim
  const depth = new Int32Array(count).fill(-1);
  const queue = new Int32Array(count);
  let head = 0;
  let tail = 0;
  for (let c = 0; c < count; c++) {
    const rim = adjacency[c].length < cells[c].polygon.length / 2 || adjacency[c].some((d) => winners[d] !== winners[c]);
    if (rim) {
      depth[c] = 0;
      queue[tail++] = c;
    }
  }
  while (head < tail) {
    const c = queue[head++];
    for (const d of adjacency[c]) {
      if (depth[d] === -1) {
        depth[d] = depth[c] + 1;
        queue[tail++] = d;
      }
    }
  }
  // regions: flood fill over equal winners, keep the deepest cell
  const region = new Int32Array(count).fill(-1);
  const result: [number, string][] = [];
  for (let c = 0; c < count; c++) {
    const w = winners[c];
    if (region[c] !== -1 || w === null) continue;
    let best = c;
    head = 0;
    tail = 0;
    queue[tail++] = c;
    region[c] = c;
    while (head < tail) {
      const e = queue[head++];
      if (depth[e] > depth[best] || (depth[e] === depth[best] && e < best)) best = e;
      for (const d of adjacency[e]) {
        if (region[d] === -1 && winners[d] === w) {
          region[d] = c;
          queue[tail++] = d;
        }
      }
    }
    result.push([best, w]);
  }
  return result;
}

/**
 * The triangle's outline, share gridlines at tenths-of-five (0.2, 0.4, 0.6, 0.8), share ticks
 * labelled along each edge (share w1 along the bottom, w2 along the right, w0 along the left, each
 * rising from 0 to 1 towards its own corner) and the three share names at their corners.
 */
function triangleFrame(point: (i: number, j: number) => [number, number], m: number, names: readonly string[], n: (v: number) => string): string {
  // a point of given weights (w1 along V0->V1, w2 along V0->V2) in lattice units
  const at = (w1: number, w2: number): [number, number] => point(w1 * m, w2 * m);
  const out: string[] = [`<g class="triangle-frame" font-family="sans-serif" font-size="10" fill="${INK}">`];
  const grid: string[] = [];
  const labels: string[] = [];
  for (let k = 1; k <= 4; k++) {
    const f = k / 5;
    const text = String(f);
    // w1 = f: from (f, 0) to (f, 1 - f); label under the bottom edge
    const [a1, b1] = [at(f, 0), at(f, 1 - f)];
    grid.push(`M${n(a1[0])} ${n(a1[1])} L${n(b1[0])} ${n(b1[1])}`);
    labels.push(`<text x="${n(a1[0])}" y="${n(a1[1] + 14)}" text-anchor="middle">${text}</text>`);
    // w2 = f: from (0, f) to (1 - f, f); label right of the right edge
    const [a2, b2] = [at(0, f), at(1 - f, f)];
    grid.push(`M${n(a2[0])} ${n(a2[1])} L${n(b2[0])} ${n(b2[1])}`);
    labels.push(`<text x="${n(b2[0] + 6)}" y="${n(b2[1] + 3)}" text-anchor="start">${text}</text>`);
    // w0 = f: from (1 - f, 0) to (0, 1 - f); label left of the left edge
    const [a0, b0] = [at(1 - f, 0), at(0, 1 - f)];
    grid.push(`M${n(a0[0])} ${n(a0[1])} L${n(b0[0])} ${n(b0[1])}`);
    labels.push(`<text x="${n(b0[0] - 6)}" y="${n(b0[1] + 3)}" text-anchor="end">${text}</text>`);
  }
  out.push(`<path d="${grid.join(' ')}" fill="none" stroke="#000000" stroke-opacity="0.15"/>`);
  const [v0, v1, v2] = [at(0, 0), at(1, 0), at(0, 1)];
  out.push(`<polygon points="${n(v0[0])},${n(v0[1])} ${n(v1[0])},${n(v1[1])} ${n(v2[0])},${n(v2[1])}" fill="none" stroke="${INK}" stroke-width="1"/>`);
  out.push(...labels);
  out.push(`<text x="${n(v0[0])}" y="${n(v0[1] + 28)}" text-anchor="middle" font-size="12">${escapeXml(names[0])} = 1</text>`);
  out.push(`<text x="${n(v1[0])}" y="${n(v1[1] + 28)}" text-anchor="middle" font-size="12">${escapeXml(names[1])} = 1</text>`);
  out.push(`<text x="${n(v2[0])}" y="${n(v2[1] - 8)}" text-anchor="middle" font-size="12">${escapeXml(names[2])} = 1</text>`);
  out.push('</g>');
  return out.join('\n');
}
