/**
 * What an OEM's OBJECT_ID names, for matching to a catalogue object (DESIGN.md "Owner
 * ephemerides"): a catalogue number (Alpha-5 allowed) or an international designator.
 * 502.0-B-2 recommends the designator form YYYY-NNNP{PP}; owners also write catalogue numbers.
 * The Alpha-5 and TLE-designator decoding is the TLE reader's own (tle-fields.ts), so the
 * catalogue ids come out exactly as element sets store them.
 */
import { decodeCatalogNumber, designatorToOmm } from '../tle/fields.js';

export type OemObjectRef =
  /** Canonical decimal catalogue number, as ElementSet.objectId ("5", "100001" for "A0001"). */
  | { readonly kind: 'catalogue'; readonly catalogueNumber: string }
  /** International designator in the OMM/OEM form "2026-100A". */
  | { readonly kind: 'designator'; readonly designator: string }
  | { readonly kind: 'unrecognised'; readonly text: string };

const DESIGNATOR_RE = /^\d{4}-\d{3}[A-Z]{1,3}$/;

export function classifyObjectId(text: string): OemObjectRef {
  const t = text.trim().toUpperCase();
  if (/^\d{1,9}$/.test(t)) return { kind: 'catalogue', catalogueNumber: String(Number(t)) };
  if (/^[A-Z]\d{4}$/.test(t)) {
    const n = decodeCatalogNumber(t);
    if (n !== null) return { kind: 'catalogue', catalogueNumber: String(n) };
  }
  if (DESIGNATOR_RE.test(t)) return { kind: 'designator', designator: t };
  // The TLE's 8-column form ("26100A"), written by some tools into OBJECT_ID.
  if (/^\d{5}[A-Z]{1,3}$/.test(t)) {
    const d = designatorToOmm(t);
    if (d) return { kind: 'designator', designator: d };
  }
  return { kind: 'unrecognised', text: text.trim() };
}
