// Property tests (fast-check) of the response models: exact data are refitted to
// their parameters, scaling yields scales the plateau and leaves the join, and a
// change of units (lb/ac ↔ kg/ha, factor from the exact pound 0.45359237 kg and
// the international acre 4046.8564224 m²) carries the optimum with it.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { economicOptimum } from '../shared/economics';
import {
  fitExponential,
  fitLinearPlateau,
  fitQuadraticPlateau,
  fitAllModels,
  type SiteData,
} from '../shared/models';

const RATES = [0, 40, 80, 120, 160, 200];
const LB_AC_TO_KG_HA = (0.45359237 * 10000) / 4046.8564224; // 1.12085116…

function exactSite(
  curve: (x: number) => number,
  blocks = 3,
): { rateKgHa: number[]; yieldKgHa: number[]; block: string[] } {
  const rateKgHa: number[] = [];
  const yieldKgHa: number[] = [];
  const block: string[] = [];
  for (let b = 0; b < blocks; b++) {
    for (const r of RATES) {
      rateKgHa.push(r);
      yieldKgHa.push(curve(r));
      block.push(`B${b}`);
    }
  }
  return { rateKgHa, yieldKgHa, block };
}

/** Deterministic "noise" so that fits are not exact but the property is still checked. */
function wobble(i: number, size: number): number {
  return size * Math.sin(12.9898 * (i + 1)) * 0.5;
}

describe('refitting data generated exactly from a model returns its parameters', () => {
  it('fitLinearPlateau recovers a, b and x0 (x0 past the second rate)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 3000, max: 9000, noNaN: true }),
        fc.double({ min: 5, max: 60, noNaN: true }),
        fc.double({ min: 45, max: 195, noNaN: true }),
        (a, b, x0) => {
          const fit = fitLinearPlateau(exactSite((x) => a + b * Math.min(x, x0)));
          expect(fit.status).toBe('ok');
          expect(fit.params.x0).toBeCloseTo(x0, 5);
          expect(fit.params.b).toBeCloseTo(b, 6);
          expect(fit.params.a).toBeCloseTo(a, 4);
        },
      ),
      { numRuns: 60 },
    );
  });
  it('fitQuadraticPlateau recovers P, c and x0', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 6000, max: 12000, noNaN: true }),
        fc.double({ min: -0.3, max: -0.02, noNaN: true }),
        fc.double({ min: 85, max: 195, noNaN: true }),
        (P, c, x0) => {
          const fit = fitQuadraticPlateau(exactSite((x) => P + c * Math.min(x - x0, 0) ** 2));
          expect(fit.status).toBe('ok');
          expect(fit.params.x0).toBeCloseTo(x0, 4);
          expect(fit.params.c).toBeCloseTo(c, 7);
          expect(fit.params.P).toBeCloseTo(P, 4);
        },
      ),
      { numRuns: 60 },
    );
  });
  it('fitExponential recovers a, b and k', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 3000, max: 8000, noNaN: true }),
        fc.double({ min: 1000, max: 6000, noNaN: true }),
        fc.double({ min: 0.003, max: 0.06, noNaN: true }),
        (a, b, k) => {
          const fit = fitExponential(exactSite((x) => a + b * (1 - Math.exp(-k * x))));
          expect(fit.status).toBe('ok');
          expect(fit.params.k / k).toBeCloseTo(1, 6);
          expect(fit.params.b / b).toBeCloseTo(1, 6);
          expect(fit.params.a).toBeCloseTo(a, 3);
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('multiplying yields by a constant scales the plateau and leaves the join', () => {
  it('holds for the linear- and quadratic-plateau on noisy data', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 20, noNaN: true }),
        fc.double({ min: 70, max: 170, noNaN: true }),
        (factor, x0) => {
          const base = exactSite((x) => 6000 + 25 * Math.min(x, x0), 4);
          const noisy = { ...base, yieldKgHa: base.yieldKgHa.map((y, i) => y + wobble(i, 300)) };
          const scaled = { ...noisy, yieldKgHa: noisy.yieldKgHa.map((y) => y * factor) };
          for (const fitter of [fitLinearPlateau, fitQuadraticPlateau]) {
            const one = fitter(noisy);
            const two = fitter(scaled);
            expect(two.status).toBe(one.status);
            if (one.status !== 'ok') continue;
            expect(two.joinPoint!.estimate).toBeCloseTo(one.joinPoint!.estimate, 5);
            // x0 is located to Brent's tolerance (about 1e-10 relative), hence 7 digits.
            expect(two.plateauYield!.estimate / (one.plateauYield!.estimate * factor)).toBeCloseTo(
              1,
              7,
            );
            expect(two.sse / (one.sse * factor * factor)).toBeCloseTo(1, 8);
          }
        },
      ),
      { numRuns: 40 },
    );
  });
});

describe('converting rates and yields between lb/ac and kg/ha converts the optimum the same way', () => {
  it('holds for every model with an interior optimum', () => {
    expect(LB_AC_TO_KG_HA).toBeCloseTo(1.12085, 5);
    fc.assert(
      fc.property(
        fc.double({ min: 80, max: 160, noNaN: true }),
        fc.integer({ min: 0, max: 50 }),
        (x0, seed) => {
          // The site in lb/ac (rates lb N/ac, yields lb/ac) and the same site in kg/ha.
          const lb = exactSite((x) => 5000 + 22 * Math.min(x, x0), 4);
          lb.yieldKgHa = lb.yieldKgHa.map((y, i) => y + wobble(i + seed, 250));
          const kg: SiteData = {
            rateKgHa: Array.from(lb.rateKgHa, (r) => r * LB_AC_TO_KG_HA),
            yieldKgHa: Array.from(lb.yieldKgHa, (y) => y * LB_AC_TO_KG_HA),
            block: lb.block,
          };
          // Prices per lb and per kg are the same ratio: PR is unitless (kg/kg = lb/lb).
          const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 1.1 };
          const inLb = fitAllModels(lb);
          const inKg = fitAllModels(kg);
          for (const model of [
            'quadratic',
            'linearPlateau',
            'quadraticPlateau',
            'exponential',
          ] as const) {
            const a = economicOptimum(inLb.fits[model], prices);
            const b = economicOptimum(inKg.fits[model], prices);
            expect(b.status).toBe(a.status);
            if (a.rateKgHa === null) continue;
            if (a.rateKgHa === 0) expect(b.rateKgHa).toBe(0);
            else expect(b.rateKgHa! / (a.rateKgHa * LB_AC_TO_KG_HA)).toBeCloseTo(1, 6);
          }
        },
      ),
      { numRuns: 30 },
    );
  });
});
