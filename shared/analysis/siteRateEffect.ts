/**
 * Did a site respond to the nutrient at all? The one-way analysis of variance
 * of yield on rate taken as a factor (one mean per rate, no curve assumed),
 * with block terms when the plots carry blocks (the randomized complete block
 * ANOVA; Steel, Torrie & Dickey, Principles and Procedures of Statistics, 3rd
 * ed., ch. 9; chapter from memory). The rate effect is the extra-sum-of-squares F-test of
 * y ~ block + rate against y ~ block. The same fit gives the site's CV:
 *
 *   CV% = 100 · √(residual mean square) / mean yield
 *
 * Edge cases, each a result with a reason rather than an exception:
 * - fewer than two distinct rates: no rate effect can be tested;
 * - no residual degrees of freedom (one plot per rate and block cell missing): no test;
 * - blocks confounded with rates: no test.
 */
import { designSse } from './designSse';
import { extraSumOfSquaresTest, type FTestResult, type NoTest } from './extraSumOfSquaresTest';
import type { SitePlots } from './sitePlots';

export interface SiteRateEffect {
  /** The rate-effect test, or why there is none. */
  test: FTestResult | NoTest;
  /** Coefficient of variation of the block × rate ANOVA, %; NaN without residual df. */
  cvPct: number;
  /** Mean yield of the site's analyzable plots, kg/ha. */
  meanYieldKgHa: number;
}

function levelsOf(values: ReadonlyArray<string | number | null>): Map<string, number[]> {
  const m = new Map<string, number[]>();
  values.forEach((v, i) => {
    const key = String(v ?? '');
    const list = m.get(key);
    if (list) list.push(i);
    else m.set(key, [i]);
  });
  return m;
}

function indicators(n: number, groups: Map<string, number[]>, dropFirst: boolean): Float64Array[] {
  return [...groups.values()].slice(dropFirst ? 1 : 0).map((members) => {
    const c = new Float64Array(n);
    for (const i of members) c[i] = 1;
    return c;
  });
}

/**
 * Rate effect and CV of one site.
 * @param site - the site's plots (rates and yields in kg/ha)
 * @returns the F-test of the rate effect, CV% and the mean yield (kg/ha)
 * @example
 * const e = siteRateEffect(site);
 * e.test.kind === 'f-test' && e.test.p < 0.05 // the site responded
 */
export function siteRateEffect(site: SitePlots): SiteRateEffect {
  const n = site.yieldKgHa.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += site.yieldKgHa[i];
  mean = n > 0 ? mean / n : NaN;
  const rates = levelsOf(Array.from(site.rateKgHa));
  if (n === 0 || rates.size < 2) {
    return {
      test: {
        kind: 'no-test',
        reason: n === 0 ? (site.problem ?? 'no plots') : 'only one rate was tested',
      },
      cvPct: NaN,
      meanYieldKgHa: mean,
    };
  }
  const blocks = levelsOf(site.block);
  const base = [new Float64Array(n).fill(1), ...indicators(n, blocks, true)];
  const full = [...base, ...indicators(n, rates, true)];
  const reduced = designSse(base, site.yieldKgHa);
  const fit = designSse(full, site.yieldKgHa);
  const df = n - full.length;
  if (fit.rank < full.length || df <= 0) {
    return {
      test: {
        kind: 'no-test',
        reason:
          fit.rank < full.length
            ? 'the blocks and rates are confounded'
            : 'no residual degrees of freedom are left after blocks and rates',
      },
      cvPct: NaN,
      meanYieldKgHa: mean,
    };
  }
  return {
    test: extraSumOfSquaresTest({ sse: reduced.sse, df: n - base.length }, { sse: fit.sse, df }),
    cvPct: (100 * Math.sqrt(fit.sse / df)) / mean,
    meanYieldKgHa: mean,
  };
}
