/**
 * The renderer without a browser: its page (CSP, caution, controls), its text functions, and the
 * week list's model (filter, search, sort, keyboard). The page itself runs in a real browser in
 * test/ui-browser.test.ts.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { EventRow, RunSummary } from '../core/bridge/contract.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { catalogLine, formatPc, formatUtc, runLabel, tierDisplay } from '../renderer/format.js';
import { COLUMNS } from '../renderer/week/columns.js';
import { ALL_TIERS, applyQuery, DEFAULT_QUERY, navigate, prepareRows, tierCounts } from '../renderer/week/listModel.js';

const html = readFileSync(new URL('../renderer/index.html', import.meta.url), 'utf8');

describe('renderer page', () => {
  it('shows the decision-aid caution in its footer, worded as core/risk/assess.ts has it', () => {
    const footer = /<footer[^>]*>([\s\S]*?)<\/footer>/.exec(html)?.[1] ?? '';
    expect(footer.replace(/<[^>]+>/g, '').replace(/\s+/g, ' ').trim()).toBe(DECISION_AID_NOTE);
  });

  it('allows no inline script, no eval, no remote code', () => {
    const csp = /Content-Security-Policy"\s+content="([^"]+)"/.exec(html)?.[1] ?? '';
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/unsafe-(eval|inline)/);
    expect(html).not.toMatch(/<script(?![^>]*src=)/);
    expect(html).not.toMatch(/https?:\/\//);
  });

  it('has the event page and the manoeuvre panel carry the caution', () => {
    expect(html.match(/data-caution/g)?.length).toBeGreaterThanOrEqual(2);
    expect(html).toMatch(/id="plan-form"/);
  });
});

const row: EventRow = {
  id: 'R3-1', runId: 'R3', primary: '25544', secondary: 'A1234', tca: '2026-12-03T04:05:06.789Z',
  missKm: 0.8134, relativeSpeedKmS: 14.2, rtnKm: [0.1, -0.8, 0.05], approachAngleDeg: 170,
  pc: 1.234e-5, pcMethod: '2d-short-encounter', covarianceSource: 'element-set history', tier: 'monitor',
};

describe('renderer text', () => {
  it('formats the list cells with units in the headers', () => {
    expect(COLUMNS.map((c) => c.label)).toEqual(['Tier', 'TCA (UTC)', 'Primary', 'Secondary', 'Miss (km)', 'Rel. speed (km/s)', 'Pc', 'Series']);
    expect(COLUMNS.map((c) => c.text(row)).slice(1)).toEqual(['2026-12-03 04:05:06.789', '25544', 'A1234', '0.813', '14.20', '1.23e-5', '—']);
    expect(COLUMNS.at(-1)!.text({ ...row, seriesId: 'S-R1-4', seriesState: 'updated' })).toBe('updated · S-R1-4');
  });

  it('formats Pc (THE formatter of core/events/pcText.ts), times, tiers, runs and the catalogue line', () => {
    expect(formatPc(0)).toBe('< 1e-10');
    expect(formatPc(1e-4)).toBe('1.00e-4');
    expect(formatPc(null)).toBe('—');
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

describe('the week list model', () => {
  const ev = (id: string, o: Partial<EventRow>): EventRow => ({ ...row, id, ...o });
  const rows = prepareRows([
    ev('R3-1', { tca: '2026-12-03T00:00:00.000Z', pc: 1e-6, tier: 'monitor', missKm: 0.9 }),
    ev('R3-2', { tca: '2026-12-04T00:00:00.000Z', pc: 2e-4, tier: 'plan', missKm: 0.1, secondary: '40001' }),
    ev('R3-3', { tca: '2026-12-05T00:00:00.000Z', pc: null, tier: null, missKm: 4.2, primary: '25545', seriesId: 'S-R1-7', seriesState: 'no-longer-predicted' }),
    ev('R3-4', { tca: '2026-12-02T00:00:00.000Z', pc: 1e-9, tier: 'routine', missKm: 2.5 }),
  ]);
  const ids = (q: Partial<typeof DEFAULT_QUERY>): string[] => applyQuery(rows, { ...DEFAULT_QUERY, ...q }).map((r) => r.event.id);

  it('opens riskiest first; no Pc sorts last either way; TCA breaks ties', () => {
    expect(ids({})).toEqual(['R3-2', 'R3-1', 'R3-4', 'R3-3']);
    expect(ids({ descending: false })).toEqual(['R3-3', 'R3-4', 'R3-1', 'R3-2']);
    expect(ids({ sort: 'tca', descending: false })).toEqual(['R3-4', 'R3-1', 'R3-2', 'R3-3']);
    expect(ids({ sort: 'missKm', descending: false })).toEqual(['R3-2', 'R3-1', 'R3-4', 'R3-3']);
    expect(ids({ sort: 'tier', descending: true })).toEqual(['R3-2', 'R3-1', 'R3-4', 'R3-3']);
  });

  it('filters by tier, object and TCA window, and searches ids, objects and series', () => {
    expect(ids({ tiers: new Set(['plan', 'none'] as const) })).toEqual(['R3-2', 'R3-3']);
    expect(ids({ object: '40001' })).toEqual(['R3-2']);
    expect(ids({ object: '25545' })).toEqual(['R3-3']);
    expect(ids({ fromMs: Date.parse('2026-12-03T00:00:00Z'), toMs: Date.parse('2026-12-04T12:00:00Z'), sort: 'tca', descending: false })).toEqual(['R3-1', 'R3-2']);
    expect(ids({ search: 'no-longer' })).toEqual(['R3-3']);
    expect(ids({ search: 'r3-4' })).toEqual(['R3-4']);
    expect(ids({ search: 'A1234 R3-1' })).toEqual(['R3-1']);
    expect(tierCounts(rows)).toEqual({ plan: 1, monitor: 1, routine: 1, none: 1 });
    expect(ALL_TIERS).toEqual(['plan', 'monitor', 'routine', 'none']);
  });

  it('moves the selection with the keyboard within the list', () => {
    expect(navigate('ArrowDown', 3, 10, 5)).toBe(4);
    expect(navigate('ArrowDown', 9, 10, 5)).toBe(9);
    expect(navigate('ArrowUp', 0, 10, 5)).toBe(0);
    expect(navigate('PageDown', 7, 10, 5)).toBe(9);
    expect(navigate('PageUp', 3, 10, 5)).toBe(0);
    expect(navigate('Home', 6, 10, 5)).toBe(0);
    expect(navigate('End', 0, 10, 5)).toBe(9);
    expect(navigate('x', 0, 10, 5)).toBeNull();
    expect(navigate('ArrowDown', 0, 0, 5)).toBeNull();
  });
});
