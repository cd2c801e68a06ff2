import { describe, expect, it } from 'vitest';
import {
  CHANNELS,
  ID_MAX_LENGTH,
  ipcChannelName,
  isChannel,
  isRequest,
  REQUEST_GUARDS,
  RUNS_LIST_MAX_LIMIT,
  validateRequest,
  type Channel,
} from '../core/bridge/contract.js';

/** The message of a rejected request (fails the test if it was accepted). */
function rejection(channel: unknown, req: unknown): { code: string; message: string } {
  const r = validateRequest(channel, req);
  if (r.ok) throw new Error(`expected ${String(channel)} ${JSON.stringify(req)} to be rejected`);
  return r.error;
}

describe('bridge contract: channels', () => {
  it('lists exactly its channels, in contract order', () => {
    expect(CHANNELS).toEqual([
      'catalog.summary', 'runs.list', 'runs.events', 'events.get', 'events.view', 'events.scene', 'reports.make', 'exports.make',
      'jobs.start', 'jobs.get', 'jobs.cancel', 'jobs.list',
    ]);
    expect(Object.isFrozen(CHANNELS)).toBe(true);
    expect(Object.keys(REQUEST_GUARDS)).toEqual([...CHANNELS]);
  });

  it('knows its channels and nothing else (no prototype keys)', () => {
    for (const c of CHANNELS) expect(isChannel(c)).toBe(true);
    for (const c of ['catalog', 'runs.delete', 'toString', '__proto__', 'constructor', '', 'RUNS.LIST']) {
      expect(isChannel(c)).toBe(false);
    }
    expect(isChannel(42)).toBe(false);
    expect(isChannel(null)).toBe(false);
  });

  it('maps each channel to its own IPC name', () => {
    expect(ipcChannelName('runs.events')).toBe('keepclear:runs.events');
    expect(new Set(CHANNELS.map(ipcChannelName)).size).toBe(CHANNELS.length);
  });
});

describe('bridge contract: good requests pass', () => {
  const good: [Channel, unknown][] = [
    ['catalog.summary', {}],
    ['catalog.summary', Object.create(null)],
    ['runs.list', {}],
    ['runs.list', { limit: 1 }],
    ['runs.list', { limit: RUNS_LIST_MAX_LIMIT }],
    ['runs.list', { limit: undefined }],
    ['runs.events', { runId: 'R12' }],
    ['events.get', { eventId: 'R12-3' }],
    ['events.get', { eventId: 'x'.repeat(ID_MAX_LENGTH) }],
  ];
  it.each(good)('%s %j', (channel, req) => {
    const r = validateRequest(channel, req);
    expect(r).toEqual({ ok: true, channel, req });
    expect(isRequest(channel, req)).toBe(true);
    expect(REQUEST_GUARDS[channel](req)).toBe(true);
  });
});

describe('bridge contract: bad requests are refused with a clear message', () => {
  it('refuses an unknown channel and names the known ones', () => {
    const e = rejection('runs.delete', { runId: 'R1' });
    expect(e.code).toBe('UNKNOWN_CHANNEL');
    expect(e.message).toBe(
      'bridge: unknown channel "runs.delete" (known: catalog.summary, runs.list, runs.events, events.get, events.view, events.scene, reports.make, exports.make, jobs.start, jobs.get, jobs.cancel, jobs.list)',
    );
    expect(rejection(7, {}).message).toMatch(/^bridge: unknown channel the number 7 \(known: /);
    expect(rejection('toString', {}).code).toBe('UNKNOWN_CHANNEL');
  });

  const bad: [Channel, unknown, string][] = [
    ['catalog.summary', undefined, 'bridge: catalog.summary: the request must be a plain object, got nothing'],
    ['catalog.summary', null, 'bridge: catalog.summary: the request must be a plain object, got null'],
    ['catalog.summary', [], 'bridge: catalog.summary: the request must be a plain object, got an array'],
    ['catalog.summary', 'all', 'bridge: catalog.summary: the request must be a plain object, got the string "all"'],
    ['catalog.summary', new Date(0), 'bridge: catalog.summary: the request must be a plain object, got an object'],
    ['catalog.summary', { verbose: true }, 'bridge: catalog.summary: unknown field "verbose" (it takes no fields; send {})'],
    ['runs.list', { limit: '10' }, 'bridge: runs.list: "limit" must be a whole number from 1 to 1000, got the string "10"'],
    ['runs.list', { limit: 0 }, 'bridge: runs.list: "limit" must be a whole number from 1 to 1000, got the number 0'],
    ['runs.list', { limit: 2.5 }, 'bridge: runs.list: "limit" must be a whole number from 1 to 1000, got the number 2.5'],
    ['runs.list', { limit: Number.NaN }, 'bridge: runs.list: "limit" must be a whole number from 1 to 1000, got the number NaN'],
    ['runs.list', { limit: 1001 }, 'bridge: runs.list: "limit" must be a whole number from 1 to 1000, got the number 1001'],
    ['runs.list', { limit: null }, 'bridge: runs.list: "limit" must be a whole number from 1 to 1000, got null'],
    ['runs.list', { limt: 5 }, 'bridge: runs.list: unknown field "limt" (allowed: limit)'],
    ['runs.events', {}, 'bridge: runs.events: "runId" must be a string id, got nothing'],
    ['runs.events', { runId: 12 }, 'bridge: runs.events: "runId" must be a string id, got the number 12'],
    ['runs.events', { runId: '' }, 'bridge: runs.events: "runId" must not be empty'],
    ['runs.events', { runId: 'R1\n' }, 'bridge: runs.events: "runId" contains control characters'],
    ['runs.events', { runId: 'R1', eventId: 'R1-1' }, 'bridge: runs.events: unknown field "eventId" (allowed: runId)'],
    ['runs.events', { id: 'R1', x: 1 }, 'bridge: runs.events: unknown fields "id", "x" (allowed: runId)'],
    ['events.get', { eventId: ['R1-1'] }, 'bridge: events.get: "eventId" must be a string id, got an array'],
    ['events.get', { eventId: 'x'.repeat(ID_MAX_LENGTH + 1) }, `bridge: events.get: "eventId" is ${ID_MAX_LENGTH + 1} characters long; ids have at most ${ID_MAX_LENGTH}`],
    ['events.get', { runId: 'R1-1' }, 'bridge: events.get: unknown field "runId" (allowed: eventId)'],
  ];
  it.each(bad)('%s %j', (channel, req, message) => {
    const e = rejection(channel, req);
    expect(e).toEqual({ code: 'BAD_REQUEST', message });
    expect(isRequest(channel, req)).toBe(false);
    expect(REQUEST_GUARDS[channel](req)).toBe(false);
  });

  it('refuses a request meant for another channel', () => {
    expect(isRequest('events.get', { runId: 'R1' })).toBe(false);
    expect(isRequest('runs.events', { eventId: 'R1-1' })).toBe(false);
  });
});
