/** Reports for the renderer to save: the same self-contained HTML as `keepclear report`. */
import type { ReportDocument, ReportRequest } from '../../core/bridge/contract.js';
import type { KeepclearDb } from '../../db/index.js';

/** Report ids become part of a file name: keep letters, digits and dashes. */
const safe = (id: string): string => id.replace(/[^A-Za-z0-9-]+/g, '_');

export async function makeReport(db: KeepclearDb, req: ReportRequest): Promise<ReportDocument> {
  const r = await import('../report/index.js');
  const text =
    req.target === 'event'
      ? await r.renderEventReportHtml(r.eventReportModelFromDb(db, req.id))
      : await r.renderRunReportHtml(r.runReportModelFromDb(db, req.id));
  return { fileName: `keepclear-${req.target}-${safe(req.id)}.html`, mediaType: 'text/html', text };
}
