/**
 * `keepclear export`: stored events as CDM (KVN, one message per event), CSV or JSON. Returns
 * what it wrote; the CLI presents it. Files are written whole (to a temporary name, then renamed)
 * so an interrupted export never leaves half a message under the final name.
 */
import { existsSync, mkdirSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { KeepclearError } from '../../core/errors.js';
import { DECISION_AID_NOTE } from '../../core/risk/assess.js';
import type { Instant } from '../../core/time/instant.js';
import { toIso } from '../../core/time/instant.js';
import { getEventExtra, runEphemerides, type KeepclearDb } from '../../db/index.js';
import { eventToJson, runToJson } from '../eventJson.js';
import { seriesToJson } from '../seriesJson.js';
import { cdmTextOfEvent, type CdmExportOptions } from './cdm.js';
import { eventsCsv } from './table.js';
import { selectEvents, type ExportSelection, type ExportTarget } from './target.js';

export { cdmOfEvent, cdmTextOfEvent, cdmMessageId, CDM_ORIGINATOR } from './cdm.js';
export { eventsCsv, CSV_COLUMNS } from './table.js';
export { selectEvents, type ExportTarget, type ExportSelection } from './target.js';

export const EXPORT_FORMATS = ['cdm', 'csv', 'json'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

/** File name of one event's message inside an export folder. */
export const cdmFileName = (eventId: string): string => `${eventId}.cdm`;

export interface ExportOutcome {
  readonly format: ExportFormat;
  readonly kind: ExportSelection['kind'];
  readonly id: string;
  readonly events: number;
  /** every file written, in event order */
  readonly files: readonly string[];
  /** the folder the messages went into (CDM of a run or series) */
  readonly folder: string | null;
}

function writeWhole(path: string, text: string): void {
  const tmp = `${path}.partial-${process.pid}`;
  try {
    writeFileSync(tmp, text);
    renameSync(tmp, path);
  } catch (e) {
    throw new KeepclearError(
      'FILE_UNREADABLE',
      `${path}: cannot write the export (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}) — check that the folder exists and is writable`,
    );
  }
}

const isDirectory = (p: string): boolean => existsSync(p) && statSync(p).isDirectory();

/** The JSON document of an export: the events with their extras, and the run they belong to. */
export function exportJson(db: KeepclearDb, sel: ExportSelection, now: Instant): Record<string, unknown> {
  if (sel.series) {
    // The same document as `events --series ID --json`, with the export's own facts.
    return {
      caution: DECISION_AID_NOTE,
      export: { kind: sel.kind, id: sel.id, createdAt: toIso(now), events: sel.events.length },
      ...seriesToJson(db, sel.series),
    };
  }
  return {
    caution: DECISION_AID_NOTE,
    export: { kind: sel.kind, id: sel.id, createdAt: toIso(now), events: sel.events.length },
    run: sel.run ? runToJson(sel.run, sel.run.flagged, runEphemerides(db, sel.run.id)) : null,
    events: sel.events.map((e) => Object.assign(eventToJson(e), { extra: getEventExtra(db, e.id) ?? {} })),
  };
}

/**
 * Writes the export. CDM: one message per event — a CDM describes one conjunction
 * (508.0-B-1 §1), and providers and tools take one message per file — so a run or series goes
 * into the folder `out` (created if missing) as EVENT.cdm files, and a single event goes to the
 * file `out` (or into `out` when that is a folder). CSV and JSON: one file `out`.
 */
export function exportEvents(
  db: KeepclearDb,
  target: ExportTarget,
  format: ExportFormat,
  out: string,
  opts: CdmExportOptions = {},
): ExportOutcome {
  const now = opts.now ?? (Date.now() as Instant);
  const sel = selectEvents(db, target);
  const base = { format, kind: sel.kind, id: sel.id, events: sel.events.length };
  if (format === 'csv') {
    writeWhole(out, eventsCsv(sel.events));
    return { ...base, files: [out], folder: null };
  }
  if (format === 'json') {
    writeWhole(out, `${JSON.stringify(exportJson(db, sel, now), null, 2)}\n`);
    return { ...base, files: [out], folder: null };
  }
  const one = sel.kind === 'event' && !isDirectory(out);
  if (!one) {
    if (existsSync(out) && !isDirectory(out))
      throw new KeepclearError('BAD_ARGUMENT', `--out ${out} is a file; a CDM export of a ${sel.kind} writes one message per event into a folder — give a folder name`);
    try {
      mkdirSync(out, { recursive: true });
    } catch (e) {
      throw new KeepclearError('FILE_UNREADABLE', `${out}: cannot create the export folder (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
  }
  const files: string[] = [];
  for (const e of sel.events) {
    const path = one ? out : join(out, cdmFileName(e.id));
    writeWhole(path, cdmTextOfEvent(db, e, { ...opts, now }));
    files.push(path);
  }
  return { ...base, files, folder: one ? null : out };
}
