import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { KeepclearError } from '../../core/errors.js';

/**
 * The largest input file Keepclear reads: 256 MiB. The readers hold one file in memory (bytes,
 * then text, then records), so the limit bounds memory. It is set by the most verbose real input:
 * OMM XML takes about 1.5 kB per object, so a 100,000-object catalogue is about 155 MB (and was
 * measured at 0.77 GB peak memory to import); 256 MiB leaves room for ~170,000 objects while
 * staying inside the 1.5 GB memory target of DESIGN.md. Larger files are refused before they are
 * read, with a message that says to split them.
 */
export const MAX_INPUT_BYTES = 256 * 1024 * 1024;

const CHUNK_BYTES = 1 << 20;
const mib = (n: number): string => `${(n / (1024 * 1024)).toFixed(n < 10 * 1024 * 1024 ? 1 : 0)} MiB`;

/** Turns a read error into words a user can act on (at line 1: the convention for whole-file problems). */
function readFailure(file: string, err: unknown): KeepclearError {
  const code = (err as NodeJS.ErrnoException).code;
  const why =
    code === 'ENOENT'
      ? 'no such file; check the path'
      : code === 'EACCES' || code === 'EPERM'
        ? 'permission denied; check the file permissions'
        : code === 'EISDIR'
          ? 'it is a directory; name the files inside it'
          : `${(err as Error).message}; check the path`;
  return new KeepclearError('FILE_UNREADABLE', `cannot read: ${why}`, { file, line: 1 });
}

function tooLarge(file: string, size: string, limit: number): KeepclearError {
  return new KeepclearError(
    'INPUT_TOO_LARGE',
    `the file is ${size}, above the ${mib(limit)} limit for one input file (files are read whole into memory; ` +
      `${mib(limit)} holds about 170,000 objects as OMM XML); split it into smaller files (for example by object) ` +
      'and import them together',
    { file, line: 1 },
  );
}

/**
 * Reads a whole input file, never more than `limit` bytes: a regular file larger than that is
 * refused from its size alone, and anything else (a pipe, a device, a file still growing) is
 * read until the limit is passed. Never throws.
 */
export function readInputFile(file: string, limit = MAX_INPUT_BYTES): { bytes: Uint8Array } | { error: KeepclearError } {
  let fd: number;
  try {
    fd = openSync(file, 'r');
  } catch (err) {
    return { error: readFailure(file, err) };
  }
  try {
    const st = fstatSync(fd);
    if (st.isDirectory()) return { error: readFailure(file, Object.assign(new Error('is a directory'), { code: 'EISDIR' })) };
    if (st.isFile() && st.size > limit) return { error: tooLarge(file, mib(st.size), limit) };
    if (st.isFile()) {
      // Known size: one buffer, no copies. A file that grew meanwhile falls through to chunks.
      const whole = Buffer.allocUnsafe(st.size);
      let got = 0;
      while (got < st.size) {
        const n = readSync(fd, whole, got, st.size - got, null);
        if (n === 0) break;
        got += n;
      }
      if (readSync(fd, Buffer.allocUnsafe(1), 0, 1, null) === 0) return { bytes: whole.subarray(0, got) };
      return {
        error: new KeepclearError(
          'FILE_UNREADABLE',
          'the file grew while it was read (is it still being downloaded or written?); import it once it is complete',
          { file, line: 1 },
        ),
      };
    }
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const chunk = Buffer.allocUnsafe(CHUNK_BYTES);
      const n = readSync(fd, chunk, 0, CHUNK_BYTES, null);
      if (n === 0) break;
      total += n;
      if (total > limit) return { error: tooLarge(file, `more than ${mib(limit)}`, limit) };
      chunks.push(n === CHUNK_BYTES ? chunk : chunk.subarray(0, n));
    }
    return { bytes: chunks.length === 1 ? chunks[0]! : Buffer.concat(chunks, total) };
  } catch (err) {
    return { error: readFailure(file, err) };
  } finally {
    closeSync(fd);
  }
}
