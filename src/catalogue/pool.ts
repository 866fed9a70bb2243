// catalogue stage: a pool of worker threads (piscina, loaded only when a pool is asked for), shared by rank and atlas.

/**
 * Run `work` with a pool of `workers` threads on the module `name` next to the caller (`base`, the
 * caller's import.meta.url): compiled (dist/), `name.js` as plain JavaScript; from the sources (tests,
 * development), `name.ts` through tsx, resolved from here so the pool works whatever the current
 * directory is. The pool is destroyed when `work` ends.
 */
export async function withPool<R>(base: string, name: string, workers: number, work: (run: (payload: unknown) => Promise<unknown>) => Promise<R>): Promise<R> {
  const { Piscina } = await import('piscina');
  const compiled = !base.endsWith('.ts');
  const pool = new Piscina({
    filename: new URL(`./${name}.${compiled ? 'js' : 'ts'}`, base).href,
    execArgv: compiled ? [] : ['--import', import.meta.resolve('tsx')],
    minThreads: workers,
    maxThreads: workers,
  });
  try {
    return await work((payload) => pool.run(payload) as Promise<unknown>);
  } finally {
    await pool.destroy();
  }
}
