// render tests: text snapshots in tests/snapshots/, compared after rounding every number to 3 decimals.

import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';

const DIR = fileURLToPath(new URL('../snapshots/', import.meta.url));

/** Every number, also right after a path command letter, rounded to 3 decimals; colours like #1e5a00 kept as they are. */
export function normaliseNumbers(text: string): string {
  return text.replace(/#[0-9a-fA-F]{3,8}\b|-?\d+(?:\.\d+)?(?:e[-+]?\d+)?/g, (token) => {
    if (token.startsWith('#')) return token;
    const r = Math.round(Number(token) * 1000) / 1000;
    return r === 0 ? '0' : String(r);
  });
}

/**
 * Compare `text` with tests/snapshots/<name>.svg after normalising numbers (d3-geo style protocol):
 * a missing snapshot is written when CI is not set and fails when it is; UPDATE_SNAPSHOTS=1
 * rewrites it. `dir` (ending in '/') is for testing this helper.
 */
export function expectSnapshot(name: string, text: string, dir = DIR): void {
  const path = `${dir}${name}.svg`;
  if (process.env.UPDATE_SNAPSHOTS === '1' || !existsSync(path)) {
    if (process.env.CI !== undefined && process.env.UPDATE_SNAPSHOTS !== '1') {
      throw new Error(`Snapshot ${name}.svg is missing when expected it in tests/snapshots (CI does not write snapshots).`);
    }
    writeFileSync(path, text);
    return;
  }
  expect(normaliseNumbers(text)).toBe(normaliseNumbers(readFileSync(path, 'utf8')));
}
