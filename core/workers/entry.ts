import { Worker } from 'node:worker_threads';

/**
 * Starts worker threads on a module next to the caller, given as its TypeScript name.
 *
 * The shipped program runs compiled JavaScript (dist/, bundled at install time by
 * scripts/build.mjs): there every worker file is a bundled entry point at its own dist/ path
 * (dist/core/screening/worker.js), started directly — no compiling or bundling at run time. The
 * caller's code sits in a shared chunk, so the build hands it the URL its own file would have
 * (dist/core/screening/run.js) as `import.meta.url`, and the worker is found beside that. Only when running from the TypeScript sources (tests
 * under vitest, `node --import tsx` benchmarks) is the worker bundled with esbuild once per
 * process (bundle.ts), or, without esbuild, started through the TypeScript loader.
 */
export async function startWorkers(tsName: string, callerUrl: string, count: number): Promise<Worker[]> {
  if (!callerUrl.endsWith('.ts')) {
    const compiled = new URL(tsName.replace(/\.ts$/, '.js'), callerUrl);
    return Array.from({ length: count }, () => new Worker(compiled));
  }
  // Imported here only: the compiled program never loads the bundler or the loader.
  const { bundledWorker } = await import('./bundle.js');
  const { spawnTsWorker } = await import('./spawn.js');
  const entry = new URL(tsName, callerUrl);
  const script = await bundledWorker(entry);
  return Array.from({ length: count }, () => (script ? new Worker(script) : spawnTsWorker(entry)));
}

/**
 * Stops worker threads whose work is over, without waiting for them to go: on the 1-primary bench
 * week a screening worker took 35–160 ms to terminate after its results were in (measured), time
 * the caller spends on what comes next (risk, storing, output) instead. Unreferenced, a stopping
 * worker does not hold the process open.
 */
export function stopWorkers(workers: readonly Worker[]): void {
  for (const w of workers) {
    w.unref();
    w.terminate().catch(() => undefined);
  }
}
