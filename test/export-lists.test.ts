/**
 * CSV and JSON exports of a run (issue 7 item 4). CSV is read back with a small RFC 4180 reader
 * written here (quoted fields, doubled quotes, CRLF), independent of the writer; JSON carries the
 * contract names of DESIGN.md ("JSON of screen and events") and a top-level `caution`.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSV_COLUMNS, eventsCsv, exportEvents } from '../app/export/index.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import type { KeepclearDb } from '../db/index.js';
import { reportFixture } from './support/reportFixture.js';
import { exportFixture, screenAgain } from './support/exportFixture.js';

/** RFC 4180 §2: records end in CRLF; a field in quotes may hold commas, CRLF and "" for a quote. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [], field = '', quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') { field += '"'; i++; }
      else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') { row.push(field); field = ''; }
    else if (c === '\r' && text[i + 1] === '\n') { row.push(field); rows.push(row); row = []; field = ''; i++; }
    else field += c;
  }
  if (field !== '' || row.length) { row.push(field); rows.push(row); }
  return rows;
}

let db: KeepclearDb;
let runId: string;
let dir: string;

beforeAll(() => {
  const fx = reportFixture(12);
  db = fx.db;
  runId = fx.runId;
  dir = mkdtempSync(join(tmpdir(), 'keepclear-export-lists-'));
});
afterAll(() => {
  db.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('CSV export', () => {
  it('has a header row and one row per event, numbers at full precision', () => {
    const out = join(dir, 'run.csv');
    const r = exportEvents(db, { run: runId }, 'csv', out);
    const rows = readCsv(readFileSync(out, 'utf8'));
    expect(rows[0]).toEqual([...CSV_COLUMNS]);
    expect(rows.length - 1).toBe(r.events);
    const col = (name: string) => CSV_COLUMNS.indexOf(name);
    const first = rows[1]!;
    expect(first[col('id')]).toBe(`${runId}-1`);
    expect(first[col('tca')]).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    expect(r.events).toBe(12);
    // full precision is checked against the JSON export below (value for value)
  });

  it('quotes fields with commas and quotes, and leaves missing values empty', () => {
    const e = {
      id: 'R1-1', runId: 'R1', primary: '1', secondary: 'odd, "name"', tca: 0, missKm: 0.1, relativeSpeedKmS: 1,
      rtnKm: [0, 0, 0], approachAngleDeg: 90, entry: null, exit: null, primaryState: [0, 0, 0, 0, 0, 0],
      secondaryState: [0, 0, 0, 0, 0, 0], primaryEpoch: 0, secondaryEpoch: 0, risk: null,
    } as unknown as ConjunctionEvent;
    const rows = readCsv(eventsCsv([e]));
    expect(rows[1]![CSV_COLUMNS.indexOf('secondary')]).toBe('odd, "name"');
    expect(rows[1]![CSV_COLUMNS.indexOf('pc')]).toBe('');
    expect(rows[1]![CSV_COLUMNS.indexOf('entry')]).toBe('');
    expect(rows[1]).toHaveLength(CSV_COLUMNS.length);
  });
});

describe('JSON export', () => {
  it('carries the caution, the run and the events under the contract names', () => {
    const out = join(dir, 'run.json');
    exportEvents(db, { run: runId }, 'json', out);
    const doc = JSON.parse(readFileSync(out, 'utf8')) as {
      caution: string; run: { id: string }; export: { kind: string; id: string };
      events: { id: string; tca: string; missKm: number; pc: number | null; rtnKm: number[]; covarianceSource: string }[];
    };
    expect(doc.caution).toBe(DECISION_AID_NOTE);
    expect(doc.export).toMatchObject({ kind: 'run', id: runId });
    expect(doc.run.id).toBe(runId);
    expect(doc.events).toHaveLength(12);
    const csv = readCsv(readFileSync(join(dir, 'run.csv'), 'utf8'));
    // CSV and JSON agree value for value (both at full double precision)
    doc.events.forEach((e, k) => {
      const row = csv[k + 1]!;
      expect(row[CSV_COLUMNS.indexOf('id')]).toBe(e.id);
      expect(row[CSV_COLUMNS.indexOf('tca')]).toBe(e.tca);
      expect(Number(row[CSV_COLUMNS.indexOf('missKm')])).toBe(e.missKm);
      expect(Number(row[CSV_COLUMNS.indexOf('pc')])).toBe(e.pc);
      expect(Number(row[CSV_COLUMNS.indexOf('rtnTKm')])).toBe(e.rtnKm[1]);
    });
  });

  it('exports one event as a one-element list', () => {
    const out = join(dir, 'one.json');
    exportEvents(db, { event: `${runId}-2` }, 'json', out);
    const doc = JSON.parse(readFileSync(out, 'utf8')) as { caution: string; events: { id: string; tca: string }[] };
    expect(doc.caution).toBe(DECISION_AID_NOTE);
    expect(doc.events.map((e) => e.id)).toEqual([`${runId}-2`]);
  });
});

describe('series export', () => {
  it('lists the series\' events in data order, in CSV, JSON (with the series and the caution) and as CDMs', async () => {
    const fx = await exportFixture();
    try {
      const again = await screenAgain(fx.db);
      const seriesId = again.events[0]!.seriesId!;
      expect(seriesId).toBeTruthy();
      expect(fx.events[0]!.id).not.toBe(again.events[0]!.id);
      const csvPath = join(dir, 'series.csv');
      const r = exportEvents(fx.db, { series: seriesId }, 'csv', csvPath);
      expect(r).toMatchObject({ kind: 'series', id: seriesId, events: 2 });
      const rows = readCsv(readFileSync(csvPath, 'utf8'));
      expect(rows.slice(1).map((x) => x[CSV_COLUMNS.indexOf('id')])).toEqual([fx.events[0]!.id, again.events[0]!.id]);
      expect(rows.slice(1).map((x) => x[CSV_COLUMNS.indexOf('seriesId')])).toEqual([seriesId, seriesId]);
      const jsonPath = join(dir, 'series.json');
      exportEvents(fx.db, { series: seriesId }, 'json', jsonPath);
      const doc = JSON.parse(readFileSync(jsonPath, 'utf8')) as { caution: string; series: { id: string; state: string }; events: { id: string }[] };
      expect(doc.caution).toBe(DECISION_AID_NOTE);
      expect(doc.series).toMatchObject({ id: seriesId, state: 'updated' });
      expect(doc.events.map((e) => e.id)).toEqual([fx.events[0]!.id, again.events[0]!.id]);
      const cdms = exportEvents(fx.db, { series: seriesId }, 'cdm', join(dir, 'series-cdm'));
      expect(cdms.files.map((f) => f.split('/').pop())).toEqual([`${fx.events[0]!.id}.cdm`, `${again.events[0]!.id}.cdm`]);
      expect(() => exportEvents(fx.db, { series: 'S-nope' }, 'csv', join(dir, 'x.csv'))).toThrow(/no series "S-nope"/);
    } finally {
      fx.db.close();
    }
  });
});
