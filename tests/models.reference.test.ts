// Checks the six response models against reference fits made with R 4.2.2
// (tests/fixtures/models/referenceFits.R; its output referenceFits.json records
// the R version). The sites are invented (known curves plus seeded noise).
// lm() for the linear models; for the plateau and exponential models the global
// optimum found in R by a fine grid over the nonlinear parameter followed by
// nls(algorithm = "port"), with nls()'s standard errors s²(JᵀJ)⁻¹.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fitAllModels, MODEL_NAMES, type ModelName } from '../shared/models';

interface RFit {
  params: Record<string, number>;
  stdErrors: Record<string, number>;
  sse: number;
  dfResidual: number;
  aicc: number;
}
interface NaiveResult {
  failed: boolean;
  sse?: number;
  message?: string;
}
interface RSite {
  rateKgHa: number[];
  yieldKgHa: number[];
  block: string[];
  linearBlocks: { params: Record<string, number>; sse: number; dfResidual: number };
  quadraticBlocks: { params: Record<string, number>; sse: number; dfResidual: number };
  naiveStart?: Record<string, NaiveResult>;
  guessStart?: Record<string, NaiveResult>;
  linearPlateauProfile?: { joins: number[]; sse: number[]; gridArgmin: number };
  blocksProfiled?: Record<string, Record<string, number>>;
  [model: string]: unknown;
}
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/models/referenceFits.json', import.meta.url), 'utf8'),
) as { rVersion: string; sites: Record<string, RSite> };

function relativeDifference(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe('reference fits come from R', () => {
  it('records R 4.2.2', () => expect(reference.rVersion).toMatch(/^R version 4\.2\.2/));
});

const linearModels: ModelName[] = ['linear', 'proportional', 'quadratic'];
const profiledModels: ModelName[] = ['linearPlateau', 'quadraticPlateau', 'exponential'];

for (const [siteName, site] of Object.entries(reference.sites)) {
  describe(`fitAllModels on ${siteName} (R 4.2.2 reference)`, () => {
    const data = { rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa, block: site.block };
    const all = fitAllModels(data);

    for (const model of linearModels) {
      it(`${model} matches R lm(): coefficients, SEs, SSE and AICc to 1e-9 relative`, () => {
        const r = site[model] as RFit;
        const fit = all.fits[model];
        expect(fit.dfResidual).toBe(r.dfResidual);
        expect(relativeDifference(fit.sse, r.sse)).toBeLessThan(1e-9);
        expect(Math.abs(fit.aicc - r.aicc)).toBeLessThan(1e-9 * Math.abs(r.aicc));
        for (const name of Object.keys(r.params)) {
          expect(relativeDifference(fit.params[name], r.params[name])).toBeLessThan(1e-9);
          expect(relativeDifference(fit.stdErrors[name], r.stdErrors[name])).toBeLessThan(1e-9);
        }
      });
    }

    it('proportional R² is labelled uncentered, the others centered', () => {
      expect(all.fits.proportional.r2Kind).toBe('uncentered');
      expect(all.fits.linear.r2Kind).toBe('centered');
    });

    it('fixed blocks match R lm(y ~ x + block) with contr.sum (SSE 1e-9, df exact)', () => {
      const blocked = fitAllModels(data, { blocks: 'fixed', models: ['linear', 'quadratic'] });
      expect(blocked.fits.linear.dfResidual).toBe(site.linearBlocks.dfResidual);
      expect(relativeDifference(blocked.fits.linear.sse, site.linearBlocks.sse)).toBeLessThan(1e-9);
      expect(relativeDifference(blocked.fits.quadratic.sse, site.quadraticBlocks.sse)).toBeLessThan(
        1e-9,
      );
      for (const name of ['a', 'b', 'c']) {
        expect(
          relativeDifference(
            blocked.fits.quadratic.params[name],
            site.quadraticBlocks.params[name],
          ),
        ).toBeLessThan(1e-9);
      }
      const offsets = Object.values(blocked.fits.linear.blockOffsets);
      expect(offsets).toHaveLength(4);
      expect(Math.abs(offsets.reduce((s, v) => s + v, 0))).toBeLessThan(1e-8);
    });

    if (site.linearPlateau) {
      for (const model of profiledModels) {
        it(`${model} reaches R's global optimum: SSE no higher (1e-9), parameters within 1e-4 SE, SEs within 1e-5`, () => {
          const r = site[model] as RFit;
          const fit = all.fits[model];
          expect(fit.status).toBe('ok');
          expect(fit.dfResidual).toBe(r.dfResidual);
          // R's nls stops on its own convergence test, so it can only be at or above the minimum.
          expect(fit.sse).toBeLessThanOrEqual(r.sse * (1 + 1e-9));
          expect(relativeDifference(fit.sse, r.sse)).toBeLessThan(1e-9);
          for (const name of Object.keys(r.params)) {
            expect(Math.abs(fit.params[name] - r.params[name])).toBeLessThan(
              1e-4 * r.stdErrors[name],
            );
            expect(relativeDifference(fit.stdErrors[name], r.stdErrors[name])).toBeLessThan(1e-5);
          }
        });
      }

      it('with fixed blocks matches R: lm(y ~ g + block, contr.sum) profiled by grid and optimize()', () => {
        const blocked = fitAllModels(data, { blocks: 'fixed', models: profiledModels });
        for (const model of profiledModels) {
          const r = site.blocksProfiled![model];
          const fit = blocked.fits[model];
          expect(fit.status).toBe('ok');
          expect(fit.dfResidual).toBe(r.dfResidual);
          // optimize() stops on its own tolerance, so it can only be at or above the minimum.
          expect(fit.sse).toBeLessThanOrEqual(r.sse * (1 + 1e-10));
          expect(relativeDifference(fit.sse, r.sse)).toBeLessThan(1e-9);
          const theta = model === 'exponential' ? 'k' : 'x0';
          expect(Math.abs(fit.params[theta] - r[theta])).toBeLessThan(1e-3 * fit.stdErrors[theta]);
          for (const name of Object.keys(r).filter(
            (k) => !['sse', 'dfResidual', theta].includes(k),
          )) {
            expect(Math.abs(fit.params[name] - r[name])).toBeLessThan(1e-3 * fit.stdErrors[name]);
          }
          expect(Object.values(fit.blockOffsets)).toHaveLength(4);
        }
      });

      it("is never worse than R's nls from naive or guessed starting values, and R fails on some", () => {
        const tried = [site.naiveStart!, site.guessStart!];
        let failures = 0;
        let worse = 0;
        for (const starts of tried) {
          for (const model of profiledModels) {
            const r = starts[model];
            if (r.failed) {
              failures++;
              continue;
            }
            expect(all.fits[model].sse).toBeLessThanOrEqual(r.sse! * (1 + 1e-9));
            if (all.fits[model].sse < r.sse! * (1 - 1e-3)) worse++;
          }
        }
        expect(failures).toBeGreaterThan(0);
        // On lpSite nls started at x0 = 70 stops in a local minimum 9.6 % above the global one.
        if (siteName === 'lpSite') expect(worse).toBeGreaterThan(0);
      });
    }
  });
}

describe('degenerate reference sites (R 4.2.2 profile of the linear-plateau)', () => {
  it('fitLinearPlateau reports full response by the lowest rate when R finds SSE flat over the first interval', () => {
    const site = reference.sites.firstIntervalSite;
    const profile = site.linearPlateauProfile!;
    // R: the same SSE at joins 5, 20 and 35 kg/ha, so the join is not identified.
    expect(relativeDifference(profile.sse[0], profile.sse[2])).toBeLessThan(1e-12);
    const all = fitAllModels({ rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa });
    for (const model of ['linearPlateau', 'quadraticPlateau', 'exponential'] as const) {
      const fit = all.fits[model];
      expect(fit.status).toBe('full-response-at-lowest-rate');
      expect(fit.joinBetweenKgHa).toEqual([0, 40]);
      expect(fit.joinPoint).toBeNull();
      expect(relativeDifference(fit.sse, profile.sse[1])).toBeLessThan(1e-9);
    }
    expect(Number.isNaN(all.fits.linearPlateau.params.x0)).toBe(true);
  });

  it('fitLinearPlateau and fitQuadraticPlateau report no plateau when R puts the best join at the highest rate', () => {
    const site = reference.sites.risingSite;
    expect(site.linearPlateauProfile!.gridArgmin).toBe(200);
    const all = fitAllModels({ rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa });
    expect(all.fits.linearPlateau.status).toBe('no-plateau');
    expect(all.fits.quadraticPlateau.status).toBe('no-plateau');
    expect(all.fits.exponential.status).toBe('no-plateau');
    // R's quadratic opens upward on this site.
    expect((site.quadratic as RFit).params.c).toBeGreaterThan(0);
    expect(all.fits.quadratic.status).toBe('convex');
    // No join is reported as a number, and the no-plateau fits are not ranked.
    expect(all.fits.linearPlateau.joinPoint).toBeNull();
    const unranked = all.ranking.filter((r) => r.rank === null).map((r) => r.model);
    expect(unranked).toEqual(expect.arrayContaining(['linearPlateau', 'quadraticPlateau']));
    // The LP in its limit is the straight line exactly.
    expect(relativeDifference(all.fits.linearPlateau.sse, all.fits.linear.sse)).toBeLessThan(1e-12);
  });

  it('fitAllModels reports the exponential of a rising, convex site as its limit, the straight line (R lm)', () => {
    // The rate constant runs to 0 and b to infinity (b·k is the slope): the fit reports the
    // line itself, a its yield at rate 0 with the line's SE and residual df, b and k blank.
    const site = reference.sites.risingSite;
    const line = site.linear as RFit;
    const fit = fitAllModels({ rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa }).fits
      .exponential;
    expect(fit.status).toBe('no-plateau');
    expect(relativeDifference(fit.params.a, line.params.a)).toBeLessThan(1e-9);
    expect(relativeDifference(fit.stdErrors.a, line.stdErrors.a)).toBeLessThan(1e-9);
    expect(relativeDifference(fit.sse, line.sse)).toBeLessThan(1e-9);
    expect([fit.dfResidual, fit.estimatedParameterCount]).toEqual([line.dfResidual, 2]);
    expect([fit.params.b, fit.params.k]).toEqual([NaN, NaN]);
  });
});

describe('fits at a limit report the limiting model as R fits it (R 4.2.2 lm)', () => {
  type Limits = { step: RFit; stepUpper: { estimate: number; stdError: number }; flat: RFit };
  const profiled = ['linearPlateau', 'quadraticPlateau', 'exponential'] as const;

  it('fitAllModels reports a full response as the step lm(y ~ I(x > 0)): its levels, SEs and residual df', () => {
    const site = reference.sites.firstIntervalSite;
    const r = site as unknown as Limits;
    const all = fitAllModels({ rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa });
    for (const model of profiled) {
      const fit = all.fits[model];
      expect(fit.status).toBe('full-response-at-lowest-rate');
      expect([fit.dfResidual, fit.estimatedParameterCount]).toEqual([r.step.dfResidual, 2]);
      expect(relativeDifference(fit.sse, r.step.sse)).toBeLessThan(1e-9);
      // The plateau is the step's upper level, with its SE from the two estimated levels.
      expect(relativeDifference(fit.plateauYield!.estimate, r.stepUpper.estimate)).toBeLessThan(
        1e-9,
      );
      expect(relativeDifference(fit.plateauYield!.stdError, r.stepUpper.stdError)).toBeLessThan(
        1e-9,
      );
    }
    const exp = all.fits.exponential;
    expect(relativeDifference(exp.params.a, r.step.params.check)).toBeLessThan(1e-9);
    expect(relativeDifference(exp.stdErrors.a, r.step.stdErrors.check)).toBeLessThan(1e-9);
    expect(relativeDifference(exp.params.b, r.step.params.step)).toBeLessThan(1e-9);
    expect(relativeDifference(exp.stdErrors.b, r.step.stdErrors.step)).toBeLessThan(1e-9);
    expect(exp.params.k).toBeNaN();
    expect(relativeDifference(all.fits.linearPlateau.params.a, r.step.params.check)).toBeLessThan(
      1e-9,
    );
  });

  it('fitAllModels reports no response as the flat fit lm(y ~ 1): the mean, its SE, n − 1 df, no gain', () => {
    const site = reference.sites.fallingSite;
    const flat = (site as unknown as Limits).flat;
    const all = fitAllModels({ rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa });
    for (const model of profiled) {
      const fit = all.fits[model];
      const level = model === 'quadraticPlateau' ? 'P' : 'a';
      const rise = model === 'quadraticPlateau' ? 'c' : 'b';
      expect(fit.status).toBe('no-response');
      expect([fit.dfResidual, fit.estimatedParameterCount]).toEqual([flat.dfResidual, 1]);
      expect(relativeDifference(fit.sse, flat.sse)).toBeLessThan(1e-9);
      expect(relativeDifference(fit.params[level], flat.params.mean)).toBeLessThan(1e-9);
      expect(relativeDifference(fit.stdErrors[level], flat.stdErrors.mean)).toBeLessThan(1e-9);
      // The rise is held at 0 by its sign, not estimated: 0, with no SE (before, the
      // exponential reported the unconstrained refit here: b = −274,002 on a flat site).
      expect(fit.params[rise]).toBe(0);
      expect(fit.stdErrors[rise]).toBeNaN();
    }
  });
});

describe('fitAllModels ranking', () => {
  it('ranks every model once', () => {
    const site = reference.sites.lpSite;
    const all = fitAllModels({ rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa });
    expect(all.ranking.map((r) => r.model).sort()).toEqual([...MODEL_NAMES].sort());
    const weights = all.ranking.reduce((s, r) => s + r.weight, 0);
    expect(weights).toBeCloseTo(1, 12);
  });
});
