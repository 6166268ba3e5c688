// The results JSON: its keys are the documented schema (README "Results
// format"), its numbers are in the units it names, and the same seed gives the
// same file. Unit factors from the exact pound and acre (NIST SP 811) and the
// 56 lb corn bushel (USDA).
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { fitRegionalPlateauMixedModel } from '../shared/analysis/regionalPlateauMixedModel';
import {
  resultsJson,
  resultsJsonPieces,
  resultsJsonText,
  type ResultsJson,
} from '../shared/report/resultsJson';
import type { TrialReport } from '../shared/report/trialReport';
import { demoReport, gainsOverBlockCheck } from './report.fixture';

const KG_HA_PER_LB_AC = 0.45359237 / (43560 * 0.3048 * 0.3048 * 1e-4);

let us: TrialReport;
let json: ResultsJson;

beforeAll(async () => {
  us = await demoReport('us', 40);
  json = resultsJson(us);
});

describe('resultsJson', () => {
  it('has exactly the documented fields', () => {
    expect(Object.keys(json).sort()).toEqual([
      'acrossSites',
      'settings',
      'sites',
      'tool',
      'yearsCompared',
    ]);
    // One season: no site has several years, so nothing to compare.
    expect(json.yearsCompared).toEqual([]);
    expect(Object.keys(json.tool).sort()).toEqual(['name', 'version']);
    for (const k of [
      'units',
      'crop',
      'grainPrice',
      'nutrientPrice',
      'priceRatio',
      'boot',
      'seed',
    ]) {
      expect(json.settings).toHaveProperty(k);
    }
    const site = json.sites[0];
    for (const k of [
      'site',
      'year',
      'n',
      'interceptTest',
      'responseOverCheck',
      'lackOfFit',
      'bestModel',
      'optimumCIBootstrap',
      'models',
      'priceRatioSensitivity',
      'shortfallRisk',
    ])
      expect(site).toHaveProperty(k);
    expect(Object.keys(site.priceRatioSensitivity[0]).sort()).toEqual([
      'interval',
      'priceRatio',
      'rate',
      'ratioMultiplier',
    ]);
    expect(Object.keys(site.shortfallRisk!).sort()).toEqual([
      'resamples',
      'rows',
      'tolerance',
      'toleranceUnit',
    ]);
    expect(Object.keys(site.shortfallRisk!.rows[0]).sort()).toEqual([
      'rate',
      'recommended',
      'share',
    ]);
    expect(json.settings).toHaveProperty('shortfallTolerance');
    expect(json.settings).toHaveProperty('shortfallToleranceDefault');
    expect(Object.keys(json.acrossSites!.priceRatioSensitivity[0]).sort()).toEqual([
      'priceRatio',
      'profitableRange',
      'rate',
      'ratioMultiplier',
    ]);
    expect(Object.keys(json.acrossSites!.shortfallRisk!).sort()).toEqual([
      'rows',
      'sites',
      'tolerance',
      'toleranceUnit',
    ]);
    expect(Object.keys(site.optimumCIBootstrap!).sort()).toEqual([
      'basis',
      'level',
      'modelShares',
      'resamples',
      'seed',
      'shares',
    ]);
    expect(Object.keys(site.optimumCIBootstrap!.shares).sort()).toEqual([
      'curve',
      'fullResponse',
      'noPlateau',
      'noResponse',
    ]);
    expect(Object.keys(site.interceptTest!).sort()).toEqual(['F', 'df1', 'df2', 'p', 't']);
    expect(Object.keys(site.responseOverCheck!).sort()).toEqual([
      'biasPresent',
      'curvatureTest',
      'interceptTest',
      'reading',
      'slope',
      'slopeCI',
    ]);
    expect(Object.keys(site.responseOverCheck!.interceptTest).sort()).toEqual([
      'F',
      'df1',
      'df2',
      'p',
      't',
    ]);
    for (const m of site.models) {
      for (const k of [
        'model',
        'status',
        'params',
        'stdErrors',
        'sse',
        'dfResidual',
        'aicc',
        'optimumRate',
        'optimumCI',
        'yieldAtOptimum',
        'joinProfileInterval',
        'optimumProfileInterval',
      ]) {
        expect(m).toHaveProperty(k);
      }
    }
    expect(json.acrossSites).toHaveProperty('bestRate');
    expect(json.acrossSites!.profitableRange).toHaveLength(2);
  });

  it('states the units and gives the price ratio as nutrient price over grain price in bu per lb N', () => {
    expect(json.settings.units).toEqual({ rate: 'lb/ac', yield: 'bu/ac' });
    // Urea 46 % N at 0.30 per lb: 0.30 / 0.46 per lb of N.
    expect(json.settings.nutrientPrice).toBeCloseTo(0.3 / 0.46, 9);
    expect(json.settings.priceRatio).toBeCloseTo(0.3 / 0.46 / 4.5, 9);
  });

  it('converts rates, yields and parameters from kg/ha by the exact factors', () => {
    us.sites.forEach((s, i) => {
      const js = json.sites[i];
      expect(js.n).toBe(s.n);
      s.models.forEach((m, j) => {
        const jm = js.models[j];
        expect(jm.model).toBe(m.model);
        if (m.optimumRateKgHa !== null) {
          expect(jm.optimumRate!).toBeCloseTo(m.optimumRateKgHa / KG_HA_PER_LB_AC, 8);
        }
        if (m.yieldAtOptimumKgHa !== null) {
          expect(jm.yieldAtOptimum!).toBeCloseTo(m.yieldAtOptimumKgHa / (56 * KG_HA_PER_LB_AC), 8);
        }
        if (m.joinProfile) {
          expect(jm.joinProfileInterval!.interval[0]).toBeCloseTo(
            m.joinProfile.lowKgHa / KG_HA_PER_LB_AC,
            8,
          );
          expect(jm.joinProfileInterval!.interval[1]).toBeCloseTo(
            m.joinProfile.highKgHa / KG_HA_PER_LB_AC,
            8,
          );
        } else {
          expect(jm.joinProfileInterval).toBeNull();
        }
        // A slope is yield per rate: kg grain/kg N → (bu/ac)/(lb/ac) = kg/kg × lb/bu-weight.
        if (m.model === 'linear') {
          expect(jm.params.b).toBeCloseTo(m.params.b / 56, 8);
        }
      });
    });
  });

  it('gives the gain over the check in bu/lb N as contrasts of a plain least-squares rate + block fit', () => {
    us.sites.forEach((s, i) => {
      const r = json.sites[i].responseOverCheck!;
      const { slope, gainAtZero: a } = gainsOverBlockCheck(s.plots);
      // kg grain/kg N → bu/lb N: ÷ 56 (the 56 lb corn bushel; the pound cancels).
      expect(r.slope).toBeCloseTo(slope.estimate / 56, 9);
      expect(r.slopeCI[0]).toBeCloseTo(slope.ciLow / 56, 9);
      expect(r.slopeCI[1]).toBeCloseTo(slope.ciHigh / 56, 9);
      expect(r.interceptTest.t).toBeCloseTo(a.t, 9);
      expect(r.interceptTest.F).toBeCloseTo(a.t * a.t, 8);
      expect(r.interceptTest.df1).toBe(1);
      expect(r.interceptTest.df2).toBe(a.df);
      expect(r.interceptTest.p).toBeCloseTo(a.p, 11);
      expect(r.biasPresent).toBe(r.reading === 'gain-at-zero');
      expect(r.reading === 'from-zero').toBe(a.p >= 0.05 && r.reading !== 'bends');
    });
    expect(json.settings.priceRatioUnit).toBe('bu/lb N');
  });

  it('writes null for a site whose gain over the check is not available', () => {
    const [first, ...rest] = us.sites;
    const without = resultsJson({
      ...us,
      sites: [
        { ...first, responseOverCheck: { available: false, message: 'no blocks.' } },
        ...rest,
      ],
    });
    expect(without.sites[0].responseOverCheck).toBeNull();
    expect(without.sites[1].responseOverCheck).toEqual(json.sites[1].responseOverCheck);
  });

  it('reports the chosen model with its bootstrap interval around its optimum', () => {
    for (const s of json.sites) {
      const best = s.models.find((m) => m.model === s.bestModel);
      if (!best?.optimumCI) continue;
      expect(best.optimumCI[0]).toBeLessThanOrEqual(best.optimumRate! + 1e-9);
      expect(best.optimumCI[1]).toBeGreaterThanOrEqual(best.optimumCI[0]);
    }
  });

  it('gives each reported join a profile interval that holds it, at the run’s level', () => {
    const joins = json.sites.flatMap((s) => s.models.filter((m) => m.joinProfileInterval));
    expect(joins.length).toBeGreaterThan(0);
    for (const m of joins) {
      const { interval, level } = m.joinProfileInterval!;
      expect(level).toBe(json.sites[0].recommendation.level);
      expect(interval[0]).toBeLessThanOrEqual(m.params.x0);
      expect(interval[1]).toBeGreaterThanOrEqual(m.params.x0);
    }
  });

  it('gives the price-ratio table in the output units, its 1× row the recommendation itself', () => {
    const multiples = [0.5, 0.75, 1, 1.5, 2];
    us.sites.forEach((s, i) => {
      const rows = json.sites[i].priceRatioSensitivity;
      expect(rows.map((r) => r.ratioMultiplier)).toEqual(multiples);
      for (const [j, r] of rows.entries()) {
        // The nitrogen price scaled, the grain price kept: the ratio in bu/lb N scales too.
        expect(r.priceRatio / (json.settings.priceRatio * r.ratioMultiplier)).toBeCloseTo(1, 10);
        expect(r.rate!).toBeCloseTo(s.priceRatioSensitivity[j].rateKgHa! / KG_HA_PER_LB_AC, 8);
      }
      expect(rows[2].rate).toBe(json.sites[i].recommendation.rate);
      expect(rows[2].interval).toEqual(json.sites[i].recommendation.interval);
    });
    const region = json.acrossSites!.priceRatioSensitivity;
    expect(region[2].rate).toBe(json.acrossSites!.bestRate);
    expect(region[2].profitableRange).toEqual(json.acrossSites!.profitableRange);
  });

  it('gives the shortfall risk with its tolerance per acre and the recommended rate marked', () => {
    // The default tolerance is the cost of 10 kg N/ha: 10 kg/ha is 10/1.120851 lb N/ac, at the
    // N price per lb, per acre.
    const perAcre = (json.settings.nutrientPrice * 10) / KG_HA_PER_LB_AC;
    expect(json.settings.shortfallToleranceDefault).toBe(true);
    expect(json.settings.shortfallTolerance).toBeCloseTo(perAcre, 9);
    for (const s of json.sites) {
      const risk = s.shortfallRisk!;
      expect(risk.tolerance).toBe(json.settings.shortfallTolerance);
      // The fixture's prices are in USD (tests/report.fixture.ts); every money unit names it.
      expect(json.settings.currency).toBe('USD');
      expect(risk.toleranceUnit).toBe('USD/ac');
      expect(risk.resamples).toBe(40);
      for (const r of risk.rows) expect(r.share >= 0 && r.share <= 1).toBe(true);
      expect(risk.rows.filter((r) => r.recommended).map((r) => r.rate)).toEqual([
        s.recommendation.rate,
      ]);
    }
    const region = json.acrossSites!.shortfallRisk!;
    expect(region.sites).toBe(json.acrossSites!.sites.length);
    expect(region.rows.filter((r) => r.recommended).map((r) => r.rate)).toEqual([
      json.acrossSites!.bestRate,
    ]);
  });

  it('carries the regional mixed model in the file’s units, with R’s fixed effects', () => {
    // R 4.2.2, nlme::lme on the demo's corn sites (tests/fixtures/mixed/mixedModelFits.R, REML,
    // Psi unstructured; this report is run without block terms, so without blocks), in kg/ha; the file is in
    // lb/ac and bu/ac: a / (K·56), b / 56, c·K / 56 with K kg/ha per lb/ac (56 lb bushel).
    const reference = JSON.parse(
      readFileSync(new URL('./fixtures/mixed/mixedModelFits.json', import.meta.url), 'utf8'),
    ) as Record<string, { method: string; structure: string; blocks: boolean; fixed: number[] }[]>;
    const r = reference['demo-corn'].find(
      (f) => f.method === 'REML' && f.structure === 'unstructured' && !f.blocks,
    )!;
    const mixed = json.acrossSites!.mixed!;
    expect(Object.keys(mixed).sort()).toEqual([
      'aic',
      'blockOffsets',
      'fixed',
      'level',
      'method',
      'model',
      'optimumCI',
      'optimumRate',
      'siteYears',
      'stdErrors',
      'structure',
      'variance',
    ]);
    expect(mixed.siteYears).toBe(6);
    expect(mixed.blockOffsets).toBe(false);
    const expected = [
      r.fixed[0] / (KG_HA_PER_LB_AC * 56),
      r.fixed[1] / 56,
      (r.fixed[2] * KG_HA_PER_LB_AC) / 56,
    ];
    [mixed.fixed.a, mixed.fixed.b, mixed.fixed.c].forEach((v, i) =>
      expect(Math.abs(v / expected[i] - 1)).toBeLessThan(1e-4),
    );
    expect(mixed.level).toBe(json.sites[0].recommendation.level);
    if (mixed.optimumCI) {
      expect(mixed.optimumCI[0]).toBeLessThanOrEqual(mixed.optimumRate);
      expect(mixed.optimumCI[1]).toBeGreaterThanOrEqual(mixed.optimumRate);
    }
  });

  it('lists every regional mixed model form in the file’s units, with the sentence on their AIC', () => {
    const forms = json.acrossSites!.mixedModels;
    expect(forms.map((f) => f.model)).toEqual(['quadratic', 'quadraticPlateau', 'linearPlateau']);
    const [quadratic, qp, lp] = forms;
    // The quadratic's entry is acrossSites.mixed's fit, with its ML AIC.
    expect(quadratic.fixed).toEqual(json.acrossSites!.mixed!.fixed);
    expect(quadratic.aic).toBe(json.acrossSites!.mixed!.aic);
    // AIC = −2ℓ + 2k in the file's yield unit: k = 3 fixed + 2 variances (Psi diagonal) + σ².
    for (const f of [qp, lp]) {
      expect(f.structure).toBe('diagonal');
      expect(Math.abs(f.aic - (-2 * f.logLikelihood + 12))).toBeLessThan(1e-6);
      expect(f.variance.randomParameters).toEqual(['P', 'x0']);
    }
    // The same plots fitted by the engine in kg/ha (the demo's corn sites, as the R fixtures
    // read them: tests/fixtures/mixed/plateauSites.csv), then converted as the file converts:
    // P / (K·56) bu/ac, c·K² / (K·56), x0 / K lb/ac.
    const csv = readFileSync(new URL('./fixtures/mixed/plateauSites.csv', import.meta.url), 'utf8');
    const bySite = new Map<string, { rateKgHa: number[]; yieldKgHa: number[] }>();
    for (const line of csv.trim().split('\n').slice(1)) {
      const [set, site, , rate, y] = line.split(',');
      if (set !== 'demo-corn') continue;
      const g = bySite.get(site) ?? { rateKgHa: [], yieldKgHa: [] };
      g.rateKgHa.push(Number(rate));
      g.yieldKgHa.push(Number(y));
      bySite.set(site, g);
    }
    const m = fitRegionalPlateauMixedModel(
      [...bySite].map(([site, g]) => ({ site, ...g })),
      'quadraticPlateau',
    );
    if (m.model === null) throw new Error(m.reason);
    const K = KG_HA_PER_LB_AC;
    expect(Math.abs(qp.fixed.P / (m.fixed.P / (K * 56)) - 1)).toBeLessThan(1e-6);
    expect(Math.abs(qp.fixed.c / ((m.fixed.shape * K) / 56) - 1)).toBeLessThan(1e-6);
    expect(Math.abs(qp.fixed.x0 / (m.fixed.x0 / K) - 1)).toBeLessThan(1e-6);
    expect(qp.converged).toBe(true);
    // The linear-plateau cycles on these six site-years, as in R's nlme (see
    // tests/analysis.regionalPlateauMixedModel.reference.test.ts): said, and ranked only if it
    // stays within 0.1 %.
    expect(lp.converged).toBe(false);
    expect(lp.note).not.toBe('');
    expect(json.acrossSites!.mixedModelsSentence).toMatch(
      lp.settled ? /cycles between nearby solutions/ : /linear-plateau did not settle/,
    );
    // The sentence names the form with the lowest AIC and how much higher the others are.
    const best = forms.filter((f) => f.settled).reduce((a, f) => (f.aic < a.aic ? f : a));
    const label = {
      quadratic: 'quadratic',
      quadraticPlateau: 'quadratic-plateau',
      linearPlateau: 'linear-plateau',
    };
    expect(json.acrossSites!.mixedModelsSentence).toMatch(
      new RegExp(`AIC favours the ${label[best.model]} \\(`),
    );
  });

  it('writes in pieces exactly the text JSON.stringify gives, a site to a piece', () => {
    // ECMA-262's JSON.stringify with an indent of 2, and a final newline, is the file's format.
    const whole = `${JSON.stringify(json, null, 2)}\n`;
    const pieces = [...resultsJsonPieces(us)];
    expect(pieces.join('')).toBe(whole);
    expect(resultsJsonText(us)).toBe(whole);
    expect(pieces.length).toBeGreaterThan(json.sites.length);
    // Each site is a piece of its own, and parses back to that site.
    const siteKey = JSON.stringify(json.sites[0].site);
    const first = pieces.find((p) => p.includes(`"site": ${siteKey}`))!;
    expect(JSON.parse(first.trim().replace(/,$/, ''))).toEqual(json.sites[0]);
  });

  it('gives the same file for the same seed', async () => {
    const again = resultsJson(await demoReport('us', 40));
    expect(JSON.stringify(again)).toBe(JSON.stringify(json));
  });
});
