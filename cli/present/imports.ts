import { rejectionLine } from '../../core/errors.js';
import type { FileOutcome, ImportSummary } from '../../app/import/index.js';
import type { ImportCounts } from '../../db/index.js';

const countsText = (c: ImportCounts): string =>
  `imported ${c.imported}, updated ${c.updated}, unchanged ${c.unchanged}, rejected ${c.rejected}`;

/** A reader's note already starts with FILE:LINE (its convention): "FILE:LINE: note: what". */
function noteLine(file: string, note: string): string {
  const m = note.startsWith(`${file}:`) ? /^(\d+): ([\s\S]*)$/.exec(note.slice(file.length + 1)) : null;
  return m ? `${file}:${m[1]}: note: ${m[2]}` : `${file}: note: ${note}`;
}

/**
 * One file's outcome for the terminal: problems on stderr as `keepclear: FILE:LINE: what is
 * wrong`, the counts on `out` (stdout, or stderr when stdout carries JSON).
 */
export function presentFileOutcome(o: FileOutcome, out: NodeJS.WritableStream): void {
  if (!o.ok) {
    process.stderr.write(`keepclear: ${o.error.toLine()}\n`);
    return;
  }
  for (const n of o.notes) process.stderr.write(`keepclear: ${noteLine(o.file, n)}\n`);
  for (const r of o.rejections) process.stderr.write(`keepclear: ${rejectionLine(r)}\n`);
  out.write(`${o.file} (${o.format}): ${countsText(o.counts)}\n`);
}

export function presentImportTotal(s: ImportSummary, out: NodeJS.WritableStream): void {
  const n = s.outcomes.length;
  const failed = s.notImported > 0 ? `, ${s.notImported} not imported` : '';
  out.write(`total: ${countsText(s.total)} (${n} file${n === 1 ? '' : 's'}${failed})\n`);
}
