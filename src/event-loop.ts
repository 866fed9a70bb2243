// shared: long synchronous work that lets the event loop run now and then, so signals, 'drain' events and
// progress are handled while it runs (a signal's handler cannot run in the middle of a loop).

/**
 * A function to call between units of work: it returns a promise to await (one turn of the event loop)
 * when `milliseconds` have passed since the last turn, and null otherwise (no cost).
 */
export function eventLoopTurns(milliseconds = 50): () => Promise<void> | null {
  let last = performance.now();
  return () => {
    const now = performance.now();
    if (now - last < milliseconds) return null;
    last = now;
    return new Promise((done) => setImmediate(done));
  };
}
