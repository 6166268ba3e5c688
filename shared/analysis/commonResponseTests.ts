/**
 * Do the sites share one response? Nested linear models on the pooled plots,
 * for the straight line, the line through the origin (proportional) and the
 * quadratic in rate x (kg/ha):
 *
 *   common curve         y = f(x)                       one curve for all sites
 *   site-specific levels y = level(site or block) + g(x)  same shape, own level
 *   site-specific curves y = level + g_site(x)          every site its own curve
 *
 * with g(x) = b·x (linear), b·x + c·x² (quadratic). Levels are site intercepts
 * or, with `levels: 'blockWithinSite'`, one mean per block within each site (the
 * block-adjusted version). A line through the origin has no level to shift, so
 * its chain has only the common slope against site slopes.
 *
 * Each step is an extra-sum-of-squares F-test whose denominator is the
 * site-specific curves' residual mean square, as R's anova(m0, m1, m2) does
 * (checked against R in tests/sites.commonResponseTests.test.ts). For the
 * straight line the levels-vs-curves step is the test of homogeneity of slopes
 * (the site × rate interaction).
 *
 * Computation: the level terms are absorbed by centring within each site or
 * block (Frisch–Waugh–Lovell theorem; Davidson & MacKinnon, Econometric Theory
 * and Methods, 2004, §2.4; section from memory) and the site-specific model splits into one small fit
 * per site, so the cost is linear in the number of plots.
 *
 * Sites with too few distinct rates for the model, or whose blocks are confounded
 * with rate, are left out of all three models (so that they stay nested) and
 * listed with the reason.
 */
import { modelLabelInText } from '../models/curves';
import { designSse } from './designSse';
import { extraSumOfSquaresTest, type FTestResult, type NoTest } from './extraSumOfSquaresTest';
import { describeFTest } from './describeFTest';
import type { SitePlots } from './sitePlots';

/** Models whose pooled comparisons are linear least squares. */
export type PooledLinearModel = 'linear' | 'proportional' | 'quadratic';

/** How site-specific levels are modelled: one per site, or one per block within each site. */
export type LevelTerms = 'site' | 'blockWithinSite';

/** One fitted pooled model. */
export interface PooledModelFit {
  /** Residual sum of squares, (kg/ha)². */
  sse: number;
  /** Residual degrees of freedom. */
  df: number;
  /** Estimated coefficients. */
  parameters: number;
}

export type PoolingQuestion =
  'common-vs-levels' | 'levels-vs-site-curves' | 'common-vs-site-curves' | 'groups';

/** One reported test. */
export interface PoolingTest {
  question: PoolingQuestion;
  result: FTestResult | NoTest;
  /** The comparison, the statistic and its reading in one sentence. */
  sentence: string;
}

export interface SiteLeftOut {
  site: string;
  reason: string;
}

export interface CommonResponseTests {
  model: PooledLinearModel;
  levels: LevelTerms;
  /** Plots in the pooled fits. */
  n: number;
  sitesUsed: string[];
  sitesLeftOut: SiteLeftOut[];
  common: PooledModelFit | null;
  /** Null for the proportional model (no levels) or when it could not be fitted. */
  siteLevels: PooledModelFit | null;
  siteCurves: PooledModelFit | null;
  tests: PoolingTest[];
  /** For the straight line: the site × rate interaction test (same as levels-vs-site-curves). */
  slopeHomogeneity: PoolingTest | null;
}

export interface CommonResponseOptions {
  /** Site levels (default) or block-within-site levels. */
  levels?: LevelTerms;
  /** Significance level for the sentences, default 0.05. */
  alpha?: number;
}

/** The rate terms g(x) of a model, one array per column. */
export function rateTerms(model: PooledLinearModel, x: ArrayLike<number>): Float64Array[] {
  // Plain loops into one store: Float64Array.from with a function, and a store per column,
  // cost more than the fits that read these columns (called once per site and model).
  const n = x.length;
  const quadratic = model === 'quadratic';
  const store = new ArrayBuffer(8 * n * (quadratic ? 2 : 1));
  const lin = new Float64Array(store, 0, n);
  for (let i = 0; i < n; i++) lin[i] = x[i];
  if (!quadratic) return [lin];
  const square = new Float64Array(store, 8 * n, n);
  for (let i = 0; i < n; i++) square[i] = lin[i] * lin[i];
  return [lin, square];
}

function distinctCount(x: ArrayLike<number>): number {
  const seen = new Set<number>();
  for (let i = 0; i < x.length; i++) seen.add(x[i]);
  return seen.size;
}

/** Indices of each level cell within a site: one cell, or one per block label. */
function cellsOf(site: SitePlots, levels: LevelTerms): number[][] {
  if (levels === 'site') {
    const all: number[] = [];
    for (let i = 0; i < site.rateKgHa.length; i++) all.push(i);
    return [all];
  }
  const byBlock = new Map<string, number[]>();
  site.block.forEach((b, i) => {
    const key = b ?? '';
    const list = byBlock.get(key);
    if (list) list.push(i);
    else byBlock.set(key, [i]);
  });
  return [...byBlock.values()];
}

function indicator(n: number, members: number[]): Float64Array {
  const c = new Float64Array(n);
  for (const i of members) c[i] = 1;
  return c;
}

/** Why a site cannot take part, or null. */
function siteProblem(site: SitePlots, model: PooledLinearModel): string | null {
  if (site.problem) return site.problem;
  const k = distinctCount(site.rateKgHa);
  if (model === 'proportional') {
    return site.rateKgHa.some((r) => r !== 0) ? null : 'every plot has rate 0';
  }
  const need = model === 'quadratic' ? 3 : 2;
  return k >= need
    ? null
    : `${k} distinct rate${k === 1 ? '' : 's'}; a ${modelLabelInText(model)} needs at least ${need}`;
}

/**
 * Nested F-tests of a common response across sites on the pooled plots.
 * @param sites - the sites' plots (rates and yields in kg/ha), from sitePlots()
 * @param model - "linear", "proportional" or "quadratic"
 * @param options - level terms ("site" or "blockWithinSite") and the significance level
 * @returns the three fits, the tests with sentences, and the sites left out with reasons
 * @example
 * const t = testCommonResponse(sitePlots(table), 'quadratic');
 * t.tests.map((x) => x.sentence) // ["Site-specific levels against one common quadratic: F = …", …]
 */
export function testCommonResponse(
  sites: readonly SitePlots[],
  model: PooledLinearModel,
  options: CommonResponseOptions = {},
): CommonResponseTests {
  const levels = options.levels ?? 'site';
  const alpha = options.alpha ?? 0.05;
  const hasLevels = model !== 'proportional';
  const words = modelLabelInText(model);
  const sitesLeftOut: SiteLeftOut[] = [];
  const used: SitePlots[] = [];
  let siteCurveSse = 0;
  let siteCurveParameters = 0;

  for (const site of sites) {
    const problem = siteProblem(site, model);
    if (problem) {
      sitesLeftOut.push({ site: site.site, reason: problem });
      continue;
    }
    const n = site.yieldKgHa.length;
    const levelCols = hasLevels ? cellsOf(site, levels).map((m) => indicator(n, m)) : [];
    const cols = [...levelCols, ...rateTerms(model, site.rateKgHa)];
    const fit = designSse(cols, site.yieldKgHa);
    if (fit.rank < cols.length) {
      sitesLeftOut.push({
        site: site.site,
        reason:
          levels === 'blockWithinSite' && hasLevels
            ? `its blocks and rates are confounded, so a ${words} with block levels cannot be fitted`
            : `its rates cannot support a ${words}`,
      });
      continue;
    }
    used.push(site);
    siteCurveSse += fit.sse;
    siteCurveParameters += cols.length;
  }

  const n = used.reduce((s, site) => s + site.yieldKgHa.length, 0);
  const empty: CommonResponseTests = {
    model,
    levels,
    n,
    sitesUsed: used.map((s) => s.site),
    sitesLeftOut,
    common: null,
    siteLevels: null,
    siteCurves: null,
    tests: [],
    slopeHomogeneity: null,
  };
  if (used.length < 2) {
    const reason = `fewer than two sites can be fitted with a ${words}`;
    empty.tests = questionsFor(model).map((question) => ({
      question,
      result: { kind: 'no-test', reason },
      sentence: describeFTest(
        { kind: 'no-test', reason },
        readings(question, model, levels),
        alpha,
      ),
    }));
    return empty;
  }

  const x = new Float64Array(n);
  const y = new Float64Array(n);
  let offset = 0;
  for (const site of used) {
    x.set(site.rateKgHa, offset);
    y.set(site.yieldKgHa, offset);
    offset += site.yieldKgHa.length;
  }
  const terms = rateTerms(model, x);
  const commonCols = hasLevels ? [new Float64Array(n).fill(1), ...terms] : terms;
  const commonFit = designSse(commonCols, y);
  const common: PooledModelFit = {
    sse: commonFit.sse,
    df: n - commonCols.length,
    parameters: commonCols.length,
  };
  const siteCurves: PooledModelFit = {
    sse: siteCurveSse,
    df: n - siteCurveParameters,
    parameters: siteCurveParameters,
  };

  let siteLevels: PooledModelFit | null = null;
  if (hasLevels) {
    // Center y and each rate term within every level cell; the slope fit on the
    // centered columns has the SSE of the model with one indicator per cell.
    const yc = Float64Array.from(y);
    const tc = terms.map((t) => Float64Array.from(t));
    let cellCount = 0;
    offset = 0;
    for (const site of used) {
      for (const members of cellsOf(site, levels)) {
        cellCount++;
        for (const col of [yc, ...tc]) {
          let mean = 0;
          for (const i of members) mean += col[offset + i];
          mean /= members.length;
          for (const i of members) col[offset + i] -= mean;
        }
      }
      offset += site.yieldKgHa.length;
    }
    const fit = designSse(tc, yc);
    if (fit.rank === tc.length) {
      siteLevels = {
        sse: fit.sse,
        df: n - cellCount - tc.length,
        parameters: cellCount + tc.length,
      };
    }
  }

  const tests: PoolingTest[] = [];
  const add = (question: PoolingQuestion, result: FTestResult | NoTest): PoolingTest => {
    const t = {
      question,
      result,
      sentence: describeFTest(result, readings(question, model, levels), alpha),
    };
    tests.push(t);
    return t;
  };
  const noLevels: NoTest = { kind: 'no-test', reason: 'the site-levels model could not be fitted' };
  let slopeHomogeneity: PoolingTest | null = null;
  if (hasLevels) {
    add(
      'common-vs-levels',
      siteLevels ? extraSumOfSquaresTest(common, siteLevels, siteCurves) : noLevels,
    );
    const step = add(
      'levels-vs-site-curves',
      siteLevels ? extraSumOfSquaresTest(siteLevels, siteCurves) : noLevels,
    );
    if (model === 'linear') slopeHomogeneity = step;
  }
  add('common-vs-site-curves', extraSumOfSquaresTest(common, siteCurves));
  return { ...empty, common, siteLevels, siteCurves, tests, slopeHomogeneity };
}

function questionsFor(model: PooledLinearModel): PoolingQuestion[] {
  return model === 'proportional'
    ? ['common-vs-site-curves']
    : ['common-vs-levels', 'levels-vs-site-curves', 'common-vs-site-curves'];
}

function readings(question: PoolingQuestion, model: PooledLinearModel, levels: LevelTerms) {
  const words = modelLabelInText(model);
  const lv = levels === 'site' ? 'site-specific levels' : 'block-within-site levels';
  switch (question) {
    case 'common-vs-levels':
      return {
        comparison: `${cap(lv)} against one common ${words}`,
        significant: 'the sites differ in yield level',
        notSignificant: 'the sites do not differ detectably in yield level',
      };
    case 'levels-vs-site-curves':
      return {
        comparison:
          model === 'linear'
            ? `Homogeneity of slopes (site × rate interaction), site-specific lines against ${lv} with one common slope`
            : `Site-specific ${words}s against ${lv} with one common response to rate`,
        significant: 'the response to rate differs between sites',
        notSignificant: 'the sites share one response to rate (beyond their levels)',
      };
    case 'common-vs-site-curves':
      return {
        comparison: `Site-specific ${words}s against one common ${words}`,
        significant: 'the sites do not share one curve',
        notSignificant: 'one common curve describes the sites as well',
      };
    default:
      return {
        comparison: `Group-specific ${words}s against one common ${words}`,
        significant: 'the groups respond differently',
        notSignificant: 'the groups do not differ detectably',
      };
  }
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
