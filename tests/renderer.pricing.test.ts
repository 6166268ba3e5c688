import { describe, expect, it } from 'vitest';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { economicOptimum } from '../shared/economics/economicOptimum';
import { analyseTable } from '../renderer/src/analysis/siteAnalysis';
import {
  leadingModel,
  modelOptima,
  prepareRegional,
  regionalAtPrices,
  siteOptima,
} from '../renderer/src/analysis/pricing';
import {
  canonicalPrices,
  grainPriceFromShown,
  grainPriceShown,
  ILLUSTRATIVE_PRICES,
  priceRatioDisplay,
  productPriceFromShown,
  productPriceShown,
} from '../renderer/src/analysis/priceInputs';

const noProgress = async () => {};

describe('renderer analysis and re-pricing', () => {
  it('analyseTable fits every site as plain data (no functions cross to the window)', async () => {
    const seen: string[] = [];
    const out = await analyseTable(
      { table: syntheticPlotTable({ sites: 3 }), blocks: 'fixed' },
      async (_d, _t, note) => {
        seen.push(note);
      },
    );
    expect(out.sites.map((s) => s.site)).toEqual(['Site 0001', 'Site 0002', 'Site 0003']);
    expect(seen).toEqual(['Site 0001', 'Site 0002', 'Site 0003', 'across sites']);
    for (const s of out.sites) {
      expect(s.best).not.toBeNull();
      expect(s.intercept.ok).toBe(true);
      expect(s.correlation.ok).toBe(true);
      for (const fit of Object.values(s.fits)) expect('predict' in fit!).toBe(false);
    }
    expect(() => structuredClone(out)).not.toThrow();
    expect(out.across.tests).toHaveLength(2);
  });

  it('a higher nitrogen price never raises a site optimum, and the regional rate follows', async () => {
    const out = await analyseTable(
      { table: syntheticPlotTable({ sites: 4, seed: 9 }), blocks: 'none' },
      noProgress,
    );
    const cheap = canonicalPrices({ ...ILLUSTRATIVE_PRICES, productPerKg: 0.4 });
    const dear = canonicalPrices({ ...ILLUSTRATIVE_PRICES, productPerKg: 1.6 });
    const a = siteOptima(out.sites, {}, cheap);
    const b = siteOptima(out.sites, {}, dear);
    for (let i = 0; i < a.length; i++) {
      expect(a[i].model).toBe(b[i].model);
      expect(b[i].optimum!.rateKgHa!).toBeLessThanOrEqual(a[i].optimum!.rateKgHa!);
    }
    const leads = Object.fromEntries(a.map((o) => [o.site, o.model]));
    const prepared = prepareRegional(out.sites, leads);
    const rc = regionalAtPrices(prepared, cheap)!;
    const rd = regionalAtPrices(prepared, dear)!;
    expect(rd.bestRateKgHa).toBeLessThan(rc.bestRateKgHa);
    expect(rc.profitableRange.lowKgHa).toBeLessThanOrEqual(rc.bestRateKgHa);
    expect(rc.profitableRange.highKgHa).toBeGreaterThanOrEqual(rc.bestRateKgHa);
  });

  it('the site optimum is the closed-form optimum of its leading fit at the same prices', async () => {
    const out = await analyseTable(
      { table: syntheticPlotTable({ sites: 1, seed: 2 }), blocks: 'none' },
      noProgress,
    );
    const prices = canonicalPrices(ILLUSTRATIVE_PRICES);
    const [entry] = siteOptima(out.sites, {}, prices);
    const direct = economicOptimum(out.sites[0].fits[entry.model!]!, prices);
    expect(entry.optimum!.rateKgHa).toBe(direct.rateKgHa);
    expect(modelOptima(out.sites[0], prices)[entry.model!]!.rateKgHa).toBe(direct.rateKgHa);
  });

  it('leadingModel prefers a curve with a rate, and the user choice wins', async () => {
    const out = await analyseTable(
      { table: syntheticPlotTable({ sites: 1, seed: 4 }), blocks: 'none' },
      noProgress,
    );
    const site = out.sites[0];
    const prices = canonicalPrices(ILLUSTRATIVE_PRICES);
    const lead = leadingModel(site, {}, prices)!;
    expect(['quadratic', 'linearPlateau', 'quadraticPlateau', 'exponential']).toContain(lead);
    expect(leadingModel(site, { [site.site]: 'linear' }, prices)).toBe('linear');
  });
});

describe('renderer price inputs', () => {
  it('shown prices round-trip through canonical per-kg values in both unit systems', () => {
    for (const unit of ['bu/ac', 't/ha'] as const) {
      expect(grainPriceFromShown(grainPriceShown(0.18, unit, 'corn'), unit, 'corn')).toBeCloseTo(
        0.18,
        12,
      );
    }
    for (const unit of ['lb/ac', 'kg/ha'] as const) {
      expect(productPriceFromShown(productPriceShown(0.57, unit), unit)).toBeCloseTo(0.57, 12);
    }
    // $4.50 a 56-lb bushel
    expect(grainPriceShown(ILLUSTRATIVE_PRICES.grainPerKg, 'bu/ac', 'corn')).toBeCloseTo(4.5, 10);
  });

  it('the nutrient price is the product price over its N fraction', () => {
    const p = canonicalPrices({ ...ILLUSTRATIVE_PRICES, productPerKg: 0.46, analysisPct: 46 });
    expect(p.nutrientPricePerKg).toBeCloseTo(1, 12);
    expect(() => canonicalPrices({ ...ILLUSTRATIVE_PRICES, analysisPct: 0 })).toThrow(
      'The product analysis must be above 0 and at most 100 % N; got 0.',
    );
  });

  it('the price ratio reads in bu/lb N (US) and kg/kg N (metric)', () => {
    // 1 kg grain per kg N = (1/25.4 bu) per (1/0.4536 lb) for 56-lb corn.
    const us = priceRatioDisplay(1, 'us', 'corn');
    expect(us.unit).toBe('bu/lb N');
    expect(us.value).toBeCloseTo(0.45359237 / (56 * 0.45359237), 10);
    expect(priceRatioDisplay(7.5, 'metric', 'corn')).toEqual({ value: 7.5, unit: 'kg/kg N' });
  });
});
