/**
 * Greedy placement of a few text labels next to their marks so that labels neither overlap each
 * other nor sit on other marks. Vega-Lite has no label-collision option, and the plots that label
 * marks know their scales (fixed domains), so the spec builder places labels in pixels itself.
 */

export interface LabelRequest {
  readonly text: string;
  /** the labelled mark's centre (px from the plot's top-left) */
  readonly px: number;
  readonly py: number;
}

export interface PlacedLabel {
  readonly text: string;
  /** text anchor (px): the left end for align 'left', the right end for 'right'; vertically the middle */
  readonly x: number;
  readonly y: number;
  readonly align: 'left' | 'right';
}

export interface PlacementArea {
  readonly widthPx: number;
  readonly heightPx: number;
  /** other marks' centres (px) that labels should not cover */
  readonly marks: readonly { readonly px: number; readonly py: number }[];
  /** radius kept clear around each mark (px) */
  readonly markRadiusPx?: number;
  /** width of one character (px) at the label's font size; an estimate (no font metrics in Node) */
  readonly charPx?: number;
  readonly lineHeightPx?: number;
}

interface Box { x0: number; x1: number; y0: number; y1: number }

/** Offsets tried in order: right, left, then above and below on either side. */
const CANDIDATES: readonly { dx: number; dy: number; align: 'left' | 'right' }[] = [
  { dx: 9, dy: 0, align: 'left' },
  { dx: -9, dy: 0, align: 'right' },
  { dx: 6, dy: -12, align: 'left' },
  { dx: 6, dy: 12, align: 'left' },
  { dx: -6, dy: -12, align: 'right' },
  { dx: -6, dy: 12, align: 'right' },
  { dx: 9, dy: -22, align: 'left' },
  { dx: 9, dy: 22, align: 'left' },
  { dx: -9, dy: -22, align: 'right' },
  { dx: -9, dy: 22, align: 'right' },
];

const overlap = (a: Box, b: Box): number =>
  Math.max(0, Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0)) * Math.max(0, Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0));

/** Places labels in the given order (most important first); a label that fits nowhere takes its least crowded place. */
export function placeLabels(requests: readonly LabelRequest[], area: PlacementArea): PlacedLabel[] {
  const r = area.markRadiusPx ?? 5;
  const charPx = area.charPx ?? 6.6;
  const h = area.lineHeightPx ?? 13;
  const obstacles: Box[] = area.marks.map((m) => ({ x0: m.px - r, x1: m.px + r, y0: m.py - r, y1: m.py + r }));
  const placed: PlacedLabel[] = [];
  for (const q of requests) {
    const w = q.text.length * charPx;
    let best: { box: Box; label: PlacedLabel; cost: number } | null = null;
    for (const c of CANDIDATES) {
      const x = q.px + c.dx, y = q.py + c.dy;
      const box: Box = c.align === 'left' ? { x0: x, x1: x + w, y0: y - h / 2, y1: y + h / 2 } : { x0: x - w, x1: x, y0: y - h / 2, y1: y + h / 2 };
      const outside = Math.max(0, -box.x0) + Math.max(0, box.x1 - area.widthPx) + Math.max(0, -box.y0) + Math.max(0, box.y1 - area.heightPx);
      const cost = obstacles.reduce((s, o) => s + overlap(box, o), 0) + outside * h * 10;
      if (!best || cost < best.cost) best = { box, label: { text: q.text, x, y, align: c.align }, cost };
      if (cost === 0) break;
    }
    placed.push(best!.label);
    obstacles.push(best!.box);
  }
  return placed;
}
