// The regional quadratic-plateau and linear-plateau mixed models checked against R 4.2.2 with
// nlme 3.1.162 (tests/fixtures/mixed/plateauMixedModelFits.R; its output plateauMixedModelFits.json
// records both versions). Data (tests/fixtures/mixed/makePlateauSites.ts): the demo trial's six
// corn site-years, 18 generated quadratic-plateau site-years and 18 generated linear-plateau
// site-years, each fitted with both forms by
//   nlme(y ~ f(P, s, x0, x), fixed = P + s + x0 ~ 1, random = P + x0 ~ 1 | site, method = "ML"),
// Psi diagonal and unstructured, from Plotrate's own starting values; each R fit once with the
// analytic derivatives as the model's gradient attribute and once with nlme's finite differences.
//
// Three checks:
// 1. The numerical pieces at R's own estimate, for every R fit: linearizing at R's fixed effects
//    and conditional modes (linearizedMixedModel) and solving at R's Psi/sigma^2 must give R's
//    log-likelihood within 1e-6 absolute (analytic derivatives; with nlme's finite differences,
//    whose derivatives differ from ours in the 7th digit, 2e-6: measured at most 7.9e-7),
//    standard errors within 1e-4 relative and sigma^2 within 1e-3 relative.
// 2. The fit (fitRegionalPlateauMixedModel) against R wherever R ended on a fixed point of the
//    alternation (re-solving at R's estimate moves R's fixed effects by < 1e-6 relative): fixed
//    effects within 1e-4 relative, standard errors 1e-4, Psi and sigma^2 1e-3 relative, the
//    log-likelihood 1e-6 absolute (R's analytic-derivative fits). Against R's finite-difference
//    fits of the linear-plateau, whose derivative in x0 jumps at every rate, the same tolerances
//    hold on these data, because no site-year's join sits within a finite-difference step of a
//    rate; that is what the check measures, not an assumption.
//    The population optimum at R's price ratio (5.5) within 1e-4 relative, its delta-method SE
//    (from nlme's varFix) within 1e-3.
// 3. On the demo's six site-years R's nlme does not reach an interior fixed point (500
//    iterations with Psi diagonal; with Psi unstructured it stops where re-solving moves the
//    fixed effects by ~1e-3, or, for the linear-plateau, at a plateau-join correlation of -0.999
//    after "step halving factor reduced below minimum", where our fit cycles without converging). There our quadratic-plateau converges and
//    must be a fixed point itself, and may differ from R's last iterate by no more than R's own
//    last step (the fixed effects within 3 %; measured: P 0.02 %, x0 1.1 %, c 2.0 % with Psi
//    diagonal, 0.003-0.2 % unstructured). The linear-plateau has no interior fixed point in
//    either program: one site-year's join (Pennock Flats) crosses the lowest rate and back from
//    one round to the next, where its derivative in x0 switches between 0 and the slope. Our
//    fit must say it did not converge.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { MixedModelSite } from '../shared/analysis/regionalMixedModel';
import {
  fitRegionalPlateauMixedModel,
  plateauMixedSpec,
  type PlateauMixedForm,
} from '../shared/analysis/regionalPlateauMixedModel';
import { plateauMixedModelOptimum } from '../shared/economics/plateauMixedModelOptimum';
import { linearizedMixedModel } from '../shared/optimize/fitNonlinearMixedModel';
import { mixedModelEstimates } from '../shared/stats/mixedModelDeviance';

interface RFit {
  form: PlateauMixedForm;
  structure: 'unstructured' | 'diagonal';
  derivatives: 'analytic' | 'numeric';
  failed: boolean;
  warning: string;
  iterations: [number];
  fixed: number[];
  stdErrors: number[];
  psi: number[][];
  sigma2: [number];
  logLik: [number];
  aic: [number];
  varFix: number[][];
  optimum: { priceRatio: number; rate: [number]; se: [number] };
  ranefSites: string[];
  ranef: number[][];
}
type Dataset = 'demo-corn' | 'generated-qp' | 'generated-lp';
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/mixed/plateauMixedModelFits.json', import.meta.url), 'utf8'),
) as Record<Dataset, RFit[]>;
const csv = readFileSync(new URL('./fixtures/mixed/plateauSites.csv', import.meta.url), 'utf8');

function sitesOf(dataset: Dataset): MixedModelSite[] {
  const bySite = new Map<string, { rateKgHa: number[]; yieldKgHa: number[] }>();
  for (const line of csv.trim().split('\n').slice(1)) {
    const [set, site, , rate, y] = line.split(',');
    if (set !== dataset) continue;
    const s = bySite.get(site) ?? { rateKgHa: [], yieldKgHa: [] };
    s.rateKgHa.push(Number(rate));
    s.yieldKgHa.push(Number(y));
    bySite.set(site, s);
  }
  return [...bySite].map(([site, s]) => ({ site, ...s }));
}

const relative = (ours: number, r: number) => Math.abs(ours - r) / Math.abs(r);

/** Our estimates at R's fixed effects, conditional modes and Psi/sigma^2 (kg/ha throughout). */
function atR(dataset: Dataset, fit: RFit) {
  const groups = sitesOf(dataset).map((s) => ({ name: s.site, x: s.rateKgHa, y: s.yieldKgHa }));
  const b = groups.map((g) => fit.ranef[fit.ranefSites.indexOf(g.name)]);
  const data = linearizedMixedModel(groups, plateauMixedSpec(fit.form), [1, 1], fit.fixed, b);
  const m = fit.psi.map((row) => row.map((v) => v / fit.sigma2[0]));
  const t11 = Math.sqrt(m[0][0]);
  const t21 = m[1][0] / t11;
  const t22 = Math.sqrt(m[1][1] - t21 * t21);
  const theta = fit.structure === 'diagonal' ? [t11, t22] : [t11, t21, t22];
  return mixedModelEstimates(data, theta, fit.structure, 'ML')!;
}

/**
 * R ended on an interior fixed point: re-solving at its estimate leaves its fixed effects in
 * place, and Psi's correlation is not at ±1 (a boundary nlme's log-Cholesky parameters approach
 * but cannot reach, where its PNLS step stops halving).
 */
function rAtFixedPoint(dataset: Dataset, fit: RFit): boolean {
  if (fit.failed) return false;
  const correlation = fit.psi[0][1] / Math.sqrt(fit.psi[0][0] * fit.psi[1][1]);
  if (Math.abs(correlation) > 0.99) return false;
  const e = atR(dataset, fit);
  return e.fixed.every((v, i) => relative(v, fit.fixed[i]) < 1e-6);
}

for (const dataset of ['demo-corn', 'generated-qp', 'generated-lp'] as const) {
  describe(`the regional plateau mixed models on ${dataset} against R's nlme::nlme`, () => {
    const sites = sitesOf(dataset);
    for (const fit of reference[dataset]) {
      const label = `${fit.form}, Psi ${fit.structure}, R's derivatives ${fit.derivatives}`;
      it(`linearizedMixedModel at R's estimate reproduces R's likelihood (${label})`, () => {
        expect(fit.failed).toBe(false);
        const e = atR(dataset, fit);
        const tolerance = fit.derivatives === 'analytic' ? 1e-6 : 2e-6;
        expect(Math.abs(e.logLikelihood - fit.logLik[0])).toBeLessThan(tolerance);
        e.fixedCovariance.forEach((row, i) =>
          expect(relative(Math.sqrt(row[i]), fit.stdErrors[i])).toBeLessThan(1e-4),
        );
        expect(relative(e.residualVariance, fit.sigma2[0])).toBeLessThan(1e-3);
      });
      if (!rAtFixedPoint(dataset, fit)) continue;
      it(`fitRegionalPlateauMixedModel reaches R's estimate (${label})`, () => {
        const m = fitRegionalPlateauMixedModel(sites, fit.form, fit.structure);
        if (m.model === null) throw new Error(m.reason);
        expect(m.converged).toBe(true);
        const ours = [m.fixed.P, m.fixed.shape, m.fixed.x0];
        const se = [m.stdErrors.P, m.stdErrors.shape, m.stdErrors.x0];
        ours.forEach((v, i) => expect(relative(v, fit.fixed[i])).toBeLessThan(1e-4));
        se.forEach((v, i) => expect(relative(v, fit.stdErrors[i])).toBeLessThan(1e-4));
        expect(relative(m.residualVariance, fit.sigma2[0])).toBeLessThan(1e-3);
        m.siteCovariance.forEach((row, i) =>
          row.forEach((v, j) => {
            const r = fit.psi[i][j];
            // A covariance R puts at exactly 0 (Psi diagonal) is 0 here too.
            if (r === 0) expect(v).toBe(0);
            else expect(relative(v, r), `Psi[${i}][${j}] ${v} vs R ${r}`).toBeLessThan(1e-3);
          }),
        );
        expect(Math.abs(m.logLikelihoodMl - fit.logLik[0])).toBeLessThan(1e-6);
        expect(Math.abs(m.aic - fit.aic[0])).toBeLessThan(2e-6);
        // The population optimum at R's price ratio and its delta-method SE, computed in R from
        // nlme's fixed effects and varFix (plateauMixedModelFits.R).
        const optimum = plateauMixedModelOptimum(m, fit.optimum.priceRatio, 0.9);
        expect(relative(optimum.stdErrorKgHa!, fit.optimum.se[0])).toBeLessThan(1e-3);
        if (optimum.status === 'interior') {
          expect(relative(optimum.rateKgHa, fit.optimum.rate[0])).toBeLessThan(1e-4);
        }
        // Conditional modes per site, against each effect's SD.
        m.siteCurves.forEach((c) => {
          const r = fit.ranef[fit.ranefSites.indexOf(c.site)];
          expect(Math.abs(c.plateauKgHa - m.fixed.P - r[0])).toBeLessThan(
            1e-3 * Math.sqrt(fit.psi[0][0]),
          );
          expect(Math.abs(c.joinKgHa - m.fixed.x0 - r[1])).toBeLessThan(
            1e-3 * Math.sqrt(fit.psi[1][1]),
          );
        });
      });
    }
  });
}

describe("the regional plateau mixed models on the demo, where R's nlme finds no fixed point", () => {
  const sites = sitesOf('demo-corn');
  const cases: [PlateauMixedForm, 'diagonal' | 'unstructured'][] = [
    ['quadraticPlateau', 'diagonal'],
    ['quadraticPlateau', 'unstructured'],
  ];
  for (const [form, structure] of cases) {
    it(`the ${form} converges to a fixed point near R's last iterate (Psi ${structure})`, () => {
      const r = reference['demo-corn'].find(
        (f) => f.form === form && f.structure === structure && f.derivatives === 'analytic',
      )!;
      expect(rAtFixedPoint('demo-corn', r)).toBe(false);
      const m = fitRegionalPlateauMixedModel(sites, form, structure);
      if (m.model === null) throw new Error(m.reason);
      expect(m.converged).toBe(true);
      // A fixed point: linearized at our estimate, the LME step gives our fixed effects back.
      const groups = sites.map((s) => ({ name: s.site, x: s.rateKgHa, y: s.yieldKgHa }));
      const b = m.siteCurves.map((c) => [c.plateauKgHa - m.fixed.P, c.joinKgHa - m.fixed.x0]);
      const ours = [m.fixed.P, m.fixed.shape, m.fixed.x0];
      const data = linearizedMixedModel(groups, plateauMixedSpec(form), [1, 1], ours, b);
      const psi = m.siteCovariance.map((row) => row.map((v) => v / m.residualVariance));
      const t11 = Math.sqrt(psi[0][0]);
      const t21 = psi[1][0] / t11;
      const theta =
        structure === 'diagonal'
          ? [t11, Math.sqrt(psi[1][1])]
          : [t11, t21, Math.sqrt(psi[1][1] - t21 * t21)];
      const e = mixedModelEstimates(data, theta, structure, 'ML')!;
      // The alternation stops when a step moves the fixed effects < 1e-7 relative; one more
      // step from the reported estimate moves them, and the log-likelihood, by ~1e-6 (measured
      // up to 1.2e-6).
      e.fixed.forEach((v, i) => expect(relative(v, ours[i])).toBeLessThan(1e-5));
      expect(Math.abs(e.logLikelihood - m.logLikelihoodMl)).toBeLessThan(1e-5);
      ours.forEach((v, i) => expect(relative(v, r.fixed[i])).toBeLessThan(0.03));
    });
  }
  for (const structure of ['diagonal', 'unstructured'] as const) {
    it(`the linear-plateau, which cycles in R's nlme too, says it did not converge (Psi ${structure})`, () => {
      const r = reference['demo-corn'].find(
        (f) =>
          f.form === 'linearPlateau' && f.structure === structure && f.derivatives === 'analytic',
      )!;
      expect(rAtFixedPoint('demo-corn', r)).toBe(false);
      const m = fitRegionalPlateauMixedModel(sites, 'linearPlateau', structure);
      if (m.model === null) throw new Error(m.reason);
      expect(m.converged).toBe(false);
      expect(m.note).not.toBe('');
    });
  }
});
