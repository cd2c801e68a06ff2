/**
 * What screenAndStore hands back is what a reader of the database gets. The service builds its
 * events from those it stored (plus the series ids linking gave them, plus a fresh read of any
 * event whose risk linking changed) instead of reading 10⁵ rows back; these checks hold it to
 * eventsOfRun, field for field, including the case where a received message of the same series
 * changes an event's covariance while the run is linked (app/series.ts).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { cdmTextOfEvent } from '../app/export/index.js';
import { importFile } from '../app/import/index.js';
import { seriesStatesOf } from '../app/seriesJson.js';
import { eventsOfRun, getEvent, getSeries, sightingsOfRunPairs } from '../db/index.js';
import { exportFixture, screenAgain } from './support/exportFixture.js';

const dir = mkdtempSync(join(tmpdir(), 'keepclear-screen-result-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('the events screenAndStore returns', () => {
  it('equal the run read back from the database, series ids included', async () => {
    const { db, run, events } = await exportFixture();
    expect(events.length).toBeGreaterThan(0);
    expect(events.every((e) => typeof e.seriesId === 'string')).toBe(true);
    expect(events).toEqual(eventsOfRun(db, run.id));
  });

  it('equal the run read back when a received message of the series changed an event\'s risk while linking', async () => {
    const { db, events } = await exportFixture();
    const first = events[0]!;
    // A message about the first run's event, created before the next run: the next run's
    // sighting of the same conjunction takes its covariance while it is linked.
    const file = join(dir, 'message.cdm');
    writeFileSync(file, cdmTextOfEvent(db, first, { now: (Date.now() - 60_000) as never }));
    const imported = importFile(db, file);
    expect(imported.ok, imported.ok ? '' : imported.error.message).toBe(true);
    const again = await screenAgain(db);
    const back = eventsOfRun(db, again.run.id);
    // (the message, older than the first run, may have re-founded the series: its id now)
    const seriesId = getEvent(db, first.id)!.seriesId;
    const sighting = again.events.find((e) => e.seriesId === seriesId);
    expect(sighting, 'the second run sees the same conjunction').toBeDefined();
    expect(sighting!.risk!.covarianceSource).toBe('cdm / cdm');
    expect(again.linked.reassessed).toContain(sighting!.id);
    expect(again.events).toEqual(back);
  });

  it('are stored with the series they would found, and linking moves those that join an older series', async () => {
    // The first run's events found their series: linking had nothing to write or retire.
    const { db, run, events } = await exportFixture();
    expect(events.map((e) => e.seriesId)).toEqual(events.map((e) => `S-${e.id}`));
    // The next run sees the same conjunction: its event joins the first run's series; the id it
    // was stored with is replaced, and no series is reported retired for it.
    const again = await screenAgain(db);
    const back = eventsOfRun(db, again.run.id);
    expect(back.map((e) => e.seriesId)).toEqual(events.map((e) => e.seriesId));
    expect(again.linked.reassigned).toBe(back.length);
    expect(again.linked.retired).toEqual([]);
    expect(again.events).toEqual(back);
    expect(eventsOfRun(db, run.id)).toEqual(events);
  });

  it('are, as linking takes them from memory, the sightings the database gives for the run (σ of the series rule included)', async () => {
    const { db, run, events } = await exportFixture();
    const fromDb = [...sightingsOfRunPairs(db, run.id).values()].flat();
    expect(fromDb.map((m) => m.event.id).sort()).toEqual(events.map((e) => e.id).sort());
    for (const m of fromDb) {
      const mine = events.find((e) => e.id === m.event.id)!;
      // the series tolerance reads σ along the relative velocity from the risk detail
      expect(m.event.risk!.detail!.sigmaAlongVelocityM).toBeGreaterThan(0);
      expect(m.event.risk!.detail).toEqual(mine.risk!.detail);
      expect(m.event.seriesId).toBe(mine.seriesId);
      expect(m.source).toEqual({ id: run.id, kind: 'screening', createdAt: run.dataAt });
    }
  });

  it('have series states read in one statement that agree with each stored series', async () => {
    const { db, events } = await exportFixture();
    const states = seriesStatesOf(db, [...events, ...events]);
    const ids = new Set(events.map((e) => e.seriesId!));
    expect(states.size).toBe(ids.size);
    for (const id of ids) expect(states.get(id)).toBe(getSeries(db, id)!.state);
  });
});
