import { describe, expect, it } from 'vitest';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { economicOptimum } from '../shared/economics/economicOptimum';
import { analyzeAcrossSites } from '../shared/analysis/analyzeAcrossSites';
import { sitePlots } from '../shared/analysis/sitePlots';
import {
  analyzeTable,
  poolingTests,
  siteViews,
  type AnalysisOutput,
  type AnalysisPartial,
} from '../renderer/src/analysis/siteAnalysis';
import { modelOptima, regionalOf, siteLeads, siteOptima } from '../renderer/src/analysis/pricing';
import { regionalModelText } from '../renderer/src/analysis/regionalModelText';
import { formatRate } from '../renderer/src/lib/format';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { priceTrial } from '../shared/analysis/priceTrial';
import { reportOf } from './report.pipeline';
import { reportDisplay } from '../renderer/src/analysis/reportInput';
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
const illustrative = canonicalPrices(ILLUSTRATIVE_PRICES);
/** The workspace's analysis settings with the given block choice (and no resamples unless asked). */
const settings = (blocks: 'auto' | 'none', resamples = 0) =>
  analysisSettings({ prices: illustrative, blocks, resamples });

describe('renderer analysis and re-pricing', () => {
  it('analyzeTable runs the pipeline site by site as plain data (no functions cross to the window)', async () => {
    const seen: string[] = [];
    const table = syntheticPlotTable({ sites: 3 });
    const previews: AnalysisPartial[] = [];
    const out = await analyzeTable(
      { table, settings: settings('auto') },
      async (_d, _t, note) => {
        seen.push(note);
      },
      (partial) => {
        previews.push(partial);
      },
    );
    const sites = siteViews(out);
    expect(sites.map((s) => s.site)).toEqual(['Site 0001', 'Site 0002', 'Site 0003']);
    // One note per site, then the regional models, fitted after the preview went to the window
    // (no resamples here, so no draws follow it).
    expect(seen).toEqual([
      'fitting Site 0001',
      'fitting Site 0002',
      'fitting Site 0003',
      'regional models',
    ]);
    expect(previews.map((p) => p.kind)).toEqual(['sites']);
    expect(siteViews((previews[0] as { analysis: AnalysisOutput }).analysis)).toEqual(sites);
    // The same analysis as the one-call form with the same options.
    const whole = analyzeAcrossSites(table, {
      prices: illustrative,
      blocks: 'auto',
      groupKeys: [],
    });
    expect(out.across.regional.regional.bestRateKgHa).toBe(whole.regional.regional.bestRateKgHa);
    expect(out.plots).toEqual(sitePlots(table));
    for (const [i, s] of sites.entries()) {
      expect(s.recommended).toBe(whole.sites[i].recommended.model);
      expect(s.recommended).not.toBeNull();
      expect(s.intercept.ok).toBe(true);
      expect(s.correlation.ok).toBe(true);
      // The synthetic sites have a zero-rate plot in every block: the pipeline's gain over the check.
      expect(s.responseOverCheck).toEqual({ ok: true, value: whole.sites[i].responseOverCheck });
      for (const fit of Object.values(s.fits)) expect('predict' in fit!).toBe(false);
    }
    expect(() => structuredClone(out)).not.toThrow();
    expect(poolingTests(out.across).map((t) => t.model)).toEqual(['linear', 'quadratic']);
  });

  it('a higher nitrogen price never raises a site optimum, and the regional rate follows', async () => {
    const out = await analyzeTable(
      { table: syntheticPlotTable({ sites: 4, seed: 9 }), settings: settings('none') },
      noProgress,
    );
    const cheap = canonicalPrices({ ...ILLUSTRATIVE_PRICES, productPerKg: 0.4 });
    const dear = canonicalPrices({ ...ILLUSTRATIVE_PRICES, productPerKg: 1.6 });
    const a = siteOptima(siteViews(out), priceTrial(out, cheap, {}));
    const b = siteOptima(siteViews(out), priceTrial(out, dear, {}));
    for (let i = 0; i < a.length; i++) {
      expect(a[i].model).toBe(b[i].model);
      expect(b[i].optimum!.rateKgHa!).toBeLessThanOrEqual(a[i].optimum!.rateKgHa!);
    }
    const rc = regionalOf(priceTrial(out, cheap, {}))!;
    const rd = regionalOf(priceTrial(out, dear, {}))!;
    expect(rd.bestRateKgHa).toBeLessThan(rc.bestRateKgHa);
    expect(rc.profitableRange.lowKgHa).toBeLessThanOrEqual(rc.bestRateKgHa);
    expect(rc.profitableRange.highKgHa).toBeGreaterThanOrEqual(rc.bestRateKgHa);
    // The regional rate is the pipeline's at those prices.
    const fresh = analyzeAcrossSites(syntheticPlotTable({ sites: 4, seed: 9 }), {
      prices: dear,
      blocks: 'none',
      groupKeys: [],
    });
    expect(rd.bestRateKgHa).toBe(fresh.regional.regional.bestRateKgHa);
    // The regional mixed model's optimum follows the price in closed form from the same fit.
    const mc = priceTrial(out, cheap, {});
    const md = priceTrial(out, dear, {});
    expect(md.across.mixed).toBe(mc.across.mixed);
    expect(md.mixedOptimum!.rateKgHa).toBeLessThan(mc.mixedOptimum!.rateKgHa);
    const text = regionalModelText(md, 'lb/ac', 'en-US')!;
    expect(text).toContain('Across 4 site-years, the regional quadratic mixed model');
    expect(text).toContain(formatRate(md.mixedOptimum!.rateKgHa, 'lb/ac', 'en-US'));
    // With two or more forms fitted, the screen says which the AIC favours: the lowest AIC.
    const q = md.across.mixed;
    if (q.model === null) throw new Error(q.reason);
    const fitted = [
      { model: 'quadratic', aic: q.aic, ok: q.converged },
      ...md.across.plateauMixed.map((m) => ({
        model: m.model ?? '',
        aic: m.model === null ? Infinity : m.aic,
        ok: m.model !== null && m.settled,
      })),
    ].filter((f) => f.ok);
    expect(fitted.length).toBeGreaterThanOrEqual(2);
    const best = fitted.reduce((a, f) => (f.aic < a.aic ? f : a));
    const label = best.model.replace('P', '-p').toLowerCase();
    expect(text).toContain(`the AIC favours the ${label}`);
    // A favoured plateau form also says where it puts the rate: its own priced optimum.
    const k = md.across.plateauMixed.findIndex((m) => m.model === best.model);
    if (k >= 0)
      expect(text).toContain(
        `On the ${label} the most profitable regional rate is ${formatRate(md.plateauMixedOptima[k]!.rateKgHa, 'lb/ac', 'en-US')}`,
      );
    else expect(text).not.toContain('On the ');
  });

  it('the site optimum is the closed-form optimum of its leading fit at the same prices', async () => {
    const out = await analyzeTable(
      { table: syntheticPlotTable({ sites: 1, seed: 2 }), settings: settings('none') },
      noProgress,
    );
    const [site] = siteViews(out);
    const [entry] = siteOptima([site], priceTrial(out, illustrative, {}));
    const direct = economicOptimum(site.fits[entry.model!]!, illustrative);
    expect(entry.optimum!.rateKgHa).toBe(direct.rateKgHa);
    expect(modelOptima(site, illustrative)[entry.model!]!.rateKgHa).toBe(direct.rateKgHa);
  });

  it("the leading model is the pipeline's recommendation, the user's choice wins, and the regional mean follows it", async () => {
    const out = await analyzeTable(
      { table: syntheticPlotTable({ sites: 2, seed: 4 }), settings: settings('none') },
      noProgress,
    );
    const [site] = siteViews(out);
    expect(siteLeads(out, {})[site.site]).toBe(site.recommended);
    expect(['quadratic', 'linearPlateau', 'quadraticPlateau', 'exponential', 'step']).toContain(
      site.recommended,
    );
    const mine = { [site.site]: 'linear' as const };
    expect(siteLeads(out, mine)[site.site]).toBe('linear');
    const chosen = regionalOf(priceTrial(out, illustrative, mine))!;
    const fresh = analyzeAcrossSites(syntheticPlotTable({ sites: 2, seed: 4 }), {
      prices: illustrative,
      blocks: 'none',
      groupKeys: [],
      siteModels: mine,
    });
    expect(chosen.siteOptima).toEqual(fresh.regional.regional.siteOptima);
    expect(chosen.bestRateKgHa).toBe(fresh.regional.regional.bestRateKgHa);
  });
});

describe('renderer optimum intervals', () => {
  it("the interval on screen is the report's for each site's leading model", async () => {
    const table = syntheticPlotTable({ sites: 2, seed: 3 });
    const out = await analyzeTable({ table, settings: settings('auto', 200) }, noProgress);
    const onScreen = siteOptima(siteViews(out), priceTrial(out, illustrative, {}));
    const units = { rate: 'kg/ha', yield: 'kg/ha' } as const;
    const display = reportDisplay(ILLUSTRATIVE_PRICES, units, 'metric', table.crop);
    const report = reportOf(
      table,
      { ...display, crop: table.crop, boot: 200, seed: 1, blocks: 'fixed', intervalLevel: 0.9 },
      {
        tool: { name: 'Plotrate', version: 'test' },
        createdAt: '2026-01-01T00:00:00Z',
        mapping: [],
      },
    );
    for (const [i, s] of report.sites.entries()) {
      expect(s.bootstrap?.ciKgHa).toBeTruthy();
      expect(onScreen[i].intervalKgHa).toEqual(s.bootstrap!.ciKgHa);
      // The profile interval beside it is the report's too (the chosen model's row).
      const chosen = s.models.find((m) => m.model === s.bestModel);
      expect(onScreen[i].profile).toEqual(chosen?.optimumProfile ?? null);
    }
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
