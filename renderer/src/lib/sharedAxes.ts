/**
 * One x range and one y range for charts shown side by side, so the eye compares sites, not
 * axes: a site that stopped at a lower rate or yields less shows it by where its curve sits.
 */

export interface AxisRanges {
  x: [number, number];
  y: [number, number];
}

/**
 * The ranges that hold every point of every chart: x from 0 (rates start at no N) to the
 * highest, y from the lowest to the highest with 5 % room above and below.
 * @param charts - each chart's traces (their x and y arrays; other values are skipped)
 * @returns the shared ranges, or null when no chart has a finite point
 * @example
 * sharedRanges([[{ x: [0, 100], y: [6, 9] }], [{ x: [0, 200], y: [7, 12] }]])
 * // { x: [0, 200], y: [5.7, 12.3] }
 */
export function sharedRanges(
  charts: readonly (readonly { x?: unknown; y?: unknown }[])[],
): AxisRanges | null {
  let x1 = -Infinity;
  let y0 = Infinity;
  let y1 = -Infinity;
  for (const traces of charts) {
    for (const trace of traces) {
      const xs = Array.isArray(trace.x) ? (trace.x as unknown[]) : [];
      const ys = Array.isArray(trace.y) ? (trace.y as unknown[]) : [];
      for (const v of xs) if (typeof v === 'number' && Number.isFinite(v) && v > x1) x1 = v;
      for (const v of ys) {
        if (typeof v !== 'number' || !Number.isFinite(v)) continue;
        if (v < y0) y0 = v;
        if (v > y1) y1 = v;
      }
    }
  }
  if (!(x1 > -Infinity) || !(y1 > -Infinity)) return null;
  const room = 0.05 * Math.max(y1 - y0, Math.abs(y1) * 0.01, 1e-9);
  return { x: [Math.min(0, x1), x1], y: [y0 - room, y1 + room] };
}
