/**
 * The smallest burn magnitude that meets a target, along one direction: a bracket [unmet, met]
 * narrowed by regula falsi with the Illinois modification (Dowell & Jarratt, BIT 11, 1971),
 * falling back to bisection when the margin is not finite or the bracket stops shrinking. The
 * met end is returned, so the answer always meets the target as evaluated.
 */
export interface Probe {
  readonly s: number;
  readonly margin: number;
}

export function narrowBracket<P extends Probe>(
  evaluate: (s: number) => P,
  unmet: P,
  met: P,
  tolerance: (s: number) => number,
  maxIterations = 60,
): P {
  let lo = unmet, hi = met;
  let loM = lo.margin, hiM = hi.margin;
  let side = 0; // which end the last probe replaced: −1 the met end, +1 the unmet end
  let lastWidth = hi.s - lo.s;
  for (let i = 0; i < maxIterations && hi.s - lo.s > tolerance(hi.s); i++) {
    const w = hi.s - lo.s;
    let s: number;
    const shrinking = w <= 0.5 * lastWidth || i < 2;
    if (Number.isFinite(loM) && Number.isFinite(hiM) && hiM !== loM && shrinking) {
      s = hi.s - (hiM * (hi.s - lo.s)) / (hiM - loM);
      // Probe half a tolerance past the estimated root, away from the nearer end: when the
      // estimate is good, the bracket then shrinks to about one tolerance in two probes.
      const half = 0.5 * tolerance(hi.s);
      s = s - lo.s < hi.s - s ? s + half : s - half;
      // Stay clear of the ends so each step removes a real part of the bracket.
      s = Math.min(hi.s - 0.02 * w, Math.max(lo.s + 0.02 * w, s));
    } else s = 0.5 * (lo.s + hi.s);
    if (i % 2 === 1) lastWidth = w;
    const p = evaluate(s);
    if (p.margin >= 0) {
      hi = p;
      hiM = p.margin;
      if (side === -1) loM *= 0.5;
      side = -1;
    } else {
      lo = p;
      loM = p.margin;
      if (side === 1) hiM *= 0.5;
      side = 1;
    }
  }
  return hi;
}
