/**
 * Event-for-event comparison of two engines' encounters on the same inputs: encounters of the
 * same unordered pair within 1 s are the same approach, then their TCA and miss are compared.
 */
import type { Encounter } from '../../core/events/index.js';

export const pairKey = (e: { primary: string; secondary: string }): string => [e.primary, e.secondary].sort().join('~');

export function compareEngines(a: readonly Encounter[], b: readonly Encounter[]) {
  const unmatched = [...b];
  const missing: Encounter[] = [];
  let worstTca = 0, worstMiss = 0;
  for (const e of a) {
    const j = unmatched.findIndex((x) => pairKey(x) === pairKey(e) && Math.abs(x.tca - e.tca) < 1000);
    if (j < 0) {
      missing.push(e);
      continue;
    }
    const x = unmatched.splice(j, 1)[0]!;
    worstTca = Math.max(worstTca, Math.abs(x.tca - e.tca));
    worstMiss = Math.max(worstMiss, Math.abs(x.missKm - e.missKm));
  }
  return { missing, extra: unmatched, worstTca, worstMiss };
}
