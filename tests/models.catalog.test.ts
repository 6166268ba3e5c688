// The model catalog (shared/models/catalog) and the curve list it builds on
// (shared/models/curves): every name has one consistent entry in both, and the entry's pieces
// agree with each other and with calculus. The closed-form optimum is
// checked against the slope of the curve by central differences (dy/dx = PR at x*).
import { describe, expect, it } from 'vitest';
import {
  fitAllModels,
  MODEL_CATALOG,
  MODEL_CURVES,
  MODEL_NAMES,
  modelLabel,
  modelLabelInText,
  paramDimension,
  PLATEAU_MODELS,
} from '../shared/models';

/** Parameters of each model that give a rising curve with an interior optimum at PR = 5. */
const RISING: Record<string, Record<string, number>> = {
  linear: { a: 6000, b: 20 },
  proportional: { b: 20 },
  quadratic: { a: 6000, b: 40, c: -0.1 },
  linearPlateau: { a: 6000, b: 25, x0: 140 },
  quadraticPlateau: { P: 10000, c: -0.15, x0: 160 },
  exponential: { a: 6000, b: 4000, k: 0.015 },
  step: { a: 6000, d: 3000 },
};

describe('MODEL_CATALOG', () => {
  it('has one entry per model name, each naming its own model', () => {
    expect(Object.keys(MODEL_CATALOG).sort()).toEqual([...MODEL_NAMES].sort());
    for (const name of MODEL_NAMES) expect(MODEL_CATALOG[name].spec.model).toBe(name);
  });
  it('takes the names, in display order, from the curve list, and each curve from there', () => {
    expect(MODEL_NAMES).toEqual([
      'linear',
      'proportional',
      'quadratic',
      'linearPlateau',
      'quadraticPlateau',
      'exponential',
      'step',
    ]);
    expect(Object.keys(MODEL_CURVES)).toEqual([...MODEL_NAMES]);
    for (const name of MODEL_NAMES) {
      const { fit, estimate, ...curve } = MODEL_CATALOG[name];
      expect([typeof fit, typeof estimate]).toEqual(['function', 'function']);
      expect(curve).toEqual(MODEL_CURVES[name]);
      expect(curve.spec).toBe(MODEL_CURVES[name].spec);
      expect(curve.optimum).toBe(MODEL_CURVES[name].optimum);
    }
  });
  it('gives every model a display name and a dash of its own', () => {
    const labels = MODEL_NAMES.map(modelLabel);
    expect(new Set(labels).size).toBe(MODEL_NAMES.length);
    expect(new Set(MODEL_NAMES.map((m) => MODEL_CATALOG[m].dash)).size).toBe(MODEL_NAMES.length);
    expect(labels).toEqual([
      'Straight line',
      'Line through the origin',
      'Quadratic',
      'Linear-plateau',
      'Quadratic-plateau',
      'Exponential rise',
      'Check vs fertilized step',
    ]);
    expect(modelLabelInText('proportional')).toBe('line through the origin');
  });
  it('gives every parameter a dimension, and only those', () => {
    for (const name of MODEL_NAMES) {
      const { paramNames, dimensions } = MODEL_CATALOG[name].spec;
      expect(Object.keys(dimensions).sort()).toEqual([...paramNames].sort());
    }
    expect(paramDimension('exponential', 'b')).toBe('yield');
    expect(paramDimension('linear', 'b')).toBe('yieldPerRate');
    expect(() => paramDimension('linear', 'x0')).toThrow('the linear model has no parameter "x0"');
  });
  it('names a limit model that is itself in the catalog and simpler', () => {
    for (const name of MODEL_NAMES) {
      const { limit } = MODEL_CATALOG[name];
      if (limit === null) continue;
      expect(MODEL_NAMES).toContain(limit);
      expect(MODEL_CATALOG[limit].linearInParameters).toBe(true);
    }
  });
  it('compares across sites by pooled fits exactly the models not linear in their parameters', () => {
    expect([...PLATEAU_MODELS]).toEqual(['linearPlateau', 'quadraticPlateau', 'exponential']);
  });
  it.each(MODEL_NAMES)('%s: the curve from stored parameters is the fitted curve', (name) => {
    const entry = MODEL_CATALOG[name];
    const params = RISING[name];
    const vector = Float64Array.from(entry.spec.paramNames, (p) => params[p]);
    for (const x of [0, 37.5, 100, 139.9, 140, 160, 200, 250]) {
      expect(entry.curveValue(params, x)).toBeCloseTo(entry.spec.value(x, vector), 9);
    }
  });
  // The step's slope is nowhere the price ratio: its optimum is a range from the tested rates
  // (tests/models.step.test.ts).
  it.each(MODEL_NAMES.filter((m) => MODEL_CATALOG[m].isCurve && m !== 'step'))(
    '%s: the closed-form optimum is where the slope equals the price ratio',
    (name) => {
      const entry = MODEL_CATALOG[name];
      const params = RISING[name];
      const pr = 5;
      const { rateKgHa } = entry.optimum(params, pr, 300);
      expect(rateKgHa).toBeGreaterThan(0);
      const h = 1e-3;
      const below =
        (entry.curveValue(params, rateKgHa - h) - entry.curveValue(params, rateKgHa - 2 * h)) / h;
      const above =
        (entry.curveValue(params, rateKgHa + 2 * h) - entry.curveValue(params, rateKgHa + h)) / h;
      // The slope crosses PR at x*: at or above it just before, at or below it just after
      // (the linear-plateau's slope drops from b to 0 at its join).
      expect(below).toBeGreaterThanOrEqual(pr - 1e-3);
      expect(above).toBeLessThanOrEqual(pr + 1e-3);
    },
  );
  it('straight lines are not curves: their optimum is a corner', () => {
    for (const name of ['linear', 'proportional'] as const) {
      expect(MODEL_CATALOG[name].isCurve).toBe(false);
      expect(MODEL_CATALOG[name].optimum(RISING[name], 5, 300).rateKgHa).toBe(300);
      expect(MODEL_CATALOG[name].optimum(RISING[name], 25, 300).rateKgHa).toBe(0);
    }
  });
  it('a fit carries its catalog display name', () => {
    const all = fitAllModels({
      rateKgHa: [0, 0, 60, 60, 120, 120, 180, 180],
      yieldKgHa: [5100, 5300, 7900, 8200, 9000, 9100, 9000, 9200],
    });
    for (const name of MODEL_NAMES) expect(all.fits[name].label).toBe(modelLabel(name));
  });
});
