// cli stage: an output sink that is either standard output or a file written whole or not at all.

import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { UsageError } from '../errors.ts';
import { cliStreams } from './streams.ts';

/** A line-oriented output: stdout, or a temporary file renamed into place by close(). */
export class Output {
  private readonly path: string | null;
  private readonly tmp: string | null;
  private fd: number; // -1: the run's standard output stream
  private buffer: string[] = [];
  private size = 0;

  /** @throws UsageError when `path` cannot be written. */
  constructor(path: string | null) {
    this.path = path;
    if (path === null) {
      this.tmp = null;
      this.fd = -1;
      return;
    }
    this.tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
    try {
      this.fd = openSync(this.tmp, 'w');
    } catch (error) {
      const reason = (error as NodeJS.ErrnoException).code ?? 'error';
      throw new UsageError(`Cannot write ${path} (${reason}) when expected a writable file path.`);
    }
  }

  /** Append one line (a newline is added). */
  line(text: string): void {
    this.buffer.push(text + '\n');
    this.size += text.length + 1;
    if (this.size > 1 << 16) this.flush();
  }

  /** Append text as it is. */
  write(text: string): void {
    this.buffer.push(text);
    this.size += text.length;
    if (this.size > 1 << 16) this.flush();
  }

  private flush(): void {
    if (this.buffer.length === 0) return;
    const text = this.buffer.join('');
    this.buffer = [];
    this.size = 0;
    if (this.fd === -1) {
      // through the stream, which queues what the reader has not taken yet (a pipe is never cut short)
      cliStreams().out.write(text);
      return;
    }
    let offset = 0;
    const bytes = Buffer.from(text);
    while (offset < bytes.length) offset += writeSync(this.fd, bytes, offset);
  }

  /** Finish: flush, and for a file rename the temporary file into place. */
  close(): void {
    this.flush();
    if (this.tmp !== null && this.path !== null) {
      fsyncSync(this.fd);
      closeSync(this.fd);
      renameSync(this.tmp, this.path);
    }
  }

  /** Give up: remove the temporary file so no half-written output is left. */
  abort(): void {
    if (this.tmp !== null) {
      try {
        closeSync(this.fd);
      } catch {
        // already closed
      }
      rmSync(this.tmp, { force: true });
    }
  }
}
