// The regional quadratic with the timing as a fixed effect (shared/analysis/regionalLevelMixedModel)
// checked against R 4.2.2 with nlme 3.1.162 (tests/fixtures/levelmixed/levelMixed.R; its output
// levelMixed.json records both versions). Data: two sets of 12 invented rate × timing site-years
// from the project's seeded level generator (tests/fixtures/levelmixed/makeLevelMixed.ts), one
// whose split timing truly responds differently and one whose timings share one truth. R fits
// lme(y ~ x1 + q1 + x2 + q2, random = ~ x + I(x^2) | site) (a curve per timing, one intercept for
// the shared check) and lme(y ~ x + I(x^2), same random part) by REML and ML, Psi unstructured
// and diagonal, the full model also by REML with block contrasts nested in site-year.
//
// Tolerances (the project's for mixed models, tests/stats.mixedModel.reference.test.ts): fixed
// effects and their standard errors 1e-4 relative, Psi and sigma^2 1e-3 relative (or 1e-5
// absolute on the scale of Psi/sigma^2 with rates divided by the highest rate, for a variance at
// its boundary 0), log-likelihoods 1e-6 absolute; the likelihood-ratio statistic is a difference
// of two of them (2e-6 each side: 4e-6 absolute) and its p-value is read at 1e-7 absolute.
//
// Two checks, as for the regional quadratic, because nlme's log-Cholesky parameters cannot reach
// a boundary maximum (Psi of rank < 3):
// 1. The numerical pieces at R's own estimate reproduce R (likelihood, fixed effects, SEs).
// 2. The fit never ends below R's log-likelihood; where R's maximum is interior, it is R's.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { expectPsi, thetaFromR } from './mixedModelR.fixture';
import {
  fitRegionalLevelMixedModel,
  levelWaldTest,
  type LevelMixedModelSite,
} from '../shared/analysis/regionalLevelMixedModel';
import { chiSquareUpperP } from '../shared/stats/distributions';
import { mixedModelData } from '../shared/stats/mixedModelData';
import { mixedModelEstimates } from '../shared/stats/mixedModelDeviance';

interface RFit {
  model: 'full' | 'reduced';
  method: 'REML' | 'ML';
  structure: 'unstructured' | 'diagonal';
  blocks: boolean;
  fixed: number[];
  stdErrors: number[];
  psi: number[][];
  sigma2: [number];
  logLik: [number];
  blockConstant: [number];
  wald: { stat: [number]; df: number; p: [number] } | null;
}
interface RSet {
  fits: RFit[];
  lrt: { structure: 'unstructured' | 'diagonal'; stat: [number]; df: [number]; p: [number] }[];
}
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/levelmixed/levelMixed.json', import.meta.url), 'utf8'),
) as Record<'differ' | 'same', RSet>;
const csv = readFileSync(
  new URL('./fixtures/levelmixed/levelMixed.plots.csv', import.meta.url),
  'utf8',
);
const LEVELS = ['At planting', 'Split'];

function sitesOf(dataset: string, withBlocks: boolean): LevelMixedModelSite[] {
  const bySite = new Map<
    string,
    { rateKgHa: number[]; yieldKgHa: number[]; block: string[]; levelIndex: number[] }
  >();
  for (const line of csv.trim().split('\n').slice(1)) {
    const [set, site, block, timing, rate, y] = line.split(',');
    if (set !== dataset) continue;
    const name = site.replaceAll('"', '');
    const s = bySite.get(name) ?? { rateKgHa: [], yieldKgHa: [], block: [], levelIndex: [] };
    s.rateKgHa.push(Number(rate));
    s.yieldKgHa.push(Number(y));
    s.block.push(block);
    s.levelIndex.push(LEVELS.indexOf(timing.replaceAll('"', '')));
    bySite.set(name, s);
  }
  return [...bySite].map(([site, s]) => ({ site, ...s, block: withBlocks ? s.block : undefined }));
}

const relative = (ours: number, r: number) => Math.abs(ours - r) / Math.abs(r);

/** The columns as the module builds them, for the pieces at R's estimate. */
function dataOf(sites: LevelMixedModelSite[], model: 'full' | 'reduced', scale: number) {
  return mixedModelData(
    sites.map((s) => ({
      name: s.site,
      fixedRows: s.rateKgHa.map((x, i) => {
        const u = x / scale;
        if (model === 'reduced') return [1, u, u * u];
        const k = s.levelIndex[i];
        const row = [1, 0, 0, 0, 0];
        if (k >= 0) [row[1 + 2 * k], row[2 + 2 * k]] = [u, u * u];
        return row;
      }),
      randomRows: s.rateKgHa.map((x) => [1, x / scale, (x / scale) ** 2]),
      y: s.yieldKgHa,
      blocks: s.block,
    })),
  );
}

for (const dataset of ['differ', 'same'] as const) {
  describe(`the regional quadratic by timing on '${dataset}' against R's nlme::lme`, () => {
    const set = reference[dataset];
    for (const fit of set.fits) {
      const label = `${fit.model}, ${fit.method}, Psi ${fit.structure}${fit.blocks ? ', blocks fixed in site-year' : ''}`;
      const sites = sitesOf(dataset, fit.blocks);
      const scale = Math.max(...sites.flatMap((s) => s.rateKgHa));
      const p = fit.model === 'full' ? 5 : 3;
      const d = [1, 1 / scale, 1 / scale ** 2, 1 / scale, 1 / scale ** 2].slice(0, p);
      it(`mixedModelEstimates at R's estimate reproduces R (${label})`, () => {
        const e = mixedModelEstimates(
          dataOf(sites, fit.model, scale),
          thetaFromR(fit, scale),
          fit.structure,
          fit.method,
        )!;
        // The REML likelihood follows the scale of X: back to kg/ha by −(sum of powers)·ln(scale).
        const shift = fit.method === 'REML' ? -(p === 5 ? 6 : 3) * Math.log(scale) : 0;
        expect(
          Math.abs(e.logLikelihood + shift - fit.blockConstant[0] - fit.logLik[0]),
        ).toBeLessThan(1e-6);
        e.fixed.forEach((v, i) => expect(relative(v * d[i], fit.fixed[i])).toBeLessThan(1e-4));
        e.fixedCovariance.forEach((row, i) =>
          expect(relative(Math.sqrt(row[i]) * d[i], fit.stdErrors[i])).toBeLessThan(1e-4),
        );
        // σ² from the profiled residual sum of squares, and Ψ = σ²·TTᵀ back in kg/ha.
        expect(relative(e.residualVariance, fit.sigma2[0])).toBeLessThan(1e-3);
        const d3 = [1, 1 / scale, 1 / scale ** 2];
        expectPsi(
          e.randomCovariance.map((row, i) => row.map((v, j) => v * d3[i] * d3[j])),
          fit,
          scale,
          e.residualVariance,
        );
      });
    }

    for (const structure of ['unstructured', 'diagonal'] as const) {
      const find = (model: RFit['model'], method: RFit['method']) =>
        set.fits.find(
          (f) => f.model === model && f.method === method && f.structure === structure && !f.blocks,
        )!;
      const [reml, ml, oneMl] = [find('full', 'REML'), find('full', 'ML'), find('reduced', 'ML')];
      const lrt = set.lrt.find((t) => t.structure === structure)!;
      const sites = sitesOf(dataset, false);
      const scale = Math.max(...sites.flatMap((s) => s.rateKgHa));

      it(`the likelihood-ratio and Wald tests at R's estimates are R's anova and Wald (Psi ${structure})`, () => {
        const at = (f: RFit) =>
          mixedModelEstimates(
            dataOf(sites, f.model, scale),
            thetaFromR(f, scale),
            structure,
            f.method,
          )!;
        const stat = 2 * (at(ml).logLikelihood - at(oneMl).logLikelihood);
        expect(Math.abs(stat - lrt.stat[0])).toBeLessThan(4e-6);
        expect(Math.abs(chiSquareUpperP(stat, lrt.df[0]) - lrt.p[0])).toBeLessThan(1e-7);
        const e = at(reml);
        const w = levelWaldTest(e.fixed, e.fixedCovariance, 2);
        expect(w.df).toBe(reml.wald!.df);
        expect(relative(w.statistic, reml.wald!.stat[0])).toBeLessThan(1e-4);
        expect(Math.abs(w.p - reml.wald!.p[0])).toBeLessThan(1e-7);
      });

      it(`fitRegionalLevelMixedModel is at least R's maxima (Psi ${structure})`, () => {
        const m = fitRegionalLevelMixedModel(sites, LEVELS, 'Timing', structure);
        if (m.model === null) throw new Error(m.reason);
        expect(m.converged).toBe(true);
        expect(m.logLikelihoodReml).toBeGreaterThan(reml.logLik[0] - 1e-6);
        expect(m.logLikelihoodMl).toBeGreaterThan(ml.logLik[0] - 1e-6);
        expect(m.logLikelihoodMlOneCurve).toBeGreaterThan(oneMl.logLik[0] - 1e-6);
        // Balanced site-years: the fixed effects are the pooled least-squares ones whatever Psi.
        m.fixed.forEach((v, i) => expect(relative(v, reml.fixed[i])).toBeLessThan(1e-4));
        expect(m.likelihoodRatio.df).toBe(lrt.df[0]);
        expect(m.levels.map((l) => l.fixed.b)).toEqual([m.fixed[1], m.fixed[3]]);
        if (structure === 'diagonal') {
          // Interior maxima in R too (the variance of c_s at 0 in both): R's estimates and tests.
          for (const [ours, r] of [
            [m.logLikelihoodReml, reml],
            [m.logLikelihoodMl, ml],
            [m.logLikelihoodMlOneCurve, oneMl],
          ] as const)
            expect(Math.abs(ours - r.logLik[0])).toBeLessThan(1e-6);
          m.fixedCovariance.forEach((row, i) =>
            expect(relative(Math.sqrt(row[i]), reml.stdErrors[i])).toBeLessThan(1e-4),
          );
          expect(relative(m.residualVariance, reml.sigma2[0])).toBeLessThan(1e-3);
          expectPsi(m.siteCovariance, reml, scale, m.residualVariance);
          expect(Math.abs(m.likelihoodRatio.statistic - lrt.stat[0])).toBeLessThan(4e-6);
          expect(Math.abs(m.likelihoodRatio.p - lrt.p[0])).toBeLessThan(1e-7);
          expect(relative(m.wald.statistic, reml.wald!.stat[0])).toBeLessThan(1e-4);
          expect(Math.abs(m.wald.p - reml.wald!.p[0])).toBeLessThan(1e-7);
        } else {
          // Psi unstructured: nlme stops short of the maximum (measured: our REML and ML
          // log-likelihoods 0.0002 to 0.046 higher), so its tests are read at its own estimates
          // above; here the decision only, which cannot differ at these p-values.
          expect(m.likelihoodRatio.p < 0.05).toBe(lrt.p[0] < 0.05);
          expect(m.wald.p < 0.05).toBe(reml.wald!.p[0] < 0.05);
        }
      });
    }

    it("with block offsets, the Wald test at R's REML estimate is R's (Psi unstructured)", () => {
      const reml = set.fits.find((f) => f.blocks)!;
      const sites = sitesOf(dataset, true);
      const scale = Math.max(...sites.flatMap((s) => s.rateKgHa));
      const e = mixedModelEstimates(
        dataOf(sites, 'full', scale),
        thetaFromR(reml, scale),
        'unstructured',
        'REML',
      )!;
      const w = levelWaldTest(e.fixed, e.fixedCovariance, 2);
      expect(relative(w.statistic, reml.wald!.stat[0])).toBeLessThan(1e-4);
      expect(Math.abs(w.p - reml.wald!.p[0])).toBeLessThan(1e-7);
      const m = fitRegionalLevelMixedModel(sites, LEVELS, 'Timing');
      if (m.model === null) throw new Error(m.reason);
      expect(m.blockOffsets).toBe(true);
      expect(m.logLikelihoodReml - reml.blockConstant[0]).toBeGreaterThan(reml.logLik[0] - 1e-6);
    });
  });
}
