/** Conjunction events as a domain of their own: what screening finds, what risk adds, what is stored. */
export type { StateArray, Encounter } from './encounter.js';
export type { Matrix2, Matrix3, RiskDetail, RiskAssessment } from './risk.js';
export type { ConjunctionEvent } from './event.js';
