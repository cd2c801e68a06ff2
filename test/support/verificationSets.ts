/**
 * The published SGP4 verification element sets (Vallado et al. 2006, AIAA 2006-6753:
 * SGP4-VER.TLE, copied verbatim under test/authorities/sgp4-verification/), read once for every
 * test that uses them.
 */
import { readFileSync } from 'node:fs';
import { parseTle } from '../../core/formats/tle/index.js';
import type { ElementSet } from '../../core/elements/elementSet.js';

export interface VerificationRecord {
  readonly line1: string;
  /** line 2 cut at column 69 */
  readonly line2: string;
  /** the start, stop and step (min) the verification file adds after column 69 of line 2 */
  readonly start: number;
  readonly stop: number;
  readonly step: number;
}

/** Element sets in file order, with their reference start/stop/step. */
export function verificationRecords(): VerificationRecord[] {
  const text = readFileSync(new URL('../authorities/sgp4-verification/SGP4-VER.TLE', import.meta.url), 'utf8');
  const lines = text.split(/\r?\n/).filter((l) => l.trim() !== '' && !l.startsWith('#'));
  const out: VerificationRecord[] = [];
  for (let i = 0; i < lines.length; i += 2) {
    const line1 = lines[i]!, line2 = lines[i + 1]!;
    const [start, stop, step] = line2.slice(69).trim().split(/\s+/).map(Number);
    out.push({ line1, line2: line2.slice(0, 69), start: start!, stop: stop!, step: step! });
  }
  return out;
}

/** The record's reference instants: start to stop by step (min), the stop kept despite rounding (1e-9 min). */
export function referenceTimes(r: VerificationRecord): number[] {
  const times: number[] = [];
  for (let t = r.start; t <= r.stop + 1e-9; t += r.step) times.push(t);
  return times;
}

/**
 * TLE checksum by the format's definition (digits summed, '-' counts 1, modulo 10). Three
 * verification sets (33333, 33334, 33335) carry deliberately wrong line-1 checksums — python-sgp4's
 * tests.py lists them as "Checksum error as expected". Only that digit is repaired, so the
 * parser's checksum check lets them through; no element changes (a no-op for the others).
 */
export function withChecksum(line: string): string {
  let sum = 0;
  for (const c of line.slice(0, 68)) sum += c === '-' ? 1 : /\d/.test(c) ? Number(c) : 0;
  return line.slice(0, 68) + String(sum % 10);
}

/** One record parsed (checksums repaired), or undefined when the parser rejects it. */
export function verificationSet(r: VerificationRecord): ElementSet | undefined {
  return parseTle(`${withChecksum(r.line1)}\n${withChecksum(r.line2)}`, 'SGP4-VER.TLE').sets[0];
}

/** All 33 sets, parsed (checksums repaired), in file order. */
export function verificationSets(): ElementSet[] {
  return parseTle(verificationRecords().map((r) => `${withChecksum(r.line1)}\n${withChecksum(r.line2)}`).join('\n'), 'SGP4-VER.TLE').sets;
}
