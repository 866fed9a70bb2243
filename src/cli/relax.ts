// cli stage: `lather relax <id-or-code>`, every equilibrium of one arrangement at given areas that the
// search finds (solver/equilibria.ts), the first in full.

import { type Command } from 'commander';
import { arrangementIds, resolveArrangement } from '../maps/resolve.ts';
import { summarizeCluster } from '../maps/describe.ts';
import { wallSwapCode } from '../maps/t1.ts';
import { type Cluster } from '../maps/cluster.ts';
import { DEFAULT_STARTS, type EquilibriumSearch, findEquilibria, searchAnswer } from '../solver/equilibria.ts';
import type { Equilibrium } from '../solver/result.ts';
import { renderClusterSvg } from '../render/svg.ts';
import { UsageError } from '../errors.ts';
import { parseAreas } from './areas.ts';
import { type TensionText, parseTensions, parseTypes, typingFrom } from './tensions.ts';
import { type CellTyping, isUnitTable, tensionPairs, wallTensions } from '../solver/tensions.ts';
import { withRunFiles, writeOut } from './output.ts';
import { equilibriumDrawing } from './drawings.ts';
import { familyText, tableNumber } from './table.ts';
import { plural } from '../render/format.ts';
import { wholeNumber } from './parse.ts';
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

/**
 * The readable summary of a search: its first answer in full (status, perimeter, cells, certificate),
 * then, when it found more than one, every equilibrium found with its index, zero modes, lens range
 * and the starts that reached it.
 */
export function relaxSummary(label: string, cluster: Cluster, areas: Float64Array, search: EquilibriumSearch, typing?: CellTyping): string[] {
  const eq = searchAnswer(search);
  const tensed = typing !== undefined && !isUnitTable(typing.table);
  const s = summarizeCluster(cluster);
  const lines = [`arrangement ${label}  code ${cluster.code}  (${cluster.cells} cells, sides ${s.sides.join(' ')}, outside ${s.outsideSides})`];
  const tried = plural(search.tried, 'start');
  if (eq.status === 'ok') {
    const first = search.found[0];
    const stable = eq.index === 0 ? 'stable in its arrangement' : `a saddle, ${eq.index} unstable direction${eq.index === 1 ? '' : 's'}`;
    lines.push(`status ok: certified equilibrium, index ${eq.index} (${stable}), ${eq.zeroModes} zero mode${eq.zeroModes === 1 ? '' : 's'}, ${search.iterations} Newton iterations`);
    lines.push(tensed ? `energy ${tableNumber(eq.energy, 12)}  (total length ${tableNumber(eq.perimeter, 12)})` : `perimeter ${tableNumber(eq.perimeter, 12)}`);
    if (first.family !== null) lines.push(`a lens family: ${familyText(first.family)}`);
    if (search.tried > 1 || search.found.length > 1) lines.push(`reached by ${first.reached} of ${tried}; ${search.found.length} equilibri${search.found.length === 1 ? 'um' : 'a'} found`);
  } else if (eq.status === 'junction-unbalanced') {
    const [x, y, z] = eq.junctionTensions as [number, number, number];
    lines.push(
      `status junction-unbalanced: the walls at junction ${eq.unbalancedJunction} have tensions ${x}, ${y}, ${z}, one at least ` +
        'the sum of the other two, so no junction of them balances (no equilibrium of this arrangement with these tensions)',
    );
  } else if (eq.status === 'no-convergence') {
    // no convergence is no statement about existence
    lines.push(`status no-convergence: the solver did not converge (existence unknown) from ${tried}; ${search.iterations} Newton iterations`);
  } else {
    let how: string;
    if (eq.status === 'wall-collapse') {
      const to = t1Neighbour(cluster, eq);
      const id = to !== null && cluster.cells <= 8 ? arrangementIds(cluster.cells).get(to) : undefined;
      how = `the flow collapses wall ${eq.collapsingWall}; its T1 swap gives ${to === null ? 'no admissible arrangement' : id ? `${id} (${to})` : to}`;
    } else if (eq.status === 'cell-collapse') how = `the flow collapses cell ${eq.collapsingCell} (it shrinks away from the others)`;
    else if (eq.status === 'walls-cross') how = 'the walls cross';
    else how = 'the branch folds back';
    lines.push(`status ${eq.status}: no equilibrium from ${tried}; ${how}; ${search.iterations} Newton iterations`);
  }
  lines.push('');
  lines.push(`cell  target area  achieved area  pressure  sides${typing ? '  type' : ''}`);
  for (let i = 0; i < cluster.cells; i++) {
    const type = typing ? `  ${typing.table.labels[typing.types[i]]}` : '';
    lines.push(`${String(i + 1).padStart(4)}  ${tableNumber(areas[i], 6).padStart(11)}  ${tableNumber(eq.areas[i]).padStart(13)}  ${tableNumber(eq.pressures[i], 6).padStart(8)}  ${String(s.sides[i]).padStart(5)}${type}`);
  }
  const c = eq.certificate;
  lines.push('');
  lines.push(
    `certificate: area ${e(c.areaResidual)}, tangent sums ${e(c.tangentResidual)}, Laplace-Young ${e(c.curvatureResidual)}, ` +
      `shortest wall ${tableNumber(c.minWallLength, 4)}, smallest cell ${tableNumber(c.minCellArea, 4)}, crossings ${c.crossings}, misordered junctions ${c.misorderedJunctions}`,
  );
  if (search.found.length > 1) lines.push('', ...foundTable(search, tried));
  return lines;
}

/** Every equilibrium a search found: perimeter, index, zero modes, starts that reached it, lens range. */
function foundTable(search: EquilibriumSearch, tried: string): string[] {
  const head = ['#', 'perimeter', 'index', 'zero modes', 'reached', 'kind'];
  const rows = search.found.map((f, i) => {
    const q = f.equilibrium;
    const kind = q.index === 0 ? 'stable' : `saddle (index ${q.index})`;
    return [String(i + 1), tableNumber(q.perimeter, 12), String(q.index), String(q.zeroModes), String(f.reached),
      f.family === null ? kind : `${kind}, ${familyText(f.family)}`];
  });
  const widths = head.map((_, j) => Math.max(...[head, ...rows].map((r) => r[j].length)));
  const line = (r: string[]) => r.map((cell, j) => (j <= 1 ? cell.padStart(widths[j]) : cell.padEnd(widths[j]))).join('  ').trimEnd();
  return [`every equilibrium found from ${tried}:`, line(head), ...rows.map(line)];
}

/** One answer as plain JSON data. */
function answerJson(cluster: Cluster, eq: Equilibrium): object {
  return {
    status: eq.status, perimeter: eq.perimeter, energy: eq.energy,
    pressures: [...eq.pressures], areas: [...eq.areas], coords: [...eq.coords], bulges: [...eq.bulges],
    curvatures: [...eq.curvatures], certificate: eq.certificate, index: eq.index, zeroModes: eq.zeroModes,
    iterations: eq.iterations, restarts: eq.restarts, collapsingWall: eq.collapsingWall,
    collapsingCell: eq.collapsingCell, becomes: t1Neighbour(cluster, eq),
    ...(eq.status === 'junction-unbalanced' ? { unbalancedJunction: eq.unbalancedJunction, junctionTensions: eq.junctionTensions } : {}),
  };
}

/**
 * The whole search as plain JSON data: the first answer's fields at the top (as relax printed one answer
 * before it searched), then `tried` and `equilibria`, every equilibrium found with `reached` and `family`.
 */
export function relaxJson(label: string, cluster: Cluster, areas: Float64Array, search: EquilibriumSearch, typing?: CellTyping): object {
  return {
    arrangement: label, code: cluster.code, targetAreas: [...areas],
    ...(typing ? { types: typing.types.map((t) => typing.table.labels[t]), tensions: tensionPairs(typing) } : {}),
    ...answerJson(cluster, searchAnswer(search)),
    tried: search.tried,
    equilibria: search.found.map((f) => ({ ...answerJson(cluster, f.equilibrium), reached: f.reached, family: f.family })),
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
    .option('--starts <k>', `first drawings tried (barycentric, construction path, then seeded perturbations; default ${DEFAULT_STARTS})`, wholeNumber(1, undefined, 'Starts'))
    .option('--seed <n>', 'seed of the perturbed first drawings (and of the saddle search)', wholeNumber(0, 0xffffffff, 'Seed'), 1)
    .option('--unstable', 'also look for saddles (index >= 1)')
    .option('--tension-labels', 'label each wall with its tension in the drawing')
    .option('--types <list>', 'a type label per cell in cell order, e.g. a,a,b (the outside is "out")', parseTypes)
    .option('--tension <list>', 'tension of walls between two types, e.g. a:b=1.4,a:out=1 (default 1)', parseTensions)
    .action(async (what: string, opts) => {
      for (const option of ['pressures', 'junctions', 'tensionLabels'] as const) {
        const name = option === 'tensionLabels' ? 'tension-labels' : option;
        if (opts[option] && !opts.svg) throw new UsageError(`Option --${name} given without --svg when expected it only with --svg (it styles the drawing).`);
      }
      const cluster = resolveArrangement(what);
      const areas = areasForCluster(cluster, opts.areas, what);
      const typing = typingFrom(opts as { types?: string[]; tension?: TensionText[] }, cluster.cells);
      const tensions = typing ? wallTensions(cluster.map, typing.types, typing.table) : null;
      const search = await withRunFiles([], (files) => (opts.svg === undefined ? null : files.add(opts.svg, '--svg')), (svg) => {
        const search = findEquilibria(cluster.map, areas, { starts: opts.starts, unstable: Boolean(opts.unstable), seed: opts.seed, tensions });
        const typed = typing === undefined ? undefined : { cellTypes: typing.types, typeLabels: typing.table.labels, tensions };
        svg?.write(renderClusterSvg(equilibriumDrawing(cluster, areas, searchAnswer(search), what, typed), {
          pressures: opts.pressures, junctions: opts.junctions, tensions: opts.tensionLabels,
        }));
        return search;
      });
      const text = opts.json ? JSON.stringify(relaxJson(what, cluster, areas, search, typing), null, 2) : relaxSummary(what, cluster, areas, search, typing).join('\n');
      writeOut(text + '\n');
    });
}
