/** One event exported for the renderer to save: CDM (KVN), CSV or JSON — the same as `keepclear export`. */
import type { ExportRequest, ReportDocument } from '../../core/bridge/contract.js';
import { KeepclearError } from '../../core/errors.js';
import type { Instant } from '../../core/time/instant.js';
import { getEvent, type KeepclearDb } from '../../db/index.js';

const safe = (id: string): string => id.replace(/[^A-Za-z0-9-]+/g, '_');

export async function exportEvent(db: KeepclearDb, req: ExportRequest): Promise<ReportDocument> {
  const e = getEvent(db, req.eventId);
  if (!e) throw new KeepclearError('NOT_FOUND', `no event "${req.eventId}"`);
  const x = await import('../export/index.js');
  const base = `keepclear-${safe(e.id)}`;
  switch (req.format) {
    case 'cdm':
      return { fileName: x.cdmFileName(e.id), mediaType: 'text/plain', text: x.cdmTextOfEvent(db, e) };
    case 'csv':
      return { fileName: `${base}.csv`, mediaType: 'text/csv', text: x.eventsCsv([e]) };
    case 'json': {
      const sel = x.selectEvents(db, { event: e.id });
      return { fileName: `${base}.json`, mediaType: 'application/json', text: `${JSON.stringify(x.exportJson(db, sel, Date.now() as Instant), null, 2)}\n` };
    }
  }
}
