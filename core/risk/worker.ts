import { expose } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { parentPort } from 'node:worker_threads';
import type { RiskAssessment } from '../events/index.js';
import { assessEncounter } from './assess.js';
import type { RiskJob } from './assessMany.js';

/** The risk worker's API, called through comlink from assessMany.ts. */
export interface RiskWorkerApi {
  assess(jobs: RiskJob[]): RiskAssessment[];
}

const api: RiskWorkerApi = {
  assess: (jobs) => jobs.map((j) => assessEncounter(j.encounter, j.inputs)),
};

expose(api, nodeEndpoint(parentPort!));
