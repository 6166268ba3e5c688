// The regional rate's between-site risk: the share of sites at which a rate returns less than
// the site's own best by more than the tolerance. Checked against a direct count written here
// from the sites' gain curves (each curve evaluated at every grid rate and candidate rate, no
// prepared tables), on a hand-made region whose answer is worked in the comments and on a
// seeded simulated region analyzed end to end.
import { describe, expect, it } from 'vitest';
import { priceTrial } from '../shared/analysis/priceTrial';
import { regionalAtPrices } from '../shared/analysis/regionalAnalysis';
import { regionalCurves } from '../shared/analysis/regionalCurves';
import { prepareRegionalReturn, type SiteGainCurve } from '../shared/analysis/regionalReturn';
import { rateGrid } from '../shared/analysis/rateGrid';
import { CORN_PRICES as prices, simulatedAnalysis } from './analysis.simulated';

const { grainPricePerKg: pg, nutrientPricePerKg: pn } = prices;

/** The count done directly: each site's best over the grid, then short or not at each rate. */
function directShares(
  curves: SiteGainCurve[],
  grid: Float64Array,
  rates: number[],
  tolerance: number,
): number[] {
  const value = (c: SiteGainCurve, x: number) => pg * c.gainKgHa(x) - pn * x;
  return rates.map(
    (x) =>
      curves.filter(
        (c) => Math.max(...Array.from(grid, (g) => value(c, g))) - value(c, x) > tolerance,
      ).length / curves.length,
  );
}

describe('regionalShortfallRisk', () => {
  it('on a hand-made region of a responding, a flat and a full-response site', () => {
    // At PR = 1.2461/0.17716 ≈ 7.034 kg grain per kg N (the illustrative corn prices):
    // A: 40x − 0.1x², best on the grid at 165 (x* ≈ 164.8): 0.17716·3 877.5 − 1.2461·165 ≈ 481.3;
    //    at 0, 50, 100, 150, 200 it returns 0, 247.7, 406.9, 477.4, 459.4 (short by 481, 234,
    //    74.5, 3.9, 21.9);
    // B: flat, best at 0; any rate x is short by 1.2461·x: beyond 60 from 48.2 kg/ha on;
    // C: the whole 1 500 kg/ha from 50 on, best at 50: 265.7 − 62.3 ≈ 203.4; short at 0 by
    //    203.4, at 100 by 62.3, at 150 by 124.6, at 200 by 186.9.
    // With a tolerance of 60 per ha the sites short are: 0: A, C; 50: A, B; 100: A, B, C;
    // 150: B, C; 200: B, C.
    const curves: SiteGainCurve[] = [
      { site: 'A', gainKgHa: (x) => 40 * x - 0.1 * x * x },
      { site: 'B', gainKgHa: () => 0 },
      { site: 'C', gainKgHa: (x) => (x >= 50 ? 1500 : 0) },
    ];
    const grid = rateGrid(0, 200, 1);
    const tested = Float64Array.of(0, 50, 100, 150, 200);
    const r = regionalAtPrices(
      {
        prepared: prepareRegionalReturn(curves, grid),
        atTestedRates: prepareRegionalReturn(curves, tested),
      },
      prices,
      60,
    );
    const risk = r.shortfallRisk!;
    expect(risk.count).toBe(3);
    const rates = risk.rows.map((x) => x.rateKgHa);
    expect(rates).toContain(r.regional.bestRateKgHa);
    expect(rates.filter((x) => x !== r.regional.bestRateKgHa)).toEqual([0, 50, 100, 150, 200]);
    const shares = risk.rows.map((x) => x.share);
    expect(shares).toEqual(directShares(curves, grid, rates, 60));
    const at = (x: number) => shares[rates.indexOf(x)];
    expect([at(0), at(50), at(100), at(150), at(200)]).toEqual([2 / 3, 2 / 3, 1, 2 / 3, 2 / 3]);
  });

  it('agrees with the direct count on a simulated region analyzed end to end', () => {
    const analysis = simulatedAnalysis(
      [
        'quadratic-plateau',
        'linear-plateau',
        'exponential',
        'flat',
        'full-response',
        'exponential',
      ],
      61,
    );
    const priced = priceTrial(analysis, prices, {});
    const region = priced.across.regional;
    const risk = region.shortfallRisk!;
    const { used } = regionalCurves(analysis.across.sites, 'best', {});
    const rates = risk.rows.map((x) => x.rateKgHa);
    const tolerance = priced.shortfallTolerance.perHa;
    expect(tolerance).toBeCloseTo(10 * pn, 12);
    expect(risk.rows.map((x) => x.share)).toEqual(
      directShares(used, region.regional.gridKgHa, rates, tolerance),
    );
    expect(rates).toEqual(
      [0, 40, 80, 120, region.regional.bestRateKgHa, 160, 200].sort((a, b) => a - b),
    );
    // A user's tolerance replaces the default.
    const mine = priceTrial(analysis, prices, {}, { shortfallTolerancePerHa: 100 });
    expect(mine.shortfallTolerance).toEqual({ perHa: 100, isDefault: false });
    expect(mine.across.regional.shortfallRisk!.rows.map((x) => x.share)).toEqual(
      directShares(used, region.regional.gridKgHa, rates, 100),
    );
  });
});
