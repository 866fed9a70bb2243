// cli stage: reading a list of areas ("1,1,2.5") or a built-in example name.

import { InvalidArgumentError } from 'commander';
import { EXAMPLES, findExample } from '../catalogue/examples.ts';
import { UsageError } from '../errors.ts';

/** Parse "a1,a2,..." into positive finite numbers. */
export function parseAreas(text: string): number[] {
  const items = text.split(',').map((s) => s.trim());
  return items.map((item, i) => {
    if (item === '') {
      throw new InvalidArgumentError(`Area ${i + 1} of "${text}" is missing when expected a positive finite number.`);
    }
    const value = /^[+]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][-+]?[0-9]+)?$/.test(item) ? Number(item) : NaN;
    if (!(Number.isFinite(value) && value > 0)) {
      throw new InvalidArgumentError(`Area ${i + 1} is "${item}" when expected a positive finite number.`);
    }
    return value;
  });
}

/** The areas of --areas or --example (exactly one of them). @throws UsageError otherwise. */
export function areasFrom(opts: { areas?: number[]; example?: string }): number[] {
  if (opts.areas !== undefined && opts.example !== undefined) {
    throw new UsageError('Both --areas and --example given when expected one of them.');
  }
  if (opts.example !== undefined) {
    const ex = findExample(opts.example);
    if (ex === undefined) {
      throw new UsageError(`Example "${opts.example}" is unknown when expected one of ${EXAMPLES.map((e) => e.name).join(', ')}.`);
    }
    return ex.areas;
  }
  if (opts.areas === undefined) throw new UsageError('No --areas given when expected --areas a1,a2,... or --example NAME.');
  return opts.areas;
}
