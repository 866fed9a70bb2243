// render tests: text snapshots in tests/snapshots/, compared after rounding every number to 3 decimals.

import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';

const DIR = fileURLToPath(new URL('../snapshots/', import.meta.url));

/** Every number (not inside a colour like #1e5a00 or a word) rounded to 3 decimals, trailing zeros dropped. */
export function normaliseNumbers(text: string): string {
  return text.replace(/(?<![#\w.])-?\d+(?:\.\d+)?(?:e[-+]?\d+)?/g, (token) => {
    const r = Math.round(Number(token) * 1000) / 1000;
    return r === 0 ? '0' : String(r);
  });
}

/**
 * Compare `text` with tests/snapshots/<name>.svg after normalising numbers (d3-geo style protocol):
 * a missing snapshot is written when CI is not set and fails when it is; UPDATE_SNAPSHOTS=1
 * rewrites it.
 */
export function expectSnapshot(name: string, text: string): void {
  const path = `${DIR}${name}.svg`;
  if (process.env.UPDATE_SNAPSHOTS === '1' || !existsSync(path)) {
    if (process.env.CI !== undefined && process.env.UPDATE_SNAPSHOTS !== '1') {
      throw new Error(`Snapshot ${name}.svg is missing when expected it in tests/snapshots (CI does not write snapshots).`);
    }
    writeFileSync(path, text);
    return;
  }
  expect(normaliseNumbers(text)).toBe(normaliseNumbers(readFileSync(path, 'utf8')));
}
