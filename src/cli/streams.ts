// cli stage: where a run's standard output and error go. The binary uses the process's streams; the
// in-process runner of the tests gives its own, so a run can be checked without starting a process.

/** The two text sinks of a run. */
export interface CliStreams {
  out: NodeJS.WritableStream;
  err: NodeJS.WritableStream;
}

let current: CliStreams | null = null;

/** The streams of the run in progress (the process's own outside a run). */
export function cliStreams(): CliStreams {
  return current ?? { out: process.stdout, err: process.stderr };
}

/** Run `task` with its output going to `streams`; the previous streams come back afterwards. */
export async function withStreams<T>(streams: CliStreams, task: () => Promise<T>): Promise<T> {
  const previous = current;
  current = streams;
  try {
    return await task();
  } finally {
    current = previous;
  }
}
