// cli stage: `lather sweep`, which arrangement wins as the areas change along a path, over a grid or over a triangle.

import { type Command } from 'commander';
import type { ArrangementFilter } from '../catalogue/filter.ts';
import { UsageError } from '../errors.ts';
import { parseAreaFormulas, parseFormula } from '../sweep/formula.ts';
import { cellTyping } from '../solver/tensions.ts';
import type { SweepTyping } from '../sweep/tensions.ts';
import { type TensionText, parseTensions, parseTypes } from './tensions.ts';
import {
  type SweepDomain, SAMPLE_LIMIT, checkFormulasOnDomain, checkParametersUsed, checkSampleCount, parameterNames, parseShares, parseVary,
} from '../sweep/domain.ts';
import { sweepPath } from '../sweep/path.ts';
import { sweepRegion } from '../sweep/region.ts';
import { pathSweepJson, regionSweepJson } from '../sweep/format.ts';
import { type OutputFile, type RunFiles, withRunFiles, writeOut } from './output.ts';
import { filterFromOptions, wholeNumber } from './parse.ts';
import { startProgress, type Progress } from './progress.ts';
import { pathPlot, pathTable, regionPlot, regionTable } from './sweep-output.ts';
import { cliStreams } from './streams.ts';

/** Default samples: along a path, per side of a grid, divisions of a triangle's side. */
const DEFAULT_SAMPLES = { path: 50, grid: 12, triangle: 10 } as const;

/** --samples: a whole number, at most SAMPLE_LIMIT (the total is checked with the domain). */
const samplesOption = wholeNumber(1, SAMPLE_LIMIT, 'Samples');

/** Read the domain from --vary / --shares, --samples and --log. @throws UsageError when they do not fit together. */
function domainFrom(opts: { vary?: string; shares?: string; samples?: number; log?: boolean }): SweepDomain {
  if ((opts.vary === undefined) === (opts.shares === undefined)) {
    throw new UsageError('Got ' + (opts.vary === undefined ? 'neither --vary nor --shares' : 'both --vary and --shares') +
      ' when expected one of them, e.g. --vary t=0.1:10 or --shares a,b,c=3.');
  }
  if (opts.shares !== undefined) {
    if (opts.log) throw new UsageError('Got --log with --shares when expected --log only with --vary.');
    const { shares, total } = parseShares(opts.shares);
    return { kind: 'triangle', shares, total, divisions: opts.samples ?? DEFAULT_SAMPLES.triangle };
  }
  const ranges = parseVary(opts.vary as string);
  const log = Boolean(opts.log);
  if (ranges.length === 1) {
    const samples = opts.samples ?? DEFAULT_SAMPLES.path;
    if (samples < 2) throw new UsageError(`Samples is ${samples} when expected at least 2 along a path.`);
    return { kind: 'path', parameter: ranges[0], samples, log };
  }
  return { kind: 'grid', parameters: [ranges[0], ranges[1]], samples: opts.samples ?? DEFAULT_SAMPLES.grid, log };
}

/**
 * The typing of --types and --tension (tensions as formulas of the parameters), or undefined.
 * @throws UsageError for --tension without --types or bad labels; FormulaError for a bad formula.
 */
function sweepTypingFrom(opts: { types?: string[]; tension?: TensionText[] }, cells: number, parameters: string[]): SweepTyping | undefined {
  if (opts.types === undefined) {
    if (opts.tension !== undefined) throw new UsageError('Option --tension given without --types when expected --types a,b,... naming each area\'s type.');
    return undefined;
  }
  const items = opts.tension ?? [];
  // the labels and pairs checked as for numbers; the values are formulas
  const { table, types } = cellTyping(opts.types, items.map(({ a, b }) => ({ a, b, value: 1 })), cells);
  const tensions = items.map(({ a, b, text }) => ({
    i: table.labels.indexOf(a), j: table.labels.indexOf(b), formula: parseFormula(text, parameters, `Tension ${a}:${b} "${text}"`),
  }));
  return { labels: table.labels, types, tensions };
}

/** Attach `sweep` to the program. */
export function addSweepCommand(program: Command): void {
  program
    .command('sweep')
    .requiredOption('--areas <formulas>', 'cell areas as formulas of the parameters, comma separated, e.g. "1, 1, 1, t"')
    .option('--vary <ranges>', 'one parameter (a path) or two (a grid) with their ranges, e.g. t=0.1:10 or s=0.5:2,t=0.5:2')
    .option('--shares <names=total>', 'three shares with a fixed total, sampled over their triangle, e.g. a,b,c=3')
    .option('--samples <n>', `samples along the path (50), per side of the grid (12), or triangle divisions per side (10); at most ${SAMPLE_LIMIT} in total`, samplesOption)
    .option('--log', 'space the samples evenly in the logarithm of each parameter')
    .option('--competitors <k>', 'candidates ranked within the top k somewhere are plotted and have their boundaries located', wholeNumber(1, undefined, 'Competitors'), 4)
    .option('--three-connected', 'only arrangements whose map is 3-connected')
    .option('--no-lens', 'leave out arrangements with a 2-sided cell')
    .option('--max-sides <k>', 'only arrangements whose cells have at most k sides', wholeNumber(1, undefined, 'Sides'))
    .option('--min-sides <k>', 'only arrangements whose cells have at least k sides', wholeNumber(1, undefined, 'Sides'))
    .option('--json [file]', 'write every sample, transition and boundary as JSON to the file (or to stdout instead of the table)')
    .option('--plot <file.svg>', 'draw the path plot or the region map')
    .option('--types <list>', 'a type label per area, in --areas order, e.g. a,a,b,b (the outside is "out")', parseTypes)
    .option('--tension <list>', 'tension of walls between two types, a number or a formula of the parameters, e.g. "a:b=t,a:out=1" (default 1)', parseTensions)
    .action(async (opts) => {
      // everything is checked before any relaxing
      const domain = domainFrom(opts);
      checkSampleCount(domain);
      const formulas = parseAreaFormulas(opts.areas, parameterNames(domain));
      const typing = sweepTypingFrom(opts, formulas.length, parameterNames(domain));
      checkParametersUsed(formulas, domain, typing?.tensions.map((t) => t.formula));
      checkFormulasOnDomain(formulas, domain);
      const filter = filterFromOptions(opts);
      const declare = (files: RunFiles) => ({
        json: typeof opts.json === 'string' ? files.add(opts.json, '--json') : null,
        plot: opts.plot === undefined ? null : files.add(opts.plot, '--plot'),
      });
      const text = await withRunFiles([], declare, (outputs) => sweepTo(formulas, domain, filter, opts.competitors, opts.json === true, outputs, typing));
      writeOut(text);
    });
}

/** Sweep, write the JSON and the plot files asked for, and return what standard output gets. */
function sweepTo(
  formulas: ReturnType<typeof parseAreaFormulas>, domain: SweepDomain, filter: ArrangementFilter, competitors: number,
  jsonToStdout: boolean, outputs: { json: OutputFile | null; plot: OutputFile | null }, typing: SweepTyping | undefined,
): string {
  let progress: Progress | null = null;
  const onProgress = (done: number, total: number): void => {
    progress ??= startProgress('sweeping', total);
    progress.update(done);
  };
  const query = { filter, competitors };
  let json: string;
  let lines: string[];
  let svg: () => string;
  if (domain.kind === 'path') {
    const s = sweepPath(formulas, domain, { filter, competitors, onProgress, typing });
    json = pathSweepJson(s, query);
    lines = pathTable(s);
    svg = () => pathPlot(s);
  } else {
    const s = sweepRegion(formulas, domain, { filter, competitors, onProgress, typing });
    json = regionSweepJson(s, query);
    lines = regionTable(s);
    svg = () => regionPlot(s);
  }
  (progress as Progress | null)?.stop();
  outputs.json?.write(json);
  outputs.plot?.write(svg());
  return jsonToStdout ? json : `${lines.join('\n')}\n`;
}
