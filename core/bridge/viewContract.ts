/**
 * What the renderer's event page and report buttons get over the bridge: the event's numbers
 * with unit and source (the same facts as the event report), its plots as SVG rendered by the
 * host from the reports' Vega-Lite specs, and reports as self-contained HTML.
 */
import { describe, idField, objectWith, type Check } from './checks.js';

/** One quantity: value, unit and where it came from (app/report's FactModel). */
export interface FactView {
  readonly label: string;
  readonly value: string;
  readonly unit: string;
  readonly source: string;
}

/** A plot drawn by the host from a core/plots spec: the SVG text and how to read it. */
export interface PlotView {
  /** "encounter-plane", "rtn", "series-trend" */
  readonly name: string;
  readonly svg: string;
  readonly caption: string;
}

export interface ReceivedMessageView {
  readonly originator: string;
  readonly messageId: string;
  readonly creationDate: string;
  readonly missDistanceM: number;
  readonly reportedPc: number | null;
}

export interface EventView {
  readonly eventId: string;
  readonly facts: readonly FactView[];
  readonly warnings: readonly string[];
  readonly messages: readonly ReceivedMessageView[];
  /** in page order; a plot that cannot be drawn is left out and `notes` says why */
  readonly plots: readonly PlotView[];
  readonly notes: readonly string[];
  /** the event's series, when series are recorded */
  readonly series: { readonly id: string; readonly state: string; readonly sightings: number } | null;
  /** the primary's mass and Isp as stored (a manoeuvre plan needs both); null where not set */
  readonly spacecraft: { readonly objectId: string; readonly massKg: number | null; readonly ispS: number | null };
  /** the decision-aid note */
  readonly caution: string;
}

export type ReportTargetKind = 'event' | 'run';

export interface ReportRequest {
  readonly target: ReportTargetKind;
  readonly id: string;
}

export interface ReportDocument {
  /** a suggested file name ("keepclear-event-R3-1.html") */
  readonly fileName: string;
  readonly mediaType: string;
  readonly text: string;
}

export const reportCheck: Check = (req) => {
  const shape = objectWith(req, ['target', 'id']);
  if (shape) return shape;
  const r = req as Record<string, unknown>;
  if (r['target'] !== 'event' && r['target'] !== 'run') return `"target" must be "event" or "run", got ${describe(r['target'])}`;
  return idField(r, 'id');
};

export type ExportFormat = 'cdm' | 'csv' | 'json';
export const EXPORT_FORMATS: readonly ExportFormat[] = ['cdm', 'csv', 'json'];

export interface ExportRequest {
  readonly eventId: string;
  readonly format: ExportFormat;
}

export const exportCheck: Check = (req) => {
  const shape = objectWith(req, ['eventId', 'format']);
  if (shape) return shape;
  const r = req as Record<string, unknown>;
  if (!(EXPORT_FORMATS as readonly unknown[]).includes(r['format'])) return `"format" must be one of ${EXPORT_FORMATS.join(', ')}, got ${describe(r['format'])}`;
  return idField(r, 'eventId');
};
