/**
 * Reports: view models (model.ts) filled from the database (fromDb.ts), rendered to
 * self-contained HTML with inline SVG plots (html/, svg.ts) and printed to PDF (pdf.ts).
 */
export type {
  RunReportModel,
  EventReportModel,
  ReportModel,
  EventRowModel,
  RunHeaderModel,
  FactModel,
  MessageModel,
  SeriesModel,
  PlanModel,
  FlaggedModel,
  CatalogueNote,
} from './model.js';
export {
  runReportModelFromDb,
  eventReportModelFromDb,
  SYNTHETIC_CATALOGUE_KEY,
  type ReportOptions,
  type EventReportOptions,
} from './fromDb.js';
export { renderRunReportHtml, needingAttention } from './html/runReport.js';
export { renderEventReportHtml } from './html/eventReport.js';
export { renderReportHtml } from './render.js';
export { renderSpecToSvg } from './svg.js';
export { htmlToPdf, launchChromium, chromiumMissing, chromiumPath, CHROMIUM_ARGS } from './pdf.js';
export { writeReport, reportFormatOf, type ReportTarget, type ReportFormat, type WrittenReport } from './write.js';
