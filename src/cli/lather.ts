#!/usr/bin/env node
// cli stage: the `lather` binary. The exit status is set, never forced: the process ends when standard
// output has drained. Every verb loads on demand (see main.ts). A signal that stops a run removes the
// run's temporary files (the old output files stay as they were), then ends the process as the signal would.
import { main } from './main.ts';
import { removeTemporaryFiles } from './output.ts';

for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
  process.once(signal, () => {
    removeTemporaryFiles();
    process.kill(process.pid, signal);
  });
}
// a reader that closes early, or a write that fails once the run is over, is handled by main's run
// (ReaderClosed: quiet); never by a stack trace
process.stdout.on('error', () => {});
process.stderr.on('error', () => {});

process.exitCode = await main(process.argv);
