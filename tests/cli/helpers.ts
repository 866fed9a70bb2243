// Run the lather binary as a user would, capturing its output and exit status.
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const BIN = fileURLToPath(new URL('../../src/cli/lather.js', import.meta.url));

/** Run `lather ...args`; returns stdout, stderr and the exit status. */
export function lather(args: string[], options: { cwd?: string } = {}): { stdout: string; stderr: string; status: number } {
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', cwd: options.cwd, env: { ...process.env, CI: 'true' } });
  return { stdout: r.stdout, stderr: r.stderr, status: r.status ?? -1 };
}
