/**
 * Axis ticks at "nice" steps (1, 2, 2.5 or 5 × a power of ten) so a reader can
 * interpolate between gridlines: the usual chart-axis rule (common practice).
 */

/** An axis range widened to whole ticks, with the ticks themselves. */
export interface NiceTicks {
  /** Lower end of the axis, a multiple of `step`. */
  min: number;
  /** Upper end of the axis, a multiple of `step`. */
  max: number;
  /** Distance between ticks. */
  step: number;
  /** Tick positions from `min` to `max`. */
  ticks: number[];
  /** Decimals needed to print every tick exactly at this step. */
  decimals: number;
}

const steps = [1, 2, 2.5, 5, 10];

/**
 * Chooses ticks covering [lo, hi] with about `target` intervals.
 * @param lo - smallest value to show, axis units
 * @param hi - largest value to show, axis units
 * @param target - wished number of intervals (default 5)
 * @returns the widened range and its ticks
 * @example
 * niceTicks(3, 187).ticks // [0, 50, 100, 150, 200]
 */
export function niceTicks(lo: number, hi: number, target = 5): NiceTicks {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) {
    lo = 0;
    hi = 1;
  }
  if (lo > hi) [lo, hi] = [hi, lo];
  if (hi - lo < 1e-12 * Math.max(1, Math.abs(hi))) {
    // A flat series still needs an axis around it.
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  const raw = (hi - lo) / Math.max(1, target);
  const power = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = power * (steps.find((s) => s * power >= raw * (1 - 1e-9)) ?? 10);
  const min = Math.floor(lo / step + 1e-9) * step;
  const max = Math.ceil(hi / step - 1e-9) * step;
  const decimals = Math.max(
    0,
    -Math.floor(Math.log10(step) + 1e-9) + (step / power === 2.5 ? 1 : 0),
  );
  const ticks: number[] = [];
  for (let i = 0; min + i * step <= max + step * 1e-9; i++) {
    // Round away the binary noise of repeated addition (0.30000000000000004).
    ticks.push(Number((min + i * step).toFixed(decimals + 2)));
  }
  return { min, max, step, ticks, decimals };
}
