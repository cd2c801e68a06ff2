import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { BridgeCallError, bridgeErrorCode, unwrapReply } from '../core/bridge/client.js';
import { CHANNELS, ipcChannelName, type BridgeHandlers, type BridgeReply } from '../core/bridge/contract.js';
import { eventDetailOf, eventRowOf, runSummaryOf, tierOf } from '../core/bridge/convert.js';
import { dispatch } from '../core/bridge/dispatch.js';
import { createBridgeHandlers } from '../app/bridge/handlers.js';
import { KeepclearError } from '../core/errors.js';
import type { ScreeningSettings } from '../core/screening/types.js';
import type { Encounter, RiskAssessment } from '../core/events/index.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import {
  countObjects,
  createRun,
  eventsOfRun,
  finishRun,
  getEvent,
  getRun,
  listRuns,
  openDatabase,
  type KeepclearDb,
} from '../db/index.js';
import { registerBridgeIpc, type InvokeEventLike } from '../electron/ipc.js';

const T0 = parseIso('2026-12-03T00:00:00Z')!;
const SETTINGS: ScreeningSettings = {
  start: T0,
  end: instantFromMs(T0 + 7 * 86_400_000),
  volume: { kind: 'sphere', radiusKm: 5 },
  primaries: ['25544'],
};

function encounter(secondary: string, offsetMs: number): Encounter {
  return {
    primary: '25544',
    secondary,
    tca: instantFromMs(T0 + offsetMs + 0.4),
    missKm: 0.8125,
    relativeSpeedKmS: 14.25,
    rtnKm: [0.125, -0.75, 0.25],
    approachAngleDeg: 171.5,
    entry: instantFromMs(T0 + offsetMs - 500),
    exit: null,
    primaryState: [6778, 1, 2, 0.5, 7.6, 0.25],
    secondaryState: [6779, 1.5, 2.5, -0.5, -7.6, 0.5],
    primaryEpoch: instantFromMs(T0 - 3_600_000),
    secondaryEpoch: instantFromMs(T0 - 7_200_000),
  };
}

const RISK: RiskAssessment = {
  pc: 2.5e-5,
  pcMethod: '2d-short-encounter',
  covarianceSource: 'element-set history',
  hardBodyRadiusM: 12.5,
  tier: 'monitor',
  warnings: ['relative speed is low'],
};

/**
 * Handlers over a real database, as the desktop app's wiring will build them; the catalogue's
 * newest epoch needs a db query that does not exist yet, so this test reports null.
 */
function dbHandlers(db: KeepclearDb): BridgeHandlers {
  return {
    ...createBridgeHandlers(db).handlers,
    'catalog.summary': () => ({ objectCount: countObjects(db), latestEpoch: null }),
    'runs.list': ({ limit }) => ({ runs: listRuns(db, limit).map(runSummaryOf) }),
    'runs.events': ({ runId }) => {
      if (!getRun(db, runId)) throw new KeepclearError('NOT_FOUND', `no run "${runId}"`);
      return { runId, events: eventsOfRun(db, runId).map(eventRowOf) };
    },
    'events.get': async ({ eventId }) => {
      const e = getEvent(db, eventId);
      if (!e) throw new KeepclearError('NOT_FOUND', `no event "${eventId}"`);
      return { event: eventDetailOf(e) };
    },
  };
}

let db: KeepclearDb;
let runId: string;
beforeEach(() => {
  db = openDatabase(':memory:');
  runId = createRun(db, SETTINGS, 'f'.repeat(64), 3);
  finishRun(db, runId, {
    status: 'done',
    wallMs: 10,
    flagged: [{ id: '99', reason: 'decayed' }],
    events: [{ ...encounter('2', 5000), risk: RISK }, { ...encounter('1', 1000), risk: null }],
  });
});
afterEach(() => db.close());

describe('dispatch', () => {
  it('answers each channel through the injected handlers with plain data', async () => {
    const h = dbHandlers(db);
    expect(await dispatch(h, 'catalog.summary', {})).toEqual({ ok: true, value: { objectCount: 0, latestEpoch: null } });

    const runs = await dispatch(h, 'runs.list', { limit: 5 });
    expect(runs).toMatchObject({
      ok: true,
      value: {
        runs: [{
          id: runId, status: 'done', start: '2026-12-03T00:00:00.000Z', end: '2026-12-10T00:00:00.000Z',
          volume: { kind: 'sphere', radiusKm: 5 }, primaries: ['25544'], objectCount: 3, eventCount: 2, flaggedCount: 1,
        }],
      },
    });

    const events = await dispatch(h, 'runs.events', { runId });
    expect(events).toEqual({
      ok: true,
      value: {
        runId,
        events: [
          {
            id: `${runId}-1`, runId, primary: '25544', secondary: '1', tca: '2026-12-03T00:00:01.000Z',
            missKm: 0.8125, relativeSpeedKmS: 14.25, rtnKm: [0.125, -0.75, 0.25], approachAngleDeg: 171.5,
            pc: null, pcMethod: null, covarianceSource: null, tier: null,
          },
          {
            id: `${runId}-2`, runId, primary: '25544', secondary: '2', tca: '2026-12-03T00:00:05.000Z',
            missKm: 0.8125, relativeSpeedKmS: 14.25, rtnKm: [0.125, -0.75, 0.25], approachAngleDeg: 171.5,
            pc: 2.5e-5, pcMethod: '2d-short-encounter', covarianceSource: 'element-set history', tier: 'monitor',
          },
        ],
      },
    });

    const one = await dispatch(h, 'events.get', { eventId: `${runId}-2` });
    expect(one).toMatchObject({
      ok: true,
      value: {
        event: {
          id: `${runId}-2`, entry: '2026-12-03T00:00:04.500Z', exit: null,
          primaryEpoch: '2026-12-02T23:00:00.000Z', secondaryEpoch: '2026-12-02T22:00:00.000Z',
          primaryPositionTemeKm: [6778, 1, 2], primaryVelocityTemeKmS: [0.5, 7.6, 0.25],
          secondaryPositionTemeKm: [6779, 1.5, 2.5], secondaryVelocityTemeKmS: [-0.5, -7.6, 0.5],
          hardBodyRadiusM: 12.5, warnings: ['relative speed is low'], tier: 'monitor',
        },
      },
    });
    // survives JSON (the HTTP host) unchanged
    expect(JSON.parse(JSON.stringify(one))).toEqual(one);
  });

  it('answers unknown ids with NOT_FOUND, never with made-up data', async () => {
    const h = dbHandlers(db);
    expect(await dispatch(h, 'runs.events', { runId: 'R404' })).toEqual({
      ok: false,
      error: { code: 'NOT_FOUND', message: 'runs.events: no run "R404"' },
    });
    expect(await dispatch(h, 'events.get', { eventId: 'R1-404' })).toMatchObject({ ok: false, error: { code: 'NOT_FOUND' } });
  });

  it('validates before any handler runs', async () => {
    const spy = vi.fn();
    const h = Object.fromEntries(CHANNELS.map((c) => [c, spy])) as unknown as BridgeHandlers;
    expect(await dispatch(h, 'runs.events', { runId: 5 })).toEqual({
      ok: false,
      error: { code: 'BAD_REQUEST', message: 'bridge: runs.events: "runId" must be a string id, got the number 5' },
    });
    expect(await dispatch(h, 'db.exec', 'DROP TABLE runs')).toMatchObject({ ok: false, error: { code: 'UNKNOWN_CHANNEL' } });
    expect(spy).not.toHaveBeenCalled();
  });

  it('turns handler failures into replies (nothing thrown escapes)', async () => {
    const boom = (): never => {
      throw new Error('disk full');
    };
    const h: BridgeHandlers = {
      ...dbHandlers(db),
      'catalog.summary': boom,
      'runs.list': () => Promise.reject(new KeepclearError('BAD_ARGUMENT', 'limit too large')),
    };
    expect(await dispatch(h, 'catalog.summary', {})).toEqual({
      ok: false,
      error: { code: 'INTERNAL', message: 'catalog.summary: disk full' },
    });
    expect(await dispatch(h, 'runs.list', {})).toEqual({
      ok: false,
      error: { code: 'BAD_REQUEST', message: 'runs.list: limit too large' },
    });
  });
});

describe('electron/ipc.ts', () => {
  type Listener = (event: InvokeEventLike, ...args: unknown[]) => Promise<unknown>;
  function fakeIpc() {
    const listeners = new Map<string, Listener>();
    return {
      listeners,
      handle: (name: string, fn: Listener) => {
        if (listeners.has(name)) throw new Error(`second handler for ${name}`);
        listeners.set(name, fn);
      },
      removeHandler: (name: string) => void listeners.delete(name),
    };
  }
  const event = (trusted: boolean) => ({ trusted }) as unknown as InvokeEventLike;
  const isTrusted = (e: InvokeEventLike): boolean => (e as unknown as { trusted: boolean }).trusted;

  it('registers one handler per channel, validates, and removes them again', async () => {
    const ipc = fakeIpc();
    const unregister = registerBridgeIpc(ipc, dbHandlers(db), isTrusted);
    expect([...ipc.listeners.keys()]).toEqual(CHANNELS.map(ipcChannelName));

    const get = ipc.listeners.get('keepclear:runs.events')!;
    const ok = (await get(event(true), { runId })) as BridgeReply<'runs.events'>;
    expect(ok.ok && ok.value.events.map((e) => e.id)).toEqual([`${runId}-1`, `${runId}-2`]);
    expect(await get(event(true), { runId: ['R1'] })).toMatchObject({ ok: false, error: { code: 'BAD_REQUEST' } });
    expect(await get(event(false), { runId })).toEqual({
      ok: false,
      error: { code: 'BAD_REQUEST', message: 'bridge: runs.events: call from an untrusted frame refused' },
    });

    unregister();
    expect(ipc.listeners.size).toBe(0);
  });
});

describe('client side', () => {
  it('unwraps values and turns failures into errors that keep their code in the message', () => {
    expect(unwrapReply<'catalog.summary'>({ ok: true, value: { objectCount: 1, latestEpoch: null } })).toEqual({
      objectCount: 1,
      latestEpoch: null,
    });
    const fail = (): unknown => unwrapReply({ ok: false, error: { code: 'NOT_FOUND', message: 'events.get: no event "R1-9"' } });
    expect(fail).toThrow(BridgeCallError);
    expect(fail).toThrow('NOT_FOUND: events.get: no event "R1-9"');
    try {
      fail();
    } catch (e) {
      expect(bridgeErrorCode(e)).toBe('NOT_FOUND');
      // what survives Electron's contextBridge is the message only
      expect(bridgeErrorCode(new Error((e as Error).message))).toBe('NOT_FOUND');
    }
    expect(() => unwrapReply({ ok: false, error: { code: 'TEAPOT', message: 'x' } })).toThrow('INTERNAL: bridge: malformed reply');
    expect(() => unwrapReply(undefined)).toThrow('INTERNAL: bridge: malformed reply');
    expect(bridgeErrorCode(new Error('something else'))).toBeNull();
  });
});

describe('convert', () => {
  it('keeps only known tiers and sends null for non-finite numbers', () => {
    expect(tierOf('plan')).toBe('plan');
    expect(tierOf('amber')).toBeNull();
    expect(tierOf('constructor')).toBeNull();
    expect(tierOf(null)).toBeNull();
    const stored = eventsOfRun(db, runId)[1]!;
    const odd = { ...stored, risk: { ...RISK, pc: Number.NaN, hardBodyRadiusM: Number.NaN } };
    expect(eventDetailOf(odd)).toMatchObject({ pc: null, hardBodyRadiusM: null });
  });

  it('describes an ellipsoid run and an all-vs-all run', () => {
    const id = createRun(db, { ...SETTINGS, volume: { kind: 'rtn-ellipsoid', rKm: 0.5, tKm: 5, nKm: 0.5 }, primaries: 'all' }, 'a'.repeat(64), 3);
    expect(runSummaryOf(getRun(db, id)!)).toMatchObject({
      id,
      status: 'running',
      volume: { kind: 'rtn-ellipsoid', rKm: 0.5, tKm: 5, nKm: 0.5 },
      primaries: 'all',
      finishedAt: null,
      eventCount: null,
      flaggedCount: 0,
    });
  });
});
