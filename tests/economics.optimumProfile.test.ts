// optimumProfileInterval (shared/economics/optimumProfile): which optima get a profile
// interval at these prices, and from what. The intervals themselves are checked against R by
// brute force in tests/models.profileInterval.reference.test.ts.
import { describe, expect, it } from 'vitest';
import { optimumProfileInterval } from '../shared/economics/optimumProfile';
import { fitAllModelsPrepared } from '../shared/models/fitAllModels';
import { joinProfileInterval } from '../shared/models/joinProfile';
import { prepareSite } from '../shared/models/prepareSite';

const rateKgHa = [0, 40, 80, 120, 160, 200, 0, 40, 80, 120, 160, 200, 0, 40, 80, 120, 160, 200];
// A plateau from 110 kg/ha with a slope of 25 kg grain per kg N, and a fixed wobble.
const yieldKgHa = rateKgHa.map((x, i) => 6000 + 25 * Math.min(x, 110) + [150, -220, 70][i % 3]);
const site = prepareSite({ rateKgHa, yieldKgHa }, 'none');
const fits = fitAllModelsPrepared(site).fits;
const join = joinProfileInterval(site, fits.linearPlateau, 0.9);
const at = (priceRatio: number) => ({ grainPricePerKg: 0.2, nutrientPricePerKg: 0.2 * priceRatio });

describe('optimumProfileInterval', () => {
  it("gives the linear-plateau's optimum its join's interval when the slope pays", () => {
    expect(fits.linearPlateau.status).toBe('ok');
    const r = optimumProfileInterval(fits.linearPlateau, join, at(6), 0.9);
    expect(r).toEqual({ ...join, model: 'linearPlateau', basis: 'join' });
  });

  it('gives none when the slope does not pay (the optimum is no nutrient)', () => {
    expect(optimumProfileInterval(fits.linearPlateau, join, at(40), 0.9)).toBeNull();
  });

  it("holds the quadratic's closed-form optimum (PR − b)/(2c) inside its interval", () => {
    const q = fits.quadratic;
    const r = optimumProfileInterval(q, null, at(6), 0.9)!;
    expect(r.basis).toBe('linear-constraint');
    expect(r.estimateKgHa).toBeCloseTo((6 - q.params.b) / (2 * q.params.c), 9);
    expect(r.lowKgHa).toBeLessThan(r.estimateKgHa);
    expect(r.highKgHa).toBeGreaterThan(r.estimateKgHa);
  });

  it('gives none for the quadratic-plateau and the exponential (their profile needs refits)', () => {
    expect(optimumProfileInterval(fits.quadraticPlateau, null, at(6), 0.9)).toBeNull();
    expect(optimumProfileInterval(fits.exponential, null, at(6), 0.9)).toBeNull();
  });
});
