import type { Encounter } from './encounter.js';
import type { RiskAssessment } from './risk.js';

/** A stored encounter: one row of a run (a screening run or a received message) with its risk. */
export interface ConjunctionEvent extends Encounter {
  readonly id: string;
  readonly runId: string;
  readonly risk: RiskAssessment | null;
  /**
   * The series (the same conjunction across runs and messages) the event belongs to, once
   * linked; null before, absent where the event was never stored.
   */
  readonly seriesId?: string | null;
}
