import type { PlotSpec } from '../../../core/plots/style.js';
import { renderSpecToSvg } from '../svg.js';
import { esc } from './format.js';

/**
 * A plot as a figure: the SVG inline, a data-plot name (tests and readers find plots by it) and
 * a caption telling how to read it.
 */
export async function plotFigure(name: string, spec: PlotSpec, caption: string): Promise<string> {
  const svg = await renderSpecToSvg(spec);
  return `<figure class="plot" data-plot="${esc(name)}">${svg}<figcaption>${esc(caption)}</figcaption></figure>`;
}
