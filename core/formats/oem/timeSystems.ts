/**
 * Message time scales to UTC. TAI − UTC comes from core/time/leapSeconds.ts (IERS Bulletin C);
 * TT = TAI + 32.184 s; GPS time = TAI − 19 s (fixed since the GPS epoch 1980-01-06, when
 * TAI − UTC was 19 s — common practice, IS-GPS-200).
 */
import { instantFromMs, MS_PER_S, type Instant } from '../../time/instant.js';
import { taiMinusUtc, TT_MINUS_TAI_S } from '../../time/leapSeconds.js';
import type { OemTimeSystem } from './keywords.js';
import type { ScaleTime } from './message.js';

/** TAI − GPS time, s. */
export const TAI_MINUS_GPS_S = 19;

/**
 * UTC of a TAI reading. TAI − UTC is a function of UTC, so it is looked up twice: first at the
 * TAI reading itself (off by at most one leap second), then at the UTC that gives.
 */
function taiToUtc(taiMs: number): Instant {
  const guess = taiMs - taiMinusUtc(instantFromMs(taiMs)) * MS_PER_S;
  return instantFromMs(taiMs - taiMinusUtc(instantFromMs(guess)) * MS_PER_S);
}

export function toUtc(t: ScaleTime, scale: OemTimeSystem): Instant {
  switch (scale) {
    case 'UTC':
      return instantFromMs(t);
    case 'TAI':
      return taiToUtc(t);
    case 'TT':
      return taiToUtc(t - TT_MINUS_TAI_S * MS_PER_S);
    case 'GPS':
      return taiToUtc(t + TAI_MINUS_GPS_S * MS_PER_S);
  }
}
