// The across-site analysis in steps (as the workspace's worker runs it) and with the user's
// model at a site, on the invented plots of tests/fixtures/sites/pooled.plots.csv.
import { describe, expect, it } from 'vitest';
import {
  acrossSites,
  analyzeAcrossSites,
  analyzeSite,
  planAcrossSites,
} from '../shared/analysis/analyzeAcrossSites';
import { chooseSiteModels } from '../shared/analysis/chooseSiteModels';
import { leadingModel } from '../shared/analysis/leadingModel';
import { repriceAcrossSites } from '../shared/analysis/repriceAcrossSites';
import { SitesInputError } from '../shared/analysis/sitesInputError';
import { pearsonCorrelation } from '../shared/stats/pearson';
import { sitePlots } from '../shared/analysis/sitePlots';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import {
  analyzeTrial,
  analyzeTrialDrawnBy,
  analyzeTrialSteps,
} from '../shared/analysis/analyzeTrial';
import { drawSite, siteDraws } from '../shared/analysis/analyzeSite';
import { pooledPlotTable } from './analysis.fixtures';

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };
const table = pooledPlotTable();
const whole = analyzeAcrossSites(table, { prices });

describe('planAcrossSites, analyzeSite and acrossSites', () => {
  it('site by site give the same analysis as the one-call form', () => {
    const plan = planAcrossSites(table, { prices });
    const steps = acrossSites(
      plan,
      plan.plots.map((p) => analyzeSite(p, plan.options)),
    );
    expect(steps.regional.regional.bestRateKgHa).toBe(whole.regional.regional.bestRateKgHa);
    expect(steps.sites.map((s) => s.recommended.model)).toEqual(
      whole.sites.map((s) => s.recommended.model),
    );
    expect(steps.rows.map((r) => r.optimumRateKgHa)).toEqual(
      whole.rows.map((r) => r.optimumRateKgHa),
    );
    expect(steps.sharedResponse.quadratic.tests.map((t) => t.sentence)).toEqual(
      whole.sharedResponse.quadratic.tests.map((t) => t.sentence),
    );
  });

  it('analyzeTrialSteps fits every site, previews them, then resamples them: the draws analyzeSite makes in one go', () => {
    const settings = analysisSettings({ prices, resamples: 30, seed: 9 });
    const steps = analyzeTrialSteps(table, settings);
    const kinds: string[] = [];
    let previewDraws: unknown[] = [];
    let resampled: unknown[] = [];
    let step = steps.next();
    for (; !step.done; step = steps.next()) {
      const s = step.value;
      kinds.push(s.kind);
      if (s.kind === 'preview') previewDraws = s.analysis.across.sites.map((x) => x.draws);
      if (s.kind === 'resampled') resampled = s.draws;
    }
    const n = whole.sites.length;
    expect(kinds).toEqual([
      ...Array<string>(n).fill('site'),
      'preview',
      'draws-wanted',
      ...Array<string>(n).fill('resampling'),
      'resampled',
    ]);
    expect(previewDraws).toEqual(Array(n).fill(null));
    const plan = planAcrossSites(table, { prices, resamples: 30, seed: 9 });
    const inOneGo = plan.plots.map((p, i) => analyzeSite(p, plan.options, i).draws);
    expect(inOneGo.every((d) => d !== null && d.resamples === 30)).toBe(true);
    expect(resampled).toEqual(inOneGo);
    expect(step.value.across.sites.map((x) => x.draws)).toEqual(inOneGo);
    const fitted = analyzeSite(plan.plots[0], { ...plan.options, resamples: 0 }, 0);
    expect(fitted.draws).toBeNull();
    expect(siteDraws(plan.plots[0], fitted, plan.options, 0)).toEqual(inOneGo[0]);
  });

  it('analyzeTrialDrawnBy: draws made from jobs copied as to a thread are the draws analyzeTrial makes', async () => {
    const settings = analysisSettings({ prices, resamples: 30, seed: 4 });
    const here = analyzeTrial(table, settings);
    const seen: number[] = [];
    const elsewhere = await analyzeTrialDrawnBy(
      table,
      settings,
      async (jobs, onDrawn) => {
        // Drawn in reverse, each job and its draws copied as postMessage copies them.
        const out = jobs.map(() => null as ReturnType<typeof drawSite> | null);
        for (let i = jobs.length - 1; i >= 0; i--) {
          const job = jobs[i] && structuredClone(jobs[i]);
          out[i] = job && structuredClone(drawSite(job));
          onDrawn(jobs.length - i);
        }
        return out;
      },
      (done, total, stage) => {
        if (stage === 'resampled') seen.push(done);
      },
    );
    const n = here.across.sites.length;
    expect(seen).toEqual(Array.from({ length: n }, (_, i) => i + 1));
    expect(elsewhere.across.sites.map((s) => s.draws)).toEqual(
      here.across.sites.map((s) => s.draws),
    );
    expect(elsewhere.across.sites.every((s) => s.draws?.resamples === 30)).toBe(true);
    // A drawer that returns the wrong number of sites is an error, not a shifted result.
    await expect(
      analyzeTrialDrawnBy(table, settings, async (jobs) => jobs.slice(1).map(() => null)),
    ).rejects.toThrow(/draws for \d+ sites/);
  });

  it('acrossSites refuses sites that are not the plan’s, in its order', () => {
    const plan = planAcrossSites(table, { prices });
    const sites = plan.plots.map((p) => analyzeSite(p, plan.options));
    expect(() => acrossSites(plan, [...sites].reverse())).toThrow(SitesInputError);
    expect(() => acrossSites(plan, sites.slice(1))).toThrow(/in the plan's order/);
  });

  it("analyzeSite gives each site's Pearson r of yield on rate, as stats/pearson computes it", () => {
    const plots = sitePlots(table);
    for (const [i, s] of whole.sites.entries()) {
      const r = pearsonCorrelation(plots[i].rateKgHa, plots[i].yieldKgHa);
      expect(s.correlation).toEqual(r);
      // The fixture's sites all respond: yield rises with rate.
      expect('r' in s.correlation && s.correlation.r).toBeGreaterThan(0.5);
    }
  });
});

describe('leadingModel and chooseSiteModels', () => {
  const first = whole.sites[0];
  const other = first.recommended.model === 'quadratic' ? 'linearPlateau' : 'quadratic';

  it("leadingModel is the user's model when fitted, else the recommendation model", () => {
    expect(leadingModel(first, {})).toBe(first.recommended.model);
    expect(leadingModel(first, { [first.site]: other })).toBe(other);
    expect(leadingModel(first, { 'no such site': other })).toBe(first.recommended.model);
  });

  it('chooseSiteModels returns the analysis itself when nothing is chosen', () => {
    expect(chooseSiteModels(whole, {})).toBe(whole);
  });

  it("chooseSiteModels puts the user's model in the regional mean, as a fresh analysis with that choice", () => {
    const mine = chooseSiteModels(whole, { [first.site]: other });
    expect(mine.regional.sitesUsed.find((u) => u.site === first.site)?.model).toBe(other);
    const fresh = analyzeAcrossSites(table, { prices, siteModels: { [first.site]: other } });
    expect(mine.regional.regional.meanReturnPerHa).toEqual(fresh.regional.regional.meanReturnPerHa);
    expect(mine.regional.regional.siteOptima).toEqual(fresh.regional.regional.siteOptima);
    // The other sites keep their recommendation models.
    for (const u of mine.regional.sitesUsed.filter((x) => x.site !== first.site))
      expect(u.model).toBe(whole.sites.find((s) => s.site === u.site)?.recommended.model);
  });

  it('repriceAcrossSites after chooseSiteModels matches a fresh analysis at the new prices and choice', () => {
    const dearer = { ...prices, nutrientPricePerKg: 1.6, applicationCostPerHa: 12 };
    const moved = repriceAcrossSites(chooseSiteModels(whole, { [first.site]: other }), dearer);
    const fresh = analyzeAcrossSites(table, {
      prices: dearer,
      siteModels: { [first.site]: other },
    });
    expect(moved.regional.regional.bestRateKgHa).toBe(fresh.regional.regional.bestRateKgHa);
    expect(moved.regional.regional.bestMeanReturnPerHa).toBeCloseTo(
      fresh.regional.regional.bestMeanReturnPerHa,
      9,
    );
  });
});
