// The price-ratio check (shared/economics/priceRatioCheck) against the slips it is for. The
// yardstick is the crop's illustrative ratio; the slips are arithmetic on it, so each factor is
// known exactly: a price read 100 times too high ("0,62" taken as 62), one per tonne typed as
// per kilogram (1,000 times).
import { describe, expect, it } from 'vitest';
import { illustrativePrices } from '../shared/economics/illustrativePrices';
import { checkPriceRatio, PRICE_RATIO_FACTOR_LIMIT } from '../shared/economics/priceRatioCheck';

const corn = illustrativePrices('corn').canonical;

describe('checkPriceRatio', () => {
  it('finds the illustrative prices plausible for every crop, at factor 1', () => {
    for (const crop of ['corn', 'wheat', 'soybean', 'barley'] as const) {
      const c = checkPriceRatio(illustrativePrices(crop).canonical, crop);
      expect(c.factor).toBeCloseTo(1, 12);
      expect(c.plausible).toBe(true);
    }
  });

  it.each([
    ['nitrogen read 100 times too dear ("0,62" as 62)', 100, 1, false],
    ['grain priced per tonne typed as per kilogram', 1, 1000, false],
    ['nitrogen twice as dear, grain a third cheaper (a real market swing)', 2, 2 / 3, true],
    ['at the limit', PRICE_RATIO_FACTOR_LIMIT, 1, true],
  ])('%s', (_label, nitrogenTimes, grainTimes, plausible) => {
    const c = checkPriceRatio(
      {
        grainPricePerKg: corn.grainPricePerKg * grainTimes,
        nutrientPricePerKg: corn.nutrientPricePerKg * nitrogenTimes,
      },
      'corn',
    );
    expect(c.factor).toBeCloseTo(nitrogenTimes / grainTimes, 9);
    expect(c.plausible).toBe(plausible);
  });
});
