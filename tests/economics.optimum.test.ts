// Checks the economic optimum. Expected rates are derived by hand from
// dy/dx = PR for each form (the derivation is written beside each case) and,
// independently of the closed forms, by maximizing the net return numerically
// (a fine grid then golden-section search on the curve itself).
import { describe, expect, it } from 'vitest';
import {
  economicOptimum,
  netReturn,
  optimumAcrossModels,
  priceRatio,
  recommendationCautions,
} from '../shared/economics';
import type { CurveSummary, ModelName } from '../shared/models';
import { StatsInputError } from '../shared/stats/errors';

const tested = { lowestKgHa: 0, highestKgHa: 200, distinctKgHa: [0, 40, 80, 120, 160, 200] };
const summary = (model: ModelName, params: Record<string, number>): CurveSummary => ({
  model,
  status: 'ok',
  params,
  testedRates: tested,
  joinBetweenKgHa: null,
});
// PR = 1.2 / 0.2 = 6 kg grain per kg N.
const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 1.2 };

/** Rate in [0, 200] of the largest net return, by grid (0.01 kg/ha) and golden-section refinement. */
function numericOptimum(fit: CurveSummary): number {
  let best = 0;
  let bestValue = -Infinity;
  for (let x = 0; x <= 200; x += 0.01) {
    const v = netReturn(fit, prices, x);
    if (v > bestValue) {
      bestValue = v;
      best = x;
    }
  }
  let lo = Math.max(best - 0.01, 0);
  let hi = Math.min(best + 0.01, 200);
  const phi = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 80; i++) {
    const a = hi - phi * (hi - lo);
    const b = lo + phi * (hi - lo);
    if (netReturn(fit, prices, a) > netReturn(fit, prices, b)) hi = b;
    else lo = a;
  }
  return (lo + hi) / 2;
}

describe('priceRatio', () => {
  it('is nutrient price over grain price', () => expect(priceRatio(prices)).toBeCloseTo(6, 12));
  it('throws a typed error naming a non-positive price', () => {
    expect(() => priceRatio({ grainPricePerKg: 0, nutrientPricePerKg: 1 })).toThrow(
      StatsInputError,
    );
    expect(() => priceRatio({ grainPricePerKg: 0, nutrientPricePerKg: 1 })).toThrow(
      'grainPricePerKg must be a positive number; got 0.',
    );
  });
});

describe('economicOptimum closed forms (derived by hand, PR = 6)', () => {
  const cases: {
    name: string;
    fit: CurveSummary;
    expected: number;
    status: string;
    yieldAt: (x: number) => number;
  }[] = [
    // b + 2cx = PR → x = (6 − 40) / (2 · −0.1) = 170
    {
      name: 'quadratic',
      fit: summary('quadratic', { a: 5000, b: 40, c: -0.1 }),
      expected: 170,
      status: 'interior',
      yieldAt: (x) => 5000 + 40 * x - 0.1 * x * x,
    },
    // slope 30 > PR, so the join: 110
    {
      name: 'linear-plateau',
      fit: summary('linearPlateau', { a: 6000, b: 30, x0: 110 }),
      expected: 110,
      status: 'interior',
      yieldAt: (x) => 6000 + 30 * Math.min(x, 110),
    },
    // −2c(x0 − x) = PR → x = x0 + PR/(2c) = 150 + 6 / (−0.24) = 125
    {
      name: 'quadratic-plateau',
      fit: summary('quadraticPlateau', { P: 9400, c: -0.12, x0: 150 }),
      expected: 125,
      status: 'interior',
      yieldAt: (x) => 9400 - 0.12 * Math.min(x - 150, 0) ** 2,
    },
    // b k e^(−kx) = PR → x = ln(b k / PR) / k = ln(60 / 6) / 0.015 = 153.50567…
    {
      name: 'exponential',
      fit: summary('exponential', { a: 5500, b: 4000, k: 0.015 }),
      expected: Math.log(10) / 0.015,
      status: 'interior',
      yieldAt: (x) => 5500 + 4000 * (1 - Math.exp(-0.015 * x)),
    },
  ];
  for (const c of cases) {
    it(`${c.name}: ${c.expected.toFixed(3)} kg/ha, agreeing with the numeric maximum of net return`, () => {
      const opt = economicOptimum(c.fit, prices);
      expect(opt.status).toBe(c.status);
      expect(opt.rateKgHa).toBeCloseTo(c.expected, 9);
      expect(Math.abs(opt.rateKgHa! - numericOptimum(c.fit))).toBeLessThan(1e-4);
      expect(opt.yieldKgHa).toBeCloseTo(c.yieldAt(c.expected), 6);
      expect(opt.gainOverCheckPerHa).toBeGreaterThan(0);
      expect(opt.cautions).toBe(recommendationCautions);
    });
  }

  it('linear-plateau with a slope below PR: no nutrient', () => {
    const opt = economicOptimum(summary('linearPlateau', { a: 6000, b: 5, x0: 110 }), prices);
    expect(opt.status).toBe('zero');
    expect(opt.rateKgHa).toBe(0);
  });
  it('quadratic whose optimum lies past the highest rate is capped there and flagged', () => {
    // (6 − 80) / (2 · −0.1) = 370 > 200
    const opt = economicOptimum(summary('quadratic', { a: 5000, b: 80, c: -0.1 }), prices);
    expect(opt.status).toBe('capped-at-highest');
    expect(opt.rateKgHa).toBe(200);
    expect(opt.uncappedRateKgHa).toBeCloseTo(370, 9);
    expect(opt.cappedAtHighest).toBe(true);
    expect(opt.agronomicMaxRateKgHa).toBeCloseTo(400, 9);
  });
  it('quadratic-plateau never below zero: x0 + PR/(2c) < 0 gives no nutrient', () => {
    // 20 + 6 / (2 · −0.1) = −10
    const opt = economicOptimum(summary('quadraticPlateau', { P: 9000, c: -0.1, x0: 20 }), prices);
    expect(opt.rateKgHa).toBe(0);
    expect(opt.status).toBe('zero');
  });
  it('exponential with b·k ≤ PR: no nutrient', () => {
    const opt = economicOptimum(summary('exponential', { a: 5500, b: 300, k: 0.015 }), prices);
    expect(opt.status).toBe('zero');
  });
  it('straight line: a corner at the highest rate when b > PR, explained as such', () => {
    const opt = economicOptimum(summary('linear', { a: 6000, b: 14 }), prices);
    expect(opt.status).toBe('corner');
    expect(opt.rateKgHa).toBe(200);
    expect(opt.explanation).toMatch(/corner/);
    const low = economicOptimum(summary('proportional', { b: 3 }), prices);
    expect(low.rateKgHa).toBe(0);
  });
  it('an application cost larger than the gain makes no application best', () => {
    const fit = summary('linearPlateau', { a: 6000, b: 7, x0: 50 });
    // Gain at 50: (7 − 6) · 50 kg grain · 0.2 = 10 per ha; a cost of 25 per ha outweighs it.
    const opt = economicOptimum(fit, { ...prices, applicationCostPerHa: 25 });
    expect(opt.status).toBe('zero');
    const cheap = economicOptimum(fit, { ...prices, applicationCostPerHa: 5 });
    expect(cheap.rateKgHa).toBe(50);
    expect(cheap.gainOverCheckPerHa).toBeCloseTo(10 - 5, 9);
  });
  it('reports net return = grain price × yield − N cost', () => {
    const opt = economicOptimum(summary('linearPlateau', { a: 6000, b: 30, x0: 110 }), prices);
    expect(opt.netReturnPerHa).toBeCloseTo(0.2 * 9300 - 1.2 * 110, 9);
    expect(opt.gainOverCheckPerHa).toBeCloseTo(0.2 * 3300 - 1.2 * 110, 9);
  });
});

describe('economicOptimum on fits with a data status', () => {
  it('gives no number for "no-plateau"', () => {
    const opt = economicOptimum(
      { ...summary('linearPlateau', { a: 6000, b: 30, x0: NaN }), status: 'no-plateau' },
      prices,
    );
    expect(opt.status).toBe('not-available');
    expect(opt.rateKgHa).toBeNull();
  });
  it('gives the interval between the two lowest rates for full response by the lowest rate', () => {
    const fit: CurveSummary = {
      ...summary('linearPlateau', { a: 6500, b: 65, x0: 40 }),
      status: 'full-response-at-lowest-rate',
      joinBetweenKgHa: [0, 40],
    };
    const opt = economicOptimum(fit, prices);
    expect(opt.status).toBe('join-in-first-interval');
    expect(opt.rangeKgHa).toEqual([0, 40]);
    expect(opt.rateKgHa).toBeNull();
    expect(opt.explanation).toMatch(/between 0 and 40 kg\/ha/);
  });
});

describe('economicOptimum explanations write rates with the caller’s format', () => {
  // lb/ac from kg/ha: 1 lb = 0.45359237 kg, 1 acre = 4046.8564224 m² (NIST SP 811, Appendix B).
  const kgHaPerLbAc = (0.45359237 * 10000) / 4046.8564224;
  const lbAc = {
    number: (kgHa: number) => String(Math.round(kgHa / kgHaPerLbAc)),
    unit: 'lb N/ac',
  };
  // (6 − 80) / (2 · −0.1) = 370 kg/ha past the highest rate, 200 kg/ha.
  const capped = summary('quadratic', { a: 5000, b: 80, c: -0.1 });
  it('defaults to kg/ha, rounded', () => {
    expect(economicOptimum(capped, prices).explanation).toContain('The formula gives 370 kg/ha');
  });
  it('uses a lb/ac format for every rate and leaves kg out', () => {
    const text = economicOptimum(capped, prices, { rateFormat: lbAc }).explanation;
    // 370 / 1.12085 = 330.1 and 200 / 1.12085 = 178.4 lb/ac
    expect(text).toContain('330 lb N/ac');
    expect(text).toContain('(178 lb N/ac)');
    expect(text).not.toMatch(/kg/);
  });
  it('never writes a rate or price ratio with floating-point noise', () => {
    // An interior optimum with an irrational rate: ln(b k / PR) / k, PR = 6.
    const fits: CurveSummary[] = [
      summary('exponential', { a: 5500, b: 4000, k: 0.015 }),
      summary('quadratic', { a: 5000, b: 40.123456789, c: -0.1 }),
      summary('linear', { a: 6000, b: 14.987654321 }),
      summary('linearPlateau', { a: 6000, b: 5.55555, x0: 110.987654 }),
      {
        ...summary('linearPlateau', { a: 6500, b: 65, x0: 40 }),
        status: 'full-response-at-lowest-rate',
        joinBetweenKgHa: [0, 40.000000001],
      },
    ];
    for (const fit of fits) {
      const text = economicOptimum(fit, prices).explanation;
      expect(text, text).not.toMatch(/\d\.\d{2,}/);
    }
  });
});

describe('optimumAcrossModels', () => {
  const fit = (model: ModelName, params: Record<string, number>) => summary(model, params);
  const fits = {
    // Optima at PR = 6: 110 (join), 125 (x0 + PR/2c) and 170 ((PR − b)/2c), derived above.
    linearPlateau: fit('linearPlateau', { a: 6000, b: 30, x0: 110 }),
    quadraticPlateau: fit('quadraticPlateau', { P: 9400, c: -0.12, x0: 150 }),
    quadratic: fit('quadratic', { a: 5000, b: 40, c: -0.1 }),
    linear: fit('linear', { a: 6000, b: 14 }),
  } as unknown as Parameters<typeof optimumAcrossModels>[0];
  const rank = (model: ModelName, r: number | null, delta: number) => ({
    model,
    rank: r,
    aicc: 100 + delta,
    deltaAicc: delta,
    weight: 0,
    reason: '',
  });
  const ranking = [
    rank('linearPlateau', 1, 0),
    rank('quadraticPlateau', 2, 1.5),
    rank('quadratic', 3, 6),
    rank('linear', 4, 30),
  ];
  it('warns when the candidate curves’ optima spread more than the tolerance (110 to 170 kg/ha)', () => {
    const c = optimumAcrossModels(fits, ranking, prices);
    expect(c.candidates).toEqual(['linearPlateau', 'quadraticPlateau', 'quadratic']);
    expect(c.lowestRateKgHa).toBeCloseTo(110, 9);
    expect(c.highestRateKgHa).toBeCloseTo(170, 9);
    expect(c.warning).toMatch(/110 to 170 kg\/ha/);
    // The straight line's corner is priced but never a candidate.
    expect(c.optima.map((o) => o.model)).toContain('linear');
  });
  it('says nothing when the candidates within ΔAICc 2 agree within 20 kg/ha (110 and 125)', () => {
    const c = optimumAcrossModels(fits, ranking, prices, { maxDeltaAicc: 2 });
    expect(c.candidates).toEqual(['linearPlateau', 'quadraticPlateau']);
    expect(c.warning).toBeNull();
  });
});
