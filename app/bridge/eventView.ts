/**
 * The event page's content: the event report's facts (every number with unit and source), its
 * warnings and received messages, and its plots as SVG drawn here, in the host, from the very
 * specs the reports use (core/plots → app/report/svg.ts).
 *
 * Why SVG from the host and not vega in the page: the renderer's CSP forbids `unsafe-eval`, and
 * vega's default expression compiler needs it; the host already renders these specs for the
 * reports (with text measured for the fonts and hover titles), so the page shows exactly what
 * the report shows, and the renderer bundle stays free of vega (~1 MB).
 */
import type { EventView, PlotView } from '../../core/bridge/contract.js';
import type { PlotSpec } from '../../core/plots/style.js';
import { getEvent, getSpacecraft, type KeepclearDb } from '../../db/index.js';

export async function eventView(db: KeepclearDb, eventId: string): Promise<EventView> {
  // Plotting and report modules load on first use, so `serve` and the desktop app start quickly.
  const { eventReportModelFromDb, renderSpecToSvg } = await import('../report/index.js');
  const { encounterPlaneSpec, rtnSingleSpec, seriesTrendSpec } = await import('../../core/plots/index.js');
  const { seriesView } = await import('../series.js');
  const m = eventReportModelFromDb(db, eventId);
  const seriesId = getEvent(db, eventId)?.seriesId ?? null;
  const sv = seriesId ? seriesView(db, seriesId) : null;
  const notes: string[] = [];
  const wanted: { name: string; caption: string; spec: () => PlotSpec }[] = [];
  if (m.plane) {
    const plane = m.plane;
    wanted.push({
      name: 'encounter-plane',
      caption: "Encounter plane to scale: the Pc is the share of the secondary's uncertainty (ellipses) that falls on the grey hard-body disk.",
      spec: () => encounterPlaneSpec(plane),
    });
  } else {
    notes.push(m.planeNote ?? 'No encounter plane for this event.');
  }
  wanted.push({
    name: 'rtn',
    caption: "R radial, T in-track, N cross-track, in the primary's frame at TCA.",
    spec: () => rtnSingleSpec({ eventId: m.event.id, rtnKm: m.event.rtnKm }),
  });
  if (sv && sv.trend.points.length > 0) {
    const points = sv.trend.points.map((p) => ({
      eventId: p.eventId,
      source: p.sourceKind === 'cdm' ? ('cdm' as const) : ('run' as const),
      hoursToTca: p.timeToTcaH,
      missKm: p.missKm,
      pc: p.pc,
      rtnKm: p.rtnKm,
    }));
    wanted.push({
      name: 'series-trend',
      caption: 'Each point is one sighting of the series, placed at the time its data was created.',
      spec: () => seriesTrendSpec({ seriesId: sv.stored.id, points, pcPlan: m.thresholds.pcPlan, pcMonitor: m.thresholds.pcMonitor }),
    });
  }
  const plots: PlotView[] = [];
  for (const w of wanted) {
    try {
      plots.push({ name: w.name, caption: w.caption, svg: await renderSpecToSvg(w.spec()) });
    } catch (err) {
      notes.push(`The ${w.name} plot could not be drawn: ${err instanceof Error ? err.message : String(err)}`);
    }
  }
  return {
    eventId: m.event.id,
    facts: m.facts.map((f) => ({ label: f.label, value: f.value, unit: f.unit, source: f.source })),
    warnings: [...m.warnings],
    messages: m.messages.map((c) => ({
      originator: c.originator,
      messageId: c.messageId,
      creationDate: c.creationDate,
      missDistanceM: c.missDistanceM,
      reportedPc: c.reportedPc,
    })),
    plots,
    notes,
    series: sv ? { id: sv.stored.id, state: sv.stored.state, sightings: sv.stored.sightings } : null,
    spacecraft: spacecraftOf(db, m.event.primary),
    caution: m.caution,
  };
}

function spacecraftOf(db: KeepclearDb, objectId: string): EventView['spacecraft'] {
  const sc = getSpacecraft(db, objectId);
  return { objectId, massKg: sc?.massKg ?? null, ispS: sc?.ispS ?? null };
}
