/**
 * The renderer without a browser: its text functions, its page (columns, caution line), and
 * renderer/main.ts driven end to end through a BridgeApi over a real database, on a minimal
 * stand-in for the few DOM calls it makes. (A real-browser check comes with `keepclear serve`.)
 */
import { readFileSync } from 'node:fs';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { unwrapReply } from '../core/bridge/client.js';
import { eventDetailOf, eventRowOf, runSummaryOf } from '../core/bridge/convert.js';
import type { BridgeApi, BridgeHandlers, Channel, EventRow, Req, Res, RunSummary } from '../core/bridge/contract.js';
import { dispatch } from '../core/bridge/dispatch.js';
import { createBridgeHandlers } from '../app/bridge/handlers.js';
import { KeepclearError } from '../core/errors.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import type { Encounter } from '../core/events/index.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import { createRun, eventsOfRun, finishRun, getEvent, getRun, listRuns, openDatabase, type KeepclearDb } from '../db/index.js';
import { catalogLine, eventCells, formatPc, formatUtc, runLabel, TABLE_COLUMNS, tierDisplay } from '../renderer/format.js';

const html = readFileSync(new URL('../renderer/index.html', import.meta.url), 'utf8');

describe('renderer page', () => {
  it('has the event table columns in order', () => {
    const heads = [...html.matchAll(/<th scope="col"[^>]*>([^<]+)<\/th>/g)].map((m) => m[1]);
    expect(heads).toEqual([...TABLE_COLUMNS]);
  });

  it('shows the decision-aid caution in its footer, worded as core/risk/assess.ts has it', () => {
    const footer = /<footer[^>]*>([\s\S]*?)<\/footer>/.exec(html)?.[1] ?? '';
    expect(footer.replace(/<[^>]+>/g, '').replace(/\s+/g, ' ').trim()).toBe(DECISION_AID_NOTE);
  });

  it('allows no inline script, no remote code', () => {
    expect(html).toMatch(/Content-Security-Policy[^>]*script-src 'self'/);
    expect(html).not.toMatch(/<script(?![^>]*src=)/);
    expect(html).not.toMatch(/https?:\/\//);
  });
});

describe('renderer text', () => {
  const row: EventRow = {
    id: 'R3-1', runId: 'R3', primary: '25544', secondary: 'A1234', tca: '2026-12-03T04:05:06.789Z',
    missKm: 0.81254, relativeSpeedKmS: 14.2, rtnKm: [0, 0, 0], approachAngleDeg: 170,
    pc: 1.2345e-5, pcMethod: 'x', covarianceSource: 'y', tier: 'monitor',
  };
  it('formats a table row', () => {
    expect(eventCells(row)).toEqual(['2026-12-03 04:05:06.789', '25544', 'A1234', '0.813', '14.200', '1.23e-5', 'Monitor']);
    expect(eventCells({ ...row, pc: null, tier: null }).slice(5)).toEqual(['—', '—']);
    expect(eventCells(row)).toHaveLength(TABLE_COLUMNS.length);
  });
  it('formats Pc, times, tiers, runs and the catalogue line', () => {
    expect(formatPc(0)).toBe('0');
    expect(formatPc(1e-4)).toBe('1.00e-4');
    expect(formatUtc(null)).toBe('—');
    expect(formatUtc('not a time')).toBe('not a time');
    expect(tierDisplay('plan')).toMatchObject({ label: 'Plan' });
    expect(tierDisplay(null)).toEqual({ label: '—', colour: null, meaning: 'not assessed' });
    const run: RunSummary = {
      id: 'R3', createdAt: '2026-12-03T00:00:00.000Z', start: '2026-12-03T00:00:00.000Z', end: '2026-12-10T00:00:00.000Z',
      volume: { kind: 'sphere', radiusKm: 5 }, primaries: 'all', objectCount: 9, status: 'done',
      finishedAt: '2026-12-03T00:01:00.000Z', eventCount: 1, flaggedCount: 0,
    };
    expect(runLabel(run)).toBe('R3 · 2026-12-03 00:00 UTC + 7 d · done · 1 event');
    expect(runLabel({ ...run, status: 'running', eventCount: null })).toBe('R3 · 2026-12-03 00:00 UTC + 7 d · running');
    expect(catalogLine(30000, '2026-12-02T23:00:00.000Z')).toBe('30,000 objects in the catalogue · newest elements 2026-12-02 23:00:00.000 UTC');
    expect(catalogLine(0, null)).toBe('0 objects in the catalogue');
  });
});

// ───────────── a stand-in for the DOM calls renderer/main.ts makes ─────────────

class El {
  children: El[] = [];
  textContent = '';
  title = '';
  hidden = false;
  disabled = false;
  tabIndex = -1;
  value = '';
  dataset: Record<string, string> = {};
  private classes = new Set<string>();
  private attrs = new Map<string, string>();
  private listeners = new Map<string, ((ev: unknown) => void)[]>();
  readonly styleProps = new Map<string, string>();
  readonly style = { setProperty: (k: string, v: string): void => void this.styleProps.set(k, v) };
  readonly classList = {
    add: (c: string): void => void this.classes.add(c),
    toggle: (c: string, on?: boolean): void => {
      if (on ?? !this.classes.has(c)) this.classes.add(c);
      else this.classes.delete(c);
    },
    contains: (c: string): boolean => this.classes.has(c),
  };
  constructor(readonly tag: string) {}
  get className(): string {
    return [...this.classes].join(' ');
  }
  set className(v: string) {
    this.classes = new Set(v.split(/\s+/).filter(Boolean));
  }
  append(...c: El[]): void {
    this.children.push(...c);
  }
  replaceChildren(...c: El[]): void {
    this.children = [...c];
  }
  setAttribute(k: string, v: string): void {
    this.attrs.set(k, v);
  }
  getAttribute(k: string): string | null {
    return this.attrs.get(k) ?? null;
  }
  addEventListener(type: string, fn: (ev: unknown) => void): void {
    this.listeners.set(type, [...(this.listeners.get(type) ?? []), fn]);
  }
  fire(type: string, ev: unknown = {}): void {
    for (const fn of this.listeners.get(type) ?? []) fn(ev);
  }
  get text(): string[] {
    return this.children.map((c) => c.textContent);
  }
}
class HTMLElementS extends El {}
class HTMLParagraphElementS extends El {}
class HTMLSelectElementS extends El {}
class HTMLButtonElementS extends El {}
class HTMLHeadingElementS extends El {}
class HTMLDListElementS extends El {}
class TBody extends El {
  get rows(): El[] {
    return this.children;
  }
}
class HTMLTableElementS extends El {
  readonly tBodies = [new TBody('tbody')];
}
class OptionS extends El {
  constructor(text = '', value = '') {
    super('option');
    this.textContent = text;
    this.value = value;
  }
}

function page() {
  const els = {
    catalog: new HTMLParagraphElementS('p'),
    run: new HTMLSelectElementS('select'),
    refresh: new HTMLButtonElementS('button'),
    status: new HTMLParagraphElementS('p'),
    events: new HTMLTableElementS('table'),
    empty: new HTMLParagraphElementS('p'),
    detail: new HTMLElementS('aside'),
    'detail-title': new HTMLHeadingElementS('h2'),
    'detail-fields': new HTMLDListElementS('dl'),
  };
  els.detail.hidden = true;
  vi.stubGlobal('HTMLElement', HTMLElementS);
  vi.stubGlobal('HTMLParagraphElement', HTMLParagraphElementS);
  vi.stubGlobal('HTMLSelectElement', HTMLSelectElementS);
  vi.stubGlobal('HTMLButtonElement', HTMLButtonElementS);
  vi.stubGlobal('HTMLTableElement', HTMLTableElementS);
  vi.stubGlobal('HTMLHeadingElement', HTMLHeadingElementS);
  vi.stubGlobal('HTMLDListElement', HTMLDListElementS);
  vi.stubGlobal('Option', OptionS);
  vi.stubGlobal('document', {
    getElementById: (id: string) => (els as Record<string, El>)[id] ?? null,
    createElement: (tag: string) => (tag === 'option' ? new OptionS() : new El(tag)),
  });
  return els;
}

const T0 = parseIso('2026-12-03T00:00:00Z')!;
const enc = (secondary: string, offsetMs: number): Encounter => ({
  primary: '25544', secondary, tca: instantFromMs(T0 + offsetMs), missKm: 0.5, relativeSpeedKmS: 12,
  rtnKm: [0.1, 0.4, 0.2], approachAngleDeg: 120, entry: null, exit: null,
  primaryState: [7000, 0, 0, 0, 7.5, 0], secondaryState: [7000.5, 0, 0, 0, -7.5, 0],
  primaryEpoch: T0, secondaryEpoch: T0,
});

/** The bridge as the preload gives it, over dispatch and a real database. */
function bridgeOver(db: KeepclearDb, calls: Channel[]): BridgeApi {
  const handlers: BridgeHandlers = {
    ...createBridgeHandlers(db).handlers,
    'catalog.summary': () => ({ objectCount: 2, latestEpoch: '2026-12-02T23:00:00.000Z' }),
    'runs.list': ({ limit }) => ({ runs: listRuns(db, limit).map(runSummaryOf) }),
    'runs.events': ({ runId }) => {
      if (!getRun(db, runId)) throw new KeepclearError('NOT_FOUND', `no run "${runId}"`);
      return { runId, events: eventsOfRun(db, runId).map(eventRowOf) };
    },
    'events.get': ({ eventId }) => {
      const e = getEvent(db, eventId);
      if (!e) throw new KeepclearError('NOT_FOUND', `no event "${eventId}"`);
      return { event: eventDetailOf(e) };
    },
  };
  return {
    async invoke<C extends Channel>(channel: C, req: Req<C>): Promise<Res<C>> {
      calls.push(channel);
      // structured clone, as IPC does
      return unwrapReply<C>(structuredClone(await dispatch(handlers, channel, structuredClone(req))));
    },
  };
}

describe('renderer/main.ts', () => {
  let db: KeepclearDb;
  beforeEach(() => {
    vi.resetModules();
    db = openDatabase(':memory:');
  });
  afterEach(() => {
    vi.unstubAllGlobals();
    db.close();
  });

  it('loads the newest run, lists its events, and shows one in detail', async () => {
    const older = createRun(db, { start: T0, end: instantFromMs(T0 + 86_400_000), volume: { kind: 'sphere', radiusKm: 5 }, primaries: 'all' }, 'a'.repeat(64), 2);
    finishRun(db, older, { status: 'done', wallMs: 1, flagged: [], events: [] });
    const newer = createRun(db, { start: T0, end: instantFromMs(T0 + 7 * 86_400_000), volume: { kind: 'sphere', radiusKm: 5 }, primaries: ['25544'] }, 'b'.repeat(64), 2);
    finishRun(db, newer, { status: 'done', wallMs: 1, flagged: [], events: [enc('B', 2000), enc('A', 1000)] });

    const els = page();
    const calls: Channel[] = [];
    vi.stubGlobal('window', { keepclear: bridgeOver(db, calls) });
    await import('../renderer/main.js');

    const tbody = els.events.tBodies[0]!;
    await vi.waitFor(() => expect(tbody.rows).toHaveLength(2));
    const rows = tbody.rows;
    expect(els.catalog.textContent).toBe('2 objects in the catalogue · newest elements 2026-12-02 23:00:00.000 UTC');
    expect(els.run.text).toEqual([
      'R2 · 2026-12-03 00:00 UTC + 7 d · done · 2 events',
      'R1 · 2026-12-03 00:00 UTC + 1 d · done · 0 events',
    ]);
    expect(els.run.value).toBe('R2');
    expect(rows[0]!.text).toEqual(['2026-12-03 00:00:01.000', '25544', 'A', '0.500', '12.000', '—', '—']);
    expect(els.status.textContent).toBe('2 close approaches in run R2');
    expect(els.empty.hidden).toBe(true);

    rows[1]!.fire('click');
    await vi.waitFor(() => expect(els.detail.hidden).toBe(false));
    expect(els['detail-title'].textContent).toBe('25544 – B');
    const fields = els['detail-fields'].text;
    expect(fields.slice(0, 4)).toEqual(['Event', 'R2-2', 'TCA (UTC)', '2026-12-03 00:00:02.000']);
    expect(rows[1]!.getAttribute('aria-selected')).toBe('true');
    expect(rows[0]!.getAttribute('aria-selected')).toBe('false');

    els.run.value = 'R1';
    els.run.fire('change');
    await vi.waitFor(() => expect(els.status.textContent).toBe('0 close approaches in run R1'));
    expect(tbody.rows).toHaveLength(0);
    expect(els.empty.hidden).toBe(false);
    expect(els.detail.hidden).toBe(true);
    expect(calls).toEqual(['catalog.summary', 'runs.list', 'runs.events', 'events.get', 'runs.events']);
  });

  it('says so when there is no run yet', async () => {
    const els = page();
    vi.stubGlobal('window', { keepclear: bridgeOver(db, []) });
    await import('../renderer/main.js');
    await vi.waitFor(() => expect(els.empty.hidden).toBe(false));
    expect(els.empty.textContent).toMatch(/^No screening runs yet/);
    expect(els.run.disabled).toBe(true);
  });

  it('shows bridge errors in the status line', async () => {
    const els = page();
    const failing: BridgeApi = { invoke: () => Promise.reject(new Error('INTERNAL: catalog.summary: database is locked')) };
    vi.stubGlobal('window', { keepclear: failing });
    await import('../renderer/main.js');
    await vi.waitFor(() => expect(els.status.classList.contains('error')).toBe(true));
    expect(els.status.textContent).toBe('Could not reach Keepclear: INTERNAL: catalog.summary: database is locked');
  });

  it('says so when no bridge is on the page', async () => {
    const els = page();
    vi.stubGlobal('window', {});
    await import('../renderer/main.js');
    expect(els.refresh.disabled).toBe(true);
    expect(els.status.textContent).toMatch(/^No Keepclear bridge on this page/);
  });
});
