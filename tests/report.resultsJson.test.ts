// The results JSON: its keys are the documented schema (README "Results
// format"), its numbers are in the units it names, and the same seed gives the
// same file. Unit factors from the exact pound and acre (NIST SP 811) and the
// 56 lb corn bushel (USDA).
import { beforeAll, describe, expect, it } from 'vitest';
import { resultsJson, type ResultsJson } from '../shared/report/resultsJson';
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
    ])
      expect(site).toHaveProperty(k);
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
      'interceptTest',
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

  it('gives the gain over the check in bu/lb N as fitLeastSquares gives it on the gains', () => {
    us.sites.forEach((s, i) => {
      const r = json.sites[i].responseOverCheck!;
      const { origin, line } = gainsOverBlockCheck(s.plots);
      const b = origin.coefficients[0];
      const a = line.coefficients[0];
      // kg grain/kg N → bu/lb N: ÷ 56 (the 56 lb corn bushel; the pound cancels).
      expect(r.slope).toBeCloseTo(b.estimate / 56, 9);
      expect(r.slopeCI[0]).toBeCloseTo(b.ciLow / 56, 9);
      expect(r.slopeCI[1]).toBeCloseTo(b.ciHigh / 56, 9);
      expect(r.interceptTest.t).toBeCloseTo(a.t, 9);
      expect(r.interceptTest.F).toBeCloseTo(a.t * a.t, 8);
      expect(r.interceptTest.df1).toBe(1);
      expect(r.interceptTest.df2).toBe(line.dfResidual);
      expect(r.interceptTest.p).toBeCloseTo(a.p, 11);
      expect(r.biasPresent).toBe(a.p < 0.05);
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

  it('gives the same file for the same seed', async () => {
    const again = resultsJson(await demoReport('us', 40));
    expect(JSON.stringify(again)).toBe(JSON.stringify(json));
  });
});
