// The weighted sample quantile (shared/stats/quantile weightedSortedQuantile): with equal weights
// it is definition 7 of Hyndman & Fan (1996), R's default quantile(type = 7); the values below
// are R 4.2's quantile(c(2, 3, 5, 7, 11, 13), p) (computed by hand from the definition too:
// h = 5p + 1, e.g. p = 0.05 → h = 1.25 → 2 + 0.25·1 = 2.25).
import { describe, expect, it } from 'vitest';
import { sortedQuantile, weightedSortedQuantile } from '../shared/stats/quantile';

const x = [2, 3, 5, 7, 11, 13];

describe('weightedSortedQuantile', () => {
  it('with equal weights is definition 7 (R quantile type 7)', () => {
    const r: [number, number][] = [
      [0, 2],
      [0.05, 2.25],
      [0.5, 6],
      [0.95, 12.5],
      [1, 13],
    ];
    for (const [p, q] of r) {
      expect(weightedSortedQuantile(x, Array(6).fill(0.3), p)).toBeCloseTo(q, 12);
      expect(sortedQuantile(x, p)).toBeCloseTo(q, 12);
    }
  });

  it('skips values of zero weight and moves toward heavy values', () => {
    expect(weightedSortedQuantile(x, [0, 1, 1, 1, 1, 0], 0)).toBe(3);
    expect(weightedSortedQuantile(x, [0, 1, 1, 1, 1, 0], 1)).toBe(11);
    // Positions (S_i − w_i/2 − w_first/2)/(S − w_first/2 − w_last/2) for weights 1, 2, 1 on
    // 3, 5, 7: 0, 1/2, 1.
    expect(weightedSortedQuantile([3, 5, 7], [1, 2, 1], 0.25)).toBeCloseTo(4, 12);
    expect(weightedSortedQuantile([3, 5, 7], [1, 2, 1], 0.75)).toBeCloseTo(6, 12);
    const light = weightedSortedQuantile(x, [1, 1, 1, 1, 1, 1], 0.5);
    const heavyTop = weightedSortedQuantile(x, [1, 1, 1, 1, 1, 10], 0.5);
    expect(heavyTop).toBeGreaterThan(light);
  });

  it('rejects p outside [0, 1] and all-zero weights', () => {
    expect(() => weightedSortedQuantile(x, Array(6).fill(1), 1.5)).toThrow(/between 0 and 1/);
    expect(() => weightedSortedQuantile(x, Array(6).fill(0), 0.5)).toThrow(/no weight/);
  });
});
