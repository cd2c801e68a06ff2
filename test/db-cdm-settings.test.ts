import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import {
  createRun,
  deleteSetting,
  finishRun,
  getCdm,
  getSetting,
  linkCdmToEvent,
  listCdms,
  listImportFiles,
  openDatabase,
  putSetting,
  rejectionsOfImport,
  storeCdm,
  storeCdmFile,
  type CdmRecord,
  type KeepclearDb,
} from '../db/index.js';

const T0 = parseIso('2026-12-03T04:05:06.789Z')!;

function cdm(messageId: string, over: Partial<CdmRecord> = {}): CdmRecord {
  return {
    messageId,
    creationDate: instantFromMs(T0 - 86_400_000),
    originator: 'ORIG-A',
    tca: T0,
    missDistanceM: 715.25,
    object1Id: '25544',
    object2Id: '40000',
    reportedPc: 4.2e-5,
    parsed: { header: { MESSAGE_ID: messageId }, object1: { X: 1.5, COVARIANCE: [1, 2, 3] } },
    eventId: null,
    ...over,
  };
}

let db: KeepclearDb;
beforeEach(() => {
  db = openDatabase(':memory:');
});
afterEach(() => db.close());

describe('cdm_messages', () => {
  it('round-trips a record and treats a re-sent message as the same one', () => {
    const first = storeCdm(db, cdm('M1'));
    expect(first.created).toBe(true);
    expect(getCdm(db, first.id)).toMatchObject({ ...cdm('M1'), id: first.id, importFileId: null });
    expect(storeCdm(db, cdm('M1', { missDistanceM: 1 }))).toEqual({ id: first.id, created: false });
    // the same MESSAGE_ID from another originator is another message
    expect(storeCdm(db, cdm('M1', { originator: 'ORIG-B' })).created).toBe(true);
  });

  it('stores one file in one transaction with its import log and rejections', () => {
    const r = storeCdmFile(
      db,
      { path: 'a.cdm', sha256: 'b'.repeat(64), format: 'CDM-KVN' },
      [cdm('M1'), cdm('M2', { tca: instantFromMs(T0 - 1000), reportedPc: null })],
      [{ code: 'CDM_MISSING_KEYWORD', file: 'a.cdm', line: 40, reason: 'TCA missing' }],
    );
    expect(r).toMatchObject({ imported: 2, unchanged: 0, rejected: 1 });
    expect(listImportFiles(db)[0]).toMatchObject({ path: 'a.cdm', imported: 2, rejected: 1 });
    expect(rejectionsOfImport(db, r.importFileId)).toEqual([{ line: 40, code: 'CDM_MISSING_KEYWORD', reason: 'TCA missing' }]);
    expect(listCdms(db).map((c) => c.messageId)).toEqual(['M2', 'M1']); // by TCA
    expect(listCdms(db, { objectId: '40000' })).toHaveLength(2);
    expect(listCdms(db, { objectId: '1' })).toHaveLength(0);
  });

  it('links a message only to an event that exists', () => {
    const run = createRun(
      db,
      { start: T0, end: instantFromMs(T0 + 1), volume: { kind: 'sphere', radiusKm: 5 }, primaries: ['25544'] },
      'x',
      2,
    );
    const { id } = storeCdm(db, cdm('M1'));
    expect(() => linkCdmToEvent(db, id, `${run}-1`)).toThrow(/FOREIGN KEY/); // no such event yet
    finishRun(db, run, {
      status: 'done',
      wallMs: 1,
      flagged: [],
      events: [
        {
          primary: '25544', secondary: '40000', tca: T0, missKm: 0.7, relativeSpeedKmS: 10, rtnKm: [0, 0.7, 0],
          approachAngleDeg: 90, entry: null, exit: null, primaryState: [7000, 0, 0, 0, 7.5, 0],
          secondaryState: [7000, 0.7, 0, 0, 0, 7.5], primaryEpoch: T0, secondaryEpoch: T0,
        },
      ],
    });
    linkCdmToEvent(db, id, `${run}-1`);
    expect(listCdms(db, { eventId: `${run}-1` }).map((c) => c.id)).toEqual([id]);
  });
});

describe('settings', () => {
  it('stores JSON values by key, replaces and deletes them', () => {
    expect(getSetting(db, 'tiers')).toBeUndefined();
    putSetting(db, 'tiers', { attention: 1e-7, mitigate: 1e-4 });
    putSetting(db, 'tiers', { attention: 1e-6, mitigate: 1e-4 });
    expect(getSetting(db, 'tiers')).toEqual({ attention: 1e-6, mitigate: 1e-4 });
    putSetting(db, 'off', null);
    expect(getSetting(db, 'off')).toBeNull();
    deleteSetting(db, 'tiers');
    expect(getSetting(db, 'tiers')).toBeUndefined();
  });
});
