// The regional-return arithmetic (maximum return to N, Sawyer et al., 2006):
// a small example worked by hand, property tests, and the closed-form quadratic
// optimum x* = (PR − b)/(2c) for one site (shared/DESIGN.md, "Economic optimum").
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  prepareRegionalReturn,
  profitableRangeAtPrices,
  regionalReturnAtPrices,
  type SiteGainCurve,
} from '../shared/analysis/regionalReturn';
import { rateGrid } from '../shared/analysis/rateGrid';
import { regionalRecommendation } from '../shared/analysis/regionalRecommendation';
import { recommendationCautions } from '../shared/economics/recommendationCautions';
import { SitesInputError } from '../shared/analysis/sitesInputError';
import { defaultShortfallTolerancePerHa } from '../shared/economics/shortfallRule';
import { StatsInputError } from '../shared/stats/errors';

/** A gain curve through the points (x, gain), straight between them. */
function tabulated(site: string, xs: number[], gains: number[]): SiteGainCurve {
  return {
    site,
    gainKgHa: (x) => {
      const i = Math.min(
        Math.max(
          xs.findIndex((v) => v >= x),
          1,
        ),
        xs.length - 1,
      );
      const t = (x - xs[i - 1]) / (xs[i] - xs[i - 1]);
      return gains[i - 1] + t * (gains[i] - gains[i - 1]);
    },
  };
}

describe('regionalReturnAtPrices on a two-site example worked by hand', () => {
  // Invented numbers. Grid 0, 50, 100, 150 kg N/ha; grain 0.20 per kg, N 1.00 per kg (PR 5).
  //   gain A (kg/ha): 0, 1000, 1600, 1800   → return 0.2·gain − 1·x: 0, 150, 220, 210
  //   gain B (kg/ha): 0,  600, 1000, 1100   → return:                0,  70, 100,  70
  //   mean return:                                                    0, 110, 160, 140
  // Best mean return 160 at 100 kg/ha; mean gain there (1600 + 1000)/2 = 1300 kg/ha.
  // Band 25 per ha: rates with mean ≥ 135 are 100 and 150 → profitable range 100–150.
  // Site optima: A at 100 (220), B at 100 (100). Quartiles of [100, 100] are all 100.
  const xs = [0, 50, 100, 150];
  const curves = [
    tabulated('A', xs, [0, 1000, 1600, 1800]),
    tabulated('B', xs, [0, 600, 1000, 1100]),
  ];
  const prepared = prepareRegionalReturn(curves, rateGrid(0, 150, 50));
  const r = regionalReturnAtPrices(
    prepared,
    { grainPricePerKg: 0.2, nutrientPricePerKg: 1 },
    { bandPerHa: 25 },
  );

  it('gives the mean return at every grid rate', () => {
    expect(Array.from(r.meanReturnPerHa)).toEqual(
      [0, 110, 160, 140].map((v) => expect.closeTo(v, 9)),
    );
  });
  it('picks 100 kg/ha with a mean return of 160 and a mean gain of 1300 kg/ha', () => {
    expect(r.bestRateKgHa).toBe(100);
    expect(r.bestMeanReturnPerHa).toBeCloseTo(160, 9);
    expect(r.meanYieldGainAtBestKgHa).toBeCloseTo(1300, 9);
    expect(r.priceRatio).toBeCloseTo(5, 12);
  });
  it('reports the profitable range 100–150 kg/ha for a band of 25 per ha', () => {
    expect(r.profitableRange).toEqual({
      bandPerHa: 25,
      lowKgHa: 100,
      highKgHa: 150,
      contiguous: true,
    });
  });
  it('profitableRangeAtPrices gives the same range, 100–150 kg/ha, by itself', () => {
    expect(
      profitableRangeAtPrices(
        prepared,
        { grainPricePerKg: 0.2, nutrientPricePerKg: 1 },
        { bandPerHa: 25 },
      ),
    ).toEqual({ bandPerHa: 25, lowKgHa: 100, highKgHa: 150, contiguous: true });
  });
  it('gives each site its own optimum and their quartiles', () => {
    expect(r.siteOptima.map((o) => [o.site, o.rateKgHa, +o.returnPerHa.toFixed(9)])).toEqual([
      ['A', 100, 220],
      ['B', 100, 100],
    ]);
    expect(r.siteOptimumDistribution).toEqual({
      n: 2,
      minKgHa: 100,
      q1KgHa: 100,
      medianKgHa: 100,
      q3KgHa: 100,
      maxKgHa: 100,
    });
  });
  it('moves to 50 kg/ha when N costs 2.00 per kg (PR 10)', () => {
    // returns A: 0, 100, 120, 60; B: 0, 20, 0, −80; mean 0, 60, 60, −10 → tie at 50 and 100,
    // the lower rate is taken.
    const dear = regionalReturnAtPrices(
      prepared,
      { grainPricePerKg: 0.2, nutrientPricePerKg: 2 },
      { bandPerHa: 0 },
    );
    expect(dear.bestRateKgHa).toBe(50);
    expect(dear.profitableRange).toMatchObject({ lowKgHa: 50, highKgHa: 100 });
  });
  it('takes the default tolerance, the cost of 10 kg N/ha, as its band (one rule with the risk tables)', () => {
    const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 1 };
    const d = regionalReturnAtPrices(prepared, prices);
    expect(d.profitableRange.bandPerHa).toBe(defaultShortfallTolerancePerHa(prices));
    expect(d.profitableRange.bandPerHa).toBe(10);
    expect(d.profitableRange).toMatchObject({ lowKgHa: 100, highKgHa: 100 });
  });
});

describe('regionalReturnAtPrices properties (fast-check)', () => {
  // Quadratic-plateau gain curves, gain = c·(min(x − x0, 0)² − x0²) with c < 0, kg/ha.
  const site = fc.record({
    c: fc.double({ min: -0.3, max: -0.01, noNaN: true }),
    x0: fc.double({ min: 20, max: 260, noNaN: true }),
  });
  const toCurve = (p: { c: number; x0: number }, i: number): SiteGainCurve => ({
    site: `S${i}`,
    gainKgHa: (x) => p.c * (Math.min(x - p.x0, 0) ** 2 - p.x0 ** 2),
  });
  const prices = fc.record({
    grainPricePerKg: fc.double({ min: 0.08, max: 0.4, noNaN: true }),
    nutrientPricePerKg: fc.double({ min: 0.3, max: 2.5, noNaN: true }),
  });
  const grid = rateGrid(0, 250, 1);
  const best = (
    curves: SiteGainCurve[],
    p: { grainPricePerKg: number; nutrientPricePerKg: number },
  ) => regionalReturnAtPrices(prepareRegionalReturn(curves, grid), p);

  it('profitableRangeAtPrices: the same range as regionalReturnAtPrices, on grids of any length in turn', () => {
    fc.assert(
      fc.property(
        fc.array(site, { minLength: 1, maxLength: 4 }),
        prices,
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 30, noNaN: true }),
        fc.integer({ min: 60, max: 400 }),
        (sites, p, app, bandPerHa, top) => {
          const withCost = { ...p, applicationCostPerHa: app };
          // A grid longer or shorter than the one before: the working buffer is reused.
          const prepared = prepareRegionalReturn(sites.map(toCurve), rateGrid(0, top, 1));
          expect(profitableRangeAtPrices(prepared, withCost, { bandPerHa })).toEqual(
            regionalReturnAtPrices(prepared, withCost, { bandPerHa }).profitableRange,
          );
        },
      ),
      { numRuns: 200, seed: 20261203 },
    );
  });

  it('regionalReturnAtPrices: the best rate and range do not depend on site order', () => {
    fc.assert(
      fc.property(
        fc.array(site, { minLength: 1, maxLength: 12 }),
        prices,
        fc.nat(),
        (ps, p, seed) => {
          const curves = ps.map(toCurve);
          const shuffled = [...curves];
          for (
            let i = shuffled.length - 1, s = seed;
            i > 0;
            i--, s = (s * 1103515245 + 12345) >>> 0
          ) {
            const j = s % (i + 1);
            [shuffled[i], shuffled[j]] = [shuffled[j], shuffled[i]];
          }
          const a = best(curves, p);
          const b = best(shuffled, p);
          expect(b.bestRateKgHa).toBe(a.bestRateKgHa);
          expect(b.profitableRange).toEqual(a.profitableRange);
          expect(b.siteOptimumDistribution).toEqual(a.siteOptimumDistribution);
        },
      ),
    );
  });

  it('regionalReturnAtPrices: duplicating every site leaves the best rate unchanged', () => {
    fc.assert(
      fc.property(fc.array(site, { minLength: 1, maxLength: 12 }), prices, (ps, p) => {
        const curves = ps.map(toCurve);
        const a = best(curves, p);
        const b = best([...curves, ...curves], p);
        expect(b.bestRateKgHa).toBe(a.bestRateKgHa);
        expect(b.profitableRange).toEqual(a.profitableRange);
        expect(b.bestMeanReturnPerHa).toBeCloseTo(a.bestMeanReturnPerHa, 6);
      }),
    );
  });

  it('regionalReturnAtPrices: with one site the best rate is that site optimum on the grid', () => {
    fc.assert(
      fc.property(site, prices, (s, p) => {
        const r = best([toCurve(s, 0)], p);
        expect(r.bestRateKgHa).toBe(r.siteOptima[0].rateKgHa);
        // Closed form for the quadratic-plateau: x* = x0 + PR/(2c), not below 0 (DESIGN.md);
        // the 1 kg/ha grid maximum of a concave curve lies within one step of it.
        const pr = p.nutrientPricePerKg / p.grainPricePerKg;
        const xStar = Math.min(Math.max(s.x0 + pr / (2 * s.c), 0), 250);
        expect(Math.abs(r.bestRateKgHa - xStar)).toBeLessThanOrEqual(1);
      }),
    );
  });
});

describe('regionalReturnAtPrices and rateGrid reject a caller mistake', () => {
  const prepared = prepareRegionalReturn([{ site: 'A', gainKgHa: (x) => x }], rateGrid(0, 10, 1));
  it('throws the economics price check for a zero grain price', () => {
    expect(() =>
      regionalReturnAtPrices(prepared, { grainPricePerKg: 0, nutrientPricePerKg: 1 }),
    ).toThrow(
      new StatsInputError('bad-argument', 'grainPricePerKg must be a positive number; got 0.'),
    );
  });
  it('throws bad-grid for a step of 0', () => {
    expect(() => rateGrid(0, 10, 0)).toThrow(/step is 0 kg\/ha; it must be above 0/);
  });
  it('throws bad-argument for a negative band', () => {
    expect(() =>
      regionalReturnAtPrices(
        prepared,
        { grainPricePerKg: 1, nutrientPricePerKg: 1 },
        { bandPerHa: -1 },
      ),
    ).toThrow(new SitesInputError('bad-argument', 'bandPerHa is -1; it must be 0 or more.'));
    expect(() =>
      regionalReturnAtPrices(
        prepared,
        { grainPricePerKg: 1, nutrientPricePerKg: 1 },
        { bandPerHa: -1 },
      ),
    ).toThrow(/bandPerHa is -1/);
  });
});

describe('regionalRecommendation', () => {
  it('regionalRecommendation states rate, range and site count, and always carries the cautions', () => {
    const prepared = prepareRegionalReturn(
      [{ site: 'A', gainKgHa: (x) => 30 * x - 0.1 * x * x }],
      rateGrid(0, 200, 1),
    );
    // PR = 1/0.2 = 5; x* = (5 − 30)/(2·−0.1) = 125 kg/ha.
    const r = regionalReturnAtPrices(
      prepared,
      { grainPricePerKg: 0.2, nutrientPricePerKg: 1 },
      { bandPerHa: 2 },
    );
    const text = regionalRecommendation(r);
    expect(text.sentence).toMatch(/^Across 1 site the highest mean net return .* is at 125 kg\/ha/);
    expect(text.sentence).toMatch(/price ratio of 5\.00 kg grain per kg N/);
    expect(text.cautions).toBe(recommendationCautions);
    expect(text.cautions.join(' ')).toMatch(/ground and surface water/);
    expect(text.cautions.join(' ')).toMatch(/licensed or certified agronomist/);
    expect(text.cautions.join(' ')).toMatch(/nutrient-management plan/);
  });
});

describe('regionalRecommendation wording of the profitable range', () => {
  const prepared = prepareRegionalReturn(
    [{ site: 'A', gainKgHa: (x) => 30 * x - 0.1 * x * x }],
    rateGrid(0, 200, 1),
  );
  const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 1 };
  it('names the range when several rates are within the band', () => {
    // Mean return 0.2·(30x − 0.1x²) − x = 5x − 0.02x²; at 125 it is 312.5; within 2 of it:
    // 0.02(x − 125)² ≤ 2 → |x − 125| ≤ 10, so 115–135 kg/ha.
    const r = regionalReturnAtPrices(prepared, prices, { bandPerHa: 2 });
    expect(regionalRecommendation(r).sentence).toMatch(
      /rates from 115 kg\/ha to 135 kg\/ha return within 2\.00 per ha of the best\.$/,
    );
  });
  it('says so when only the best rate is within the band', () => {
    const r = regionalReturnAtPrices(prepared, prices, { bandPerHa: 0 });
    expect(regionalRecommendation(r).sentence).toMatch(
      /no other rate returns within 0\.00 per ha of the best\.$/,
    );
  });
});
