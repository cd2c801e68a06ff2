import { KeepclearError } from '../../core/errors.js';
import type { ElementFileFormat } from '../../core/formats/detect.js';
import type { KeepclearDb } from '../../db/index.js';
import { importCdmFile } from './cdm.js';
import { importOemFile } from './oem.js';
import type { FileOutcome } from './outcome.js';

export type MessageFormat = Extract<ElementFileFormat, 'CDM-KVN' | 'CDM-XML' | 'OEM-KVN' | 'OEM-XML'>;

const MESSAGE_FORMATS: readonly ElementFileFormat[] = ['CDM-KVN', 'CDM-XML', 'OEM-KVN', 'OEM-XML'];
export const isMessageFormat = (f: ElementFileFormat): f is MessageFormat => MESSAGE_FORMATS.includes(f);

/**
 * THE place where CDM and OEM files are routed. Each importer stores its file in one
 * transaction; `hbrM` is the --hbr-m value for the file's objects. Problems of the file itself
 * come back as an outcome; storage failures are thrown (importFile turns them into outcomes).
 */
export function importMessageFile(
  db: KeepclearDb,
  file: string,
  bytes: Uint8Array,
  sha256: string,
  format: MessageFormat,
  hbrM: number | undefined,
): FileOutcome {
  if (format === 'CDM-KVN' || format === 'CDM-XML') {
    try {
      const r = importCdmFile(db, file, bytes, sha256, format, hbrM);
      return { ok: true, file, format, counts: r.counts, rejections: r.rejections, notes: r.repairs };
    } catch (err) {
      if (err instanceof KeepclearError && !err.code.startsWith('DATABASE_')) return { ok: false, file, format, error: err };
      throw err;
    }
  }
  try {
    const r = importOemFile(db, file, bytes, sha256, format, hbrM);
    return { ok: true, file, format, counts: r.counts, rejections: r.rejections, notes: r.notes };
  } catch (err) {
    if (err instanceof KeepclearError && !err.code.startsWith('DATABASE_')) return { ok: false, file, format, error: err };
    throw err;
  }
}
