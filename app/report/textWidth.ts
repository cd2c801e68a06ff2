import * as vega from 'vega';

/**
 * Text widths for vega's layout in Node. Without a canvas, vega estimates every character as
 * 0.8 em, so titles and legends come out a third too wide and the SVG gets wide empty margins.
 * We measure with the advance widths of Helvetica (Adobe's core-font metrics, in 1/1000 em; from
 * memory), which Arial and Liberation Sans — the first fonts of the plots' font stack — share by
 * design (metric-compatible). test/report-html.test.ts checks these widths against Chromium's
 * canvas measureText in Liberation Sans.
 */
const HELVETICA: Readonly<Record<string, number>> = (() => {
  const w: Record<string, number> = {};
  const set = (chars: string, width: number) => { for (const c of chars) w[c] = width; };
  set(' !,./:;I[\\]ft', 278);
  set('ijl', 222);
  set('"', 355);
  set('#$0123456789?L_abdeghnopqu', 556);
  set('%', 889);
  set('&ABEKPSVXY', 667);
  set("'", 191);
  set('()-`r', 333);
  set('*', 389);
  set('+<=>~', 584);
  set('@', 1015);
  set('CDHNRUw', 722);
  set('FTZ', 611);
  set('GOQ', 778);
  set('J', 500);
  set('M', 833);
  set('W', 944);
  set('^', 469);
  set('cksvxyz', 500);
  set('m', 833);
  set('{}', 334);
  set('|', 260);
  // Characters outside Helvetica's Latin set that the plots use (from the fallback fonts; approximate).
  set('×−', 584);
  set('σẑx̂ŷ', 556);
  set('→', 1000);
  set('▲◆●', 800);
  set('·', 278);
  set('—', 1000);
  set('–', 556);
  return w;
})();

/** Combining marks (the hat of x̂) take no width. */
const COMBINING = /[\u0300-\u036f]/;
/** Bold Helvetica is about this much wider on average (its AFM widths; from memory). */
const BOLD_FACTOR = 1.06;

export function helveticaWidthPx(text: string, fontSizePx: number, bold = false): number {
  let units = 0;
  for (const c of text) units += COMBINING.test(c) ? 0 : HELVETICA[c] ?? 556;
  return (units / 1000) * fontSizePx * (bold ? BOLD_FACTOR : 1);
}

interface TextItem { text?: unknown; fontSize?: number; fontWeight?: string | number }

let installed = false;

/** Makes vega measure text with the widths above (once per process; Node only). */
export function installTextMetrics(): void {
  if (installed) return;
  installed = true;
  const metrics = (vega as unknown as { textMetrics: { width: (item: TextItem, text?: unknown) => number } }).textMetrics;
  metrics.width = (item, text) => {
    const t = text ?? item.text;
    const lines = Array.isArray(t) ? t.map(String) : [t == null ? '' : String(t)];
    const size = item.fontSize != null ? +item.fontSize || 0 : 11;
    const bold = item.fontWeight === 'bold' || (typeof item.fontWeight === 'number' && item.fontWeight >= 600);
    return Math.max(0, ...lines.map((l) => helveticaWidthPx(l, size, bold)));
  };
}
