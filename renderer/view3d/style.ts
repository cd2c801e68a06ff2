/**
 * Colours and marker shapes of the 3-D view. Tiers keep their colour and shape from
 * core/risk/tiers.ts (the same the plots use through core/plots/tierScales.ts); everything else
 * is our own choice for a dark background, where the catalogue's points and thin lines read best.
 */
import { CanvasTexture, type Texture } from 'three';
import { TIERS, type TierId, type TierShape } from '../../core/risk/tiers.js';

export const SPACE_BACKGROUND = '#0E1419';
export const RTN_BACKGROUND = '#141B21';
/** the drawn Earth: a muted sea blue with lighter graticule lines */
export const EARTH_COLOUR = '#2B4A63';
export const GRATICULE_COLOUR = '#6F93AF';
export const EQUATOR_COLOUR = '#A9C4D8';
/** our fleet (the primary): a light teal, apart from every tier colour */
export const PRIMARY_COLOUR = '#4FC3C9';
/** the catalogue: light grey points, dim so the two objects stand out */
export const CATALOGUE_COLOUR = '#AEB8C2';
/** an event without a risk assessment: light version of the plots' MUTED_INK for a dark ground */
export const UNASSESSED_COLOUR = '#9AA5B0';
export const HARD_BODY_COLOUR = '#F2EEE4';
export const COMBINED_COLOUR = '#E8E4DA';
export const LABEL_INK = '#E6EAEE';
/** axis colours: radial, transverse, normal */
export const AXIS_COLOURS = { R: '#D9826B', T: '#8FC27A', N: '#7DA7E0' } as const;

export const tierColour = (tier: TierId | null): string => (tier ? TIERS[tier].colour : UNASSESSED_COLOUR);
export const tierShape = (tier: TierId | null): TierShape | 'cross' => (tier ? TIERS[tier].shape : 'cross');
export const tierGlyph = (tier: TierId | null): string => (tier ? TIERS[tier].glyph : '✕');
export const tierLabel = (tier: TierId | null): string => (tier ? TIERS[tier].label : 'Not assessed');

/**
 * A marker sprite drawn at run time (no image files): the tier's shape in white with a dark rim,
 * tinted by the material colour, so a marker reads by shape as well as colour.
 */
export function markerTexture(shape: TierShape | 'cross'): Texture {
  const size = 64;
  const c = document.createElement('canvas');
  c.width = c.height = size;
  const g = c.getContext('2d')!;
  g.fillStyle = '#FFFFFF';
  g.strokeStyle = '#000000';
  g.lineWidth = 5;
  g.beginPath();
  const m = 8, s = size - 2 * m;
  if (shape === 'triangle-up') {
    g.moveTo(size / 2, m);
    g.lineTo(size - m, size - m);
    g.lineTo(m, size - m);
    g.closePath();
  } else if (shape === 'diamond') {
    g.moveTo(size / 2, m);
    g.lineTo(size - m, size / 2);
    g.lineTo(size / 2, size - m);
    g.lineTo(m, size / 2);
    g.closePath();
  } else if (shape === 'circle') {
    g.arc(size / 2, size / 2, s / 2, 0, 2 * Math.PI);
  } else {
    const w = s / 5;
    g.moveTo(m, m + w); g.lineTo(m + w, m); g.lineTo(size / 2, size / 2 - w); g.lineTo(size - m - w, m); g.lineTo(size - m, m + w);
    g.lineTo(size / 2 + w, size / 2); g.lineTo(size - m, size - m - w); g.lineTo(size - m - w, size - m); g.lineTo(size / 2, size / 2 + w);
    g.lineTo(m + w, size - m); g.lineTo(m, size - m - w); g.lineTo(size / 2 - w, size / 2);
    g.closePath();
  }
  g.fill();
  g.stroke();
  return new CanvasTexture(c);
}

/** Distances for labels: m below 1 km, km above, three significant figures. */
export function formatDistanceM(m: number): string {
  const a = Math.abs(m);
  if (a < 1000) return `${a >= 100 ? m.toFixed(0) : a >= 10 ? m.toFixed(1) : m.toFixed(2)} m`;
  const km = m / 1000;
  return `${Math.abs(km) >= 100 ? km.toFixed(0) : Math.abs(km) >= 10 ? km.toFixed(1) : km.toFixed(2)} km`;
}

/** "TCA", "TCA − 01:05", "TCA + 00:30.5" for a scrubber time in s. */
export function formatFromTca(s: number): string {
  if (Math.abs(s) < 0.05) return 'TCA';
  const a = Math.abs(s);
  const mm = Math.floor(a / 60);
  const ss = a - 60 * mm;
  const sec = Number.isInteger(Math.round(ss * 10) / 10) ? ss.toFixed(0) : ss.toFixed(1);
  return `TCA ${s < 0 ? '−' : '+'} ${String(mm).padStart(2, '0')}:${sec.padStart(sec.includes('.') ? 4 : 2, '0')}`;
}

/** Small DOM helper: an element with inline styles set through the CSSOM (allowed by the CSP). */
export function el<K extends keyof HTMLElementTagNameMap>(tag: K, style: Partial<CSSStyleDeclaration> = {}, text?: string): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  Object.assign(e.style, style);
  if (text !== undefined) e.textContent = text;
  return e;
}
