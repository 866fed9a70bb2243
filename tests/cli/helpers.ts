// Run `lather` as a user would, in this process: the command line goes through the same `main` the binary
// calls, with its standard output and error collected. (tests/cli/package.test.ts runs the installed
// package in its own process.)
import { Writable } from 'node:stream';
import { main } from '../../src/cli/main.ts';

/** What a run printed and its exit status. */
export interface LatherRun {
  stdout: string;
  stderr: string;
  status: number;
}

/** A writable stream that keeps everything written to it. */
function collector(): { stream: Writable; text: () => string } {
  const chunks: Buffer[] = [];
  const stream = new Writable({
    write(chunk, _encoding, done) {
      chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(String(chunk)));
      done();
    },
  });
  return { stream, text: () => Buffer.concat(chunks).toString('utf8') };
}

/** Run `lather ...args` in this process; returns stdout, stderr and the exit status. */
export async function lather(args: string[]): Promise<LatherRun> {
  const out = collector();
  const err = collector();
  const status = await main(['node', 'lather', ...args], { out: out.stream, err: err.stream });
  await Promise.all([drained(out.stream), drained(err.stream)]);
  return { stdout: out.text(), stderr: err.text(), status };
}

/** Resolves once everything written to `stream` so far has been taken. */
function drained(stream: Writable): Promise<void> {
  return new Promise((resolve) => stream.end(resolve));
}
