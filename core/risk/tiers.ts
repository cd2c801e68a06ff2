/**
 * Keepclear's decision tiers. Names and colours are our own. They grade an encounter for
 * attention; they are a decision aid only (see DECISION_AID_NOTE in assess.ts).
 *
 * Default Pc thresholds are common practice: Pc ≥ 1e-4 commonly triggers mitigation planning and
 * Pc ≥ 1e-7 draws attention (NASA Conjunction Assessment Best Practices Handbook,
 * NASA/SP-20205011318, 2020).
 */
export type TierId = 'plan' | 'monitor' | 'routine';

/**
 * Vega's symbol shape names (also plain SVG/CSS-free names): the plots use them directly, and the
 * text of reports and tables uses the matching glyph, so a tier reads without colour.
 */
export type TierShape = 'triangle-up' | 'diamond' | 'circle';

export interface TierInfo {
  readonly id: TierId;
  readonly label: string;
  /** fill colour for reports and the renderer (our palette, see TIER_PALETTE_NOTE) */
  readonly colour: string;
  /** text colour used ON `colour` (badges); reaches 4.5:1 contrast, WCAG 2.1 AA */
  readonly textColour: string;
  /** mark shape in plots */
  readonly shape: TierShape;
  /** the same shape as a character, for text and tables (in DejaVu and Liberation fonts) */
  readonly glyph: string;
  readonly meaning: string;
}

/**
 * Why these colours (our own choice): the tiers must stay apart for the common colour-vision
 * deficiencies and in greyscale print. The earlier plum and cobalt, both dark and bluish, were
 * mistaken for each other at report scale. Now Plan is dark (deep red), Monitor light (amber)
 * and Routine a mid, cool slate, so lightness alone separates them; shapes separate them again.
 * test/risk-tiers.test.ts checks the WCAG 2.1 text contrast and the pairwise CIELAB distances
 * under simulated protanopia, deuteranopia and tritanopia (Machado, Oliveira & Fernandes 2009).
 */
export const TIER_PALETTE_NOTE = 'Plan ▲ deep red, Monitor ◆ amber, Routine ● slate';

export const TIERS: Readonly<Record<TierId, TierInfo>> = {
  plan: {
    id: 'plan',
    label: 'Plan',
    colour: '#A8201A',
    textColour: '#FFFFFF',
    shape: 'triangle-up',
    glyph: '▲',
    meaning: 'prepare a response and consult the screening provider',
  },
  monitor: {
    id: 'monitor',
    label: 'Monitor',
    colour: '#F0B43C',
    textColour: '#1B1F24',
    shape: 'diamond',
    glyph: '◆',
    meaning: 'follow updates of this conjunction',
  },
  routine: {
    id: 'routine',
    label: 'Routine',
    colour: '#7C8B9C',
    textColour: '#1B1F24',
    shape: 'circle',
    glyph: '●',
    meaning: 'no action beyond routine screening',
  },
};

/** Tiers from the most to the least urgent (legends, counts, sorting). */
export const TIER_ORDER: readonly TierId[] = ['plan', 'monitor', 'routine'];

export interface TierThresholds {
  readonly pcPlan: number;
  readonly pcMonitor: number;
  /**
   * Fallback when no Pc could be computed (our choice): a miss distance this small is graded
   * "plan" / "monitor". Without Pc we cannot weigh geometry against uncertainty, so the distances
   * are generous compared with typical uncertainties of public element sets (hundreds of m).
   */
  readonly missPlanKm: number;
  readonly missMonitorKm: number;
}

export const DEFAULT_TIER_THRESHOLDS: TierThresholds = {
  pcPlan: 1e-4,
  pcMonitor: 1e-7,
  missPlanKm: 1,
  missMonitorKm: 5,
};

export function tierFor(pc: number | null, missKm: number, t: TierThresholds = DEFAULT_TIER_THRESHOLDS): TierId {
  if (pc !== null && Number.isFinite(pc)) return pc >= t.pcPlan ? 'plan' : pc >= t.pcMonitor ? 'monitor' : 'routine';
  return missKm <= t.missPlanKm ? 'plan' : missKm <= t.missMonitorKm ? 'monitor' : 'routine';
}
