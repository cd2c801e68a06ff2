/**
 * Tier colours and shapes (issue 7, item 6): readable without colour, text on tier colours at
 * WCAG 2.1 AA contrast, and colours that stay apart for the common colour-vision deficiencies.
 */
import { describe, expect, it } from 'vitest';
import { TIER_ORDER, TIERS } from '../core/risk/tiers.js';

/**
 * WCAG 2.1, "relative luminance" and "contrast ratio" (W3C Recommendation, 2018, section
 * Definitions; https://www.w3.org/TR/WCAG21/#dfn-relative-luminance): linearise each sRGB
 * channel (c ≤ 0.03928 ? c/12.92 : ((c+0.055)/1.055)^2.4), L = 0.2126 R + 0.7152 G + 0.0722 B,
 * ratio = (L1 + 0.05) / (L2 + 0.05) with L1 the lighter. Written here from the definition, not
 * taken from the code under test.
 */
const channels = (hex: string): [number, number, number] => {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new Error(`not a #rrggbb colour: ${hex}`);
  return [m[1]!, m[2]!, m[3]!].map((h) => parseInt(h, 16) / 255) as [number, number, number];
};
const linear = (c: number): number => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
const luminanceOfLinear = ([r, g, b]: readonly number[]): number => 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
const luminance = (hex: string): number => luminanceOfLinear(channels(hex).map(linear));
const contrastRatio = (a: string, b: string): number => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
};

/** WCAG 2.1 success criterion 1.4.3 (Contrast, Minimum), level AA, normal text. */
const AA_TEXT = 4.5;

/**
 * Colour-vision deficiency simulation: Machado, Oliveira & Fernandes, "A Physiologically-based
 * Model for Simulation of Color Vision Deficiency", IEEE TVCG 15(6) 2009, severity 1.0 matrices,
 * applied to linear sRGB (values from memory; they are the ones browsers' developer tools use).
 */
const MACHADO: Record<string, number[][]> = {
  protanopia: [[0.152286, 1.052583, -0.204868], [0.114503, 0.786281, 0.099216], [-0.003882, -0.048116, 1.051998]],
  deuteranopia: [[0.367322, 0.860646, -0.227968], [0.280085, 0.672501, 0.047413], [-0.01182, 0.04294, 0.968881]],
  tritanopia: [[1.255528, -0.076749, -0.178779], [-0.078411, 0.930809, 0.147602], [0.004733, 0.691367, 0.3039]],
};

/** CIE 1976 L*a*b* of linear sRGB (D65 white; sRGB→XYZ matrix of IEC 61966-2-1). */
function lab(rgb: readonly number[]): [number, number, number] {
  const [r, g, b] = rgb.map((c) => Math.min(1, Math.max(0, c))) as [number, number, number];
  const x = (0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047;
  const y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
  const z = (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}
const simulate = (hex: string, m: number[][] | null): number[] => {
  const l = channels(hex).map(linear);
  return m ? m.map((row) => row[0]! * l[0]! + row[1]! * l[1]! + row[2]! * l[2]!) : l;
};
const deltaE76 = (a: readonly number[], b: readonly number[]): number => Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!);

/**
 * Smallest CIE76 colour difference between two tiers, with or without simulated deficiency (our
 * choice: ΔE ≈ 2.3 is a just-noticeable difference (Sharma, Digital Color Imaging Handbook, 2003;
 * from memory), and 20 keeps small plot marks apart at a glance).
 */
const MIN_DELTA_E = 20;
/** Lightness gap (L*) between Plan and Monitor, so they stay apart in greyscale print too (our choice). */
const MIN_PLAN_MONITOR_DL = 25;

describe('WCAG 2.1 contrast formula (checked on published values)', () => {
  it('black on white is 21:1 and a colour on itself 1:1 (WCAG 2.1: ratios range from 1 to 21)', () => {
    expect(contrastRatio('#000000', '#FFFFFF')).toBeCloseTo(21, 10);
    expect(contrastRatio('#777777', '#777777')).toBe(1);
  });
  it('#767676 on white is 4.54:1, the commonly quoted lightest grey passing AA (common practice; from memory)', () => {
    expect(contrastRatio('#767676', '#FFFFFF')).toBeCloseTo(4.54, 2);
  });
});

describe('tier palette', () => {
  it('text on every tier colour reaches 4.5:1 (WCAG 2.1 AA)', () => {
    for (const t of Object.values(TIERS)) {
      const ratio = contrastRatio(t.colour, t.textColour);
      expect(ratio, `${t.label}: ${t.textColour} on ${t.colour}`).toBeGreaterThanOrEqual(AA_TEXT);
    }
  });

  it('tiers have three different shapes and glyphs, so they read without colour', () => {
    const all = Object.values(TIERS);
    expect(new Set(all.map((t) => t.shape)).size).toBe(all.length);
    expect(new Set(all.map((t) => t.glyph)).size).toBe(all.length);
    expect(new Set(all.map((t) => t.colour.toUpperCase())).size).toBe(all.length);
    expect(TIER_ORDER).toEqual(['plan', 'monitor', 'routine']);
  });

  it('colours stay apart in normal vision and simulated protanopia, deuteranopia, tritanopia', () => {
    for (const [name, m] of [['normal', null], ...Object.entries(MACHADO)] as [string, number[][] | null][]) {
      for (let i = 0; i < TIER_ORDER.length; i++)
        for (let j = i + 1; j < TIER_ORDER.length; j++) {
          const a = TIERS[TIER_ORDER[i]!], b = TIERS[TIER_ORDER[j]!];
          const d = deltaE76(lab(simulate(a.colour, m)), lab(simulate(b.colour, m)));
          expect(d, `${name}: ${a.label} vs ${b.label}`).toBeGreaterThanOrEqual(MIN_DELTA_E);
        }
    }
  });

  it('Plan and Monitor differ in lightness (they were mistaken for each other)', () => {
    const l = (hex: string) => lab(simulate(hex, null))[0];
    expect(Math.abs(l(TIERS.plan.colour) - l(TIERS.monitor.colour))).toBeGreaterThanOrEqual(MIN_PLAN_MONITOR_DL);
  });

  it('the old plum and cobalt fail the same test, so it can tell a bad palette', () => {
    const d = deltaE76(lab(simulate('#8e3b8e', MACHADO.deuteranopia!)), lab(simulate('#2f72b8', MACHADO.deuteranopia!)));
    const dl = Math.abs(lab(simulate('#8e3b8e', null))[0] - lab(simulate('#2f72b8', null))[0]);
    expect(d < MIN_DELTA_E || dl < MIN_PLAN_MONITOR_DL).toBe(true);
  });
});
