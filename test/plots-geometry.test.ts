/**
 * The geometry behind the plots: covariance ellipses from the 2×2 eigen-decomposition and the
 * label placement of the week plot.
 */
import { describe, expect, it } from 'vitest';
import { circlePolyline, ellipseHalfExtents, ellipsePolyline, principalAxes } from '../core/plots/ellipse.js';
import { placeLabels } from '../core/plots/labelPlacement.js';

/** Double-precision rounding over a handful of operations on values near 1e4 m² (m). */
const TOL_M = 1e-9;

describe('principal axes of a 2×2 covariance', () => {
  it('diagonal: σ are the square roots of the diagonal, major axis along the larger', () => {
    expect(principalAxes([[16, 0], [0, 9]])).toEqual({ sigmaMajorM: 4, sigmaMinorM: 3, angleRad: 0 });
    const p = principalAxes([[9, 0], [0, 16]]);
    expect(p.sigmaMajorM).toBe(4);
    expect(Math.abs(Math.abs(p.angleRad) - Math.PI / 2)).toBeLessThan(1e-15);
  });

  it('[[2, 1], [1, 2]] has eigenvalues 3 and 1 with the major axis at 45° (textbook example)', () => {
    const p = principalAxes([[2, 1], [1, 2]]);
    expect(p.sigmaMajorM).toBeCloseTo(Math.sqrt(3), 14);
    expect(p.sigmaMinorM).toBeCloseTo(1, 14);
    expect(p.angleRad).toBeCloseTo(Math.PI / 4, 14);
  });

  it('refuses a matrix that is not positive semi-definite, and non-finite entries', () => {
    expect(() => principalAxes([[1, 2], [2, 1]])).toThrow(/not positive semi-definite/);
    expect(() => principalAxes([[Number.NaN, 0], [0, 1]])).toThrow(/non-finite/);
  });
});

describe('k-σ contour', () => {
  const cov = [[250_000, -60_000], [-60_000, 40_000]] as const;
  const inv = (() => {
    const det = cov[0][0] * cov[1][1] - cov[0][1] * cov[1][0];
    return [[cov[1][1] / det, -cov[0][1] / det], [-cov[1][0] / det, cov[0][0] / det]];
  })();

  it('every sample satisfies (p − c)ᵀ C⁻¹ (p − c) = k² (the contour\'s definition, inverse computed here)', () => {
    const c = [120, -30] as const;
    for (const k of [1, 2, 3]) {
      for (const [x, y] of ellipsePolyline(c, cov, k, 60)) {
        const dx = x - c[0], dy = y - c[1];
        const q = dx * (inv[0]![0]! * dx + inv[0]![1]! * dy) + dy * (inv[1]![0]! * dx + inv[1]![1]! * dy);
        expect(q).toBeCloseTo(k * k, 9);
      }
    }
  });

  it('is closed, and its bounding box matches k·√Cxx, k·√Cyy within the sampling error', () => {
    const pts = ellipsePolyline([0, 0], cov, 2, 2000);
    expect(pts[0]).toEqual(pts[pts.length - 1]);
    const [hx, hy] = ellipseHalfExtents(cov, 2);
    const xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
    // sagitta of 2000 samples: 1 − cos(π/2000) ≈ 1.2e-6 of the radius (≤ 1.2 mm here)
    expect(Math.abs(Math.max(...xs) - hx)).toBeLessThan(hx * 2e-6);
    expect(Math.abs(Math.max(...ys) - hy)).toBeLessThan(hy * 2e-6);
  });

  it('a circle has the given radius at every sample', () => {
    for (const [x, y] of circlePolyline([5, 5], 20, 36)) expect(Math.abs(Math.hypot(x - 5, y - 5) - 20)).toBeLessThan(TOL_M);
  });
});

describe('label placement', () => {
  const box = (l: { x: number; y: number; align: string; text: string }) => {
    const w = l.text.length * 6.6;
    return l.align === 'left' ? { x0: l.x, x1: l.x + w, y0: l.y - 6.5, y1: l.y + 6.5 } : { x0: l.x - w, x1: l.x, y0: l.y - 6.5, y1: l.y + 6.5 };
  };
  it('labels of crowded marks do not overlap each other or the marks', () => {
    const marks = [
      { px: 100, py: 100 },
      { px: 112, py: 102 },
      { px: 124, py: 98 },
      { px: 300, py: 50 },
    ];
    const placed = placeLabels(marks.map((m, i) => ({ text: `R1-${i + 10}`, ...m })), { widthPx: 400, heightPx: 200, marks });
    expect(placed).toHaveLength(4);
    const boxes = placed.map(box);
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i]!, b = boxes[j]!;
        expect(a.x1 <= b.x0 || b.x1 <= a.x0 || a.y1 <= b.y0 || b.y1 <= a.y0, `labels ${i} and ${j} overlap`).toBe(true);
      }
      for (const m of marks) {
        const a = boxes[i]!;
        const clear = a.x1 <= m.px - 5 || m.px + 5 <= a.x0 || a.y1 <= m.py - 5 || m.py + 5 <= a.y0;
        expect(clear, `label ${i} covers a mark`).toBe(true);
      }
    }
  });
  it('a label at the right edge goes to the left of its mark', () => {
    const [l] = placeLabels([{ text: 'R1-99', px: 395, py: 100 }], { widthPx: 400, heightPx: 200, marks: [] });
    expect(l!.align).toBe('right');
  });
});
