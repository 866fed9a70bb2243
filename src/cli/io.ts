// cli stage: the only file-system helpers; every output file is written whole or not at all.

import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { UsageError } from '../errors.ts';

/**
 * Write text to `path` through a temporary file in the same directory, then rename it into place,
 * so an interrupted run never leaves a half-written file.
 * @throws UsageError when the directory cannot be written.
 */
export function writeFileAtomic(path: string, text: string): void {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  let fd = -1;
  try {
    fd = openSync(tmp, 'w');
    writeSync(fd, text);
    fsyncSync(fd);
    closeSync(fd);
    fd = -1;
    renameSync(tmp, path);
  } catch (error) {
    if (fd !== -1) closeSync(fd);
    rmSync(tmp, { force: true });
    const reason = (error as NodeJS.ErrnoException).code ?? 'error';
    throw new UsageError(`Cannot write ${path} (${reason}) when expected a writable file path.`);
  }
}
