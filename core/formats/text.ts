/**
 * Bytes → text for every element-file reader. Binary input (a zip, a database file, a PDF
 * picked by mistake) is refused here with one clear message instead of a cascade of field
 * errors further down.
 */
import { KeepclearError } from '../errors.js';

const decoder = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false });

/** 1-based line of a byte offset, for pointing at the first bad byte. */
function lineOfByte(bytes: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset && i < bytes.length; i++) if (bytes[i] === 10) line++;
  return line;
}

export function decodeText(bytes: Uint8Array, file: string): { text: string } | { error: KeepclearError } {
  const nul = bytes.indexOf(0);
  if (nul >= 0)
    return {
      error: new KeepclearError(
        'NOT_TEXT',
        `the file is binary, not text (a NUL byte at byte offset ${nul}): element files are ` +
          'plain text (TLE, OMM, OEM, CDM); check that the right file was chosen, or unpack it first',
        { file, line: lineOfByte(bytes, nul) },
      ),
    };
  let text: string;
  try {
    // The decoder strips a UTF-8 byte order mark (ignoreBOM: false means "consume it").
    text = decoder.decode(bytes);
  } catch {
    const bad = firstInvalidUtf8(bytes);
    return {
      error: new KeepclearError(
        'NOT_TEXT',
        `the file is not UTF-8 text (invalid byte 0x${(bytes[bad] ?? 0).toString(16).padStart(2, '0')} ` +
          `at byte offset ${bad}): save it as UTF-8 or ASCII text, or check that the right file was chosen`,
        { file, line: lineOfByte(bytes, bad) },
      ),
    };
  }
  text = text.replace(/\r\n?/g, '\n');
  if (text.trim() === '')
    return {
      error: new KeepclearError(
        'FILE_EMPTY',
        'the file is empty (no text besides blanks): nothing to import; check the download or export that produced it',
        { file, line: 1 },
      ),
    };
  return { text };
}

/** Offset of the first byte that breaks UTF-8, found only after the fast decoder failed. */
function firstInvalidUtf8(b: Uint8Array): number {
  let i = 0;
  while (i < b.length) {
    const c = b[i] ?? 0;
    const n = c < 0x80 ? 0 : c >= 0xc2 && c <= 0xdf ? 1 : c >= 0xe0 && c <= 0xef ? 2 : c >= 0xf0 && c <= 0xf4 ? 3 : -1;
    if (n < 0) return i;
    for (let k = 1; k <= n; k++) if (((b[i + k] ?? 0) & 0xc0) !== 0x80) return i;
    // Overlongs and surrogates pass the shape test above; the decoder catches them.
    if (n > 0) {
      try {
        decoder.decode(b.subarray(i, i + n + 1));
      } catch {
        return i;
      }
    }
    i += n + 1;
  }
  return Math.max(0, b.length - 1);
}
