// The weighted sample quantile (shared/stats/quantile weightedSortedQuantile): the inverse of
// the weighted distribution function. With equal weights it is definition 1 of Hyndman & Fan
// (1996), R's quantile(type = 1); the values below are R 4.2.2's
// quantile(c(2, 3, 5, 7, 11, 13), c(0, .05, .5, .51, .95, 1), type = 1): 2, 2, 5, 7, 13, 13.
import { describe, expect, it } from 'vitest';
import { weightedSortedQuantile } from '../shared/stats/quantile';

const x = [2, 3, 5, 7, 11, 13];

describe('weightedSortedQuantile', () => {
  it('with equal weights is definition 1 (R quantile type 1)', () => {
    const r: [number, number][] = [
      [0, 2],
      [0.05, 2],
      [0.5, 5],
      [0.51, 7],
      [0.95, 13],
      [1, 13],
    ];
    for (const [p, q] of r) expect(weightedSortedQuantile(x, Array(6).fill(0.3), p)).toBe(q);
  });

  it('skips values of zero weight and follows the weights', () => {
    expect(weightedSortedQuantile(x, [0, 1, 1, 1, 1, 0], 0)).toBe(3);
    expect(weightedSortedQuantile(x, [0, 1, 1, 1, 1, 0], 1)).toBe(11);
    // Cumulative weights 1, 3, 4 of 4 on 3, 5, 7: a quarter reaches 3, a half and three
    // quarters reach 5, anything more reaches 7.
    expect(weightedSortedQuantile([3, 5, 7], [1, 2, 1], 0.25)).toBe(3);
    expect(weightedSortedQuantile([3, 5, 7], [1, 2, 1], 0.75)).toBe(5);
    expect(weightedSortedQuantile([3, 5, 7], [1, 2, 1], 0.76)).toBe(7);
  });

  it('never rises when values fall, whatever their weights (the interval never rises with the price ratio)', () => {
    // Two values of unequal weight swap places as one falls past the other.
    const w = [3, 1];
    let before = Infinity;
    for (let a = 10; a >= 0; a -= 0.5) {
      const pair = [
        [a, w[0]],
        [5, w[1]],
      ].sort((u, v) => u[0] - v[0]);
      const q = weightedSortedQuantile(
        pair.map((u) => u[0]),
        pair.map((u) => u[1]),
        0.6,
      );
      expect(q).toBeLessThanOrEqual(before);
      before = q;
    }
  });

  it('rejects p outside [0, 1] and all-zero weights', () => {
    expect(() => weightedSortedQuantile(x, Array(6).fill(1), 1.5)).toThrow(/between 0 and 1/);
    expect(() => weightedSortedQuantile(x, Array(6).fill(0), 0.5)).toThrow(/no weight/);
  });
});
