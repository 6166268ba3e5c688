// The optimum's bootstrap interval with the model chosen again in each resample and every
// resample counted (/work/shared/DESIGN.md, "Decisions are statistics too"). Sources beside
// each check: R's AIC() for the AICc formula (tests/fixtures/models/referenceFits.json,
// written by referenceFits.R), a hand computation from Hurvich & Tsai (Biometrika 76, 1989,
// 297–307), the closed-form optimum of the linear-plateau (slope b > PR: the join x0), and
// seeded sites whose answer is known by construction.
import { describe, expect, it } from 'vitest';
import reference from './fixtures/models/referenceFits.json';
import { analyzeSite } from '../shared/analysis/analyzeSite';
import { priceSite } from '../shared/analysis/priceTrial';
import { recommendationModel } from '../shared/analysis/recommendationModel';
import {
  DRAW_STATUSES,
  drawBootstrapEstimates,
  drawStatus,
  type BootstrapDraws,
  type ModelDraws,
} from '../shared/economics/bootstrapDraws';
import { countedOptimum } from '../shared/economics/countedOptimum';
import { drawChoices } from '../shared/economics/drawChoices';
import { economicOptimum } from '../shared/economics/economicOptimum';
import { optimumInterval, optimumIntervals } from '../shared/economics/optimumInterval';
import { aiccFromSse } from '../shared/models/aicc';
import { chooseModel } from '../shared/models/chooseModel';
import { MODEL_CURVES } from '../shared/models/curves';
import { fitAllModels } from '../shared/models/fitAllModels';
import { MODEL_NAMES, type FitStatus, type ModelName } from '../shared/models/modelTypes';
import { mulberry32 } from '../shared/demo/mulberry32';

const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 1.2 }; // PR = 6 kg grain/kg N
const RATES = [0, 40, 80, 120, 160, 200];
const TESTED = { distinctKgHa: RATES, lowestKgHa: 0, highestKgHa: 200 };

/** A 6-rate × 4-block site of a known curve with normal noise (sd in kg/ha). */
function site(curve: (x: number) => number, sd: number, seed: number) {
  // The repo's seeded generator with its normal deviates (Box–Muller).
  const r = mulberry32(seed);
  const rateKgHa: number[] = [];
  const yieldKgHa: number[] = [];
  const block: string[] = [];
  for (let b = 0; b < 4; b++)
    for (const x of RATES) {
      rateKgHa.push(x);
      yieldKgHa.push(curve(x) + sd * r.normal());
      block.push(`B${b + 1}`);
    }
  return { rateKgHa, yieldKgHa, block };
}

/** Hand-made draws: one record per model and resample (status, SSE, coefficients). */
function handDraws(
  n: number,
  records: Partial<Record<ModelName, { status: FitStatus; sse: number; params: number[] }[]>>,
  parameterCount: Partial<Record<ModelName, number>> = {},
): BootstrapDraws {
  const models: BootstrapDraws['models'] = {};
  let resamples = 0;
  for (const [m, list] of Object.entries(records) as [ModelName, typeof records.linear][]) {
    resamples = list!.length;
    const paramNames = MODEL_CURVES[m].spec.paramNames;
    const k = paramNames.length;
    const d: ModelDraws = {
      model: m,
      paramNames,
      status: Uint8Array.from(list!.map((r) => DRAW_STATUSES.indexOf(r.status))),
      params: Float64Array.from(list!.flatMap((r) => r.params)),
      sse: Float64Array.from(list!.map((r) => r.sse)),
      parameterCount: parameterCount[m] ?? k,
      joinLowKgHa: Float64Array.from(
        list!.map((r) => (r.status === 'full-response-at-lowest-rate' ? 0 : NaN)),
      ),
      joinHighKgHa: Float64Array.from(
        list!.map((r) => (r.status === 'full-response-at-lowest-rate' ? 40 : NaN)),
      ),
    };
    models[m] = d;
  }
  return { resamples, seed: 1, resampling: 'within-rates', testedRates: TESTED, n, models };
}

describe('aiccFromSse', () => {
  const sites = reference.sites as unknown as Record<
    string,
    Record<string, { sse: number; aicc: number; params: Record<string, number> }>
  >;
  it.each(['lpSite', 'qpSite', 'expSite'])(
    'matches R 4.x AIC(lm) + 2k(k+1)/(n−k−1) for the straight lines and quadratic of %s (1e-12 relative)',
    (name) => {
      for (const model of ['linear', 'proportional', 'quadratic']) {
        const r = sites[name][model];
        const p = Object.keys(r.params).length;
        expect(Math.abs(aiccFromSse(r.sse, 24, p) - r.aicc)).toBeLessThan(1e-12 * Math.abs(r.aicc));
      }
    },
  );

  it('matches a hand computation from Hurvich & Tsai (1989): n = 10, SSE = 20, p = 2', () => {
    // k = 3; −2 logLik = 10 (ln 2π + ln 2 + 1) = 35.31024247; + 2k = 6; + 2·3·4/(10 − 3 − 1) = 4.
    expect(aiccFromSse(20, 10, 2)).toBeCloseTo(45.31024247, 7);
    // No correction is defined when n − k − 1 ≤ 0.
    expect(aiccFromSse(20, 4, 2)).toBe(Infinity);
  });

  it('is the AICc every fit reports (fitAllModels, with block offsets counted)', () => {
    const data = site((x) => 6000 + 30 * Math.min(x, 110), 300, 5);
    const all = fitAllModels(data, { blocks: 'fixed' });
    for (const m of MODEL_NAMES) {
      const f = all.fits[m];
      expect(f.parameterCount).toBe(f.paramNames.length + 3);
      expect(aiccFromSse(f.sse, f.n, f.parameterCount)).toBe(f.aicc);
    }
  });
});

describe('chooseModel (the rule of recommendationModel)', () => {
  it('takes the lowest-AICc curve with a usable answer before any straight line', () => {
    const fits = [
      { model: 'linear' as const, status: 'ok' as const, aicc: 280 },
      { model: 'quadratic' as const, status: 'ok' as const, aicc: 302 },
      { model: 'exponential' as const, status: 'ok' as const, aicc: 301 },
      {
        model: 'linearPlateau' as const,
        status: 'full-response-at-lowest-rate' as const,
        aicc: 306,
      },
      { model: 'quadraticPlateau' as const, status: 'no-plateau' as const, aicc: 260 },
    ];
    expect(chooseModel(fits)).toBe('exponential');
    // A full response by the lowest rate that fits best among the curves leads.
    fits[3] = { ...fits[3], aicc: 270 };
    expect(chooseModel(fits)).toBe('linearPlateau');
    // Within 4 AICc of the best "ok" curve the full response still leads (FULL_RESPONSE_DELTA_AICC) …
    fits[3] = { ...fits[3], aicc: 305 };
    expect(chooseModel(fits)).toBe('linearPlateau');
    // … beyond it the better curve does.
    fits[3] = { ...fits[3], aicc: 305.5 };
    expect(chooseModel(fits)).toBe('exponential');
  });

  it('falls back to the lowest-AICc line, and to none without an "ok" fit of finite AICc', () => {
    const lines = [
      { model: 'proportional' as const, status: 'ok' as const, aicc: 290 },
      { model: 'linear' as const, status: 'ok' as const, aicc: 285 },
      { model: 'quadratic' as const, status: 'convex' as const, aicc: 280 },
      { model: 'linearPlateau' as const, status: 'no-plateau' as const, aicc: 282 },
    ];
    expect(chooseModel(lines)).toBe('linear');
    expect(chooseModel([{ model: 'quadraticPlateau', status: 'ok', aicc: Infinity }])).toBeNull();
    expect(chooseModel([])).toBeNull();
  });
});

describe('drawChoices applies the site rule to each resample', () => {
  // Resample 0: curves ok, QP lower SSE. 1: no curve ok (no plateau), the line decides.
  // 2: no curve ok, LP full response with far lower SSE than the line: it decides.
  // 3: the line has the lowest SSE of all but a curve is ok: the curve decides.
  const n = 24;
  const draws = handDraws(n, {
    linear: [
      { status: 'ok', sse: 9e6, params: [6000, 15] },
      { status: 'ok', sse: 2e6, params: [6000, 15] },
      { status: 'ok', sse: 9e6, params: [7000, 12] },
      { status: 'ok', sse: 1.0e6, params: [6000, 15] },
    ],
    quadratic: [
      { status: 'ok', sse: 3e6, params: [6000, 40, -0.12] },
      { status: 'convex', sse: 1.9e6, params: [6000, 10, 0.01] },
      { status: 'convex', sse: 8e6, params: [6000, 10, 0.01] },
      { status: 'ok', sse: 1.3e6, params: [6000, 40, -0.12] },
    ],
    linearPlateau: [
      { status: 'ok', sse: 2e6, params: [6000, 30, 110] },
      { status: 'no-plateau', sse: 2e6, params: [6000, 15, 200] },
      { status: 'full-response-at-lowest-rate', sse: 1e6, params: [6500, 62.5, 40] },
      { status: 'ok', sse: 1.2e6, params: [6000, 30, 110] },
    ],
    quadraticPlateau: [
      { status: 'ok', sse: 1.8e6, params: [9400, -0.14, 150] },
      { status: 'no-plateau', sse: 1.95e6, params: [9400, -0.1, 200] },
      { status: 'full-response-at-lowest-rate', sse: 1.2e6, params: [9000, NaN, NaN] },
      { status: 'no-response', sse: 5e6, params: [9000, 0, 200] },
    ],
  });

  it('picks the resample by the lowest AICc among the curves with a usable answer (ok or full response), else the line', () => {
    const c = drawChoices(draws);
    const picked = Array.from(c.decisive, (i) => c.models[i]);
    expect(picked).toEqual(['quadraticPlateau', 'linear', 'linearPlateau', 'linearPlateau']);
  });

  it('agrees with chooseModel on each resample when a curve has an optimum (the same rule)', () => {
    const c = drawChoices(draws);
    for (const b of [0, 1, 2, 3]) {
      const candidates = c.models.map((m) => {
        const d = draws.models[m]!;
        return {
          model: m,
          status: drawStatus(d, b),
          aicc: aiccFromSse(d.sse[b], n, d.parameterCount),
        };
      });
      expect(c.models[c.decisive[b]]).toBe(chooseModel(candidates));
    }
  });

  it('repeats the site’s own AICc and choice when every resample is the data (blocks counted in k)', () => {
    // Each rate's plots differ only by their block's offset, so the block-adjusted yields of a
    // rate are equal and every resample is the site itself; the lack of fit keeps SSE > 0.
    const wiggle = [0, 35, -20, 15, -30, 10];
    const offsets = [-150, 50, 120, -20];
    const rateKgHa: number[] = [];
    const yieldKgHa: number[] = [];
    const block: string[] = [];
    offsets.forEach((o, b) =>
      RATES.forEach((x, j) => {
        rateKgHa.push(x);
        yieldKgHa.push(9400 - 0.14 * Math.min(x - 150, 0) ** 2 + wiggle[j] + o);
        block.push(`B${b}`);
      }),
    );
    const data = { rateKgHa, yieldKgHa, block };
    const all = fitAllModels(data, { blocks: 'fixed' });
    const draws = drawBootstrapEstimates(data, MODEL_NAMES, {
      resamples: 20,
      seed: 4,
      blocks: 'fixed',
    });
    for (const m of MODEL_NAMES) {
      const d = draws.models[m]!;
      expect(d.parameterCount).toBe(all.fits[m].parameterCount);
      // Resamples search to 1e-7, the fit to 1e-10: AICc agrees to well below a ranking's 0.1.
      expect(aiccFromSse(d.sse[7], draws.n, d.parameterCount)).toBeCloseTo(all.fits[m].aicc, 4);
    }
    const c = drawChoices(draws);
    const own = recommendationModel(all).model;
    expect(own).not.toBeNull();
    expect(new Set(Array.from(c.decisive, (i) => c.models[i]))).toEqual(new Set([own]));
  });
});

describe('countedOptimum counts every kind of resample', () => {
  const at = (model: ModelName, status: FitStatus, params: Record<string, number>) => ({
    model,
    status,
    params,
    testedRates: TESTED,
    joinBetweenKgHa:
      status === 'full-response-at-lowest-rate' ? ([0, 40] as [number, number]) : null,
  });

  it('prices an ok curve by its closed form (linear-plateau: the join when b > PR)', () => {
    expect(countedOptimum(at('linearPlateau', 'ok', { a: 6000, b: 30, x0: 110 }), prices)).toEqual({
      kind: 'curve',
      rateKgHa: 110,
    });
  });

  it('counts no plateau at the highest rate, full response at the second-lowest, no response at 0', () => {
    expect(
      countedOptimum(at('linearPlateau', 'no-plateau', { a: 6000, b: 15, x0: 200 }), prices),
    ).toEqual({ kind: 'noPlateau', rateKgHa: 200 });
    expect(
      countedOptimum(
        at('linearPlateau', 'full-response-at-lowest-rate', { a: 6500, b: 62.5, x0: 40 }),
        prices,
      ),
    ).toEqual({ kind: 'fullResponse', rateKgHa: 40 });
    expect(
      countedOptimum(at('quadraticPlateau', 'no-response', { P: 9000, c: 0, x0: 200 }), prices),
    ).toEqual({ kind: 'noResponse', rateKgHa: 0 });
    expect(countedOptimum(at('quadratic', 'convex', { a: 6000, b: 10, c: 0.01 }), prices)).toEqual({
      kind: 'noResponse',
      rateKgHa: 0,
    });
    expect(countedOptimum(null, prices)).toEqual({ kind: 'noResponse', rateKgHa: 0 });
  });

  it('reads a straight line by its corner: slope above PR is no plateau, below is no response', () => {
    expect(countedOptimum(at('linear', 'ok', { a: 6000, b: 15 }), prices)).toEqual({
      kind: 'noPlateau',
      rateKgHa: 200,
    });
    expect(countedOptimum(at('linear', 'ok', { a: 6000, b: 2 }), prices)).toEqual({
      kind: 'noResponse',
      rateKgHa: 0,
    });
  });

  it('counts a full response that does not pay for the second-lowest rate at 0', () => {
    // Gain 20 kg/ha for 40 kg N at PR 6: 0.2·20 = 4 < 1.2·40 = 48 per ha.
    expect(
      countedOptimum(
        at('linearPlateau', 'full-response-at-lowest-rate', { a: 6500, b: 0.5, x0: 40 }),
        prices,
      ),
    ).toEqual({ kind: 'fullResponse', rateKgHa: 0 });
  });
});

describe('optimumInterval counts every resample', () => {
  const flat = site(() => 8000, 400, 21);
  const flatDraws = drawBootstrapEstimates(flat, MODEL_NAMES, {
    resamples: 200,
    seed: 9,
    blocks: 'fixed',
  });

  it('on a flat site includes 0 and reports the share of resamples with no response', () => {
    const i = optimumInterval(flatDraws, 'quadratic', prices, 0.9)!;
    expect(i.basis).toBe('model-reselected');
    expect(i.count).toBe(200);
    const { curve, noPlateau, fullResponse, noResponse } = i.shares;
    expect(curve + noPlateau + fullResponse + noResponse).toBeCloseTo(1, 12);
    // Shares of the resamples' weight (each resample's weight is spread over its candidates).
    for (const s of [curve, noPlateau, fullResponse, noResponse]) {
      expect(s).toBeGreaterThanOrEqual(0);
      expect(s).toBeLessThanOrEqual(1);
    }
    // Flat truth: the rule finds no curve in a good share of resamples, and they count at 0.
    expect(noResponse).toBeGreaterThan(0.05);
    expect(i.ciKgHa![0]).toBe(0);
  });

  it('counts as many resamples as were drawn at every price (no resample dropped)', () => {
    for (const nutrientPricePerKg of [0.2, 1.2, 4]) {
      const i = optimumInterval(
        flatDraws,
        'quadratic',
        { grainPricePerKg: 0.2, nutrientPricePerKg },
        0.9,
      )!;
      const total = Object.values(i.shares).reduce((a, b) => a + b, 0);
      expect(total * i.count).toBeCloseTo(200, 9);
      const decided = Object.values(i.modelShares).reduce((a, b) => a + b!, 0);
      expect(decided).toBeLessThanOrEqual(1 + 1e-12);
    }
  });

  it('with the model fixed prices that model in every resample, and is null for a model not drawn', () => {
    const i = optimumInterval(flatDraws, 'quadraticPlateau', prices, 0.9, 'fixed-model')!;
    expect(i.basis).toBe('fixed-model');
    expect(i.modelShares).toEqual({ quadraticPlateau: 1 });
    const one = drawBootstrapEstimates(flat, ['linear'], { resamples: 10, seed: 9 });
    expect(optimumInterval(one, 'quadratic', prices, 0.9, 'fixed-model')).toBeNull();
  });

  it('on a clear linear-plateau site holds the fitted optimum, from curves in most resamples', () => {
    const lp = site((x) => 6000 + 30 * Math.min(x, 110), 250, 3);
    const d = drawBootstrapEstimates(lp, MODEL_NAMES, { resamples: 200, seed: 2, blocks: 'fixed' });
    const i = optimumInterval(d, 'linearPlateau', prices, 0.9)!;
    expect(i.shares.curve).toBeGreaterThan(0.9);
    // One seeded site: a 90 % interval need not cover the truth (x0 = 110), but it holds the
    // optimum of the model the site's own rule chooses (economicOptimum of that fit).
    const all = fitAllModels(lp, { blocks: 'fixed' });
    const own = economicOptimum(all.fits[recommendationModel(all).model!], prices).rateKgHa!;
    expect(i.ciKgHa![0]).toBeLessThanOrEqual(own);
    expect(i.ciKgHa![1]).toBeGreaterThanOrEqual(own);
    expect(i.ciKgHa![1] - i.ciKgHa![0]).toBeGreaterThan(0);
  });

  it('prices several sets in one pass as each alone, and the interval never rises with the N price', () => {
    // A dearer N never makes the economic optimum of a rising, levelling curve higher (its
    // marginal product must pay more), so neither bound of the interval may rise: the reason the
    // weighted quantile does not interpolate (shared/stats/quantile). Invented site.
    const lp = site((x) => 6000 + 30 * Math.min(x, 110), 250, 5);
    const d = drawBootstrapEstimates(lp, MODEL_NAMES, { resamples: 200, seed: 4, blocks: 'fixed' });
    const sets = [0.4, 0.8, 1.2, 2.4, 4.8].map((n) => ({
      grainPricePerKg: 0.2,
      nutrientPricePerKg: n,
    }));
    const together = optimumIntervals(d, 'linearPlateau', sets, 0.9);
    expect(together).toEqual(sets.map((p) => optimumInterval(d, 'linearPlateau', p, 0.9)));
    for (let k = 1; k < sets.length; k++) {
      expect(together[k]!.ciKgHa![0]).toBeLessThanOrEqual(together[k - 1]!.ciKgHa![0]);
      expect(together[k]!.ciKgHa![1]).toBeLessThanOrEqual(together[k - 1]!.ciKgHa![1]);
    }
    expect(together[0]!.ciKgHa![1]).toBeGreaterThan(together[4]!.ciKgHa![1]);
  });
});

describe('priceSite: the rule’s model gets the reselecting interval, an analyst’s pick its own', () => {
  const data = site((x) => 9400 - 0.14 * Math.min(x - 150, 0) ** 2, 350, 8);
  const analysis = analyzeSite(
    {
      site: 'S',
      year: null,
      siteName: 'S',
      rateKgHa: Float64Array.from(data.rateKgHa),
      yieldKgHa: Float64Array.from(data.yieldKgHa),
      block: data.block,
      plotIds: data.block.map((_, i) => `P${i + 1}`),
      groups: {},
      problem: null,
    },
    { blocks: 'auto', alpha: 0.05, curvePoints: 21, resamples: 100, seed: 3, intervalLevel: 0.9 },
  );

  it('uses "model-reselected" without a pick and "fixed-model" with one', () => {
    const own = priceSite(analysis, prices, {}, 0.9, 1);
    expect(own.interval!.basis).toBe('model-reselected');
    expect(own.interval!.model).toBe(analysis.recommended.model);
    const pick: ModelName = analysis.recommended.model === 'linear' ? 'quadratic' : 'linear';
    const picked = priceSite(analysis, prices, { S: pick }, 0.9, 1);
    expect(picked.lead.picked).toBe(true);
    expect(picked.interval!.basis).toBe('fixed-model');
    expect(picked.interval!.model).toBe(pick);
  });
});
