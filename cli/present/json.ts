import { writeFileSync } from 'node:fs';
import { DECISION_AID_NOTE } from '../../core/risk/assess.js';

/**
 * Writes a JSON document that carries Pc or tiers, with the decision-aid note as its top-level
 * `caution` (DESIGN.md), to a file or to stdout for "-" (and nothing else goes to stdout then).
 */
export function writeJsonWithCaution(target: string, doc: Record<string, unknown>): void {
  const text = `${JSON.stringify({ caution: DECISION_AID_NOTE, ...doc }, null, 2)}\n`;
  if (target === '-') process.stdout.write(text);
  else writeFileSync(target, text);
}
