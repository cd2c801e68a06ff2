/**
 * The terminal summary of a screening (cli/present/events.ts): tier counts, then at most
 * SCREEN_SUMMARY_ROWS events needing attention, highest Pc first, the rest counted and pointed
 * to; --all-events lists every event (an all-vs-all run has 10⁵: the table must not overflow).
 */
import { describe, expect, it } from 'vitest';
import { eventSummary, SCREEN_SUMMARY_ROWS } from '../cli/present/events.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import type { Instant } from '../core/time/instant.js';

const T0 = Date.parse('2026-12-07T00:00:00Z');
function event(n: number, tier: 'monitor' | 'routine', pc: number): ConjunctionEvent {
  return {
    id: `R1-${n}`, runId: 'R1', primary: '100001', secondary: String(200000 + n), tca: (T0 + n * 1000) as Instant,
    missKm: 1, relativeSpeedKmS: 10, rtnKm: [0, 1, 0], approachAngleDeg: 90, entry: null, exit: null,
    primaryState: [7000, 0, 0, 0, 7.5, 0], secondaryState: [7000, 1, 0, 0, 0, 7.5],
    primaryEpoch: T0 as Instant, secondaryEpoch: T0 as Instant,
    risk: { pc, pcMethod: '2d-reference', covarianceSource: 'default / default', hardBodyRadiusM: 10, tier, warnings: [] },
  };
}

describe('screening summary in the terminal', () => {
  const attention = Array.from({ length: SCREEN_SUMMARY_ROWS + 50 }, (_, k) => event(k + 1, 'monitor', 1e-6 * (1 + k)));
  const routine = Array.from({ length: 20 }, (_, k) => event(1000 + k, 'routine', 1e-12));
  const events = [...attention, ...routine];

  it('lists the highest-Pc events needing attention up to the cap and counts the rest', () => {
    const text = eventSummary(events, false, [], undefined, SCREEN_SUMMARY_ROWS);
    expect(text).toContain(`Needing attention (${attention.length}), the ${SCREEN_SUMMARY_ROWS} with the highest Pc:`);
    const listed = text.split('\n').filter((l) => /^R1-\d+ /.test(l));
    expect(listed).toHaveLength(SCREEN_SUMMARY_ROWS);
    // highest Pc first: event 150 has the largest, event 51 is the 100th
    expect(listed[0]!.startsWith(`R1-${attention.length} `)).toBe(true);
    expect(listed.at(-1)!.startsWith(`R1-${attention.length - SCREEN_SUMMARY_ROWS + 1} `)).toBe(true);
    expect(text).toContain('50 more needing attention');
    expect(text).toContain('20 Routine event(s) not listed');
  });

  it('lists every event with --all-events, even 10⁵ of them', () => {
    const many = Array.from({ length: 130_000 }, (_, k) => event(k + 1, 'routine', 1e-12));
    const text = eventSummary(many, true, [], undefined, SCREEN_SUMMARY_ROWS);
    expect(text.split('\n').filter((l) => /^R1-\d+ /.test(l))).toHaveLength(many.length);
  });
});
