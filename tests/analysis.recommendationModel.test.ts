// The one definition of a site's recommendation model, and that the report and
// the regional return (regionalModel 'best') use it. The rule's basis is
// /work/shared/DESIGN.md ("Economic optimum": a straight line gives only a
// corner; a full response by the lowest rate cannot place the optimum) and the
// AICc ranking of shared/models (Hurvich & Tsai 1989). The site data are the
// invented plots of tests/fixtures/sites/pooled.plots.csv (written by pooled.R
// with R 4.2.2).
import { describe, expect, it } from 'vitest';
import type { ModelRank } from '../shared/models/fitAllModels';
import { MODEL_NAMES, type FitStatus, type ModelName } from '../shared/models/modelTypes';
import { reportOf } from './report.pipeline';
import { analyzeAcrossSites } from '../shared/analysis/analyzeAcrossSites';
import { recommendationModel } from '../shared/analysis/recommendationModel';
import { pooledPlotTable } from './analysis.fixtures';

/** Fits and a ranking from a list of (model, status, ΔAICc) in AICc order; unlisted models are unranked. */
function ranked(list: [ModelName, FitStatus, number][]) {
  const fits = Object.fromEntries(
    MODEL_NAMES.map((m) => [m, { status: 'no-plateau' as FitStatus }]),
  ) as Record<ModelName, { status: FitStatus }>;
  const ranking: ModelRank[] = list.map(([model, status, delta], i) => {
    fits[model] = { status };
    return { model, rank: i + 1, aicc: 100 + delta, deltaAicc: delta, weight: 0.5, reason: '' };
  });
  for (const m of MODEL_NAMES)
    if (!list.some(([x]) => x === m))
      ranking.push({ model: m, rank: null, aicc: NaN, deltaAicc: NaN, weight: 0, reason: 'x' });
  return { fits, ranking };
}

describe('recommendationModel follows the rule in its header', () => {
  const cases: {
    name: string;
    list: [ModelName, FitStatus, number][];
    model: ModelName | null;
    reason: RegExp;
  }[] = [
    {
      name: 'takes the AICc leader when it is a curve with a rate',
      list: [
        ['quadraticPlateau', 'ok', 0],
        ['linear', 'ok', 3],
      ],
      model: 'quadraticPlateau',
      reason: /^lowest AICc of the models fitted, Akaike weight 0\.50$/,
    },
    {
      name: 'prefers a curve to a straight line that leads by AICc (a line gives only a corner)',
      list: [
        ['linear', 'ok', 0],
        ['exponential', 'ok', 1.25],
      ],
      model: 'exponential',
      reason: /^lowest AICc among the curves with a usable rate, ΔAICc 1\.3 from the best$/,
    },
    {
      name: 'takes a full response by the lowest rate that fits best among the curves',
      list: [
        ['linearPlateau', 'full-response-at-lowest-rate', 0],
        ['quadratic', 'ok', 2],
      ],
      model: 'linearPlateau',
      reason: /^full response by the lowest non-zero rate, lowest AICc of the models fitted/,
    },
    {
      name: 'passes over a full response more than 4 AICc behind a curve with an optimum',
      list: [
        ['quadraticPlateau', 'ok', 0],
        ['linearPlateau', 'full-response-at-lowest-rate', 4.5],
      ],
      model: 'quadraticPlateau',
      reason: /^lowest AICc of the models fitted/,
    },
    {
      name: 'takes a full response within 4 AICc of the best curve with an optimum',
      list: [
        ['quadraticPlateau', 'ok', 0],
        ['linearPlateau', 'full-response-at-lowest-rate', 3.5],
      ],
      model: 'linearPlateau',
      reason:
        /^full response by the lowest non-zero rate, ΔAICc 3\.5 behind the quadratic-plateau, within 4 units: the data cannot tell the two apart, and the lower answer is kept$/,
    },
    {
      name: 'says why a better fit does not lead when the lead is more than 4 AICc behind',
      list: [
        ['quadraticPlateau', 'no-plateau', 0],
        ['quadratic', 'ok', 6],
      ],
      model: 'quadratic',
      reason:
        /ΔAICc 6\.0 from the best; the better-fitting quadratic-plateau gives no usable rate: its yields rise without levelling off/,
    },
    {
      name: 'falls back on a straight line, saying it gives only a corner',
      list: [
        ['quadratic', 'convex', 0],
        ['proportional', 'ok', 1],
      ],
      model: 'proportional',
      reason: /straight line gives only a corner rate/,
    },
    {
      name: 'gives no model when none gives a rate',
      list: [['quadratic', 'convex', 0]],
      model: null,
      reason: /^no model gave an economic optimum$/,
    },
  ];
  for (const c of cases)
    it(`recommendationModel ${c.name}`, () => {
      const r = recommendationModel(ranked(c.list));
      expect(r.model).toBe(c.model);
      expect(r.reason).toMatch(c.reason);
    });
});

describe('the report and the regional return recommend from the same model', () => {
  const table = pooledPlotTable();
  const report = reportOf(
    table,
    {
      units: { rate: 'kg/ha', yield: 'kg/ha' },
      unitSystem: 'metric',
      currency: 'USD',
      crop: table.crop,
      prices: { grainPrice: 0.18, nutrientPrice: 1.1, product: null, defaulted: false },
      boot: 0,
      seed: 1,
      blocks: 'none',
      intervalLevel: 0.9,
    },
    { tool: { name: 'Plotrate', version: 'test' }, createdAt: '2026-01-01T00:00:00Z', mapping: [] },
  );
  const prices = {
    grainPricePerKg: report.prices.grainPricePerKg,
    nutrientPricePerKg: report.prices.nutrientPricePerKg,
  };
  const analysis = analyzeAcrossSites(table, { prices, blocks: 'none' });

  it("analyzeTrials' bestModel is each site's recommendationModel and the model it adds to the regional mean", () => {
    expect(report.sites.map((s) => s.site)).toEqual(analysis.sites.map((s) => s.site));
    analysis.sites.forEach((s, i) => {
      expect(s.recommended.model).not.toBeNull();
      expect(report.sites[i].bestModel).toBe(s.recommended.model);
      expect(report.sites[i].bestModelReason).toBe(s.recommended.reason);
      const used = analysis.regional.sitesUsed.find((u) => u.site === s.site);
      expect(used?.model).toBe(s.recommended.model);
    });
  });

  it("analyzeTrials' regional rate is the across-site analysis' rate at the same prices", () => {
    expect(report.acrossSites).not.toBeNull();
    expect(report.acrossSites!.bestRateKgHa).toBe(analysis.regional.regional.bestRateKgHa);
    expect(report.acrossSites!.sites).toEqual(analysis.regional.sitesUsed.map((u) => u.site));
  });
});
