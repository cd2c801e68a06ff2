/**
 * Covariance precedence for screened events (DESIGN.md risk requirements): a received CDM about
 * the same conjunction comes before the element-set history and the default table. "The same
 * conjunction" is the series rule (core/events/seriesTolerance.ts; DESIGN.md "Series"), and the
 * message used is the newest of the series created no later than the run's data (app/series.ts).
 * Behaviour checks of the wiring; the Pc numbers themselves are checked against SciPy in risk-*.
 * The message is test/fixtures/cdm/valid-6x6.kvn (CREATION_DATE 2010-03-12T22:31:12, TCA
 * 2010-03-13T22:37:52.618, 14.762 km/s).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { importCdmFile } from '../app/import/index.js';
import { RiskContext } from '../app/risk.js';
import { linkRun } from '../app/series.js';
import { encounterFromCdm } from '../core/events/fromCdm.js';
import { parseCdmFile } from '../core/formats/cdm/index.js';
import type { Encounter } from '../core/events/index.js';
import { parseIso, type Instant } from '../core/time/instant.js';
import { createRun, finishRun, getEvent, getEventExtra, openDatabase, setRunDataAt, type KeepclearDb } from '../db/index.js';

const FILE = 'test/fixtures/cdm/valid-6x6.kvn';
const CREATED = parseIso('2010-03-12T22:31:12Z')!;
const HOUR = 3_600_000;

function withMessage() {
  const db = openDatabase(':memory:');
  const bytes = readFileSync(FILE);
  const outcome = importCdmFile(db, FILE, bytes, 'sha', 'CDM-KVN', undefined);
  const cdm = parseCdmFile(bytes, FILE).cdm!;
  return { db, enc: encounterFromCdm(cdm), cdmEventId: outcome.eventId! };
}

const swapped = (e: Encounter): Encounter => ({
  ...e,
  primary: e.secondary,
  primaryState: e.secondaryState,
  secondary: e.primary,
  secondaryState: e.primaryState,
  primaryEpoch: e.secondaryEpoch,
  secondaryEpoch: e.primaryEpoch,
  rtnKm: [e.rtnKm[0], e.rtnKm[1], e.rtnKm[2]],
});

/** A screening run holding one event, made at `dataAt`, assessed without the message and then linked. */
function screened(db: KeepclearDb, e: Encounter, dataAt: Instant) {
  const runId = createRun(db, { start: (e.tca - 2 * 86_400_000) as Instant, end: (e.tca + 86_400_000) as Instant, volume: { kind: 'sphere', radiusKm: 5 }, primaries: [e.primary] }, 'f', 2);
  setRunDataAt(db, runId, dataAt);
  const [ev] = finishRun(db, runId, { status: 'done', wallMs: 1, flagged: [], events: [{ ...e, risk: new RiskContext(db).assess(e) }] });
  linkRun(db, runId);
  return getEvent(db, ev!.id)!;
}

describe('a screened event takes the covariance of a received message of its series', () => {
  it('uses the CDM covariances first, with the 2-D reference Pc, and records the message', () => {
    const { db, enc, cdmEventId } = withMessage();
    // TCA 0.3 s off the message's (inside τ: 1 s floor at 14.8 km/s), data a day after the message
    const e = screened(db, { ...enc, tca: (enc.tca + 300) as Instant }, (CREATED + 24 * HOUR) as Instant);
    expect(e.seriesId).toBe(getEvent(db, cdmEventId)!.seriesId);
    expect(e.risk!.covarianceSource).toBe('cdm / cdm');
    expect(e.risk!.pcMethod).toBe('2d-reference');
    expect(getEventExtra(db, e.id)).toMatchObject({ cdmEventId, reportedPc: 4.835e-5 });
    // Without the message the same event has no covariance here (no element sets stored).
    expect(new RiskContext(db).assess(enc).covarianceSource).not.toContain('cdm');
  });

  it('matches the pair in either order and maps each covariance to its object (Pc is symmetric)', () => {
    const a = withMessage();
    const ea = screened(a.db, a.enc, (CREATED + HOUR) as Instant);
    const b = withMessage();
    const eb = screened(b.db, swapped(b.enc), (CREATED + HOUR) as Instant);
    expect(eb.risk!.covarianceSource).toBe('cdm / cdm');
    // Relative tolerance: both are the reference integrator on the same geometry (1e-9 relative).
    expect(Math.abs(eb.risk!.pc! - ea.risk!.pc!) / ea.risk!.pc!).toBeLessThan(1e-9);
  });

  it('does not take the message for a conjunction of the same pair one orbit (95 min) later', () => {
    const { db, enc } = withMessage();
    const e = screened(db, { ...enc, tca: (enc.tca + 95 * 60_000) as Instant }, (CREATED + HOUR) as Instant);
    expect(e.risk!.covarianceSource).not.toContain('cdm');
  });

  it('a run whose data is older than the message keeps its own covariance (the trend shows what was known then)', () => {
    const { db, enc } = withMessage();
    const e = screened(db, enc, (CREATED - 24 * HOUR) as Instant);
    expect(e.risk!.covarianceSource).not.toContain('cdm');
    expect(e.seriesId).toBeTruthy();
  });
});
