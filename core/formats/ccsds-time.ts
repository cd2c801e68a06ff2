/**
 * CCSDS time strings (CCSDS 502.0-B-2 §7.5.10): calendar "YYYY-MM-DDThh:mm:ss[.d…]" and
 * day-of-year "YYYY-DDDThh:mm:ss[.d…]" (the OMM example of 502.0-B-2 uses the latter),
 * optionally with "Z". Calendar forms go through parseIso so there is one ISO reader.
 */
import { MS_PER_DAY, parseIso, type Instant } from '../time/instant.js';

const DOY_RE = /^(\d{4})-(\d{3})(?:T(\d{2}):(\d{2}):(\d{2})(\.\d+)?)?Z?$/;

export function parseCcsdsEpoch(text: string): Instant | null {
  const t = text.trim();
  const m = DOY_RE.exec(t);
  if (!m) return parseIso(t);
  const [, y, d, h = '0', mi = '0', s = '0', frac] = m;
  const year = Number(y), doy = Number(d);
  const days = (Date.UTC(year + 1, 0, 1) - Date.UTC(year, 0, 1)) / MS_PER_DAY;
  if (doy < 1 || doy > days || Number(h) > 23 || Number(mi) > 59 || Number(s) > 60) return null;
  let ms = Date.UTC(year, 0, doy, Number(h), Number(mi), Number(s));
  if (frac) ms += Number(frac) * 1000;
  return ms as Instant;
}

/**
 * "YYYY-MM-DDThh:mm:ss.ffffff" (UTC, no zone, as public OMM providers write it). Microseconds
 * keep a TLE-derived epoch (1e-8 day resolution) to within 0.5 µs; toIso's milliseconds would not.
 */
export function formatCcsdsEpoch(t: Instant): string {
  let whole = Math.floor(t);
  let micro = Math.round((t - whole) * 1000);
  if (micro === 1000) {
    whole += 1;
    micro = 0;
  }
  const iso = new Date(whole).toISOString(); // YYYY-MM-DDThh:mm:ss.mmmZ
  return `${iso.slice(0, 23)}${String(micro).padStart(3, '0')}`;
}
