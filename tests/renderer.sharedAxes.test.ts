// Side-by-side charts share their axes (renderer/src/lib/sharedAxes): the ranges hold every
// finite point of every chart. Hand-computed expectations on small invented traces.
import { describe, expect, it } from 'vitest';
import { sharedRanges } from '../renderer/src/lib/sharedAxes';

describe('sharedRanges', () => {
  it('spans every chart: x from 0 to the highest rate, y with 5 % room each side', () => {
    const r = sharedRanges([
      [{ x: [0, 100], y: [6, 9] }],
      [
        { x: [0, 50, 200], y: [7, 12] },
        { x: [150], y: [null, 'text'] },
      ],
    ])!;
    expect(r.x).toEqual([0, 200]);
    // y from 6 to 12: room 0.05 × 6 = 0.3.
    expect(r.y[0]).toBeCloseTo(5.7, 12);
    expect(r.y[1]).toBeCloseTo(12.3, 12);
  });

  it('gives null when no chart has a finite point', () => {
    expect(sharedRanges([[{ x: [], y: [] }], [{ x: [NaN], y: [Infinity] }]])).toBeNull();
  });
});
