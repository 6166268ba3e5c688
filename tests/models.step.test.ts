// The check vs fertilized step y = a + d·[x > 0] (shared/models/step): its fit against R
// 4.2.2's lm() (tests/fixtures/models/stepFits.R; its output stepFits.json records the R
// version), its optimum as a range, and its place in the recommendation's rule. The sites are
// invented (known curves plus seeded noise).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { economicOptimum } from '../shared/economics/economicOptimum';
import { fitAllModels } from '../shared/models';
import { chooseModel } from '../shared/models/chooseModel';
import { fitStep } from '../shared/models/step';

interface RFit {
  params: Record<string, number>;
  stdErrors: Record<string, number>;
  sse: number;
  dfResidual: number;
  aicc: number;
}
interface RSite {
  rateKgHa: number[];
  yieldKgHa: number[];
  block: string[];
  plain: RFit;
  blocked: RFit;
}
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/models/stepFits.json', import.meta.url), 'utf8'),
) as { rVersion: string; sites: Record<string, RSite> };

const relativeDifference = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };

describe('step against R 4.2 lm(y ~ fertilized) (tests/fixtures/models/stepFits.R)', () => {
  it('was made by R 4.2', () => expect(reference.rVersion).toMatch(/^R version 4\.2/));
  for (const [name, site] of Object.entries(reference.sites)) {
    it(`${name}: coefficients, standard errors, SSE and AICc, without and with block offsets`, () => {
      for (const [blocks, r] of [
        ['none', site.plain],
        ['fixed', site.blocked],
      ] as const) {
        const fit = fitStep(
          { rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa, block: site.block },
          { blocks },
        );
        for (const p of ['a', 'd']) {
          expect(relativeDifference(fit.params[p], r.params[p])).toBeLessThan(1e-9);
          expect(relativeDifference(fit.stdErrors[p], r.stdErrors[p])).toBeLessThan(1e-9);
        }
        expect(relativeDifference(fit.sse, r.sse)).toBeLessThan(1e-9);
        expect(fit.dfResidual).toBe(r.dfResidual);
        expect(Math.abs(fit.aicc - r.aicc)).toBeLessThan(1e-9 * Math.abs(r.aicc));
      }
    });
  }
});

describe('step: what it answers', () => {
  const full = reference.sites.fullSite;
  const data = { rateKgHa: full.rateKgHa, yieldKgHa: full.yieldKgHa, block: full.block };

  it('a full response: the optimum is the range up to the second-lowest rate, never one number', () => {
    const fit = fitStep(data, { blocks: 'fixed' });
    expect(fit.status).toBe('full-response-at-lowest-rate');
    const o = economicOptimum(fit, prices);
    expect(o.status).toBe('join-in-first-interval');
    expect(o.rateKgHa).toBeNull();
    expect(o.rangeKgHa).toEqual([0, 40]);
  });

  it('leads the recommendation where the whole response came by the lowest rate, and not on a gradual rise', () => {
    const rank = (site: RSite) => {
      const all = fitAllModels(
        { rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa, block: site.block },
        { blocks: 'fixed' },
      );
      return chooseModel(all.ranking.map((r) => ({ ...r, status: all.fits[r.model].status })));
    };
    expect(rank(full)).toBe('step');
    expect(rank(reference.sites.lpSite)).not.toBe('step');
  });

  it('needs check plots at rate 0 and three rates', () => {
    const noCheck = fitStep({
      rateKgHa: [40, 80, 120, 40, 80, 120],
      yieldKgHa: [9, 9, 9, 9.1, 9, 9],
    });
    expect(noCheck.status).toBe('too-few-rates');
    expect(noCheck.message).toMatch(/rate 0/);
    const two = fitStep({ rateKgHa: [0, 80, 0, 80], yieldKgHa: [7, 9, 7.1, 9.2] });
    expect(two.status).toBe('too-few-rates');
  });
});
