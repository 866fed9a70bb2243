// cli stage: a progress bar with an estimate of the time left, on stderr only when it is a terminal.

import cliProgress from 'cli-progress';

/** A progress reporter; silent when stderr is not a terminal. */
export interface Progress {
  /** Set the amount done (same unit as the total). */
  update(done: number): void;
  /** Remove the bar. */
  stop(): void;
}

/** Start a progress bar over `total` units labelled `label`. */
export function startProgress(label: string, total: number): Progress {
  if (!process.stderr.isTTY || total <= 0) return { update() {}, stop() {} };
  const bar = new cliProgress.SingleBar(
    {
      format: `${label} [{bar}] {percentage}% | {value}/{total} | {duration_formatted} elapsed, {eta_formatted} left`,
      stream: process.stderr,
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
