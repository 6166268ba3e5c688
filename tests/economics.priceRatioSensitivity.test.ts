// The recommendation at multiples of the price ratio (shared/economics/priceRatioSensitivity,
// made by priceSite for a site and by the regional return for the region). Expected rates come
// from each model's published closed form, dy/dx = PR solved for x: the quadratic
// a + b·x + c·x² gives x* = (PR − b)/(2c), the form used to compare N response models in
// Cerrato & Blackmer (1990, Agronomy Journal 82:138–143; reference from memory); the
// exponential a + b·(1 − e^(−k·x)) gives x* = ln(b·k/PR)/k. Each is also checked by maximizing
// the net return numerically on the fitted curve, and the monotone fall of the optimum as the
// price ratio rises is checked as a property over sites and random ratios.
import { describe, expect, it } from 'vitest';
import { priceSite, priceTrial } from '../shared/analysis/priceTrial';
import { regionalAtPrices } from '../shared/analysis/regionalAnalysis';
import { prepareRegionalReturn } from '../shared/analysis/regionalReturn';
import { rateGrid } from '../shared/analysis/rateGrid';
import { mulberry32 } from '../shared/demo/mulberry32';
import { TRUTH_NAMES } from '../shared/demo/simulatedSite';
import { netReturn, recommendedRateKgHa } from '../shared/economics/economicOptimum';
import { optimumInterval } from '../shared/economics/optimumInterval';
import {
  PRICE_RATIO_MULTIPLIERS,
  pricesAtRatioMultiple,
  priceRatioSensitivity,
} from '../shared/economics/priceRatioSensitivity';
import { StatsInputError } from '../shared/stats/errors';
import { CORN_PRICES as prices, simulatedAnalysis as analyzed } from './analysis.simulated';

const PR = prices.nutrientPricePerKg / prices.grainPricePerKg;
const LEVEL = 0.9;
const TOLERANCE = 12;

/** The rate of the largest net return on a 0.01 kg/ha grid over the tested rates. */
function numericOptimum(fit: Parameters<typeof netReturn>[0], p: typeof prices, hi: number) {
  let best = 0;
  let value = -Infinity;
  for (let x = 0; x <= hi + 1e-9; x += 0.01) {
    const v = netReturn(fit, p, x);
    if (v > value) [best, value] = [x, v];
  }
  return best;
}

describe('pricesAtRatioMultiple', () => {
  it('scales the nitrogen price and keeps the grain price and application cost', () => {
    const p = { grainPricePerKg: 0.2, nutrientPricePerKg: 1.2, applicationCostPerHa: 15 };
    expect(pricesAtRatioMultiple(p, 1.5)).toEqual({
      grainPricePerKg: 0.2,
      nutrientPricePerKg: 1.2 * 1.5,
      applicationCostPerHa: 15,
    });
  });

  it('refuses a multiplier that is not a positive number, naming it', () => {
    expect(() => pricesAtRatioMultiple(prices, 0)).toThrow(StatsInputError);
    expect(() => pricesAtRatioMultiple(prices, -2)).toThrow(
      'a price ratio multiplier must be a positive number; got -2.',
    );
  });

  it('labels each row with its multiple and the price ratio it gives', () => {
    const rows = priceRatioSensitivity(prices, () => ({}));
    expect(rows.map((r) => r.ratioMultiplier)).toEqual([0.5, 0.75, 1, 1.5, 2]);
    for (const r of rows) expect(r.priceRatio / (PR * r.ratioMultiplier)).toBeCloseTo(1, 12);
  });
});

describe('a site at multiples of the price ratio', () => {
  const trial = analyzed(['quadratic-plateau', 'exponential'], 7);

  it.each([
    ['quadratic', 0, (p: Record<string, number>, pr: number) => (pr - p.b) / (2 * p.c)],
    [
      'exponential',
      1,
      (p: Record<string, number>, pr: number) =>
        p.b * p.k > pr ? Math.log((p.b * p.k) / pr) / p.k : 0,
    ],
  ] as const)(
    'the %s picked by the analyst: each row is the closed form at that price ratio (1e-9 kg/ha)',
    (model, index, closedForm) => {
      const s = trial.across.sites[index];
      const priced = priceSite(s, prices, { [s.site]: model }, LEVEL, TOLERANCE);
      const fit = s.fits!.fits[model];
      const highest = fit.testedRates.highestKgHa;
      expect(priced.priceRatioSensitivity).toHaveLength(PRICE_RATIO_MULTIPLIERS.length);
      for (const row of priced.priceRatioSensitivity!) {
        const expected = Math.min(
          Math.max(closedForm(fit.params, PR * row.ratioMultiplier), 0),
          highest,
        );
        expect(Math.abs(row.rateKgHa! - expected)).toBeLessThan(1e-9);
        // And the grid search on the fitted curve finds the same rate within its step.
        const scaled = pricesAtRatioMultiple(prices, row.ratioMultiplier);
        expect(Math.abs(numericOptimum(fit, scaled, highest) - expected)).toBeLessThanOrEqual(
          0.011,
        );
      }
      // Doubling the ratio must move the optimum: these sites respond well inside the rates.
      const rates = priced.priceRatioSensitivity!.map((r) => r.rateKgHa!);
      expect(rates[0] - rates[4]).toBeGreaterThan(10);
    },
  );

  it('gives at each ratio the interval of the same resamples priced at that ratio, and 1× is the recommendation', () => {
    for (const s of trial.across.sites) {
      const priced = priceSite(s, prices, {}, LEVEL, TOLERANCE);
      for (const row of priced.priceRatioSensitivity!) {
        const scaled = pricesAtRatioMultiple(prices, row.ratioMultiplier);
        const interval = optimumInterval(s.draws!, priced.lead.model!, scaled, LEVEL);
        expect(row.intervalKgHa).toEqual(interval!.ciKgHa);
        expect(row.rateKgHa).toBe(
          recommendedRateKgHa(priceSite(s, scaled, {}, LEVEL, TOLERANCE).optimum),
        );
      }
      const one = priced.priceRatioSensitivity!.find((r) => r.ratioMultiplier === 1)!;
      expect(one.rateKgHa).toBe(recommendedRateKgHa(priced.optimum));
      expect(one.intervalKgHa).toEqual(priced.interval!.ciKgHa);
    }
  });

  it('computes the rows and the risk once, on first read, and a structured clone carries them', () => {
    // Read on demand (priceSite's keptOnFirstRead), so a price slider pays only for the sites shown.
    const s = trial.across.sites.find((x) => x.draws)!;
    const priced = priceSite(s, prices, {}, LEVEL, TOLERANCE);
    const rows = priced.priceRatioSensitivity;
    expect(priced.priceRatioSensitivity).toBe(rows);
    expect(priced.shortfallRisk).toBe(priced.shortfallRisk);
    const copy = structuredClone(priced);
    expect(Object.getOwnPropertyDescriptor(copy, 'priceRatioSensitivity')!.value).toEqual(rows);
    expect(copy.shortfallRisk).toEqual(priced.shortfallRisk);
    expect(JSON.parse(JSON.stringify(priced)).priceRatioSensitivity).toEqual(rows);
  });
});

describe('the optimum never rises as the price ratio rises (property)', () => {
  // Every kind of simulated truth, two seeds; 25 random multiples in [0.2, 5] per site.
  const trial = analyzed([...TRUTH_NAMES, ...TRUTH_NAMES], 19);
  const random = mulberry32(2024);
  const multiples = Array.from({ length: 25 }, () => 0.2 + 4.8 * random.next()).sort(
    (a, b) => a - b,
  );

  it('at every site: the recommended rate and both interval ends are non-increasing', () => {
    for (const s of trial.across.sites) {
      const rows = priceRatioSensitivity(
        prices,
        (p) => {
          const priced = priceSite(s, p, {}, LEVEL, TOLERANCE);
          return { rate: recommendedRateKgHa(priced.optimum), ci: priced.interval!.ciKgHa! };
        },
        multiples,
      );
      for (let i = 1; i < rows.length; i++) {
        const [a, b] = [rows[i - 1], rows[i]];
        expect(b.rate!, `${s.site} at ×${b.ratioMultiplier}`).toBeLessThanOrEqual(a.rate!);
        expect(b.ci[0]).toBeLessThanOrEqual(a.ci[0]);
        expect(b.ci[1]).toBeLessThanOrEqual(a.ci[1]);
      }
    }
  });

  it('for the region: the regional rate is non-increasing', () => {
    const region = priceTrial(trial, prices, {}).across.regional;
    const rows = priceRatioSensitivity(
      prices,
      (p) => regionalAtPrices(region, p, 10).regional,
      multiples,
    );
    for (let i = 1; i < rows.length; i++)
      expect(rows[i].bestRateKgHa).toBeLessThanOrEqual(rows[i - 1].bestRateKgHa);
    expect(rows[0].bestRateKgHa).toBeGreaterThan(rows[rows.length - 1].bestRateKgHa);
  });
});

describe('the region at multiples of the price ratio', () => {
  it('puts the regional rate of quadratic gains at their closed form, within half a grid step', () => {
    // Two sites with the gain 40·x − 0.1·x² (kg/ha): the mean has the same optimum,
    // x* = (PR − 40)/(2·(−0.1)) = (40 − PR)/0.2 at each ratio.
    const gain = (x: number) => 40 * x - 0.1 * x * x;
    const grid = rateGrid(0, 250, 1);
    const curves = [
      { site: 'A', gainKgHa: gain },
      { site: 'B', gainKgHa: gain },
    ];
    const r = regionalAtPrices(
      {
        prepared: prepareRegionalReturn(curves, grid),
        atTestedRates: prepareRegionalReturn(curves, Float64Array.of(0, 100, 200)),
      },
      prices,
      10,
    );
    for (const row of r.priceRatioSensitivity) {
      const expected = (40 - PR * row.ratioMultiplier) / 0.2;
      expect(Math.abs(row.rateKgHa - expected), `×${row.ratioMultiplier}`).toBeLessThanOrEqual(0.5);
      expect(row.profitableRangeKgHa[0]).toBeLessThanOrEqual(row.rateKgHa);
      expect(row.profitableRangeKgHa[1]).toBeGreaterThanOrEqual(row.rateKgHa);
    }
    expect(r.priceRatioSensitivity[2].rateKgHa).toBe(r.regional.bestRateKgHa);
  });
});
