// cli stage: reading --types ("a,a,b") and --tension ("a:b=1.4,a:out=1") into a query's cell typing.

import { InvalidArgumentError } from 'commander';
import { UsageError } from '../errors.ts';
import { type CellTyping, type TensionSetting, cellTyping } from '../solver/tensions.ts';
import { findExample } from '../catalogue/examples.ts';

/** One --tension item as typed: the two types and the value's text (a number, or a formula for sweep). */
export interface TensionText {
  a: string;
  b: string;
  text: string;
}

/** Parse --types "a,b,..." into one label per area (the labels are checked with the areas' count). */
export function parseTypes(text: string): string[] {
  return text.split(',').map((item, i) => {
    const t = item.trim();
    if (t === '') throw new InvalidArgumentError(`Type ${i + 1} of "${text}" is missing when expected a label such as a or b.`);
    return t;
  });
}

// An item starts at a "label:label=" (a formula's own commas, as in max(t, 1), stay inside its value).
const ITEM_START = /,(?=\s*[A-Za-z][A-Za-z0-9_]*\s*:\s*[A-Za-z][A-Za-z0-9_]*\s*=)/;
const ITEM = /^\s*([A-Za-z][A-Za-z0-9_]*)\s*:\s*([A-Za-z][A-Za-z0-9_]*)\s*=(.*)$/;

/** Parse --tension "a:b=1.4,a:out=1" into its items (values checked by the verb). */
export function parseTensions(text: string): TensionText[] {
  return text.split(ITEM_START).map((item) => {
    const m = ITEM.exec(item);
    if (m === null || m[3].trim() === '') {
      throw new InvalidArgumentError(`Tension "${item.trim()}" is not valid when expected type:type=value, e.g. a:b=1.4 or a:out=1.`);
    }
    return { a: m[1], b: m[2], text: m[3].trim() };
  });
}

const DECIMAL = /^[+]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][-+]?[0-9]+)?$/;

/** The items of --tension with numeric values. @throws UsageError naming a value that is not a positive number. */
export function numericTensions(items: readonly TensionText[]): TensionSetting[] {
  return items.map(({ a, b, text }) => {
    const value = DECIMAL.test(text) ? Number(text) : NaN;
    if (!(value > 0) || !Number.isFinite(value)) {
      throw new UsageError(`Tension ${a}:${b} is "${text}" when expected a positive finite number.`);
    }
    return { a, b, value };
  });
}

/**
 * The cell typing of --types and --tension for `cells` areas (numeric tensions), or the types and
 * tensions of --example when it has them and neither is given, or undefined.
 * @throws UsageError for --tension without --types, or bad labels or values.
 */
export function typingFrom(opts: { types?: string[]; tension?: TensionText[]; example?: string }, cells: number): CellTyping | undefined {
  const example = opts.example === undefined ? undefined : findExample(opts.example);
  if (example?.types !== undefined && opts.types === undefined && opts.tension === undefined) {
    return cellTyping(example.types, example.tensions ?? [], cells);
  }
  if (opts.types === undefined) {
    if (opts.tension !== undefined) throw new UsageError('Option --tension given without --types when expected --types a,b,... naming each cell\'s type.');
    return undefined;
  }
  return cellTyping(opts.types, numericTensions(opts.tension ?? []), cells);
}
