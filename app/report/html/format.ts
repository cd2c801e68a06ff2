import { formatPc } from '../../../core/plots/style.js';
import { TIERS, type TierId } from '../../../core/risk/tiers.js';

export { formatPc };

/** HTML text and attribute escaping. */
export const esc = (s: string): string =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** "2026-12-07T14:52:48.317Z" → "2026-12-07 14:52:48Z" for tables (the full value is in the title). */
export const shortIso = (iso: string): string => iso.replace('T', ' ').replace(/\.\d+Z$/, 'Z');

export const num = (x: number, digits: number): string => (Number.isFinite(x) ? x.toFixed(digits) : '—');

/** A tier as glyph + label on its colour, so it reads without colour too. */
export function tierBadge(tier: TierId | null): string {
  if (tier === null) return '<span class="tier tier-none">— not assessed</span>';
  const t = TIERS[tier];
  return `<span class="tier tier-${t.id}" title="${esc(t.meaning)}"><span class="glyph" aria-hidden="true">${t.glyph}</span> ${esc(t.label)}</span>`;
}

/** One CSS rule per tier, from the palette in core/risk/tiers.ts. */
export const tierCss = (): string =>
  Object.values(TIERS)
    .map((t) => `.tier-${t.id}{background:${t.colour};color:${t.textColour}}`)
    .join('\n');

