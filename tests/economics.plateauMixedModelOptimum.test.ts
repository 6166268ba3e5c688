// plateauMixedModelOptimum's rate checked against a brute-force search of the net return
// y(x) − PR·x on a 0.01 kg/ha grid of the population curve (an independent computation of the
// same definition, not a published value), and its edge cases one by one. Its delta-method SE
// is checked against R's nlme in tests/analysis.regionalPlateauMixedModel.reference.test.ts.
import { describe, expect, it } from 'vitest';
import {
  plateauMixedModelOptimum,
  type PlateauMixedFixedEffects,
} from '../shared/economics/plateauMixedModelOptimum';

const covariance = [
  [90000, 0, 0],
  [0, 1e-4, 0.01],
  [0, 0.01, 100],
];
function model(
  form: PlateauMixedFixedEffects['model'],
  shape: number,
  x0: number,
): PlateauMixedFixedEffects {
  return {
    model: form,
    fixed: { P: 11000, shape, x0 },
    fixedCovariance: covariance,
    testedRangeKgHa: [0, 240],
    dfFixed: 15,
  };
}

function gridOptimum(m: PlateauMixedFixedEffects, pr: number): number {
  const { P, shape, x0 } = m.fixed;
  let best = -Infinity;
  let at = 0;
  for (let x = 0; x <= 240; x += 0.01) {
    const d = Math.min(x - x0, 0);
    const y = m.model === 'quadraticPlateau' ? P + shape * d * d : P + shape * d;
    if (y - pr * x > best + 1e-9) {
      best = y - pr * x;
      at = x;
    }
  }
  return at;
}

describe('plateauMixedModelOptimum', () => {
  const cases: [PlateauMixedFixedEffects['model'], number, number, number][] = [
    ['quadraticPlateau', -0.16, 150, 5.5],
    ['quadraticPlateau', -0.05, 200, 12],
    ['linearPlateau', 35, 120, 5.5],
    ['linearPlateau', 35, 120, 30],
  ];
  for (const [form, shape, x0, pr] of cases) {
    it(`puts the ${form} (shape ${shape}, join ${x0}) optimum at PR ${pr} where the grid does`, () => {
      const m = model(form, shape, x0);
      const o = plateauMixedModelOptimum(m, pr, 0.9);
      expect(o.status).toBe('interior');
      expect(Math.abs(o.rateKgHa - gridOptimum(m, pr))).toBeLessThan(0.02);
      expect(o.interval!.lowKgHa).toBeLessThan(o.rateKgHa);
      expect(o.interval!.highKgHa).toBeGreaterThan(o.rateKgHa);
    });
  }
  it('gives the linear-plateau the lowest rate and no interval when N costs more than its slope', () => {
    const o = plateauMixedModelOptimum(model('linearPlateau', 35, 120), 40, 0.9);
    expect(o).toMatchObject({ status: 'capped-low', rateKgHa: 0, interval: null });
  });
  it('caps the quadratic-plateau optimum below the tested range and opens the interval there', () => {
    const o = plateauMixedModelOptimum(model('quadraticPlateau', -0.01, 20), 5.5, 0.9);
    expect(o.status).toBe('capped-low');
    expect(o.rateKgHa).toBe(0);
    expect(o.interval!.lowOpen).toBe(true);
  });
  it('reports no maximum for a curvature that does not bend down', () => {
    const o = plateauMixedModelOptimum(model('quadraticPlateau', 0.01, 150), 5.5, 0.9);
    expect(o.status).toBe('no-maximum');
    expect(o.interval).toBeNull();
  });
  it("gives the linear-plateau's interval as the join's: ± t·SE(x0)", () => {
    const o = plateauMixedModelOptimum(model('linearPlateau', 35, 120), 5.5, 0.9);
    // t(0.95, 15) = 1.753050 (Student t table, e.g. R qt(0.95, 15)); SE(x0) = 10.
    expect(o.stdErrorKgHa).toBeCloseTo(10, 12);
    expect(o.interval!.highKgHa - 120).toBeCloseTo(17.5305, 3);
  });
});
