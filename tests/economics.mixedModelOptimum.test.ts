// The regional mixed model's optimum rate and its delta-method interval
// (shared/economics/mixedModelOptimum), checked by simulation against a known truth: regions of
// 12 invented site-years (shared/demo/simulatedRegion: a population quadratic with correlated
// random site effects, blocks and plot error), fitted by fitRegionalMixedModel with its
// defaults. The nominal 90 % interval must cover the true population optimum at the stated rate
// within three binomial standard errors; 300 regions in a longer run gave 0.88.
import { describe, expect, it } from 'vitest';
import { fitRegionalMixedModel } from '../shared/analysis/regionalMixedModel';
import { regionTrueOptimumKgHa, simulatedRegion } from '../shared/demo/simulatedRegion';
import {
  mixedModelOptimum,
  type MixedModelFixedEffects,
} from '../shared/economics/mixedModelOptimum';

const PRICE_RATIO = 5.5; // kg grain per kg N, e.g. 1.10 per kg N over 0.20 per kg grain

describe('mixedModelOptimum', () => {
  it('covers the true regional optimum at its nominal 90 % over simulated regions', () => {
    const regions = 120;
    const truth = regionTrueOptimumKgHa(PRICE_RATIO);
    let covered = 0;
    for (let r = 0; r < regions; r++) {
      const fit = fitRegionalMixedModel(simulatedRegion(12, 5000 + r));
      if (fit.model === null) throw new Error(fit.reason);
      const o = mixedModelOptimum(fit, PRICE_RATIO, 0.9);
      if (o.interval && o.interval.lowKgHa <= truth && truth <= o.interval.highKgHa) covered++;
    }
    const se = Math.sqrt((0.9 * 0.1) / regions);
    expect(Math.abs(covered / regions - 0.9)).toBeLessThan(3 * se);
  });

  const model: MixedModelFixedEffects = {
    fixed: { a: 8000, b: 40, c: -0.1 },
    fixedCovariance: [
      [90000, -300, 0.5],
      [-300, 16, -0.04],
      [0.5, -0.04, 0.0004],
    ],
    testedRangeKgHa: [0, 200],
    dfFixed: 9,
  };

  it('puts the rate where the population slope equals the price ratio', () => {
    const o = mixedModelOptimum(model, PRICE_RATIO, 0.9);
    expect(o.status).toBe('interior');
    expect(model.fixed.b + 2 * model.fixed.c * o.rateKgHa).toBeCloseTo(PRICE_RATIO, 10);
  });

  it('gives the delta method’s standard error, which a finite difference of the rate confirms', () => {
    const o = mixedModelOptimum(model, PRICE_RATIO, 0.9);
    const rate = (b: number, c: number) => (PRICE_RATIO - b) / (2 * c);
    const h = 1e-6;
    const gb = (rate(40 + h, -0.1) - rate(40 - h, -0.1)) / (2 * h);
    const gc = (rate(40, -0.1 + h * 1e-3) - rate(40, -0.1 - h * 1e-3)) / (2 * h * 1e-3);
    const v = model.fixedCovariance;
    const se = Math.sqrt(gb * gb * v[1][1] + 2 * gb * gc * v[1][2] + gc * gc * v[2][2]);
    expect(o.stdErrorKgHa!).toBeCloseTo(se, 6);
  });

  it('caps a rate beyond the tested range and marks that end open', () => {
    const o = mixedModelOptimum({ ...model, testedRangeKgHa: [0, 150] }, PRICE_RATIO, 0.9);
    expect(o.status).toBe('capped-high');
    expect(o.rateKgHa).toBe(150);
    expect(o.interval!.highOpen).toBe(true);
    expect(o.interval!.highKgHa).toBe(150);
  });

  it('reports no maximum for a curve that does not bend down, with the better end', () => {
    const flatCurve = { ...model, fixed: { a: 8000, b: 10, c: 0.001 } };
    const o = mixedModelOptimum(flatCurve, PRICE_RATIO, 0.9);
    expect(o.status).toBe('no-maximum');
    expect(o.interval).toBeNull();
    expect(o.rateKgHa).toBe(200);
    expect(mixedModelOptimum(flatCurve, 20, 0.9).rateKgHa).toBe(0);
  });
});
