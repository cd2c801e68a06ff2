/**
 * Reading vega's SVG output through a DOM (linkedom), for the report tests: axes, their tick
 * labels with pixel positions, and mark paths as point lists.
 */
import { parseHTML } from 'linkedom';

// linkedom's DOM types are its own; the tests need only a few members.
export interface Node {
  getAttribute(name: string): string | null;
  querySelectorAll(sel: string): ArrayLike<Node>;
  querySelector(sel: string): Node | null;
  textContent: string | null;
  parentNode: Node | null;
}

export const parseDoc = (html: string): { document: Node } => parseHTML(html) as unknown as { document: Node };

export const all = (n: Node, sel: string): Node[] => Array.from(n.querySelectorAll(sel));

export interface Axis {
  readonly label: string;
  readonly title: string;
  /** tick labels as text with their pixel offset along the axis */
  readonly ticks: { text: string; at: number }[];
}

const translate = (t: string | null): [number, number] => {
  const m = /translate\(([-\d.e]+),\s*([-\d.e]+)\)/.exec(t ?? '');
  return m ? [Number(m[1]), Number(m[2])] : [Number.NaN, Number.NaN];
};

/** The axes vega drew (aria-label "X-axis titled …" / "Y-axis titled …"). */
export function axesOf(svg: Node): Axis[] {
  return all(svg, 'g.role-axis[aria-label]').map((g) => {
    const label = g.getAttribute('aria-label') ?? '';
    const isX = label.startsWith('X-axis');
    return {
      label,
      title: all(g, 'g.role-axis-title text').map((t) => t.textContent ?? '').join(' '),
      ticks: all(g, 'g.role-axis-label text')
        .filter((t) => t.getAttribute('opacity') !== '0')
        .map((t) => {
          const [x, y] = translate(t.getAttribute('transform'));
          return { text: t.textContent ?? '', at: isX ? x : y };
        }),
    };
  });
}

/** Points of an SVG path made of M/L commands (vega's line marks). */
export function pathPoints(d: string): [number, number][] {
  const nums = (d.match(/-?\d+(?:\.\d+)?(?:e-?\d+)?/g) ?? []).map(Number);
  const pts: [number, number][] = [];
  for (let i = 0; i + 1 < nums.length; i += 2) pts.push([nums[i]!, nums[i + 1]!]);
  return pts;
}

export function extentPx(pts: readonly [number, number][]): { width: number; height: number } {
  const xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
  return { width: Math.max(...xs) - Math.min(...xs), height: Math.max(...ys) - Math.min(...ys) };
}

/** Pixels per data unit along an axis, from two of its numeric tick labels ("1,000" → 1000). */
export function pxPerUnit(axis: Axis): number {
  const ticks = axis.ticks.map((t) => ({ v: Number(t.text.replace(/,/g, '').replace('−', '-')), at: t.at })).filter((t) => Number.isFinite(t.v));
  const a = ticks[0]!, b = ticks[ticks.length - 1]!;
  return Math.abs((b.at - a.at) / (b.v - a.v));
}
