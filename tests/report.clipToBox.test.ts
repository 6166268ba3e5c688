// Cutting chart geometry to a panel (shared/report/clipToBox): checked against what clipping
// means, not against the code's own steps — every point kept lies in the box, every point of
// the original inside the box is kept, and a filled shape keeps exactly its area inside the box
// (shoelace formula against the analytic area of two rectangles' overlap, and against counting
// grid points for triangles).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { clipPolygon, clipPolyline, type Box } from '../shared/report/clipToBox';

const box: Box = { x: 10, y: 20, w: 100, h: 50 };
const coord = fc.double({ min: -50, max: 200, noNaN: true });
const polyline = fc.array(fc.tuple(coord, coord), { minLength: 2, maxLength: 12 });

function inBox(x: number, y: number, b: Box, eps = 1e-9): boolean {
  return x >= b.x - eps && x <= b.x + b.w + eps && y >= b.y - eps && y <= b.y + b.h + eps;
}

/** Distance from (px, py) to the segment (ax, ay)–(bx, by). */
function toSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number) {
  const dx = bx - ax;
  const dy = by - ay;
  const len = dx * dx + dy * dy;
  const t = len === 0 ? 0 : Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / len));
  return Math.hypot(px - ax - t * dx, py - ay - t * dy);
}

/** Area by the shoelace formula (Gauss's area formula). */
function area(points: readonly number[]): number {
  let s = 0;
  for (let i = 0; i < points.length; i += 2) {
    const j = (i + 2) % points.length;
    s += points[i] * points[j + 1] - points[j] * points[i + 1];
  }
  return Math.abs(s) / 2;
}

describe('clipPolyline', () => {
  it('keeps a line inside the box as it is, and drops one wholly outside', () => {
    expect(clipPolyline([20, 30, 50, 40, 90, 60], box)).toEqual([[20, 30, 50, 40, 90, 60]]);
    expect(clipPolyline([0, 0, 5, 200], box)).toEqual([]);
  });

  it('cuts a line that leaves and comes back into two runs, each ending on the edge', () => {
    // Up through the top edge (y = 20) at x = 40 and back down through it at x = 60.
    const runs = clipPolyline([30, 30, 50, 10, 70, 30], box);
    expect(runs).toHaveLength(2);
    expect(runs[0][2]).toBeCloseTo(40, 12);
    expect(runs[0][3]).toBeCloseTo(20, 12);
    expect(runs[1][0]).toBeCloseTo(60, 12);
    expect(runs[1][1]).toBeCloseTo(20, 12);
  });

  it('keeps only points in the box, and every point of the line that is in it', () => {
    fc.assert(
      fc.property(polyline, (pts) => {
        const flat = pts.flat();
        const runs = clipPolyline(flat, box);
        for (const run of runs) {
          expect(run.length).toBeGreaterThanOrEqual(4);
          for (let i = 0; i < run.length; i += 2) expect(inBox(run[i], run[i + 1], box)).toBe(true);
        }
        // Points along the original, well inside the box, lie on some kept segment.
        for (let i = 0; i + 3 < flat.length; i += 2) {
          for (let k = 0; k <= 20; k++) {
            const t = k / 20;
            const px = flat[i] + t * (flat[i + 2] - flat[i]);
            const py = flat[i + 1] + t * (flat[i + 3] - flat[i + 1]);
            const inner = { x: box.x + 1e-6, y: box.y + 1e-6, w: box.w - 2e-6, h: box.h - 2e-6 };
            if (!inBox(px, py, inner, 0)) continue;
            let nearest = Infinity;
            for (const run of runs)
              for (let j = 0; j + 3 < run.length; j += 2)
                nearest = Math.min(
                  nearest,
                  toSegment(px, py, run[j], run[j + 1], run[j + 2], run[j + 3]),
                );
            expect(nearest).toBeLessThan(1e-7);
          }
        }
      }),
      { numRuns: 300, seed: 20261203 },
    );
  });
});

describe('clipPolygon', () => {
  it('keeps exactly the overlap of two rectangles (area against the analytic overlap)', () => {
    fc.assert(
      fc.property(coord, coord, coord, coord, (x1, y1, x2, y2) => {
        const [l, r] = [Math.min(x1, x2), Math.max(x1, x2)];
        const [t, b] = [Math.min(y1, y2), Math.max(y1, y2)];
        const kept = clipPolygon([l, t, r, t, r, b, l, b], box);
        const ow = Math.max(0, Math.min(r, box.x + box.w) - Math.max(l, box.x));
        const oh = Math.max(0, Math.min(b, box.y + box.h) - Math.max(t, box.y));
        expect(area(kept)).toBeCloseTo(ow * oh, 6);
        for (let i = 0; i < kept.length; i += 2)
          expect(inBox(kept[i], kept[i + 1], box, 1e-9)).toBe(true);
      }),
      { numRuns: 300, seed: 7 },
    );
  });

  it('keeps a triangle’s area inside the box (against counting grid points)', () => {
    const tri = [0, 60, 80, 0, 120, 90];
    const kept = clipPolygon(tri, box);
    // Count points of a 0.05 grid inside both the triangle and the box (same-side tests).
    const sign = (ax: number, ay: number, bx: number, by: number, px: number, py: number) =>
      (bx - ax) * (py - ay) - (by - ay) * (px - ax);
    let count = 0;
    const step = 0.05;
    for (let x = box.x + step / 2; x < box.x + box.w; x += step) {
      for (let y = box.y + step / 2; y < box.y + box.h; y += step) {
        const s1 = sign(tri[0], tri[1], tri[2], tri[3], x, y);
        const s2 = sign(tri[2], tri[3], tri[4], tri[5], x, y);
        const s3 = sign(tri[4], tri[5], tri[0], tri[1], x, y);
        if ((s1 >= 0 && s2 >= 0 && s3 >= 0) || (s1 <= 0 && s2 <= 0 && s3 <= 0)) count++;
      }
    }
    expect(area(kept)).toBeCloseTo(count * step * step, 0);
  });
});
