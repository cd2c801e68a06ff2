// Worker entry that teaches the worker thread to load TypeScript, then loads the real module.
// Worker threads do not inherit the parent's loader hooks, and `--import` in a worker's execArgv
// is ignored on Node 20, so the hooks are registered here first.
import { register } from 'tsx/esm/api';
import { workerData } from 'node:worker_threads';

register();
await import(workerData.__tsModuleUrl);
