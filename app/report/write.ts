import { writeFileSync } from 'node:fs';
import { extname } from 'node:path';
import { KeepclearError } from '../../core/errors.js';
import type { KeepclearDb } from '../../db/index.js';
import { eventReportModelFromDb, runReportModelFromDb, type EventReportOptions } from './fromDb.js';
import { htmlToPdf } from './pdf.js';
import { renderReportHtml } from './render.js';

export type ReportTarget = { readonly run: string } | { readonly event: string };
export type ReportFormat = 'html' | 'pdf';

export interface WrittenReport {
  readonly path: string;
  readonly format: ReportFormat;
  readonly bytes: number;
  /** building the model and rendering the HTML with its plots (ms) */
  readonly htmlMs: number;
  /** printing to PDF through Chromium (ms); 0 for HTML */
  readonly pdfMs: number;
}

/** The format from the output file's extension: .html/.htm or .pdf. */
export function reportFormatOf(path: string): ReportFormat {
  const ext = extname(path).toLowerCase();
  if (ext === '.html' || ext === '.htm') return 'html';
  if (ext === '.pdf') return 'pdf';
  throw new KeepclearError('BAD_ARGUMENT', `--out ${path}: the report's file name must end in .html or .pdf`);
}

/** Builds the report of a run or an event from the database and writes it as HTML or PDF. */
export async function writeReport(db: KeepclearDb, target: ReportTarget, out: string, opts: EventReportOptions = {}): Promise<WrittenReport> {
  const format = reportFormatOf(out);
  const t0 = performance.now();
  const model = 'run' in target ? runReportModelFromDb(db, target.run, opts) : eventReportModelFromDb(db, target.event, opts);
  const html = await renderReportHtml(model);
  const t1 = performance.now();
  const bytes = format === 'pdf' ? await htmlToPdf(html) : Buffer.from(html, 'utf8');
  const t2 = performance.now();
  try {
    writeFileSync(out, bytes);
  } catch (e) {
    throw new KeepclearError('FILE_UNREADABLE', `${out}: cannot write the report (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}) — check that the folder exists and is writable`);
  }
  return { path: out, format, bytes: bytes.length, htmlMs: t1 - t0, pdfMs: format === 'pdf' ? t2 - t1 : 0 };
}
