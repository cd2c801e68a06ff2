import { renderEventReportHtml } from './html/eventReport.js';
import { renderRunReportHtml } from './html/runReport.js';
import type { ReportModel } from './model.js';

/** Any report model to its self-contained HTML. */
export const renderReportHtml = (m: ReportModel): Promise<string> =>
  m.kind === 'run' ? renderRunReportHtml(m) : renderEventReportHtml(m);
