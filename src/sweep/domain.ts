// sweep stage: what is varied (a path, a grid of two parameters, or a triangle of three shares) and where it is sampled.

import { triangleSamples } from './triangle-grid.ts';
import { FormulaError, UsageError } from '../errors.ts';
import { FORMULA_CONSTANTS, FORMULA_FUNCTIONS, type AreaFormula } from './formula.ts';

/** A parameter and the closed range it runs over. */
export interface ParameterRange {
  readonly name: string;
  readonly from: number;
  readonly to: number;
}

/** One parameter along a path of `samples` points, ends included. */
export interface PathDomain {
  readonly kind: 'path';
  readonly parameter: ParameterRange;
  readonly samples: number;
  /** Samples equally spaced in the logarithm of the parameter. */
  readonly log: boolean;
}

/** Two parameters over a samples x samples grid, ends included. */
export interface GridDomain {
  readonly kind: 'grid';
  readonly parameters: readonly [ParameterRange, ParameterRange];
  readonly samples: number;
  readonly log: boolean;
}

/**
 * Three shares a + b + c = total, sampled at the centroids of the divisions^2 small triangles of the
 * barycentric triangle (triangle-grid.ts triangleSamples order). Shares are never 0 there.
 */
export interface TriangleDomain {
  readonly kind: 'triangle';
  readonly shares: readonly [string, string, string];
  readonly total: number;
  readonly divisions: number;
}

/** Any sweep domain. */
export type SweepDomain = PathDomain | GridDomain | TriangleDomain;

const NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;

function checkName(name: string, what: string): void {
  if (!NAME.test(name) || FORMULA_CONSTANTS.includes(name) || FORMULA_FUNCTIONS.includes(name)) {
    throw new UsageError(
      `${what} name "${name}" is not valid when expected a letter followed by letters, digits or _, other than a constant or function name.`,
    );
  }
}

function number(text: string, what: string): number {
  const t = text.trim();
  const v = /^[-+]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][-+]?[0-9]+)?$/.test(t) ? Number(t) : NaN;
  if (!Number.isFinite(v)) throw new UsageError(`${what} is "${text}" when expected a finite number.`);
  return v;
}

/**
 * Parse "t=0.1:10" or "s=0.5:2,t=0.5:2": one or two parameters with their ranges (from < to).
 * @throws UsageError naming the bad part.
 */
export function parseVary(text: string): ParameterRange[] {
  const parts = text.split(',').map((p) => p.trim());
  if (parts.length > 2) throw new UsageError(`--vary "${text}" names ${parts.length} parameters when expected 1 or 2.`);
  const ranges = parts.map((part) => {
    const m = /^([^=]+)=([^:]+):(.+)$/.exec(part);
    if (m === null) throw new UsageError(`Range "${part}" is not valid when expected name=from:to, e.g. t=0.1:10.`);
    const name = m[1].trim();
    checkName(name, 'Parameter');
    const from = number(m[2], `Start of ${name}`);
    const to = number(m[3], `End of ${name}`);
    if (!(from < to)) throw new UsageError(`Range of ${name} runs from ${from} to ${to} when expected from < to.`);
    return { name, from, to };
  });
  if (ranges.length === 2 && ranges[0].name === ranges[1].name) {
    throw new UsageError(`--vary names ${ranges[0].name} twice when expected two different parameters.`);
  }
  return ranges;
}

/**
 * Parse "a,b,c=3": three share names and their fixed positive total.
 * @throws UsageError naming the bad part.
 */
export function parseShares(text: string): { shares: [string, string, string]; total: number } {
  const m = /^([^=]+)=(.+)$/.exec(text.trim());
  if (m === null) throw new UsageError(`--shares "${text}" is not valid when expected three names and a total, e.g. a,b,c=3.`);
  const names = m[1].split(',').map((s) => s.trim());
  if (names.length !== 3) throw new UsageError(`--shares "${text}" names ${names.length} shares when expected 3.`);
  names.forEach((s) => checkName(s, 'Share'));
  if (new Set(names).size !== 3) throw new UsageError(`--shares "${text}" repeats a name when expected three different names.`);
  const total = number(m[2], 'Total of the shares');
  if (!(total > 0)) throw new UsageError(`Total of the shares is ${total} when expected a positive number.`);
  return { shares: names as [string, string, string], total };
}

/** Names of the domain's parameters, in order. */
export function parameterNames(domain: SweepDomain): string[] {
  if (domain.kind === 'path') return [domain.parameter.name];
  if (domain.kind === 'grid') return domain.parameters.map((p) => p.name);
  return [...domain.shares];
}

/**
 * Sample positions of one parameter: `count` points from `from` to `to`, ends exact, equally spaced
 * (in the logarithm when `log`).
 * @throws UsageError when a log range is not positive.
 */
export function rangeSamples(range: ParameterRange, count: number, log: boolean): Float64Array {
  if (log && !(range.from > 0)) {
    throw new UsageError(`Range of ${range.name} starts at ${range.from} when expected a positive start on a log scale.`);
  }
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const f = count === 1 ? 0 : i / (count - 1);
    out[i] = log ? range.from * Math.pow(range.to / range.from, f) : range.from + f * (range.to - range.from);
  }
  out[count - 1] = range.to;
  out[0] = range.from;
  return out;
}

/**
 * The most samples a sweep takes in total: along a path, over a grid (samples per side, squared) or over
 * a triangle (divisions per side, squared). Every sample keeps a tracked state per candidate, so memory
 * grows with the total, not with the count per side.
 */
export const SAMPLE_LIMIT = 10_000;

/** The number of samples of a domain: path samples, grid samples squared, triangle divisions squared. */
export function sampleCount(domain: SweepDomain): number {
  if (domain.kind === 'path') return domain.samples;
  if (domain.kind === 'grid') return domain.samples * domain.samples;
  return domain.divisions * domain.divisions;
}

/**
 * Check the total number of samples against SAMPLE_LIMIT, before any is made.
 * @throws UsageError naming the total, how it comes about and the cap.
 */
export function checkSampleCount(domain: SweepDomain): void {
  const total = sampleCount(domain);
  if (total <= SAMPLE_LIMIT) return;
  const how = domain.kind === 'path'
    ? 'along the path'
    : domain.kind === 'grid'
      ? `(${domain.samples} x ${domain.samples} over the grid)`
      : `(${domain.divisions} x ${domain.divisions} triangles)`;
  const side = domain.kind === 'path' ? SAMPLE_LIMIT : Math.floor(Math.sqrt(SAMPLE_LIMIT));
  throw new UsageError(
    `Sweep has ${total} samples ${how} when expected at most ${SAMPLE_LIMIT} in total (--samples ${side} or fewer${domain.kind === 'path' ? '' : ' per side'}).`,
  );
}

/**
 * Check that the formulas use the parameters the domain varies: every parameter of a path or a grid,
 * and at least two of a triangle's three shares (the third is then fixed by the total). A parameter no
 * formula uses would sweep nothing. `tensions`: formulas of wall tensions, which use parameters too.
 * @throws UsageError naming the parameter and the formulas.
 */
export function checkParametersUsed(formulas: readonly AreaFormula[], domain: SweepDomain, tensions: readonly AreaFormula[] = []): void {
  const names = parameterNames(domain);
  const used = names.filter((name) => formulas.some((f) => f.uses.includes(name)) || tensions.some((f) => f.uses.includes(name)));
  const areas = formulas.map((f) => f.source).join(', ');
  if (domain.kind === 'triangle') {
    if (used.length < 2) {
      throw new UsageError(
        `Areas "${areas}" use ${used.length === 0 ? 'none' : `only ${used[0]}`} of the shares ${names.join(', ')} when expected at least two of them.`,
      );
    }
    return;
  }
  const unused = names.find((name) => !used.includes(name));
  if (unused !== undefined) {
    const where = tensions.length > 0 ? ` nor the tensions "${tensions.map((f) => f.source).join(', ')}"` : '';
    throw new UsageError(`Parameter ${unused} is used by none of the areas "${areas}"${where} when expected every parameter of --vary in a formula.`);
  }
}

/** The sample points of a domain: values[k * names.length + j] is parameter j at sample k. */
export interface SamplePoints {
  readonly names: readonly string[];
  readonly count: number;
  readonly values: Float64Array;
}

/**
 * Every sample point of a domain: a path in order; a grid row by row (second parameter outer), so
 * sample j * samples + i is at (x_i, y_j); a triangle in triangleSamples order.
 * @throws UsageError beyond SAMPLE_LIMIT samples in total.
 */
export function domainSamples(domain: SweepDomain): SamplePoints {
  checkSampleCount(domain);
  const names = parameterNames(domain);
  if (domain.kind === 'path') {
    const xs = rangeSamples(domain.parameter, domain.samples, domain.log);
    return { names, count: xs.length, values: xs };
  }
  if (domain.kind === 'grid') {
    const xs = rangeSamples(domain.parameters[0], domain.samples, domain.log);
    const ys = rangeSamples(domain.parameters[1], domain.samples, domain.log);
    const values = new Float64Array(2 * xs.length * ys.length);
    let k = 0;
    for (let j = 0; j < ys.length; j++) {
      for (let i = 0; i < xs.length; i++) {
        values[k++] = xs[i];
        values[k++] = ys[j];
      }
    }
    return { names, count: xs.length * ys.length, values };
  }
  const weights = triangleSamples(domain.divisions);
  const values = new Float64Array(weights.length);
  for (let k = 0; k < weights.length; k++) values[k] = domain.total * weights[k];
  return { names, count: weights.length / 3, values };
}

/** The scope of sample k ({name: value}). */
export function sampleScope(points: SamplePoints, k: number): Record<string, number> {
  const scope: Record<string, number> = {};
  const m = points.names.length;
  for (let j = 0; j < m; j++) scope[points.names[j]] = points.values[k * m + j];
  return scope;
}

function scopeText(scope: Readonly<Record<string, number>>): string {
  return Object.entries(scope).map(([k, v]) => `${k} = ${v}`).join(', ');
}

/**
 * Evaluate every formula at a scope into `out` (one value per slot).
 * @throws FormulaError when a value is not a positive finite number, naming it and the scope.
 */
export function slotValuesInto(formulas: readonly AreaFormula[], scope: Readonly<Record<string, number>>, out: Float64Array): Float64Array {
  for (let i = 0; i < formulas.length; i++) {
    const v = formulas[i].value(scope);
    if (!(Number.isFinite(v) && v > 0)) {
      throw new FormulaError(`Area ${i + 1} "${formulas[i].source}" is ${v} at ${scopeText(scope)} when expected a positive finite area.`);
    }
    out[i] = v;
  }
  return out;
}

/**
 * Check every formula on the samples of the domain and on its range ends (grid corners included),
 * before any relaxing; the triangle is checked on its samples (its corners have zero shares).
 * @throws FormulaError naming the first bad value and where it happens.
 */
export function checkFormulasOnDomain(formulas: readonly AreaFormula[], domain: SweepDomain): void {
  const out = new Float64Array(formulas.length);
  if (domain.kind === 'path') {
    const { name, from, to } = domain.parameter;
    slotValuesInto(formulas, { [name]: from }, out);
    slotValuesInto(formulas, { [name]: to }, out);
  } else if (domain.kind === 'grid') {
    const [p, q] = domain.parameters;
    for (const x of [p.from, p.to]) for (const y of [q.from, q.to]) slotValuesInto(formulas, { [p.name]: x, [q.name]: y }, out);
  }
  const points = domainSamples(domain);
  for (let k = 0; k < points.count; k++) slotValuesInto(formulas, sampleScope(points, k), out);
}
