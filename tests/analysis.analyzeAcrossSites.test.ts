// The across-site analysis as a whole, on the invented plots of
// tests/fixtures/sites/pooled.plots.csv (written by pooled.R with R 4.2.2).
import { MODEL_NAMES } from '../shared/models/curves';
import { describe, expect, it } from 'vitest';
import { analyzeAcrossSites } from '../shared/analysis/analyzeAcrossSites';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial } from '../shared/analysis/analyzeTrial';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { repriceAcrossSites } from '../shared/analysis/repriceAcrossSites';
import { filterSiteRows, sortSiteRows } from '../shared/analysis/siteModelRows';
import { SitesInputError } from '../shared/analysis/sitesInputError';
import { recommendationCautions } from '../shared/economics/recommendationCautions';
import { economicOptimum } from '../shared/economics/economicOptimum';
import type { PlotTable } from '../shared/table/plotTable';
import type { FTestResult, NoTest } from '../shared/analysis/extraSumOfSquaresTest';
import { plateauFitters } from '../shared/analysis/plateauModels';
import { pooledPlotTable, readRCsv, sitesPlotTable } from './analysis.fixtures';

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };

/** The fixture plus a seventh site whose plots are all excluded. */
function tableWithEmptySite(): PlotTable {
  const t = pooledPlotTable();
  const extra = t.plots.slice(0, 3).map((p, i) => ({
    ...p,
    id: `extra|${i}`,
    site: 'Gorse Lane',
    excluded: { reason: 'hail', by: 'sheet' as const },
  }));
  return { ...t, plots: [...t.plots, ...extra] };
}

describe('analyzeAcrossSites on the pooled fixture', () => {
  const a = analyzeAcrossSites(tableWithEmptySite(), { prices });

  it('analyzeAcrossSites keeps a site with no analyzable plot, with its reason, in sites and rows', () => {
    expect(a.sites.map((s) => s.site)).toEqual([
      'Alder Flats',
      'Birch Hollow',
      'Cedar Rise',
      'Dunmore East',
      'Elm Crossing',
      'Fallow Gate',
      'Gorse Lane',
    ]);
    const gorse = a.rows.filter((r) => r.site === 'Gorse Lane');
    expect(gorse).toHaveLength(MODEL_NAMES.length);
    expect(
      gorse.every((r) => r.status === 'not-fitted' && /none of the site's 3 plots/.test(r.message)),
    ).toBe(true);
    expect(a.regional.sitesLeftOut).toEqual([
      { site: 'Gorse Lane', reason: expect.stringMatching(/excluded/) },
    ]);
    expect(a.sharedResponse.quadratic.sitesLeftOut.map((s) => s.site)).toEqual(['Gorse Lane']);
    expect(a.sharedResponse.plateau.linearPlateau.partsLeftOut.map((s) => s.site)).toEqual([
      'Gorse Lane',
    ]);
    expect(a.response.notAssessed.map((s) => s.site)).toEqual(['Gorse Lane']);
  });

  it("analyzeAcrossSites rows carry each fit's EONR from shared/economics and mark one AICc winner per site", () => {
    for (const s of a.sites.slice(0, 6)) {
      const rows = a.rows.filter((r) => r.site === s.site);
      expect(rows.filter((r) => r.aiccWinner).map((r) => r.model)).toEqual([s.fits!.best]);
      const q = rows.find((r) => r.model === 'quadratic')!;
      expect(q.optimumRateKgHa).toBe(economicOptimum(s.fits!.fits.quadratic, prices).rateKgHa);
    }
  });

  it('analyzeAcrossSites counts every fixture site as responded (R gives rate-effect p < 1e-5 at each)', () => {
    const r = readRCsv('pooled.anova.csv').filter((x) => x.test === 'rate-effect');
    expect(r.every((x) => Number(x.p) < 1e-5)).toBe(true);
    expect(a.response).toMatchObject({ responded: 6, assessed: 6, share: 1 });
  });

  it("analyzeAcrossSites puts the regional rate inside the sites' optimum range, with the cautions", () => {
    const reg = a.regional.regional;
    const d = reg.siteOptimumDistribution!;
    expect(d.n).toBe(6);
    expect(reg.bestRateKgHa).toBeGreaterThanOrEqual(d.minKgHa);
    expect(reg.bestRateKgHa).toBeLessThanOrEqual(d.maxKgHa);
    expect(reg.gridKgHa[reg.gridKgHa.length - 1]).toBe(225);
    expect(reg.profitableRange.lowKgHa).toBeLessThanOrEqual(reg.bestRateKgHa);
    expect(reg.profitableRange.highKgHa).toBeGreaterThanOrEqual(reg.bestRateKgHa);
    expect(a.regional.text.cautions).toBe(recommendationCautions);
  });

  it('analyzeAcrossSites analyses each previous crop and tests whether they differ', () => {
    expect(a.groups.map((g) => g.key)).toEqual(['previousCrop']);
    const g = a.groups[0];
    expect(g.values.map((v) => [v.value, v.sites.length])).toEqual([
      ['soybean', 3],
      ['corn', 3],
    ]);
    expect(g.sitesWithoutValue).toEqual([
      { site: 'Gorse Lane', reason: 'no value of previousCrop' },
    ]);
    const r = readRCsv('pooled.anova.csv').find(
      (x) => x.test === 'groups' && x.model === 'quadratic',
    )!;
    const t = g.differ.quadratic.result;
    expect(t.kind === 'f-test' && Math.abs(t.f - Number(r.F)) <= 1e-9 * Number(r.F)).toBe(true);
    expect(g.differ.plateau.linearPlateau.partsUsed).toEqual(['soybean', 'corn']);
  });

  it('a group value every site shares reuses the whole analysis, naming its sites', () => {
    // Invented sites, one year: the value's regional rate is the trial's own (not refitted), and
    // the value lists site names, not the site analyses (which once doubled the window's copy).
    const table = syntheticPlotTable({ sites: 3, seed: 4 });
    const trial = analyzeTrial(table, analysisSettings({ prices, resamples: 0 }));
    const [value] = trial.across.groups[0].values;
    expect(trial.across.groups[0].values).toHaveLength(1);
    expect(Object.keys(value).sort()).toEqual([
      'regional',
      'response',
      'sharedResponse',
      'sites',
      'value',
    ]);
    expect(value.sites).toEqual(trial.across.sites.map((x) => x.site));
    expect(value.regional).toBe(trial.across.regional);
  });

  it('repriceAcrossSites gives what a fresh analysis at the new prices gives', () => {
    const dear = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.6 };
    const again = analyzeAcrossSites(tableWithEmptySite(), { prices: dear });
    const re = repriceAcrossSites(a, dear);
    expect(re.regional.regional.bestRateKgHa).toBe(again.regional.regional.bestRateKgHa);
    expect(Array.from(re.regional.regional.meanReturnPerHa)).toEqual(
      Array.from(again.regional.regional.meanReturnPerHa),
    );
    expect(re.rows.map((r) => r.optimumRateKgHa)).toEqual(again.rows.map((r) => r.optimumRateKgHa));
    expect(re.groups[0].values[1].regional.regional.bestRateKgHa).toBe(
      again.groups[0].values[1].regional.regional.bestRateKgHa,
    );
    // Dearer N never raises the best rate.
    expect(re.regional.regional.bestRateKgHa).toBeLessThanOrEqual(a.regional.regional.bestRateKgHa);
  });

  it('analyzeAcrossSites throws SitesInputError for alpha outside (0, 1)', () => {
    expect(() => analyzeAcrossSites(pooledPlotTable(), { prices, alpha: 1 })).toThrow(
      new SitesInputError('bad-argument', 'alpha is 1; it must lie strictly between 0 and 1.'),
    );
  });
});

describe('sortSiteRows and filterSiteRows', () => {
  const a = analyzeAcrossSites(tableWithEmptySite(), { prices });
  it('sortSiteRows orders by optimum, empty optima last in both directions', () => {
    const asc = sortSiteRows(a.rows, 'optimumRateKgHa');
    const desc = sortSiteRows(a.rows, 'optimumRateKgHa', 'desc');
    const values = (rows: typeof asc) =>
      rows.map((r) => r.optimumRateKgHa).filter((v) => v !== null);
    expect(values(asc)).toEqual([...values(asc)].sort((x, y) => x! - y!));
    expect(values(desc)).toEqual([...values(asc)].reverse());
    expect(asc[asc.length - 1].optimumRateKgHa).toBeNull();
    expect(desc[desc.length - 1].optimumRateKgHa).toBeNull();
  });
  it('filterSiteRows keeps the AICc winners of one previous crop', () => {
    const rows = filterSiteRows(a.rows, {
      aiccWinnersOnly: true,
      group: { key: 'previousCrop', value: 'corn' },
    });
    expect(rows.map((r) => r.site)).toEqual(['Dunmore East', 'Elm Crossing', 'Fallow Gate']);
  });
  it('sortSiteRows throws for an unknown column', () => {
    expect(() => sortSiteRows(a.rows, 'color' as never)).toThrow(/"color" is not a column/);
  });
});

/**
 * An F test as R's fixture row gives it: the same df, F to 1e-6 and p to 1e-5 relative (above
 * an absolute floor for p-values near 0).
 */
function expectFTestOfR(
  result: FTestResult | NoTest,
  row: Record<string, string>,
  pFloor = 1e-9,
): void {
  if (result.kind !== 'f-test') throw new Error(`expected a test: ${result.reason}`);
  expect([result.df1, result.df2]).toEqual([Number(row.df1), Number(row.df2)]);
  expect(Math.abs(result.f - Number(row.F))).toBeLessThanOrEqual(1e-6 * Number(row.F));
  expect(Math.abs(result.p - Number(row.p))).toBeLessThanOrEqual(pFloor + 1e-5 * Number(row.p));
}

describe('pooled plateau and exponential tests against R (tests/fixtures/sites/pooledPlateau.R, R 4.2.2)', () => {
  // R profiles the join with optimize() on every interval between rates (the exponential: ln k
  // on a grid, then optimize()), inner fit lm();
  // SSE agrees to 1e-7 relative (a flat minimum: SSE is insensitive to small x0 errors).
  const r = readRCsv('pooledPlateau.csv');
  const a = analyzeAcrossSites(pooledPlotTable(), { prices });
  for (const model of ['linearPlateau', 'quadraticPlateau', 'exponential'] as const) {
    it(`the ${model} pooled-versus-site-curves F-test matches R's profiled fits`, () => {
      const rows = r.filter((x) => x.model === model);
      const pooledR = rows.find((x) => x.part === '(pooled)')!;
      const separateR = rows
        .filter((x) => !x.part.startsWith('('))
        .reduce((s, x) => s + Number(x.sse), 0);
      const t = a.sharedResponse.plateau[model];
      expect(t.partsUsed).toHaveLength(6);
      expect(Math.abs(t.pooled!.sse - Number(pooledR.sse))).toBeLessThanOrEqual(
        1e-7 * Number(pooledR.sse),
      );
      expect(Math.abs(t.separate!.sse - separateR)).toBeLessThanOrEqual(1e-7 * separateR);
      expectFTestOfR(t.result, pooledR);
    });

    it(`the ${model} test of one curve per previous crop against one for all matches R`, () => {
      const testR = r.find((x) => x.model === model && x.part === '(previousCrop test)')!;
      const g = a.groups[0].differ.plateau[model];
      expect(g.partsUsed).toEqual(['soybean', 'corn']);
      expect(Math.abs(g.separate!.sse - Number(testR.sse))).toBeLessThanOrEqual(
        1e-7 * Number(testR.sse),
      );
      expectFTestOfR(g.result, testR);
    });
  }
});

describe('pooled plateau tests count what fits at a limit estimate (tests/fixtures/sites/pooledDegenerate.R, R 4.2.2)', () => {
  // R fits each site without block terms, decides what the fit reduces to (a straight line or
  // the quadratic with its vertex at the highest rate: 2 parameters; a step: 2; flat: 1; else
  // 3) by the documented rules coded from scratch, and fits that limit by lm(). One curve per
  // site then has 3 + 3 + 2 + 2 + 1 = 11 parameters, not 15: the F test has 8 and 109 df.
  const r = readRCsv('pooledDegenerate.csv');
  const table = sitesPlotTable('pooledDegenerate.plots.csv');
  const a = analyzeAcrossSites(table, { prices });
  // One set of fitters and one pair of arrays per site for all three models, as the pooled tests
  // use them: the models share each site's preparation, and each must still match R.
  const fitters = plateauFitters();
  const sitePlotArrays = new Map<string, { x: Float64Array; y: Float64Array }>();
  const arraysOf = (site: string) => {
    if (!sitePlotArrays.has(site)) {
      const plots = table.plots.filter((p) => p.site === site);
      sitePlotArrays.set(site, {
        x: Float64Array.from(plots, (p) => p.rateKgHa!),
        y: Float64Array.from(plots, (p) => p.yieldKgHa!),
      });
    }
    return sitePlotArrays.get(site)!;
  };
  for (const model of ['linearPlateau', 'quadraticPlateau', 'exponential'] as const) {
    const rows = r.filter((x) => x.model === model);
    it(`the ${model} fit of each site counts the parameters of what it reduces to, as R does`, () => {
      const statuses = new Set<string>();
      for (const row of rows.filter((x) => !x.part.startsWith('('))) {
        const { x, y } = arraysOf(row.part);
        const out = fitters[model](x, y);
        if ('problem' in out) throw new Error(out.problem);
        expect(out.parameters, row.part).toBe(Number(row.parameters));
        expect(Math.abs(out.sse - Number(row.sse))).toBeLessThanOrEqual(1e-7 * Number(row.sse));
        statuses.add(row.status);
      }
      // The fixture holds every limit: no plateau, full response and no response.
      expect(statuses).toEqual(
        new Set(['ok', 'no-plateau', 'full-response-at-lowest-rate', 'no-response']),
      );
    });

    it(`the ${model} pooled-versus-site-curves F test has R's degrees of freedom, F and p`, () => {
      const pooledR = rows.find((x) => x.part === '(pooled)')!;
      const t = a.sharedResponse.plateau[model];
      expect(t.partsUsed).toHaveLength(5);
      expect(t.separate!.parameters).toBe(11);
      expectFTestOfR(t.result, pooledR, 1e-12);
    });
  }
});

describe('analyzeAcrossSites with one model for all sites', () => {
  // Cross-check of the grid search against shared/economics' closed form for the quadratic,
  // x* = (PR − b)/(2c) (DESIGN.md): on a 1 kg/ha grid the best rate of a single site's
  // concave quadratic is the grid rate nearest x*, so within 0.5 kg/ha.
  const table = pooledPlotTable();
  for (const site of ['Alder Flats', 'Dunmore East', 'Fallow Gate']) {
    it(`the regional rate of ${site} alone is its quadratic EONR to the nearest kg/ha`, () => {
      const one = { ...table, plots: table.plots.filter((p) => p.site === site) };
      const a = analyzeAcrossSites(one, { prices, regionalModel: 'quadratic' });
      expect(a.regional.sitesUsed).toEqual([{ site, model: 'quadratic', note: '' }]);
      const eonr = economicOptimum(a.sites[0].fits!.fits.quadratic, prices);
      expect(eonr.status).toBe('interior');
      expect(Math.abs(a.regional.regional.bestRateKgHa - eonr.rateKgHa!)).toBeLessThanOrEqual(0.5);
      expect(a.regional.gridNote).toMatch(
        /to 225 kg\/ha in steps of 1 kg\/ha: 225 kg\/ha is the highest rate tested/,
      );
    });
  }
});

describe('analyzeAcrossSites does not depend on the order of the sites', () => {
  it('reversing the sites leaves the regional rate, its range and every pooled F unchanged', () => {
    const t = pooledPlotTable();
    const a = analyzeAcrossSites(t, { prices });
    const b = analyzeAcrossSites({ ...t, plots: [...t.plots].reverse() }, { prices });
    expect(b.sites.map((s) => s.site)).toEqual(a.sites.map((s) => s.site).reverse());
    expect(b.regional.regional.bestRateKgHa).toBe(a.regional.regional.bestRateKgHa);
    expect(b.regional.regional.profitableRange).toEqual(a.regional.regional.profitableRange);
    const fs = (x: typeof a) =>
      [
        ...x.sharedResponse.linear.tests,
        ...x.sharedResponse.quadratic.tests,
        ...x.sharedResponse.proportional.tests,
        ...Object.values(x.sharedResponse.plateau),
      ].map((test) => (test.result.kind === 'f-test' ? test.result.f : NaN));
    const fa = fs(a);
    fs(b).forEach((f, i) => expect(Math.abs(f - fa[i])).toBeLessThanOrEqual(1e-7 * fa[i]));
  });
});

describe('analyzeAcrossSites result as plain data', () => {
  it('survives structuredClone (a worker can post it) and reprices the same after the copy', () => {
    const a = analyzeAcrossSites(pooledPlotTable(), { prices });
    const copy = structuredClone(a);
    const dear = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.6 };
    expect(repriceAcrossSites(copy, dear).regional.regional.bestRateKgHa).toBe(
      repriceAcrossSites(a, dear).regional.regional.bestRateKgHa,
    );
  });
});

describe('analyzeAcrossSites with a site that never levels off', () => {
  // An invented straight-line site (6000 + 18·x kg/ha with small symmetric deviations): the
  // plateau models and the exponential reach no plateau, so their limit curve stands in
  // (DESIGN.md: the straight line, or the quadratic for the quadratic-plateau).
  const t = pooledPlotTable();
  const rates = [0, 45, 90, 135, 180, 225];
  const dev = [40, -25, -15, 0, 25, -40, 15, 0];
  const line = rates.flatMap((r, i) =>
    [0, 1, 2, 3].map((b) => ({
      ...t.plots[0],
      id: `line|${i}|${b}`,
      site: 'Juniper Row',
      block: `B${b + 1}`,
      rateKgHa: r,
      yieldKgHa: 6000 + 18 * r + dev[(i + b * 3) % 8] + (i % 2 ? 30 : -30) * (b % 2 ? 1 : -1),
    })),
  );
  const table = { ...t, plots: [...t.plots, ...line] };
  for (const [model, limit] of [
    ['exponential', 'linear'],
    ['linearPlateau', 'linear'],
  ] as const) {
    it(`keeps the site in the regional mean through the ${limit} when the ${model} has no plateau`, () => {
      const a = analyzeAcrossSites(table, { prices, regionalModel: model });
      const fit = a.sites.find((s) => s.site === 'Juniper Row')!.fits!.fits[model];
      expect(fit.status).toBe('no-plateau');
      expect(a.regional.sitesLeftOut).toEqual([]);
      const used = a.regional.sitesUsed.find((u) => u.site === 'Juniper Row')!;
      expect(used.model).toBe(limit);
      expect(used.note).toMatch(/reached no plateau, so its limit, the straight line, is used/);
    });
  }
});

describe('analyzeAcrossSites with nothing to fit', () => {
  it('lists every site with its reason and gives no regional rate, cautions still attached', () => {
    const t = pooledPlotTable();
    const none = {
      ...t,
      plots: t.plots.map((p) => ({ ...p, excluded: { reason: 'flooded', by: 'user' as const } })),
    };
    const a = analyzeAcrossSites(none, { prices });
    expect(a.sites).toHaveLength(6);
    expect(a.sites.every((s) => s.problem !== null && s.fits === null)).toBe(true);
    expect(a.regional.sitesLeftOut).toHaveLength(6);
    expect(a.regional.regional.bestRateKgHa).toBeNaN();
    expect(a.regional.text.sentence).toBe(
      'No regional rate: no site has a fitted response to average.',
    );
    expect(a.regional.text.cautions.length).toBeGreaterThanOrEqual(5);
    expect(a.response).toMatchObject({ responded: 0, assessed: 0 });
    expect(a.sharedResponse.quadratic.tests.every((x) => x.result.kind === 'no-test')).toBe(true);
  });
});

describe('analyzeAcrossSites with a site the models refuse', () => {
  // Negative rates are impossible values: the table leaves them out of the fits
  // (shared/table/plotTable analyzablePlots), so a site of nothing else has no plot to fit.
  it('keeps a site whose every rate is negative, with its reason, out of every pooled test', () => {
    const t = pooledPlotTable();
    const bad = t.plots
      .filter((p) => p.site === 'Alder Flats')
      .map((p, i) => ({
        ...p,
        id: `bad|${i}`,
        site: 'Hazel Patch',
        rateKgHa: -10 - (p.rateKgHa ?? 0),
      }));
    const a = analyzeAcrossSites({ ...t, plots: [...t.plots, ...bad] }, { prices });
    const hazel = a.sites.find((s) => s.site === 'Hazel Patch')!;
    expect(hazel.fits).toBeNull();
    expect(hazel.problem).toMatch(/none of the site's \d+ plots can be analyzed/);
    for (const x of [
      a.sharedResponse.linear,
      a.sharedResponse.quadratic,
      a.sharedResponse.proportional,
    ]) {
      expect(x.sitesLeftOut).toEqual([{ site: 'Hazel Patch', reason: hazel.problem }]);
    }
    expect(a.regional.sitesLeftOut.map((s) => s.site)).toEqual(['Hazel Patch']);
    expect(
      a.rows.filter((r) => r.site === 'Hazel Patch').every((r) => r.status === 'not-fitted'),
    ).toBe(true);
  });
});
