/**
 * Covariance precedence for screened events (DESIGN.md risk requirements): a received CDM about
 * the same pair and TCA comes before the element-set history and the default table.
 * Behaviour checks of the wiring; the Pc numbers themselves are checked against SciPy in risk-*.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { importCdmFile } from '../app/import/index.js';
import { encounterFromCdm } from '../core/events/fromCdm.js';
import { matchingCdm, SAME_CONJUNCTION_MS } from '../app/cdmMatch.js';
import { RiskContext } from '../app/risk.js';
import { parseCdmFile } from '../core/formats/cdm/index.js';
import type { Encounter } from '../core/events/index.js';
import type { Instant } from '../core/time/instant.js';
import { listCdms, openDatabase } from '../db/index.js';

const FILE = 'test/fixtures/cdm/valid-6x6.kvn';

function setup() {
  const db = openDatabase(':memory:');
  const bytes = readFileSync(FILE);
  importCdmFile(db, FILE, bytes, 'sha', 'CDM-KVN', undefined);
  const cdm = parseCdmFile(bytes, FILE).cdm!;
  return { db, enc: encounterFromCdm(cdm) };
}

const swapped = (e: Encounter): Encounter => ({
  ...e,
  primary: e.secondary,
  secondary: e.primary,
  primaryState: e.secondaryState,
  secondaryState: e.primaryState,
  primaryEpoch: e.secondaryEpoch,
  secondaryEpoch: e.primaryEpoch,
});

describe('a screened event takes the covariance of a received message about it', () => {
  it('uses the CDM covariances first, with the 2-D reference Pc', () => {
    const { db, enc } = setup();
    expect(listCdms(db)).toHaveLength(1);
    const inputs = matchingCdm(db, enc);
    expect(inputs).not.toBeNull();
    const risk = new RiskContext(db).assess(enc, inputs!);
    expect(risk.covarianceSource).toBe('cdm / cdm');
    expect(risk.pcMethod).toBe('2d-reference');
    expect(risk.pc).not.toBeNull();
    // Without the message the same event has no covariance here (no element sets stored).
    expect(new RiskContext(db).assess(enc).covarianceSource).not.toContain('cdm');
  });

  it('matches the pair in either order and maps each covariance to its object (Pc is symmetric)', () => {
    const { db, enc } = setup();
    const a = new RiskContext(db).assess(enc, matchingCdm(db, enc)!);
    const flip = swapped(enc);
    const b = new RiskContext(db).assess(flip, matchingCdm(db, flip)!);
    // Relative tolerance: both are the reference integrator on the same geometry (1e-9 relative).
    expect(Math.abs(b.pc! - a.pc!) / a.pc!).toBeLessThan(1e-9);
  });

  it('does not match a conjunction of the same pair at another time', () => {
    const { db, enc } = setup();
    const later = { ...enc, tca: (enc.tca + SAME_CONJUNCTION_MS + 1000) as Instant };
    expect(matchingCdm(db, later)).toBeNull();
  });
});
