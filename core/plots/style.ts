import { formatPc, PC_DISPLAY_FLOOR } from '../events/pcText.js';
import type { Config, TopLevelSpec } from 'vega-lite';

/**
 * Why Vega-Lite: one declarative JSON spec per plot, built here from plain inputs, serves both
 * the reports (rendered to SVG in Node by vega's headless View: no canvas, no native modules)
 * and, later, the renderer (the same spec made interactive by vega in the browser). Axes,
 * scales, legends and ticks come from the library, so no plot draws its own axes by hand.
 */
export type PlotSpec = TopLevelSpec;

/** Ink for everything that is not a tier: marks, ellipses, labels. */
export const INK = '#1B1F24';
export const MUTED_INK = '#5A6570';
export const GRID = '#E3E7EB';

/** Fonts present on Debian with Chromium (Liberation, DejaVu) and on most desktops. */
export const PLOT_FONT = '"Liberation Sans", Arial, "DejaVu Sans", Helvetica, sans-serif';

/** Widths in CSS px: the reports scale SVG down to the page, so these only fix proportions. */
export const WIDE_PX = 860;
export const PANEL_HEIGHT_PX = 170;

export const PLOT_CONFIG: Config = {
  font: PLOT_FONT,
  background: 'white',
  padding: 8,
  view: { stroke: '#C9D0D6' },
  axis: {
    labelColor: INK,
    titleColor: INK,
    tickColor: '#8C96A0',
    domainColor: '#8C96A0',
    gridColor: GRID,
    labelFontSize: 11,
    titleFontSize: 12,
    titleFontWeight: 'normal',
    labelFlush: true,
  },
  legend: { labelFontSize: 11, titleFontSize: 11, titleFontWeight: 'bold', labelColor: INK, titleColor: INK },
  title: { fontSize: 14, subtitleFontSize: 11, subtitleColor: MUTED_INK, anchor: 'start', color: INK, fontWeight: 'bold' },
  text: { color: INK, fontSize: 11 },
};

/** Vega-Lite's schema URL; the spec works without fetching it (nothing reads it in Node). */
export const VL_SCHEMA = 'https://vega.github.io/schema/vega-lite/v6.json';

/** Pc shown in log plots from the display floor up; smaller values (and exact zeros) sit on it. */
export const PC_PLOT_FLOOR = PC_DISPLAY_FLOOR;

/** The one Pc formatter (core/events/pcText.ts), re-exported for the plot builders. */
export { formatPc };

/**
 * Breaks a subtitle into lines of at most `maxChars` characters at spaces: Vega draws each title
 * line as given and never wraps, and a long line would widen the whole SVG.
 */
export function wrapLines(lines: readonly string[], maxChars: number): string[] {
  const out: string[] = [];
  for (const line of lines) {
    let cur = '';
    for (const word of line.split(' ')) {
      if (cur && cur.length + 1 + word.length > maxChars) {
        out.push(cur);
        cur = word;
      } else cur = cur ? `${cur} ${word}` : word;
    }
    if (cur) out.push(cur);
  }
  return out;
}
