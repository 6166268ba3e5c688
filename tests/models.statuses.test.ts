// Data findings as statuses, caller mistakes as typed errors, and the full
// block design checked against an independent route: shared/stats/fitLeastSquares
// (Householder QR, itself checked against NIST StRD Norris) with explicit block
// dummies, at every join point of a fine grid.
import { describe, expect, it } from 'vitest';
import {
  fitAllModels,
  fitExponential,
  fitLinearPlateau,
  fitQuadratic,
  fitQuadraticPlateau,
  prepareSite,
} from '../shared/models';
import { minimizeBrent } from '../shared/optimize/minimizeBrent';
import { fitLeastSquares } from '../shared/stats/leastSquares';
import { StatsInputError } from '../shared/stats/errors';

describe('statuses a screen can explain', () => {
  it('fitQuadratic reports too few rates with two distinct rates', () => {
    const fit = fitQuadratic({ rateKgHa: [0, 0, 100, 100], yieldKgHa: [5, 6, 8, 9] });
    expect(fit.status).toBe('too-few-rates');
    expect(fit.message).toBe(
      'The quadratic model needs at least 3 distinct rates; this site has 2.',
    );
    expect(Number.isNaN(fit.sse)).toBe(true);
  });
  it('the rising models report no response when yields fall with rate', () => {
    const data = {
      rateKgHa: [0, 50, 100, 150, 0, 50, 100, 150],
      yieldKgHa: [9, 8.6, 8.1, 7.7, 9.1, 8.5, 8.2, 7.6],
    };
    for (const fit of [fitLinearPlateau(data), fitQuadraticPlateau(data), fitExponential(data)]) {
      expect(fit.status).toBe('no-response');
      expect(fit.joinPoint).toBeNull();
    }
  });
  it('fitQuadratic reports a convex curve', () => {
    const fit = fitQuadratic({ rateKgHa: [0, 50, 100, 150], yieldKgHa: [5, 5.2, 6, 7.5] });
    expect(fit.status).toBe('convex');
    expect(fit.joinPoint).toBeNull();
  });
  it('the proportional model is ranked by AICc but its R² is labelled uncentered', () => {
    const all = fitAllModels({
      rateKgHa: [0, 50, 100, 150, 0, 50, 100, 150],
      yieldKgHa: [0.1, 5, 10.2, 14.9, -0.1, 5.1, 9.8, 15.1],
    });
    expect(all.fits.proportional.r2Kind).toBe('uncentered');
    expect(all.ranking.find((r) => r.model === 'proportional')?.rank).not.toBeNull();
  });
});

describe('status messages write rates with the caller’s format', () => {
  // A straight rise with no plateau up to a highest rate stored with floating-point noise.
  const top = 269.0042774866694;
  const data = {
    rateKgHa: [0, 90, 180, top, 0, 90, 180, top],
    yieldKgHa: [6000, 7800, 9600, 11380, 6100, 7700, 9650, 11420],
  };
  it('fitLinearPlateau writes the highest rate rounded, in kg/ha by default', () => {
    const fit = fitLinearPlateau(data);
    expect(fit.status).toBe('no-plateau');
    expect(fit.message).toContain('(269 kg/ha)');
    expect(fit.message).not.toMatch(/\d\.\d{2,}/);
  });
  it('fitQuadraticPlateau takes a lb/ac format', () => {
    // 1 lb = 0.45359237 kg, 1 acre = 4046.8564224 m² (NIST SP 811, Appendix B): 269.004 kg/ha = 240.0 lb/ac.
    const kgHaPerLbAc = (0.45359237 * 10000) / 4046.8564224;
    const rateFormat = { number: (v: number) => (v / kgHaPerLbAc).toFixed(0), unit: 'lb N/ac' };
    const fit = fitQuadraticPlateau(data, { rateFormat });
    expect(fit.status).toBe('no-plateau');
    expect(fit.message).toContain('(240 lb N/ac)');
    expect(fit.message).not.toMatch(/kg/);
  });
});

describe('typed errors for a caller’s mistakes', () => {
  it('names the lengths that differ', () => {
    expect(() => fitAllModels({ rateKgHa: [0, 1], yieldKgHa: [1] })).toThrow(
      'yieldKgHa has 1 values but rateKgHa has 2.',
    );
  });
  it('refuses a negative rate', () => {
    expect(() => fitAllModels({ rateKgHa: [0, -1, 2], yieldKgHa: [1, 2, 3] })).toThrow(
      StatsInputError,
    );
  });
  it("needs block labels for blocks: 'fixed'", () => {
    expect(() =>
      fitAllModels({ rateKgHa: [0, 1, 2], yieldKgHa: [1, 2, 3] }, { blocks: 'fixed' }),
    ).toThrow("blocks: 'fixed' needs a block label for each of the 3 plots.");
  });
  it("refuses exponentialIntercept 'zero' with fixed blocks", () => {
    const data = {
      rateKgHa: [0, 1, 2, 0, 1, 2],
      yieldKgHa: [1, 2, 3, 1, 2, 3],
      block: ['a', 'a', 'a', 'b', 'b', 'b'],
    };
    expect(() => fitExponential(data, { blocks: 'fixed', exponentialIntercept: 'zero' })).toThrow(
      /cannot be combined/,
    );
  });
  it('minimizeBrent names a bad interval', () => {
    expect(() => minimizeBrent((x) => x, 2, 1)).toThrow(/lower ≤ upper/);
  });
});

describe('minimizeBrent (closed-form minima)', () => {
  it('finds the minimum of (x − 2)² + 1 on [0, 5] to 1e-8', () => {
    const r = minimizeBrent((x) => (x - 2) ** 2 + 1, 0, 5);
    expect(Math.abs(r.x - 2)).toBeLessThan(1e-8);
    expect(r.converged).toBe(true);
  });
  it('returns an end when the minimum lies there', () => {
    expect(minimizeBrent((x) => x, 1, 3).x).toBe(1);
    expect(minimizeBrent((x) => -x, 1, 3).x).toBe(3);
  });
  it('finds the minimum of cos on [2, 5] at π', () => {
    expect(Math.abs(minimizeBrent(Math.cos, 2, 5).x - Math.PI)).toBeLessThan(1e-8);
  });
});

describe('unbalanced blocks use the full design', () => {
  // 6 rates × 3 blocks with two plots missing: not proportional, so no group-sum shortcut.
  const rates = [0, 40, 80, 120, 160, 200];
  const rateKgHa: number[] = [];
  const yieldKgHa: number[] = [];
  const block: string[] = [];
  let i = 0;
  for (const b of ['1', '2', '3']) {
    for (const r of rates) {
      i++;
      if ((b === '2' && r === 80) || (b === '3' && r === 200)) continue;
      rateKgHa.push(r);
      yieldKgHa.push(6000 + 28 * Math.min(r, 115) + 150 * Number(b) + 300 * Math.sin(7.3 * i));
      block.push(b);
    }
  }
  const data = { rateKgHa, yieldKgHa, block };
  const dummies = ['2', '3'].map((b) => block.map((v) => (v === b ? 1 : 0)));

  it('prepareSite picks the full design', () => {
    expect(prepareSite(data, 'fixed').design).toBe('full');
  });
  it('the straight line with blocks matches fitLeastSquares with block dummies', () => {
    const fit = fitAllModels(data, { blocks: 'fixed', models: ['linear'] }).fits.linear;
    const ref = fitLeastSquares({ columns: [rateKgHa, ...dummies], y: yieldKgHa, intercept: true });
    expect(fit.sse / ref.sse).toBeCloseTo(1, 12);
    expect(fit.params.b).toBeCloseTo(ref.coefficients[1].estimate, 9);
    expect(fit.stdErrors.b).toBeCloseTo(ref.coefficients[1].stdError, 9);
    expect(fit.dfResidual).toBe(ref.dfResidual);
  });
  it('the linear-plateau with blocks is at least as good as every join on a 0.05 kg/ha grid', () => {
    const fit = fitLinearPlateau(data, { blocks: 'fixed' });
    expect(fit.status).toBe('ok');
    let gridBest = Infinity;
    let gridJoin = NaN;
    for (let x0 = 40.05; x0 < 200; x0 += 0.05) {
      const g = rateKgHa.map((r) => Math.min(r, x0));
      const sse = fitLeastSquares({ columns: [g, ...dummies], y: yieldKgHa, intercept: true }).sse;
      if (sse < gridBest) {
        gridBest = sse;
        gridJoin = x0;
      }
    }
    expect(fit.sse).toBeLessThanOrEqual(gridBest * (1 + 1e-12));
    expect(Math.abs(fit.params.x0 - gridJoin)).toBeLessThan(0.05);
  });
});

describe('blocks of unequal size with the same mix of rates (proportional frequencies)', () => {
  // Block A holds every rate twice, block B once: group sums still apply, the offsets do not.
  const rates = [0, 40, 80, 120, 160, 200];
  const rateKgHa: number[] = [];
  const yieldKgHa: number[] = [];
  const block: string[] = [];
  let i = 0;
  for (const [b, copies] of [
    ['A', 2],
    ['B', 1],
  ] as const) {
    for (let c = 0; c < copies; c++) {
      for (const r of rates) {
        i++;
        rateKgHa.push(r);
        yieldKgHa.push(
          6000 + 26 * Math.min(r, 125) + (b === 'B' ? 400 : 0) + 250 * Math.sin(3.1 * i),
        );
        block.push(b);
      }
    }
  }
  const data = { rateKgHa, yieldKgHa, block };
  const dummy = block.map((v) => (v === 'B' ? 1 : 0));

  it('prepareSite uses group sums but no precomputed offsets', () => {
    const site = prepareSite(data, 'fixed');
    expect(site.design).toBe('balanced-blocks');
    expect(site.orthogonalBlockOffsets).toBeNull();
  });
  it('the linear-plateau matches fitLeastSquares with a block dummy on a 0.05 kg/ha grid of joins', () => {
    const fit = fitLinearPlateau(data, { blocks: 'fixed' });
    let gridBest = Infinity;
    for (let x0 = 40.05; x0 < 200; x0 += 0.05) {
      const g = rateKgHa.map((r) => Math.min(r, x0));
      gridBest = Math.min(
        gridBest,
        fitLeastSquares({ columns: [g, dummy], y: yieldKgHa, intercept: true }).sse,
      );
    }
    expect(fit.status).toBe('ok');
    expect(fit.sse).toBeLessThanOrEqual(gridBest * (1 + 1e-12));
    const atJoin = fitLeastSquares({
      columns: [rateKgHa.map((r) => Math.min(r, fit.params.x0)), dummy],
      y: yieldKgHa,
      intercept: true,
    });
    expect(fit.sse / atJoin.sse).toBeCloseTo(1, 12);
    expect(fit.params.b).toBeCloseTo(atJoin.coefficients[1].estimate, 8);
    expect(fit.stdErrors.b).toBeGreaterThan(0);
  });
});
