// maps stage: the plain-text arrangement code, e.g. "4:..2.5.8" (cells, then the walls in label order).
//
// A code is written from a twins array in canonical labelling (canonical.ts). Darts are scanned in label
// order; each dart not yet paired gives one token for its twin: '.' when the twin is the first dart of
// the next junction not yet seen (a breadth-first tree wall), otherwise the twin's label in base 36,
// padded to the width needed for the largest label 3V - 1. The outside is the face of dart 0. The
// format is versioned by this description: it does not change from release to release.
//
// Example: the theta graph (two cells) has twins [3, 5, 4, 0, 2, 1] and code "2:.54".

import { CubicMap } from './cubic-map.ts';
import { MapError } from '../errors.ts';

/**
 * The most cells a code holds: every verb that reads codes accepts 1 to this many cells, and nothing
 * enumerates or ranks more (the codes it wrote could not be read back).
 */
export const CODE_CELL_LIMIT = 200;

/** Width in base-36 digits of a label for a map of n cells. */
function labelWidth(cells: number): number {
  const darts = 6 * (cells - 1);
  return Math.max(1, (darts - 1).toString(36).length);
}

/** Write the code of a twins array for n cells. The circle (n = 1) is "1:". */
export function encodeCode(cells: number, twins: Int32Array): string {
  const m = twins.length;
  const width = labelWidth(cells);
  let body = '';
  let seen = 1;
  for (let i = 0; i < m; i++) {
    const t = twins[i];
    if (t < i) continue;
    if (t === 3 * seen) {
      body += '.';
      seen++;
    } else {
      body += t.toString(36).padStart(width, '0');
    }
  }
  return `${cells}:${body}`;
}

/**
 * Read a code back into a twins array (in the labelling it was written in).
 * @throws MapError when the text is not a well-formed code.
 */
export function decodeCode(text: string): { cells: number; twins: Int32Array } {
  const match = /^([0-9]+):([.0-9a-z]*)$/.exec(text.trim());
  if (match === null) {
    throw new MapError(`Arrangement code "${text}" is malformed when expected <cells>:<walls>, e.g. "2:.54".`);
  }
  const cells = Number(match[1]);
  if (!Number.isSafeInteger(cells) || cells < 1 || cells > CODE_CELL_LIMIT) {
    throw new MapError(`Arrangement code "${text}" has ${match[1]} cells when expected 1 to ${CODE_CELL_LIMIT}.`);
  }
  const body = match[2];
  if (cells === 1) {
    if (body !== '') throw new MapError(`Arrangement code "${text}" has walls when expected "1:" for one cell.`);
    return { cells, twins: new Int32Array(0) };
  }
  const m = 6 * (cells - 1);
  const width = labelWidth(cells);
  const twins = new Int32Array(m).fill(-1);
  let seen = 1;
  let p = 0;
  for (let i = 0; i < m; i++) {
    if (twins[i] !== -1) continue;
    if (p >= body.length) throw new MapError(`Arrangement code "${text}" ends early when expected ${m / 2} walls.`);
    let t: number;
    if (body[p] === '.') {
      t = 3 * seen;
      seen++;
      p++;
    } else {
      const token = body.slice(p, p + width);
      t = /^[0-9a-z]+$/.test(token) && token.length === width ? parseInt(token, 36) : -1;
      p += width;
    }
    if (!(t > i && t < m) || twins[t] !== -1 || (t / 3 | 0) >= seen) {
      throw new MapError(`Arrangement code "${text}" pairs dart ${i} with ${t} when expected an unpaired dart of a junction already reached.`);
    }
    twins[i] = t;
    twins[t] = i;
  }
  if (p !== body.length) throw new MapError(`Arrangement code "${text}" has ${body.length - p} extra characters when expected ${m / 2} walls.`);
  return { cells, twins };
}

/** Decode a code into a CubicMap (not yet checked for admissibility; see validateCluster). */
export function mapFromCode(text: string): { cells: number; map: CubicMap } {
  const { cells, twins } = decodeCode(text);
  return { cells, map: new CubicMap(twins) };
}
