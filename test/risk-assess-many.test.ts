/**
 * RiskContext.assessMany — the risk of a whole run, shared among worker threads in batches — must
 * give exactly what assess() gives for each encounter in this thread, in the encounters' order
 * (each assessment is a pure function of its job; the jobs are made batch by batch while the
 * threads work). Enough encounters to take the threaded path (PARALLEL_RISK_MIN_JOBS), made
 * from the fixture's conjunction with the secondary moved by up to ±3 km, so that they fall in
 * different tiers and some use the history covariance of an object with several element sets.
 */
import { describe, expect, it } from 'vitest';
import { RiskContext } from '../app/risk.js';
import { encounterWith, type Encounter, type StateArray } from '../core/events/index.js';
import { PARALLEL_RISK_MIN_JOBS } from '../core/risk/assessMany.js';
import type { Instant } from '../core/time/instant.js';
import { exportFixture } from './support/exportFixture.js';

function variants(base: Encounter, count: number): Encounter[] {
  const s = base.secondaryState;
  return Array.from({ length: count }, (_, k) => {
    const dx = ((k % 41) - 20) * 0.15, dy = ((k % 13) - 6) * 0.25, dz = ((k % 7) - 3) * 0.5; // km
    const secondaryState: StateArray = [s[0] + dx, s[1] + dy, s[2] + dz, s[3], s[4], s[5]];
    const missKm = Math.hypot(secondaryState[0] - base.primaryState[0], secondaryState[1] - base.primaryState[1], secondaryState[2] - base.primaryState[2]);
    return encounterWith(base, { secondaryState, missKm, tca: (base.tca + k) as Instant });
  });
}

describe('assessMany on worker threads', () => {
  it('equals assess() of each encounter in this thread, in order', async () => {
    const { db, events } = await exportFixture();
    const encounters = variants(events[0]!, PARALLEL_RISK_MIN_JOBS + 345);
    const risk = new RiskContext(db);
    const threaded = await risk.assessMany(encounters, 2);
    const here = encounters.map((e) => risk.assess(e));
    expect(threaded).toEqual(here);
    // the variants reach more than one tier: the comparison is not of identical answers
    expect(new Set(here.map((r) => r.tier)).size).toBeGreaterThan(1);
    expect(here[0]!.covarianceSource).toContain('history');
  });
});
