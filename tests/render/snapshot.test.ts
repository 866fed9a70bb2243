// render tests: the snapshot protocol itself (written outside CI, refused in CI, numbers normalised).

import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { expectSnapshot, normaliseNumbers } from './snapshot.ts';

describe('expectSnapshot', () => {
  const saved = process.env.CI;
  const dir = `${mkdtempSync(join(tmpdir(), 'lather-snap-'))}/`;
  afterEach(() => {
    if (saved === undefined) delete process.env.CI;
    else process.env.CI = saved;
  });

  it('expectSnapshot writes a missing snapshot when CI is not set and refuses one when it is', () => {
    delete process.env.CI;
    expectSnapshot('fresh', '<svg width="1"/>', dir);
    expect(readFileSync(`${dir}fresh.svg`, 'utf8')).toBe('<svg width="1"/>');
    process.env.CI = 'true';
    expect(() => expectSnapshot('absent', '<svg/>', dir)).toThrow(/missing/);
    rmSync(dir, { recursive: true, force: true });
  });

  it('expectSnapshot compares after rounding numbers to 3 decimals, and fails on a real change', () => {
    const d = `${mkdtempSync(join(tmpdir(), 'lather-snap-'))}/`;
    writeFileSync(`${d}s.svg`, '<path d="M1.0004 2 A3 3 0 0 1 -0.0001 5"/>');
    expectSnapshot('s', '<path d="M1 2 A3 3 0 0 1 0 5"/>', d);
    expect(() => expectSnapshot('s', '<path d="M1.01 2 A3 3 0 0 1 0 5"/>', d)).toThrow();
    rmSync(d, { recursive: true, force: true });
  });

  it('normaliseNumbers leaves colours alone', () => {
    expect(normaliseNumbers('fill="#1e5a00" x="0.12345"')).toBe('fill="#1e5a00" x="0.123"');
  });
});
