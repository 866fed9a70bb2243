// cli stage: a progress bar with an estimate of the time left, on stderr only when it is a terminal.

import { createRequire } from 'node:module';
import type cliProgressModule from 'cli-progress';
import { cliStreams } from './streams.ts';

/** A progress reporter; silent when stderr is not a terminal. */
export interface Progress {
  /** Set the amount done (same unit as the total). */
  update(done: number): void;
  /** Remove the bar. */
  stop(): void;
}

/** Start a progress bar over `total` units labelled `label`. */
export function startProgress(label: string, total: number): Progress {
  const err = cliStreams().err as NodeJS.WriteStream;
  if (!err.isTTY || total <= 0) return { update() {}, stop() {} };
  // loaded only for a terminal: a pipe or a test never pays for it
  const cliProgress = createRequire(import.meta.url)('cli-progress') as typeof cliProgressModule;
  const bar = new cliProgress.SingleBar(
    {
      format: `${label} [{bar}] {percentage}% | {value}/{total} | {duration_formatted} elapsed, {eta_formatted} left`,
      stream: err,
      hideCursor: true,
      clearOnComplete: true,
      etaBuffer: 200,
      fps: 5,
    },
    cliProgress.Presets.shades_classic,
  );
  bar.start(total, 0);
  let last = 0;
  return {
    update(done: number) {
      // redraws are throttled by the bar itself; skip work on tiny steps
      if (done - last >= total / 1000 || done >= total) {
        last = done;
        bar.update(Math.min(done, total));
      }
    },
    stop() {
      bar.stop();
    },
  };
}
