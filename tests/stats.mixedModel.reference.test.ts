// The linear mixed model checked against R 4.2.2 with nlme 3.1.162 (tests/fixtures/mixed/
// mixedModelFits.R; its output mixedModelFits.json records both versions). Data: the demo
// trial's corn sites and 16 generated site-years (tests/fixtures/mixed/makeMixedSites.ts),
// fitted as lme(y ~ x + I(x^2), random = ~ x + I(x^2) | site) by REML and ML, Psi unstructured
// and diagonal, and by REML with block contrasts nested in site as fixed effects.
//
// Two checks, because nlme does not always reach the maximum:
// 1. The numerical pieces at R's own estimate. Psi/sigma^2 from R gives theta; the profiled
//    deviance and the estimates there (shared/stats/mixedModelDeviance) must reproduce R's
//    log-likelihood within 1e-6 absolute, fixed effects and standard errors within 1e-4
//    relative, Psi and sigma^2 within 1e-3 relative (or 1e-5 absolute on the scale of
//    Psi/sigma^2 with rates divided by the highest rate: a variance at its boundary 0, which R
//    reports as a tiny positive number), conditional modes within 1e-3 relative of their SD.
// 2. The fit (fitRegionalMixedModel) never ends below R's log-likelihood, and agrees with R
//    at the tolerances above wherever R's maximum is interior (the diagonal fits). With Psi
//    unstructured both data sets have their REML and ML maxima on the boundary (Psi of rank 2:
//    theta's last diagonal is 0), which nlme's log-Cholesky parameters cannot reach; there
//    our likelihood is higher by 0.03-0.05 and we check the fixed effects (1e-4) only.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { expectPsi, thetaFromR } from './mixedModelR.fixture';
import { fitRegionalMixedModel, type MixedModelSite } from '../shared/analysis/regionalMixedModel';
import { mixedModelData } from '../shared/stats/mixedModelData';
import { mixedModelEstimates, profiledDeviance } from '../shared/stats/mixedModelDeviance';

interface RFit {
  method: 'REML' | 'ML';
  structure: 'unstructured' | 'diagonal';
  blocks: boolean;
  failed: boolean;
  fixed: number[];
  stdErrors: number[];
  psi: number[][];
  sigma2: [number];
  logLik: [number];
  aic: [number];
  blockConstant: [number];
  ranefSites: string[];
  ranef: number[][];
}
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/mixed/mixedModelFits.json', import.meta.url), 'utf8'),
) as Record<'demo-corn' | 'generated', RFit[]>;
const csv = readFileSync(new URL('./fixtures/mixed/mixedSites.csv', import.meta.url), 'utf8');

function sitesOf(dataset: string, withBlocks: boolean): MixedModelSite[] {
  const bySite = new Map<string, { rateKgHa: number[]; yieldKgHa: number[]; block: string[] }>();
  for (const line of csv.trim().split('\n').slice(1)) {
    const [set, site, block, rate, y] = line.split(',');
    if (set !== dataset) continue;
    const s = bySite.get(site) ?? { rateKgHa: [], yieldKgHa: [], block: [] };
    s.rateKgHa.push(Number(rate));
    s.yieldKgHa.push(Number(y));
    s.block.push(block);
    bySite.set(site, s);
  }
  return [...bySite].map(([site, s]) => ({ site, ...s, block: withBlocks ? s.block : undefined }));
}

const relative = (ours: number, r: number) => Math.abs(ours - r) / Math.abs(r);

for (const dataset of ['demo-corn', 'generated'] as const) {
  describe(`the regional quadratic mixed model on ${dataset} against R's nlme::lme`, () => {
    for (const fit of reference[dataset]) {
      const label = `${fit.method}, Psi ${fit.structure}${fit.blocks ? ', blocks fixed in site' : ''}`;
      const sites = sitesOf(dataset, fit.blocks);
      const scale = Math.max(...sites.flatMap((s) => s.rateKgHa));
      it(`mixedModelEstimates at R's estimate reproduces R (${label})`, () => {
        expect(fit.failed).toBe(false);
        const data = mixedModelData(
          sites.map((s) => {
            const rows = s.rateKgHa.map((x) => [1, x / scale, (x / scale) ** 2]);
            return {
              name: s.site,
              fixedRows: rows,
              randomRows: rows,
              y: s.yieldKgHa,
              blocks: s.block,
            };
          }),
        );
        const theta = thetaFromR(fit, scale);
        const e = mixedModelEstimates(data, theta, fit.structure, fit.method)!;
        // The REML likelihood follows the scale of X: back to kg/ha by −3·ln(scale).
        const shift = fit.method === 'REML' ? -3 * Math.log(scale) : 0;
        const d = [1, 1 / scale, 1 / (scale * scale)];
        expect(
          Math.abs(e.logLikelihood + shift - fit.blockConstant[0] - fit.logLik[0]),
        ).toBeLessThan(1e-6);
        expect(
          Math.abs(
            -profiledDeviance(data, theta, fit.structure, fit.method) / 2 +
              shift -
              fit.blockConstant[0] -
              fit.logLik[0],
          ),
        ).toBeLessThan(1e-6);
        e.fixed.forEach((v, i) => expect(relative(v * d[i], fit.fixed[i])).toBeLessThan(1e-4));
        e.fixedCovariance.forEach((row, i) =>
          expect(relative(Math.sqrt(row[i]) * d[i], fit.stdErrors[i])).toBeLessThan(1e-4),
        );
        expect(relative(e.residualVariance, fit.sigma2[0])).toBeLessThan(1e-3);
        const psi = e.randomCovariance.map((row, i) => row.map((v, j) => v * d[i] * d[j]));
        expectPsi(psi, fit, scale, e.residualVariance);
        // Conditional modes, per site in R's order, against each effect's SD in Psi.
        e.conditionalModes.forEach((g) => {
          const r = fit.ranef[fit.ranefSites.indexOf(g.name)];
          g.effects.forEach((v, i) => {
            const sd = Math.sqrt(fit.psi[i][i]);
            expect(Math.abs(v * d[i] - r[i]), `${g.name} effect ${i}`).toBeLessThanOrEqual(
              1e-3 * sd + 1e-9 * Math.abs(r[i]),
            );
          });
        });
      });
      if (fit.method !== 'REML') continue;
      it(`fitRegionalMixedModel is at least R's maximum (${label})`, () => {
        const m = fitRegionalMixedModel(sites, fit.structure);
        if (m.model === null) throw new Error(m.reason);
        expect(m.converged).toBe(true);
        const ml = reference[dataset].find(
          (f) => f.method === 'ML' && f.structure === fit.structure && f.blocks === fit.blocks,
        );
        expect(m.logLikelihoodReml - fit.blockConstant[0]).toBeGreaterThan(fit.logLik[0] - 1e-6);
        if (ml) expect(m.logLikelihoodMl).toBeGreaterThan(ml.logLik[0] - 1e-6);
        [m.fixed.a, m.fixed.b, m.fixed.c].forEach((v, i) =>
          expect(relative(v, fit.fixed[i])).toBeLessThan(1e-4),
        );
        if (fit.structure === 'diagonal') {
          // An interior maximum in R too: the same estimate.
          expect(Math.abs(m.logLikelihoodReml - fit.logLik[0])).toBeLessThan(1e-6);
          expect(Math.abs(m.aicReml - fit.aic[0])).toBeLessThan(2e-6);
          if (ml) expect(Math.abs(m.aic - ml.aic[0])).toBeLessThan(2e-6);
          [m.stdErrors.a, m.stdErrors.b, m.stdErrors.c].forEach((v, i) =>
            expect(relative(v, fit.stdErrors[i])).toBeLessThan(1e-4),
          );
          expect(relative(m.residualVariance, fit.sigma2[0])).toBeLessThan(1e-3);
          expectPsi(m.siteCovariance, fit, scale, m.residualVariance);
        }
      });
    }
  });
}
