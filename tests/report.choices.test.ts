// analyzeTrials with the user's model at a site and an application cost, as the workspace
// passes them, on invented plots of the seeded generator: the report leads each site with
// the screen's model and prices the optimum with the screen's application cost.
import { describe, expect, it } from 'vitest';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { economicOptimum } from '../shared/economics/economicOptimum';
import { reportOf } from './report.pipeline';
import { growerPage } from '../shared/report/growerPage';
import type { ReportSettings } from '../shared/report/reportSettings';
import { priceTerms } from '../shared/economics/priceQuote';
import { analyzeAcrossSites } from '../shared/analysis/analyzeAcrossSites';

const table = syntheticPlotTable({ sites: 3, seed: 5 });
const meta = {
  tool: { name: 'Plotrate', version: 'test' },
  createdAt: '2026-01-01T00:00:00Z',
  mapping: [],
};

function settings(extra: Partial<ReportSettings> = {}, applicationCostPerHa = 0): ReportSettings {
  return {
    units: { rate: 'kg/ha', yield: 'kg/ha' },
    unitSystem: 'metric',
    currency: 'USD',
    crop: table.crop,
    prices: {
      grainPrice: 0.18,
      nutrientPrice: 1.1,
      product: null,
      defaulted: false,
      applicationCostPerHa,
    },
    boot: 0,
    seed: 1,
    blocks: 'none',
    intervalLevel: 0.9,
    ...extra,
  };
}

describe('analyzeTrials with the user’s site models', () => {
  const plain = reportOf(table, settings(), meta);
  const first = plain.sites[0];
  const other = first.bestModel === 'quadratic' ? 'linearPlateau' : 'quadratic';
  const picked = reportOf(table, settings({ siteModels: { [first.site]: other } }), meta);

  it('leads the picked site with the picked model and says so', () => {
    expect(picked.sites[0].bestModel).toBe(other);
    expect(picked.sites[0].bestModelPicked).toBe(true);
    const recommended = first.models.find((m) => m.model === first.bestModel)!.label;
    expect(picked.sites[0].bestModelReason).toBe(
      `picked by the analyst instead of the ${recommended.toLowerCase()} (${first.bestModelReason})`,
    );
    expect(plain.sites.every((s) => !s.bestModelPicked)).toBe(true);
    // The grower page says the curve was picked, not chosen by the rule.
    expect(growerPage(picked, first.site).basis.join(' ')).toContain(
      `, picked by the analyst instead of the ${recommended.toLowerCase()}`,
    );
    // The other sites keep their recommendation models.
    expect(picked.sites.slice(1).map((s) => s.bestModel)).toEqual(
      plain.sites.slice(1).map((s) => s.bestModel),
    );
  });

  it('puts the picked model into the regional mean, as the pipeline does with the same pick', () => {
    const pipeline = analyzeAcrossSites(table, {
      prices: { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 },
      blocks: 'none',
      groupKeys: [],
      siteModels: { [first.site]: other },
    });
    expect(picked.acrossSites?.bestRateKgHa).toBe(pipeline.regional.regional.bestRateKgHa);
    expect(picked.acrossSites?.siteOptima.find((o) => o.site === first.site)?.rateKgHa).toBe(
      pipeline.regional.regional.siteOptima.find((o) => o.site === first.site)?.rateKgHa,
    );
  });
});

describe('analyzeTrials with an application cost', () => {
  const cost = 40;
  const costly = reportOf(table, settings({}, cost), meta);

  it('carries the cost into the price terms and each site’s return at its optimum', () => {
    expect(costly.prices.applicationCostPerHa).toBe(cost);
    for (const s of costly.sites) {
      const row = s.models.find((m) => m.model === s.bestModel)!;
      const fit = analyzeAcrossSites(table, {
        prices: { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1, applicationCostPerHa: cost },
        blocks: 'none',
        groupKeys: [],
      }).sites.find((x) => x.site === s.site)!.fits!.fits[s.bestModel!];
      const direct = economicOptimum(fit, {
        grainPricePerKg: 0.18,
        nutrientPricePerKg: 1.1,
        applicationCostPerHa: cost,
      });
      expect(row.optimumRateKgHa).toBe(direct.rateKgHa);
      expect(s.returnAtOptimumPerHa).toBe(direct.gainOverCheckPerHa);
    }
  });

  it('priceTerms refuses a negative application cost, naming it', () => {
    expect(() => priceTerms(settings({}, -1))).toThrow(
      'The application cost must be 0 or a positive number; got -1.',
    );
  });
});
