import { KeepclearError } from '../core/errors.js';

const ALPHA5 = 'ABCDEFGHJKLMNPQRSTUVWXYZ'; // I and O are not used

/**
 * Canonical object id from what a user types: a catalogue number with or without leading
 * zeros ("00005" → "5") or an Alpha-5 number ("A0001" → "100001").
 */
export function canonicalObjectId(text: string): string {
  const t = text.trim().toUpperCase();
  if (/^\d+$/.test(t)) return String(Number(t));
  const m = /^([A-Z])(\d{4})$/.exec(t);
  if (m) {
    const k = ALPHA5.indexOf(m[1]!);
    if (k >= 0) return String((k + 10) * 10000 + Number(m[2]));
  }
  if (t === '') throw new KeepclearError('BAD_ARGUMENT', 'empty object id');
  return text.trim();
}
