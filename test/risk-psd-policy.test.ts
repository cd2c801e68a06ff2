/**
 * One PSD policy: the CDM reader and the risk assessment judge covariances with the same function
 * (core/risk/covariancePsd.ts). Inputs are the CCSDS 508.0-B-1 example message (copy in
 * test/authorities/ccsds-508, provenance in its README), edited as each case says.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseCdmFile } from '../core/formats/cdm/index.js';
import { COV_TERMS } from '../core/formats/cdm/keywords.js';
import { judgeCovariance } from '../core/risk/covariancePsd.js';
import { assessEncounter } from '../core/risk/assess.js';
import type { Encounter, StateArray } from '../core/events/index.js';
import { parseIso, type Instant } from '../core/time/instant.js';

const example = readFileSync(new URL('./authorities/ccsds-508/cdm-obligatory.kvn', import.meta.url), 'utf8');
const lines = example.split('\n');
const object2Start = lines.findIndex((l) => /^OBJECT\s+=\s+OBJECT2/.test(l));
const COV_KEYWORDS = new Set(COV_TERMS.map((t) => t.keyword));
/** OBJECT1's covariance in the example is not PSD (CRDOT_T implies |ρ| > 1): make it the
 * obviously valid diag(100 m², …) so the message is readable, then edit OBJECT2 as asked. */
function edited(object2: (keyword: string, value: string) => string): string {
  return lines
    .map((l, i) => {
      const m = /^(C[A-Z]*_[A-Z]+)(\s+=\s+)(\S+)(.*)$/.exec(l);
      if (!m || !COV_KEYWORDS.has(m[1]!)) return l;
      const [, kw, eq, value, rest] = m as unknown as [string, string, string, string, string];
      if (i < object2Start) {
        const diag = /^C(R|T|N|RDOT|TDOT|NDOT)_\1$/.test(kw);
        return `${kw}${eq}${diag ? (kw.includes('DOT') ? '1.0E-04' : '1.0E+02') : '0.0'}${rest}`;
      }
      return `${kw}${eq}${object2(kw, value)}${rest}`;
    })
    .join('\n');
}

describe('all-zero CDM covariance', () => {
  it('is refused (not used for Pc) with a note naming the file, line and object; the message itself is kept', () => {
    const text = edited((kw, v) => (/^C(R|T|N)_(R|T|N)$/.test(kw) ? '0.0' : v));
    const r = parseCdmFile(Buffer.from(text), 'zero.kvn');
    expect(r.errors).toEqual([]);
    const line = lines.findIndex((l, i) => i > object2Start && l.startsWith('CR_R')) + 1;
    expect(r.repairs).toEqual([
      `zero.kvn:${line}: OBJECT2 covariance has an all-zero position block: it states no uncertainty and is not used for Pc`,
    ]);
    expect(r.cdm!.object2.covariance.status).toBe('zero');
    expect(r.cdm!.object2.covariance.usable).toBeNull();
    expect(r.cdm!.object1.covariance.status).toBe('psd');
  });
  it('the assessment then uses maximum Pc and says why', () => {
    const v = judgeCovariance(Array.from({ length: 6 }, () => new Array<number>(6).fill(0)), 'OBJECT2');
    const tca = parseIso('2026-12-07T10:00:00Z')! as Instant;
    const enc = {
      primary: '100001', secondary: '110001', tca, missKm: 0.05, relativeSpeedKmS: 7.6,
      primaryState: [6928, 0, 0, 0, 7.58, 0.1], secondaryState: [6928.05, 0, 0, 0, -1.2, 7.5],
      primaryEpoch: tca, secondaryEpoch: tca,
    } as unknown as Encounter;
    const a = assessEncounter(enc, {
      primary: { cdmRtnM2: [[100, 0, 0], [0, 400, 0], [0, 0, 100]] },
      secondary: { cdmDoubtfulNote: v.note! },
    });
    expect(a.pcMethod).toBe('max-pc (doubtful covariance)');
    expect(a.warnings.join(' ')).toMatch(/all-zero position block/);
  });
});

describe('a matrix judged on reading is judged the same way by the assessment', () => {
  // OBJECT2 of the example is valid (CT_R = -4.806E+04, correlation -0.83); CT_R = -5.7E+04
  // (correlation -0.99) makes the scaled matrix indefinite by about 4e-3: within the rounding
  // tolerance for 6×6 (6e-3), so the reader repairs it.
  const text = edited((kw, v) => (kw === 'CT_R' ? '-5.7E+04' : v));
  const r = parseCdmFile(Buffer.from(text), 'near.kvn');
  it('the reader repairs it (within rounding) and keeps a note', () => {
    expect(r.errors).toEqual([]);
    expect(r.cdm!.object2.covariance.status).toBe('repaired');
  });
  it('the repaired matrix passes the same judge as it is: no second repair, no second note', () => {
    const usable = r.cdm!.object2.covariance.usable!;
    const again = judgeCovariance(usable, 'secondary cdm');
    expect(again.status).toBe('psd');
    expect(again.note).toBeUndefined();
    const tca = parseIso('2026-12-07T10:00:00Z')! as Instant;
    const p: StateArray = [6928, 0, 0, 0, 7.58, 0.1];
    const s: StateArray = [6928.05, 0, 0, 0, -1.2, 7.5];
    const enc = {
      primary: '100001', secondary: '110001', tca, missKm: 0.05, relativeSpeedKmS: 7.6,
      primaryState: p, secondaryState: s, primaryEpoch: tca, secondaryEpoch: tca,
    } as unknown as Encounter;
    const a = assessEncounter(enc, {
      primary: { cdmRtnM2: [[100, 0, 0], [0, 400, 0], [0, 0, 100]] },
      secondary: { cdmRtnM2: usable },
    });
    expect(a.covarianceSource).toBe('cdm / cdm');
    expect(a.warnings.join(' ')).not.toMatch(/repaired|not positive/);
    expect(a.pcMethod).toBe('2d-reference');
  });
});
