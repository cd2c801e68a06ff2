import { TIER_ORDER, TIERS, type TierId } from '../risk/tiers.js';
import { MUTED_INK } from './style.js';

/** Label of an event that has no risk assessment yet (shown apart from the tiers). */
export const NOT_ASSESSED = 'Not assessed';

export const tierLabel = (t: TierId | null): string => (t === null ? NOT_ASSESSED : TIERS[t].label);

/** Drawing order: routine first, so the urgent marks sit on top. */
export const tierRank = (t: TierId | null): number => (t === null ? -1 : TIER_ORDER.length - 1 - TIER_ORDER.indexOf(t));

/**
 * Colour and shape scales keyed by tier label, in urgency order. "Not assessed" joins only when
 * present, so a normal legend shows exactly the three tiers.
 */
export function tierScales(withUnassessed: boolean): {
  domain: string[];
  colours: string[];
  shapes: string[];
  sizes: number[];
} {
  const tiers = TIER_ORDER.map((id) => TIERS[id]);
  const domain = tiers.map((t) => t.label);
  const colours = tiers.map((t) => t.colour);
  const shapes: string[] = tiers.map((t) => t.shape);
  // Area in px²: urgent marks larger, so they read first even in a crowd of routine ones.
  const sizes = [150, 95, 40];
  if (withUnassessed) {
    domain.push(NOT_ASSESSED);
    colours.push(MUTED_INK);
    shapes.push('cross');
    sizes.push(50);
  }
  return { domain, colours, shapes, sizes };
}
