/**
 * CDM export (issue 7 item 4): a stored event as a CCSDS 508.0-B-1 KVN message.
 *
 * Sources:
 * - The mandatory keywords, listed below block by block from the standard's keyword tables
 *   (508.0-B-1 §3: table 3-1 header, 3-2 relative metadata/data, 3-3 object metadata, 3-4 object
 *   data — written from memory), and cross-checked against the standard's own obligatory-keywords
 *   example (test/authorities/ccsds-508/cdm-obligatory.kvn, provenance in its README), which must
 *   carry exactly this set. Units are compared with the units that example prints.
 * - Frames: the EME2000 states must convert back (core/frames, checked against Skyfield in
 *   frames.test.ts) to the event's TEME states; DESIGN.md "Time, frames, units".
 * - Round trip: the exported text imported through the ordinary file import (a fresh database)
 *   gives back the event's numbers at the digits stated beside each tolerance.
 */
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cdmOfEvent, cdmTextOfEvent, exportEvents, CDM_ORIGINATOR } from '../app/export/index.js';
import { importFile } from '../app/import/index.js';
import { parseCdmFile } from '../core/formats/cdm/index.js';
import { CDM_KEYWORDS } from '../core/formats/cdm/keywords.js';
import { toTemeFrom } from '../core/frames/toTeme.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import { instantFromMs } from '../core/time/instant.js';
import { eventsOfRun, listRuns, openDatabase, type KeepclearDb } from '../db/index.js';
import { exportFixture, PRIMARY, SECONDARY } from './support/exportFixture.js';

/** 508.0-B-1 table 3-1 (header), mandatory rows. */
const MANDATORY_HEADER = ['CCSDS_CDM_VERS', 'CREATION_DATE', 'ORIGINATOR', 'MESSAGE_ID'];
/** Table 3-2 (relative metadata/data), mandatory rows. */
const MANDATORY_RELATIVE = ['TCA', 'MISS_DISTANCE'];
/** Table 3-3 (object metadata), mandatory rows. */
const MANDATORY_OBJECT_METADATA = [
  'OBJECT', 'OBJECT_DESIGNATOR', 'CATALOG_NAME', 'OBJECT_NAME', 'INTERNATIONAL_DESIGNATOR',
  'EPHEMERIS_NAME', 'COVARIANCE_METHOD', 'MANEUVERABLE', 'REF_FRAME',
];
/** Table 3-4 (object data): state vector and the 6×6 RTN covariance's lower triangle. */
const MANDATORY_OBJECT_DATA = [
  'X', 'Y', 'Z', 'X_DOT', 'Y_DOT', 'Z_DOT',
  'CR_R', 'CT_R', 'CT_T', 'CN_R', 'CN_T', 'CN_N',
  'CRDOT_R', 'CRDOT_T', 'CRDOT_N', 'CRDOT_RDOT',
  'CTDOT_R', 'CTDOT_T', 'CTDOT_N', 'CTDOT_RDOT', 'CTDOT_TDOT',
  'CNDOT_R', 'CNDOT_T', 'CNDOT_N', 'CNDOT_RDOT', 'CNDOT_TDOT', 'CNDOT_NDOT',
];
const MANDATORY_OBJECT = [...MANDATORY_OBJECT_METADATA, ...MANDATORY_OBJECT_DATA];

interface KvnLine { keyword: string; value: string; unit: string | undefined }

/** KVN lines split into header+relative and the two object sections (each starts at OBJECT). */
function sections(text: string): { top: KvnLine[]; objects: KvnLine[][] } {
  const lines = text.split(/\r?\n/).filter((l) => l.trim() !== '' && !l.startsWith('COMMENT'));
  const parsed = lines.map((l): KvnLine => {
    const m = /^(\S+)\s*=\s*(.*?)\s*(?:\[([^\]]+)\])?\s*$/.exec(l)!;
    return { keyword: m[1]!, value: m[2]!, unit: m[3] };
  });
  const starts = parsed.map((p, i) => (p.keyword === 'OBJECT' ? i : -1)).filter((i) => i >= 0);
  return {
    top: parsed.slice(0, starts[0]),
    objects: starts.map((s, k) => parsed.slice(s, starts[k + 1] ?? parsed.length)),
  };
}

const count = (ls: KvnLine[], kw: string): number => ls.filter((l) => l.keyword === kw).length;

let db: KeepclearDb;
let event: ConjunctionEvent;
let dir: string;
const NOW = instantFromMs(Date.parse('2026-12-07T07:00:00Z'));

beforeAll(async () => {
  const fx = await exportFixture();
  db = fx.db;
  expect(fx.events.length).toBeGreaterThan(0);
  event = fx.events[0]!;
  dir = mkdtempSync(join(tmpdir(), 'keepclear-export-cdm-'));
});
afterAll(() => {
  db?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('the mandatory keyword list of CCSDS 508.0-B-1', () => {
  it('is exactly the set of the standard\'s obligatory-keywords example, object by object', () => {
    const ex = sections(readFileSync(new URL('./authorities/ccsds-508/cdm-obligatory.kvn', import.meta.url), 'utf8'));
    expect(new Set(ex.top.map((l) => l.keyword))).toEqual(new Set([...MANDATORY_HEADER, ...MANDATORY_RELATIVE]));
    expect(ex.objects).toHaveLength(2);
    for (const o of ex.objects) expect(o.map((l) => l.keyword)).toEqual(MANDATORY_OBJECT);
  });

  it('agrees with the reader\'s keyword table (what import refuses without)', () => {
    const tableMandatory = [...CDM_KEYWORDS.values()].filter((s) => s.mandatory).map((s) => s.keyword);
    expect(new Set(tableMandatory)).toEqual(
      new Set([...MANDATORY_HEADER, ...MANDATORY_RELATIVE, ...MANDATORY_OBJECT]),
    );
  });
});

describe('an exported event', () => {
  let text: string;
  beforeAll(() => {
    text = cdmTextOfEvent(db, event, { now: NOW });
  });

  it('carries every mandatory keyword once per section, key by key', () => {
    const s = sections(text);
    for (const kw of [...MANDATORY_HEADER, ...MANDATORY_RELATIVE]) expect(count(s.top, kw), kw).toBe(1);
    expect(s.objects).toHaveLength(2);
    s.objects.forEach((o, k) => {
      for (const kw of MANDATORY_OBJECT) expect(count(o, kw), `OBJECT${k + 1} ${kw}`).toBe(1);
    });
    expect(text.startsWith('CCSDS_CDM_VERS')).toBe(true); // 508.0-B-1 4.1: the version line comes first
  });

  it('prints each unit as the standard\'s example does', () => {
    const ex = sections(readFileSync(new URL('./authorities/ccsds-508/cdm-obligatory.kvn', import.meta.url), 'utf8'));
    const unitInExample = new Map<string, string | undefined>();
    for (const l of [...ex.top, ...ex.objects[0]!]) unitInExample.set(l.keyword, l.unit);
    const s = sections(text);
    for (const l of [...s.top, ...s.objects[0]!, ...s.objects[1]!])
      if (unitInExample.has(l.keyword)) expect(l.unit, l.keyword).toBe(unitInExample.get(l.keyword));
    // optional keywords we add: units of 508.0-B-1 table 3-2 / 3-4 (from memory)
    const unit = (kw: string) => s.top.find((l) => l.keyword === kw)?.unit;
    expect(unit('RELATIVE_SPEED')).toBe('m/s');
    expect(unit('RELATIVE_POSITION_R')).toBe('m');
    expect(unit('RELATIVE_VELOCITY_T')).toBe('m/s');
    expect(unit('SCREEN_VOLUME_X')).toBe('m');
    expect(s.objects[0]!.find((l) => l.keyword === 'AREA_PC')?.unit).toBe('m**2');
  });

  it('says who wrote it and what it is', () => {
    const cdm = parseCdmFile(Buffer.from(text), 'export.cdm').cdm!;
    expect(cdm.header.originator).toBe(CDM_ORIGINATOR);
    expect(cdm.header.messageId).toBe(`${event.id}-20261207T070000`);
    expect(cdm.header.creationDate).toBe(NOW);
    expect(cdm.object1.metadata.objectDesignator).toBe(PRIMARY);
    expect(cdm.object2.metadata.objectDesignator).toBe(SECONDARY);
    expect(cdm.object1.metadata.objectName).toBe('KEEPCLEAR-1');
    expect(cdm.object1.metadata.internationalDesignator).toBe('2026-901A');
    expect(cdm.object1.metadata.refFrame).toBe('EME2000');
    expect(cdm.object2.metadata.refFrame).toBe('EME2000');
    // history covariance is computed; the default table is DEFAULT (508.0-B-1 COVARIANCE_METHOD)
    expect(cdm.object1.metadata.covarianceMethod).toBe('CALCULATED');
    expect(cdm.object2.metadata.covarianceMethod).toBe('DEFAULT');
    expect(cdm.header.comments.join(' ')).toContain('decision aid');
  });

  it('says in COMMENT lines that only a position covariance is known, and writes the velocity rows as 0', () => {
    const cdm = parseCdmFile(Buffer.from(text), 'export.cdm').cdm!;
    for (const o of [cdm.object1, cdm.object2]) {
      expect(o.covariance.comments.join(' ')).toMatch(/only a position covariance is known/);
      for (let i = 3; i < 6; i++) for (let j = 0; j <= i; j++) expect(o.covariance.matrix[i]![j]).toBe(0);
    }
  });

  it('gives the states in EME2000: converted back to TEME they are the event\'s states', () => {
    const cdm = cdmOfEvent(db, event, { now: NOW });
    const back = (o: typeof cdm.object1) => toTemeFrom('EME2000', o.state.r, o.state.v, event.tca);
    const p = back(cdm.object1), s = back(cdm.object2);
    // Two rotations and their transposes: round-off ~1e-15 × 7000 km; 1e-9 km (1 µm) is generous.
    const STATE_ROUNDTRIP_KM = 1e-9;
    for (let i = 0; i < 3; i++) {
      expect(Math.abs(p.r[i]! - event.primaryState[i]!)).toBeLessThan(STATE_ROUNDTRIP_KM);
      expect(Math.abs(s.v[i]! - event.secondaryState[i + 3]!)).toBeLessThan(STATE_ROUNDTRIP_KM);
    }
    // and the EME2000 state is not the TEME one: precession since J2000 alone turns it by ~0.36°
    expect(Math.abs(cdm.object1.state.r[0] - event.primaryState[0])).toBeGreaterThan(1);
  });
});

describe('an exported CDM imports again to the same numbers', () => {
  it('round trip through the file import into a fresh database', () => {
    const file = join(dir, 'roundtrip.cdm');
    writeFileSync(file, cdmTextOfEvent(db, event, { now: NOW }));
    const fresh = openDatabase(':memory:');
    try {
      const outcome = importFile(fresh, file);
      expect(outcome.ok, outcome.ok ? '' : outcome.error.message).toBe(true);
      const run = listRuns(fresh, 10, ['cdm'])[0]!;
      const [back] = eventsOfRun(fresh, run.id);
      expect(back).toBeDefined();
      const b = back!;
      expect(b.primary).toBe(event.primary);
      expect(b.secondary).toBe(event.secondary);
      // TCA: written to the microsecond (values.ts formatCcsdsTime) → within 0.5 µs.
      expect(Math.abs(b.tca - event.tca)).toBeLessThanOrEqual(0.0005);
      // States: numbers written with round-trip precision, frames round-off only → 1 µm, 1 nm/s.
      for (let i = 0; i < 6; i++) {
        expect(Math.abs(b.primaryState[i]! - event.primaryState[i]!), `primary ${i}`).toBeLessThan(1e-9);
        expect(Math.abs(b.secondaryState[i]! - event.secondaryState[i]!), `secondary ${i}`).toBeLessThan(1e-9);
      }
      // Miss and RTN recomputed from those states: 1 mm (the screening's own miss is the distance of its states).
      expect(Math.abs(b.missKm - event.missKm)).toBeLessThan(1e-6);
      for (let i = 0; i < 3; i++) expect(Math.abs(b.rtnKm[i]! - event.rtnKm[i]!)).toBeLessThan(1e-6);
      expect(Math.abs(b.relativeSpeedKmS - event.relativeSpeedKmS)).toBeLessThan(1e-9);
      // Risk: same covariances (written exactly), same hard-body radius (√(πR²/π)), same geometry
      // → same Pc to 1e-9 relative (the reference integrator's own tolerance is looser than this
      // change in inputs; it is deterministic for equal inputs).
      const r0 = event.risk!, r1 = b.risk!;
      expect(r1.covarianceSource).toBe('cdm / cdm');
      expect(r1.pcMethod).toBe(r0.pcMethod);
      expect(Math.abs(r1.hardBodyRadiusM - r0.hardBodyRadiusM)).toBeLessThan(1e-12);
      expect(Math.abs(r1.pc! - r0.pc!) / r0.pc!).toBeLessThan(1e-9);
      expect(r1.tier).toBe(r0.tier);
      for (const which of ['primaryCovRtnM2', 'secondaryCovRtnM2'] as const) {
        const a = r0.detail![which]!, c = r1.detail![which]!;
        for (let i = 0; i < 3; i++)
          for (let j = 0; j < 3; j++) expect(Math.abs(c[i]![j]! - a[i]![j]!), `${which}[${i}][${j}]`).toBeLessThanOrEqual(1e-12 * Math.abs(a[i]![i]!));
      }
      // the message's own Pc, kept apart as "reported", is ours
      const cdm = parseCdmFile(readFileSync(file), file).cdm!;
      expect(cdm.relative.collisionProbability).toBe(r0.pc);
    } finally {
      fresh.close();
    }
  });
});

describe('exportEvents', () => {
  it('writes one message per event into a folder for a run, each readable', () => {
    const out = join(dir, 'run-messages');
    const r = exportEvents(db, { run: event.runId }, 'cdm', out, { now: NOW });
    expect(r.folder).toBe(out);
    expect(readdirSync(out).sort()).toEqual(r.files.map((f) => f.slice(out.length + 1)).sort());
    expect(r.files).toHaveLength(eventsOfRun(db, event.runId).length);
    for (const f of r.files) expect(parseCdmFile(readFileSync(f), f).errors).toEqual([]);
  });

  it('writes a single event to the file named', () => {
    const out = join(dir, 'one.cdm');
    const r = exportEvents(db, { event: event.id }, 'cdm', out, { now: NOW });
    expect(r.files).toEqual([out]);
    expect(existsSync(out)).toBe(true);
    expect(readdirSync(dir).some((f) => f.includes('.partial-'))).toBe(false);
  });

  it('refuses a run export onto an existing file, and names unknown ids', () => {
    const file = join(dir, 'plain.txt');
    writeFileSync(file, 'x');
    expect(() => exportEvents(db, { run: event.runId }, 'cdm', file)).toThrow(/is a file; .* into a folder/);
    expect(() => exportEvents(db, { run: 'R999' }, 'csv', join(dir, 'x.csv'))).toThrow(/no run "R999"/);
    expect(() => exportEvents(db, { event: 'R1-99' }, 'json', join(dir, 'x.json'))).toThrow(/no event "R1-99"/);
  });
});

describe('an event made from a received CDM', () => {
  it('is exported with that message\'s full 6×6 covariance (velocity terms too), and reads back the same', () => {
    const fixture = 'test/fixtures/cdm/valid-6x6.kvn';
    const first = openDatabase(':memory:');
    const second = openDatabase(':memory:');
    try {
      expect(importFile(first, fixture).ok).toBe(true);
      const received = parseCdmFile(readFileSync(fixture), fixture).cdm!;
      const [e] = eventsOfRun(first, listRuns(first, 10, ['cdm'])[0]!.id);
      const file = join(dir, 'from-received.cdm');
      writeFileSync(file, cdmTextOfEvent(first, e!, { now: NOW }));
      const exported = parseCdmFile(readFileSync(file), file).cdm!;
      // The received message's covariance terms, written exactly (shortest round-trip text).
      expect(exported.object1.covariance.matrix).toEqual(received.object1.covariance.usable);
      expect(exported.object2.covariance.matrix).toEqual(received.object2.covariance.usable);
      expect(exported.object1.covariance.comments.join(' ')).not.toMatch(/only a position covariance/);
      expect(exported.object1.additional.areaPc).toBeCloseTo(received.object1.additional.areaPc!, 12);
      expect(importFile(second, file).ok).toBe(true);
      const [b] = eventsOfRun(second, listRuns(second, 10, ['cdm'])[0]!.id);
      expect(Math.abs(b!.risk!.pc! - e!.risk!.pc!) / e!.risk!.pc!).toBeLessThan(1e-9);
      expect(Math.abs(b!.missKm - e!.missKm)).toBeLessThan(1e-6);
    } finally {
      first.close();
      second.close();
    }
  });
});
