import { Worker, type WorkerOptions } from 'node:worker_threads';

const BOOTSTRAP = new URL('./tsBootstrap.mjs', import.meta.url);

/**
 * Starts a worker thread on a TypeScript module (through a small JS bootstrap that registers
 * the TypeScript loader in the new thread). `workerData` of the caller is passed through.
 */
export function spawnTsWorker(moduleUrl: URL, options: WorkerOptions = {}): Worker {
  const data = (options.workerData ?? {}) as Record<string, unknown>;
  return new Worker(BOOTSTRAP, {
    ...options,
    workerData: { ...data, __tsModuleUrl: moduleUrl.href },
  });
}
