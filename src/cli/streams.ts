// cli stage: where a run's standard output and error go, and what became of them. The binary uses the
// process's streams; the in-process runner of the tests gives its own, so a run can be checked without
// starting a process. A stream that fails is remembered: a reader that closed early (EPIPE) ends the run
// quietly, any other failure (a full disk) is reported in one line.

/** The two text sinks of a run. */
export interface CliStreams {
  out: NodeJS.WritableStream;
  err: NodeJS.WritableStream;
}

/** Standard output's reader has gone (EPIPE): nothing more can be delivered; the run ends quietly. */
export class ReaderClosed extends Error {
  override name = 'ReaderClosed';
}

interface Run {
  streams: CliStreams;
  failure: Error | null;
}

let current: Run | null = null;

/** The streams of the run in progress (the process's own outside a run). */
export function cliStreams(): CliStreams {
  return current?.streams ?? { out: process.stdout, err: process.stderr };
}

/** How standard output failed during this run, or null. */
export function streamFailure(): Error | null {
  return current?.failure ?? null;
}

/** A failed write in a few words: its code and the system's phrase, e.g. "ENOSPC: no space left on device". */
export function writeFailure(error: unknown): string {
  const e = error as NodeJS.ErrnoException;
  if (e.code === undefined) return String(error);
  return `${e.code}: ${e.message.split(',')[0].replace(/^[A-Z]+: /, '')}`;
}

/** What a failed write of standard output means for the run. */
function failureOf(error: NodeJS.ErrnoException, makeError: (message: string) => Error): Error {
  if (error.code === 'EPIPE' || error.code === 'ERR_STREAM_DESTROYED') return new ReaderClosed('standard output closed');
  return makeError(`Cannot write standard output (${writeFailure(error)}).`);
}

/**
 * Run `task` with its output going to `streams`, remembering how standard output fails (`makeError`
 * builds the error of a failure other than a closed reader). Before returning, waits until everything
 * written has been handed on. The previous streams come back afterwards.
 */
export async function withStreams<T>(streams: CliStreams, makeError: (message: string) => Error, task: () => Promise<T>): Promise<T> {
  const previous = current;
  const run: Run = { streams, failure: null };
  const onError = (error: NodeJS.ErrnoException) => {
    run.failure ??= failureOf(error, makeError);
  };
  const onErrError = () => {
    // standard error is gone too: nothing to report on; its failure never changes the outcome
  };
  streams.out.on('error', onError);
  streams.err.on('error', onErrError);
  current = run;
  try {
    const result = await task();
    await handedOn(streams.out);
    if (run.failure !== null) throw run.failure;
    return result;
  } finally {
    current = previous;
    streams.out.off('error', onError);
    streams.err.off('error', onErrError);
  }
}

/**
 * Resolves once everything written to `stream` so far has been handed on, and any failure of those writes
 * has been reported (a file's stream reports a failed write on the next tick).
 */
async function handedOn(stream: NodeJS.WritableStream): Promise<void> {
  const s = stream as NodeJS.WritableStream & { destroyed?: boolean };
  if (s.destroyed !== true) await new Promise<void>((done) => stream.write('', () => done()));
  await new Promise<void>((done) => setImmediate(done));
}
