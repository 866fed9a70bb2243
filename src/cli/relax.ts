// cli stage: `lather relax <id-or-code>`, the equilibrium of one arrangement at given areas.

import { type Command } from 'commander';
import { arrangementIds, resolveArrangement } from '../maps/resolve.ts';
import { summarizeCluster } from '../maps/describe.ts';
import { wallSwapCode } from '../maps/t1.ts';
import { type Cluster } from '../maps/cluster.ts';
import { relax } from '../solver/newton.ts';
import type { Equilibrium } from '../solver/result.ts';
import { renderClusterSvg } from '../render/svg.ts';
import { UsageError } from '../errors.ts';
import { parseAreas } from './areas.ts';
import { withRunFiles, writeOut } from './output.ts';
import { equilibriumDrawing } from './drawings.ts';
import { tableNumber } from './table.ts';
import { cliStreams } from './streams.ts';

/** The areas for a cluster: the given list (checked against the cell count) or equal areas of 1. */
export function areasForCluster(cluster: Cluster, given: number[] | undefined, label: string): Float64Array {
  if (given === undefined) return new Float64Array(cluster.cells).fill(1);
  if (given.length !== cluster.cells) {
    throw new UsageError(`Got ${given.length} areas when expected ${cluster.cells} (one per cell of ${label}).`);
  }
  return Float64Array.from(given);
}

/** The arrangement a collapsing wall's T1 swap leads to, as its code, or null. */
export function t1Neighbour(cluster: Cluster, eq: Equilibrium): string | null {
  return eq.status === 'wall-collapse' && eq.collapsingWall !== null ? wallSwapCode(cluster, eq.collapsingWall) : null;
}

function e(x: number): string {
  return x === 0 ? '0' : x.toExponential(1);
}

/** The readable summary of one answer. */
export function relaxSummary(label: string, cluster: Cluster, areas: Float64Array, eq: Equilibrium): string[] {
  const s = summarizeCluster(cluster);
  const lines = [`arrangement ${label}  code ${cluster.code}  (${cluster.cells} cells, sides ${s.sides.join(' ')}, outside ${s.outsideSides})`];
  if (eq.status === 'ok') {
    const stable = eq.index === 0 ? 'stable in its arrangement' : `${eq.index} unstable direction${eq.index === 1 ? '' : 's'}`;
    lines.push(`status ok: certified equilibrium, index ${eq.index} (${stable}), ${eq.zeroModes} zero mode${eq.zeroModes === 1 ? '' : 's'}, ${eq.iterations} Newton iterations`);
    lines.push(`perimeter ${tableNumber(eq.perimeter, 12)}`);
  } else {
    let why: string = eq.status;
    if (eq.status === 'wall-collapse') {
      const to = t1Neighbour(cluster, eq);
      const id = to !== null && cluster.cells <= 8 ? arrangementIds(cluster.cells).get(to) : undefined;
      why += `: wall ${eq.collapsingWall} shrinks to zero; its T1 swap gives ${to === null ? 'no admissible arrangement' : id ? `${id} (${to})` : to}`;
    } else if (eq.status === 'cell-collapse') why += `: cell ${eq.collapsingCell} shrinks away from the others`;
    // no convergence is no statement about existence
    if (eq.status === 'no-convergence') lines.push(`status ${why}: the solver did not converge (existence unknown); ${eq.iterations} Newton iterations`);
    else lines.push(`status ${why} (no equilibrium of this arrangement at these areas; ${eq.iterations} Newton iterations)`);
  }
  lines.push('');
  lines.push('cell  target area  achieved area  pressure  sides');
  for (let i = 0; i < cluster.cells; i++) {
    lines.push(`${String(i + 1).padStart(4)}  ${tableNumber(areas[i], 6).padStart(11)}  ${tableNumber(eq.areas[i]).padStart(13)}  ${tableNumber(eq.pressures[i], 6).padStart(8)}  ${s.sides[i]}`);
  }
  const c = eq.certificate;
  lines.push('');
  lines.push(
    `certificate: area ${e(c.areaResidual)}, tangent sums ${e(c.tangentResidual)}, Laplace-Young ${e(c.curvatureResidual)}, ` +
      `shortest wall ${tableNumber(c.minWallLength, 4)}, smallest cell ${tableNumber(c.minCellArea, 4)}, crossings ${c.crossings}, misordered junctions ${c.misorderedJunctions}`,
  );
  return lines;
}

/** The whole answer as plain JSON data. */
export function relaxJson(label: string, cluster: Cluster, areas: Float64Array, eq: Equilibrium): object {
  return {
    arrangement: label, code: cluster.code, targetAreas: [...areas], status: eq.status, perimeter: eq.perimeter,
    pressures: [...eq.pressures], areas: [...eq.areas], coords: [...eq.coords], bulges: [...eq.bulges],
    curvatures: [...eq.curvatures], certificate: eq.certificate, index: eq.index, zeroModes: eq.zeroModes,
    iterations: eq.iterations, restarts: eq.restarts, collapsingWall: eq.collapsingWall,
    collapsingCell: eq.collapsingCell, becomes: t1Neighbour(cluster, eq),
  };
}

/** Attach `relax` to the program. */
export function addRelaxCommand(program: Command): void {
  program
    .command('relax')
    .argument('<arrangement>', 'an id from `lather list` (e.g. 4.9) or a code (e.g. "3:...b7a")')
    .option('--areas <list>', 'cell areas in the arrangement\'s cell order (default: all 1)', parseAreas)
    .option('--json', 'print the whole answer as JSON')
    .option('--svg <file>', 'write a drawing of the answer')
    .option('--pressures', 'show pressures in the drawing')
    .option('--junctions', 'mark junctions in the drawing')
    .action(async (what: string, opts) => {
      for (const option of ['pressures', 'junctions'] as const) {
        if (opts[option] && !opts.svg) throw new UsageError(`Option --${option} given without --svg when expected it only with --svg (it styles the drawing).`);
      }
      const cluster = resolveArrangement(what);
      const areas = areasForCluster(cluster, opts.areas, what);
      const eq = await withRunFiles([], (files) => (opts.svg === undefined ? null : files.add(opts.svg, '--svg')), (svg) => {
        const eq = relax(cluster.map, areas);
        svg?.write(renderClusterSvg(equilibriumDrawing(cluster, areas, eq, what), { pressures: opts.pressures, junctions: opts.junctions }));
        return eq;
      });
      const text = opts.json ? JSON.stringify(relaxJson(what, cluster, areas, eq), null, 2) : relaxSummary(what, cluster, areas, eq).join('\n');
      writeOut(text + '\n');
    });
}
