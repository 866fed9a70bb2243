// cli stage: `lather list <cells>`, every arrangement of n cells as a table, JSON Lines or GraphML.

import { type Command, Option } from 'commander';
import { enumerateClusters } from '../maps/cluster.ts';
import { countArrangements, rootedMapCount } from '../maps/count.ts';
import { type ClusterSummary, summarizeCluster } from '../maps/describe.ts';
import { adjacencyGraph, GRAPHML_HEAD, GRAPHML_TAIL, graphmlGraph } from '../maps/adjacency.ts';
import { countText, durationText, estimateClusterCount } from '../maps/estimate.ts';
import { UsageError } from '../errors.ts';
import { type ArrangementFilter, isFiltering, passesFilter } from '../catalogue/filter.ts';
import { filterFromOptions, LIST_LIMIT, oneOf, parseCells, parseShard, wholeNumber } from './parse.ts';
import { eventLoopTurns } from '../event-loop.ts';
import { Output, withRunFiles } from './output.ts';
import { startProgress } from './progress.ts';

/** Refuse big enumerations unless asked, with an estimate of count and time. */
export function checkSize(cells: number, large: boolean | undefined, limit: number, verb: string): void {
  if (cells > limit && !large) {
    const { clusters, seconds } = estimateClusterCount(cells);
    throw new UsageError(
      `Cell count ${cells} is above ${limit} when expected at most ${limit} without --large ` +
        `(${countText(clusters)} arrangements, ${durationText(seconds)} to ${verb}).`,
    );
  }
}

function tableRow(id: string, s: ClusterSummary): string {
  const cols = [
    id.padEnd(8),
    s.code.padEnd(Math.max(14, s.code.length)),
    s.sides.join(' ').padEnd(2 * s.cells + 1),
    String(s.outsideSides).padStart(3),
    s.touchingOutside.join(',').padEnd(Math.max(8, 3 * s.cells)),
    String(s.symmetry).padStart(3),
    (s.chiral ? 'yes' : 'no').padEnd(6),
    (s.threeConnected ? 'yes' : 'no').padEnd(6),
    String(s.lenses).padStart(5),
    s.contacts.map(([a, b]) => `${a}-${b}`).join(' '),
  ];
  return cols.join(' ');
}

function tableHead(cells: number): string {
  return [
    'id'.padEnd(8),
    'code'.padEnd(Math.max(14, 6 * (cells - 1) > 36 ? 2 * cells : 14)),
    'cell sides'.padEnd(2 * cells + 1),
    'out',
    'touching'.padEnd(Math.max(8, 3 * cells)),
    'sym',
    'chiral',
    '3-conn',
    'lens',
    'walls (0 = outside)',
  ].join(' ');
}

function jsonRow(id: string | null, s: ClusterSummary): string {
  return JSON.stringify({ id, ...s });
}

/** Attach `list` to the program. */
export function addListCommand(program: Command): void {
  program
    .command('list')
    .argument('<cells>', 'number of cells', parseCells)
    .addOption(new Option('--format <format>', 'table, jsonl or graphml').default('table').argParser(oneOf(['table', 'jsonl', 'graphml'] as const, 'Format')))
    .option('--three-connected', 'only arrangements whose map is 3-connected')
    .option('--no-lens', 'leave out arrangements with a 2-sided cell')
    .option('--max-sides <k>', 'only arrangements whose cells have at most k sides', wholeNumber(1, undefined, 'Sides'))
    .option('--min-sides <k>', 'only arrangements whose cells have at least k sides', wholeNumber(1, undefined, 'Sides'))
    .option('--count', 'print the counts and the rooting check instead of the list')
    .option('--shard <i/k>', 'do part i of k of the work (union of all parts = the whole)', parseShard)
    .option('--large', `allow more than ${LIST_LIMIT} cells`)
    .option('--out <file>', 'write to a file (whole or not at all) instead of standard output')
    .action(async (cells: number, opts, command: Command) => {
      checkSize(cells, opts.large, LIST_LIMIT, 'list');
      if (opts.count && command.getOptionValueSource('format') === 'cli') {
        throw new UsageError(`--format ${opts.format} given with --count when expected one of them (--count prints counts, not a list).`);
      }
      const filter = filterFromOptions(opts);
      await withRunFiles([], (files) => (opts.out === undefined ? null : files.add(opts.out, '--out')), async (file) => {
        const output = new Output(file);
        if (opts.count) writeCounts(output, cells, opts.shard, filter);
        else await writeList(output, cells, opts.format, opts.shard, filter);
        output.flush();
      });
    });
}

async function writeList(
  output: Output,
  cells: number,
  format: 'table' | 'jsonl' | 'graphml',
  shard: { index: number; count: number } | undefined,
  filter: ArrangementFilter,
): Promise<void> {
  const progress = startProgress(`cells ${cells}`, Math.round(estimateClusterCount(cells).clusters / (shard?.count ?? 1)));
  if (format === 'table') output.line(tableHead(cells));
  if (format === 'graphml') output.line(GRAPHML_HEAD);
  const turn = eventLoopTurns();
  let k = 0;
  for (const cluster of enumerateClusters(cells, { shard })) {
    k++;
    if ((k & 255) === 0) {
      progress.update(k);
      await output.ready(); // a slow reader holds the enumeration back, so memory stays flat
      await turn(); // and a signal is heard
    }
    const summary = summarizeCluster(cluster);
    if (!passesFilter(summary, filter)) continue;
    // ids are positions in the whole enumeration, so a shard cannot know them
    const id = shard === undefined ? `${cells}.${k}` : null;
    if (format === 'table') output.line(tableRow(id ?? '-', summary));
    else if (format === 'jsonl') output.line(jsonRow(id, summary));
    else output.line(graphmlGraph(adjacencyGraph(summary), id ?? summary.code));
  }
  if (format === 'graphml') output.line(GRAPHML_TAIL);
  progress.stop();
}

function writeCounts(
  output: Output,
  cells: number,
  shard: { index: number; count: number } | undefined,
  filter: ArrangementFilter,
): void {
  const filtered = isFiltering(filter);
  if (cells === 1) {
    output.line('cells 1: 1 map, 1 arrangement (the circle); the rooting identities start at 2 cells');
    return;
  }
  const c = countArrangements(cells, { shard });
  const a = rootedMapCount(cells - 1);
  const part = shard === undefined ? '' : ` (shard ${shard.index + 1}/${shard.count}: partial sums, add the shards)`;
  output.line(`cells ${cells}${part}`);
  output.line(`  maps:         ${c.maps} (${c.mapsChiral} with mirror images apart)`);
  output.line(`  arrangements: ${c.clusters} (${c.clustersChiral} with mirror images apart)`);
  output.line(`  3-connected:  ${c.threeConnectedMaps} maps (${c.threeConnectedMapsChiral} chiral count), ${c.threeConnectedClusters} arrangements (${c.threeConnectedClustersChiral} chiral count)`);
  const by = c.threeConnectedByOutside.map((v, i) => (v > 0 ? `${i}:${v}` : '')).filter((x) => x !== '').join(' ');
  output.line(`  3-connected arrangements by cells on the outside: ${by || 'none'}`);
  const mark = (ok: boolean) => (shard !== undefined ? '' : ok ? '  ok' : '  MISMATCH');
  output.line(`  check: sum of 4E/|Aut(M)| over maps = ${c.mapRootings}; OEIS A000309(${cells - 1}) = ${a}${mark(c.mapRootings === a)}`);
  output.line(`  check: sum of 2E/|Aut+(M)| over oriented maps = ${c.orientedRootings}; A000309(${cells - 1}) = ${a}${mark(c.orientedRootings === a)}`);
  output.line(`  check: sum of 4E/|Aut(M,f)| over arrangements = ${c.clusterRootings}; (n+1) A000309(${cells - 1}) = ${BigInt(cells + 1) * a}${mark(c.clusterRootings === BigInt(cells + 1) * a)}`);
  if (filtered) {
    let kept = 0;
    for (const cluster of enumerateClusters(cells, { shard })) if (passesFilter(summarizeCluster(cluster), filter)) kept++;
    output.line(`  passing the filters: ${kept}`);
  }
}
