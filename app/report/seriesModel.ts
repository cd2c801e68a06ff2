/**
 * The series parts of the reports, from the linking service: an event's series (trend points and
 * its event list) and a run's changes by series.
 */
import { tierOf } from '../../core/bridge/convert.js';
import { SERIES_STATE_MEANING, type SeriesState, type TrendChange } from '../../core/events/index.js';
import { toIso } from '../../core/time/instant.js';
import { getEventExtra, type KeepclearDb } from '../../db/index.js';
import { changesOfRun, seriesView, tryEnsureLinked } from '../series.js';
import type { RunChangeModel, SeriesModel } from './model.js';

/** Our words for the states in reports. */
export const STATE_TEXT: Readonly<Record<SeriesState, string>> = {
  new: 'new',
  updated: 'updated',
  'no-longer-predicted': 'no longer predicted',
  past: 'past',
};

const finite = (x: number | null | undefined): number | null => (typeof x === 'number' && Number.isFinite(x) ? x : null);

export function changeText(c: TrendChange | null): string | null {
  if (!c) return null;
  const sign = c.missChangeKm >= 0 ? '+' : '−';
  const pc = c.pcFactor === null ? 'Pc unknown' : `Pc ×${c.pcFactor >= 100 || c.pcFactor < 0.01 ? c.pcFactor.toExponential(1) : c.pcFactor.toPrecision(2)} (${c.pcDirection})`;
  return `miss ${sign}${Math.abs(c.missChangeKm).toFixed(3)} km (${c.missDirection}), ${pc}, over ${c.elapsedH.toFixed(1)} h`;
}

/** The series model of an event's series; null when the event is not in a series. */
export function seriesModelOfEvent(db: KeepclearDb, eventId: string, seriesId: string | null | undefined): SeriesModel | null {
  if (!seriesId) return null;
  const view = seriesView(db, seriesId);
  if (!view) return null;
  const { stored, series, trend } = view;
  return {
    id: stored.id,
    state: STATE_TEXT[stored.state],
    stateMeaning: `${SERIES_STATE_MEANING[stored.state]}${stored.missedByRun ? ` (run ${stored.missedByRun})` : ''}`,
    points: trend.points.map((p) => ({
      eventId: p.eventId,
      source: p.sourceKind === 'cdm' ? 'cdm' : 'run',
      hoursToTca: p.timeToTcaH,
      missKm: p.missKm,
      pc: finite(p.pc),
      rtnKm: p.rtnKm,
    })),
    events: series.members.map((m, i) => {
      const extra = m.source.kind === 'cdm' ? (getEventExtra(db, m.event.id) ?? {}) : {};
      const msg = typeof extra['messageId'] === 'string' ? `${String(extra['originator'] ?? '')} ${extra['messageId']}`.trim() : null;
      return {
        id: m.event.id,
        source: m.source.kind === 'cdm' ? 'cdm' : 'run',
        sourceText: m.source.kind === 'cdm' ? `message ${msg ?? m.source.id}` : `run ${m.source.id}`,
        dataAt: toIso(m.source.createdAt),
        hoursToTca: trend.points[i]!.timeToTcaH,
        tca: toIso(m.event.tca),
        missKm: m.event.missKm,
        pc: finite(m.event.risk?.pc),
        tier: tierOf(m.event.risk?.tier),
        current: m.event.id === eventId,
      };
    }),
    changeText: changeText(trend.sinceFirst),
  };
}

/** A screening run's changes by series; null for other runs. */
export function runChangesModel(db: KeepclearDb, runId: string): RunChangeModel[] | null {
  tryEnsureLinked(db);
  const changes = changesOfRun(db, runId);
  if (!changes) return null;
  return changes.changes.map((c) => ({
    change: c.change,
    seriesId: c.seriesId,
    primary: c.primary,
    secondary: c.secondary,
    eventId: c.event.id,
    tca: toIso(c.event.tca),
    missKm: c.event.missKm,
    previousMissKm: c.change === 'updated' && c.previous ? c.previous.missKm : null,
    pc: finite(c.event.risk?.pc),
    previousPc: c.change === 'updated' && c.previous ? finite(c.previous.risk?.pc) : null,
    tier: tierOf(c.event.risk?.tier),
    stateNow: c.stateNow ? STATE_TEXT[c.stateNow] : null,
  }));
}
