// The price-ratio and risk tables as the screen writes them (renderer/src/analysis/
// ratioAndRiskTable): the same numbers as the priced view and the results JSON, in the display
// units. Unit factors from the exact pound and acre (NIST SP 811: 0.45359237 kg, 43 560 ft²)
// and the 56 lb corn bushel (USDA), worked here rather than taken from shared/units.
import { describe, expect, it } from 'vitest';
import { priceTrial } from '../shared/analysis/priceTrial';
import { recommendedRateKgHa } from '../shared/economics/economicOptimum';
import {
  regionalRatioAndRisk,
  siteRatioAndRisk,
  type TableContext,
} from '../renderer/src/analysis/ratioAndRiskTable';
import { CORN_PRICES as prices, simulatedAnalysis } from './analysis.simulated';

const KG_PER_LB = 0.45359237;
const HA_PER_AC = (43560 * 0.3048 * 0.3048) / 10000;
const KG_HA_PER_LB_AC = KG_PER_LB / HA_PER_AC;

const analysis = simulatedAnalysis(['quadratic-plateau', 'exponential', 'flat'], 9);
const priced = priceTrial(analysis, prices, {});
const us: TableContext = {
  system: 'us',
  crop: 'corn',
  currency: 'USD',
  locale: 'en-US',
  toleranceIsDefault: true,
};

describe('siteRatioAndRisk', () => {
  const site = priced.sites[0];
  const view = siteRatioAndRisk(site, 0.9, us)!;

  it('writes one row per multiple, the prices in force marked, rates in lb/ac', () => {
    expect(view.ratioRows.map((r) => r.multiple)).toEqual(['0.5×', '0.75×', '1×', '1.5×', '2×']);
    expect(view.ratioRows.map((r) => r.current)).toEqual([false, false, true, false, false]);
    site.priceRatioSensitivity!.forEach((row, i) => {
      const lbAc = Math.round(row.rateKgHa! / KG_HA_PER_LB_AC);
      expect(view.ratioRows[i].rate).toBe(`${lbAc} lb/ac`);
      const [lo, hi] = row.intervalKgHa!.map((x) => Math.round(x / KG_HA_PER_LB_AC));
      expect(view.ratioRows[i].range).toBe(`${lo} – ${hi} lb/ac`);
    });
    expect(view.rangeLabel).toBe('90 % interval');
  });

  it('quotes the price ratio in bu/lb N: kg grain per kg N ÷ 56 (the pound cancels)', () => {
    const pr = prices.nutrientPricePerKg / prices.grainPricePerKg;
    const expected = new Intl.NumberFormat('en-US', { maximumSignificantDigits: 3 }).format(
      pr / 56,
    );
    expect(view.ratioRows[2].ratio).toBe(`${expected} bu/lb N`);
  });

  it('gives each rate’s share as a whole percent, and marks the recommended rate', () => {
    const risk = site.shortfallRisk!;
    expect(view.riskRows).toHaveLength(risk.rows.length);
    risk.rows.forEach((r, i) => {
      const text = r.share > 0 && r.share < 0.005 ? '< 1 %' : `${Math.round(r.share * 100)} %`;
      expect(view.riskRows[i].share).toBe(text);
    });
    const marked = view.riskRows.filter((r) => r.recommended);
    expect(marked).toHaveLength(1);
    const rec = recommendedRateKgHa(site.optimum)!;
    expect(marked[0].rate).toBe(`${Math.round(rec / KG_HA_PER_LB_AC)} lb/ac`);
  });

  it('names the tolerance per acre: the cost of 10 kg N/ha, or the user’s own', () => {
    // 10 kg N/ha at the N price per kg, per acre.
    const perAcre = 10 * prices.nutrientPricePerKg * HA_PER_AC;
    expect(view.riskNote).toContain(`own best rate by more than $${perAcre.toFixed(2)}/ac`);
    expect(view.riskNote).toContain('the cost of 10 kg N/ha at these prices');
    expect(view.riskNote).toContain('Share of the 200 resamples');
    const own = priceTrial(analysis, prices, {}, { shortfallTolerancePerHa: 50 });
    const mine = siteRatioAndRisk(own.sites[0], 0.9, { ...us, toleranceIsDefault: false })!;
    expect(mine.riskNote).toContain(
      `by more than $${(50 * HA_PER_AC).toFixed(2)}/ac (your tolerance)`,
    );
  });

  it('writes kg/ha and the locale’s decimal comma in metric', () => {
    const de = siteRatioAndRisk(site, 0.9, {
      ...us,
      system: 'metric',
      locale: 'de-DE',
      currency: 'EUR',
    })!;
    expect(de.ratioRows[0].multiple).toBe('0,5×');
    expect(de.ratioRows[2].rate).toBe(
      `${Math.round(site.priceRatioSensitivity![2].rateKgHa!)} kg/ha`,
    );
    expect(de.ratioRows[2].ratio).toMatch(/^\d+,\d+ kg\/kg N$/);
  });
});

describe('regionalRatioAndRisk', () => {
  it('gives the regional rate with its profitable range and a between-site risk', () => {
    const region = priced.across.regional;
    const view = regionalRatioAndRisk(region, us)!;
    expect(view.rangeLabel).toBe('Profitable range');
    const r = region.priceRatioSensitivity[2];
    expect(view.ratioRows[2].rate).toBe(`${Math.round(r.rateKgHa / KG_HA_PER_LB_AC)} lb/ac`);
    expect(view.riskNote).toContain('Share of the 3 sites');
    expect(view.riskNote).toContain('a risk between sites');
    const marked = view.riskRows.filter((x) => x.recommended);
    expect(marked.map((x) => x.rate)).toEqual([
      `${Math.round(region.regional.bestRateKgHa / KG_HA_PER_LB_AC)} lb/ac`,
    ]);
    // Three sites: every share is a whole number of thirds.
    for (const x of view.riskRows) expect(['0 %', '33 %', '67 %', '100 %']).toContain(x.share);
  });

  it('keys each risk row by its rate in kg/ha, unique where two rates read the same', () => {
    // 89.66 and 89.70 kg/ha both round to 80 lb/ac (89.66 / 1.12085 = 79.99, 89.70 / 1.12085 =
    // 80.03): one a tested rate, the other the regional rate. The window's table is keyed by
    // row, and a repeated key stops it updating (as happened at 500 sites on the all-sites step).
    const region = priced.across.regional;
    const risk = region.shortfallRisk!;
    const rows = [
      { ...risk.rows[0], rateKgHa: 89.66 },
      { ...risk.rows[0], rateKgHa: 89.7 },
    ];
    const view = regionalRatioAndRisk(
      {
        ...region,
        shortfallRisk: { ...risk, rows },
        regional: { ...region.regional, bestRateKgHa: 89.7 },
      },
      us,
    )!;
    expect(view.riskRows.map((r) => r.rate)).toEqual(['80 lb/ac', '80 lb/ac']);
    expect(view.riskRows.map((r) => r.rateKgHa)).toEqual([89.66, 89.7]);
    expect(view.riskRows.map((r) => r.recommended)).toEqual([false, true]);
  });
});
