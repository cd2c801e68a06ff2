import * as vega from 'vega';
import { compile } from 'vega-lite';
import { KeepclearError } from '../../core/errors.js';
import type { PlotSpec } from '../../core/plots/style.js';
import { installTextMetrics } from './textWidth.js';

/**
 * Renders a Vega-Lite spec (core/plots) to an SVG string in Node with vega's headless View
 * (`renderer: 'none'`): no canvas, no native modules, no browser. The renderer later draws the
 * very same specs interactively.
 */
export async function renderSpecToSvg(spec: PlotSpec): Promise<string> {
  installTextMetrics();
  const warnings: string[] = [];
  const logger = {
    level: () => logger,
    error: (...a: unknown[]) => { warnings.push(a.map(String).join(' ')); return logger; },
    warn: (...a: unknown[]) => { warnings.push(a.map(String).join(' ')); return logger; },
    info: () => logger,
    debug: () => logger,
  };
  const compiled = compile(spec, { logger: logger as never }).spec;
  if (warnings.length) {
    throw new KeepclearError('INTERNAL', `plot spec "${titleOf(spec)}" compiled with warnings: ${warnings.join('; ')}`);
  }
  // vega logs dataflow errors and carries on with a broken scene; collect them and fail instead.
  const view = new vega.View(vega.parse(compiled), { renderer: 'none', logger: logger as never });
  try {
    const svg = await view.toSVG();
    if (warnings.length) throw new KeepclearError('INTERNAL', `plot "${titleOf(spec)}" failed to render: ${warnings.join('; ')}`);
    return withHoverTitles(svg);
  } catch (e) {
    if (e instanceof KeepclearError) throw e;
    throw new KeepclearError('INTERNAL', `plot "${titleOf(spec)}" failed to render: ${warnings.concat(String(e)).join('; ')}`);
  } finally {
    view.finalize();
  }
}

function titleOf(spec: PlotSpec): string {
  const t = (spec as { title?: unknown }).title;
  return typeof t === 'string' ? t : typeof t === 'object' && t && 'text' in t ? String((t as { text: unknown }).text) : '';
}

/**
 * Vega's static SVG carries each mark's description as aria-label (for screen readers) but no
 * <title>, which is what a browser shows on hover. Without scripts in the report, a <title> per
 * data mark is the tooltip: copy the aria-label of each graphics-symbol that is a point.
 */
export function withHoverTitles(svg: string): string {
  return svg.replace(
    /<path (aria-label="([^"]*)" role="graphics-symbol" aria-roledescription="point"[^>]*?)\/>/g,
    (_m, attrs: string, label: string) => `<path ${attrs}><title>${label}</title></path>`,
  );
}
