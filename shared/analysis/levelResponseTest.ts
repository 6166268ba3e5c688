/**
 * Do the levels of a treatment factor (source, timing…) respond to N differently? Nested linear
 * models on one site's plots, with the zero-rate check shared by every level, so the levels
 * share the yield at rate 0 (and the block offsets) and differ only in the response to rate:
 *
 *   common curve:     y = block + g(x)          one response for every level
 *   curves per level: y = block + g_level(x)    each level its own response, same check
 *
 * with g(x) = b·x + c·x² (quadratic, the headline) or b·x (straight line), or a plateau model
 * (levelPlateauTest: linear-plateau and quadratic-plateau, joins profiled), and one offset per
 * block (or one intercept without blocks). g(0) = 0, so a check plot adds the same terms to
 * every level and counts once. The extra-sum-of-squares F test (extraSumOfSquaresTest) divides
 * by the per-level curves' residual mean square.
 *
 * Weighted least squares, with the plot error's standard deviation taken as proportional to the
 * yield (a constant CV, the usual picture of plot yields; the weights 1/ŷ² from the common
 * curve's fitted yields, a one-step variance-function fit: Carroll & Ruppert, Transformation and
 * Weighting in Regression, 1988, §2.1, section from memory). Why: the per-level terms are zero
 * on the checks and largest at the high rates, where yields and their errors are largest, so an
 * unweighted F test compares high-rate noise with a residual mean square diluted by the checks'
 * smaller errors. Measured on simulated timings with one true quadratic-plateau and a 6.5 % CV
 * (`npm run validate`, the same 1,000 trials): unweighted 7.9 % rejected at 5 %, weighted 6.3 %
 * (5.2 % of 2,000 other trials); with an error of constant size instead the weighted test is
 * conservative (3.3 % of 2,000), not liberal. R's anova(lm(y ~ block + x + I(x^2), weights = w), lm(y ~ block + x:level +
 * I(x^2):level, weights = w)) with the same w is the reference
 * (tests/analysis.levelResponseTest.test.ts).
 *
 * Edge cases: fewer than two levels, a level with fewer fertilized rates than the curve's rate
 * terms, or a design that is not of full rank: no test, with the reason. Fertilized plots
 * without a level are left out of both models.
 */
import { StatsInputError } from '../stats/errors';
import { defaultBlockTerms } from '../stats/hasBlocks';
import { fitLeastSquares } from '../stats/leastSquares';
import type { BlockChoice } from './analysisSettings';
import { describeFTest, type TestReadings } from './describeFTest';
import { designSse } from './designSse';
import { extraSumOfSquaresTest, type FTestResult, type NoTest } from './extraSumOfSquaresTest';
import { levelPlateauFits, type LevelPlateauModel } from './levelPlateauTest';
import type { SiteLevelSplit } from './siteLevels';
import type { SitePlots } from './sitePlots';

/** The response models the level tests use (linear least squares, or profiled plateaus). */
export type LevelTestModel = 'quadratic' | 'linear' | LevelPlateauModel;

/** One nested comparison: common curve against one curve per level. */
export interface LevelCurveTest {
  model: LevelTestModel;
  /** Plots in both fits (checks once, fertilized plots with a level). */
  n: number;
  /** Weighted residual sums of squares (weights 1/ŷ², so unitless) and residual df. */
  common: { sse: number; df: number } | null;
  perLevel: { sse: number; df: number } | null;
  result: FTestResult | NoTest;
  sentence: string;
  /** Plateau models: the common curve's join and each level's, kg/ha; absent otherwise. */
  joinsKgHa?: { common: number; perLevel: number[] };
}

/** How a factor's levels meet another factor's at one site (factorCrossing). */
export type FactorRelation = 'same-treatments' | 'nested' | 'crossed' | 'partly-crossed';

/** One other factor at the same site, and what that means for this factor's test. */
export interface FactorCrossing {
  /** The other factor's column header. */
  other: string;
  relation: FactorRelation;
  /** Combinations of the two factors' levels among the fertilized plots. */
  cells: number;
  /** What the relation means for reading the tests, in plain words. */
  message: string;
  /** Crossed only: this factor's quadratic test with the other's curves in both models. */
  adjusted: LevelCurveTest | null;
}

/** Whether a site's levels differ in their response to N. */
export interface LevelResponseTests {
  factor: string;
  levels: string[];
  /** Block offsets in both models ("fixed") or one intercept ("none"). */
  blocks: 'fixed' | 'none';
  /** The headline: quadratic response per level against one common quadratic. */
  quadratic: LevelCurveTest;
  /** The same with straight lines. */
  linear: LevelCurveTest;
  /** The same with quadratic-plateaus and linear-plateaus, joins profiled (levelPlateauTest). */
  quadraticPlateau: LevelCurveTest;
  linearPlateau: LevelCurveTest;
  /** Fertilized plots left out because their factor cell is blank. */
  plotsWithoutLevel: string[];
  /** Every other factor at the site and how it meets this one (trialLevels fills it); [] alone. */
  crossings: FactorCrossing[];
  /** The significance level the sentences read the tests at. */
  alpha: number;
}

const CURVE_WORDS: Record<LevelTestModel, string> = {
  quadratic: 'quadratic',
  linear: 'straight line',
  quadraticPlateau: 'quadratic-plateau',
  linearPlateau: 'linear-plateau',
};

function readings(model: LevelTestModel, factor: string): TestReadings {
  const curve = CURVE_WORDS[model];
  return {
    comparison: `One ${curve} per ${factor.toLowerCase()} level against one ${curve} for all levels (the zero-rate check shared)`,
    significant: `the response to N differs between the ${factor.toLowerCase()} levels`,
    notSignificant: `the ${factor.toLowerCase()} levels do not differ detectably in their response to N`,
  };
}

/** The block (or intercept) columns of the plots kept. */
export function levelColumns(blocks: (string | null)[], fixed: boolean): Float64Array[] {
  const n = blocks.length;
  if (!fixed) return [new Float64Array(n).fill(1)];
  const labels = [...new Set(blocks)];
  return labels.map((b) => Float64Array.from(blocks, (v) => (v === b ? 1 : 0)));
}

/**
 * One model's level test from its two residual sums of squares (the extra-sum-of-squares F test
 * of the common curve against a curve per level), or the reason there is none; with its sentence.
 */
function levelCurveTest(
  model: LevelTestModel,
  n: number,
  fits: { common: { sse: number; df: number }; perLevel: { sse: number; df: number } } | string,
  words: TestReadings,
  alpha: number,
): LevelCurveTest {
  if (typeof fits === 'string') {
    const result: NoTest = { kind: 'no-test', reason: fits };
    return {
      model,
      n,
      common: null,
      perLevel: null,
      result,
      sentence: describeFTest(result, words, alpha),
    };
  }
  const result = extraSumOfSquaresTest(fits.common, fits.perLevel);
  return { model, n, ...fits, result, sentence: describeFTest(result, words, alpha) };
}

function curveTest(
  model: LevelTestModel,
  x: Float64Array,
  y: Float64Array,
  level: Int32Array,
  levelCount: number,
  base: Float64Array[],
  factor: string,
  alpha: number,
): LevelCurveTest {
  const n = y.length;
  const powers = model === 'quadratic' ? [1, 2] : [1];
  const term = (p: number, k: number | null) =>
    Float64Array.from(x, (v, i) => (k === null || level[i] === k ? v ** p : 0));
  const words = readings(model, factor);
  const none = (reason: string) => levelCurveTest(model, n, reason, words, alpha);
  for (let k = 0; k < levelCount; k++) {
    const rates = new Set(Array.from(x).filter((_, i) => level[i] === k));
    if (rates.size < powers.length) {
      return none(`a level has fewer fertilized rates than the ${model} has rate terms`);
    }
  }
  const commonCols = [...base, ...powers.map((p) => term(p, null))];
  const perCols = [...base];
  for (let k = 0; k < levelCount; k++) for (const p of powers) perCols.push(term(p, k));
  let fitted: Float64Array;
  try {
    fitted = fitLeastSquares({ y, columns: commonCols, intercept: false }).fitted;
  } catch (e) {
    if (!(e instanceof StatsInputError)) throw e;
    return none(`the common curve could not be fitted: ${e.message}`);
  }
  if (!fitted.every((v) => v > 0)) return none('the common curve has a fitted yield at or below 0');
  // Each row scaled by √w = 1/ŷ: ordinary least squares on the scaled rows is the weighted fit.
  const scaled = (col: ArrayLike<number>) => Float64Array.from(col, (v, i) => v / fitted[i]);
  const c = designSse(commonCols.map(scaled), scaled(y));
  const f = designSse(perCols.map(scaled), scaled(y));
  if (c.rank < c.columns || f.rank < f.columns) {
    return none('the design is not of full rank (blocks confounded with the levels or rates)');
  }
  const common = { sse: c.sse, df: n - c.columns };
  const perLevel = { sse: f.sse, df: n - f.columns };
  return levelCurveTest(model, n, { common, perLevel }, words, alpha);
}

function plateauCurveTest(
  model: LevelPlateauModel,
  x: Float64Array,
  y: Float64Array,
  level: Int32Array,
  levelCount: number,
  base: Float64Array[],
  factor: string,
  alpha: number,
): LevelCurveTest {
  const n = y.length;
  const words = readings(model, factor);
  const fits = levelPlateauFits(model, x, y, level, levelCount, base);
  if ('reason' in fits) return levelCurveTest(model, n, fits.reason, words, alpha);
  const common = { sse: fits.common.sse, df: fits.common.df };
  const perLevel = { sse: fits.perLevel.sse, df: fits.perLevel.df };
  return {
    ...levelCurveTest(model, n, { common, perLevel }, words, alpha),
    joinsKgHa: { common: fits.common.joinKgHa, perLevel: fits.perLevel.joinsKgHa },
  };
}

/**
 * The nested tests of whether a site's levels share one response to N.
 * @param site - the site's analyzable plots (kg/ha)
 * @param split - its levels (splitSiteLevels); checks have level −1, plots without a level −2
 * @param blocks - "auto" (block offsets when every plot has a block label, hasBlocks) or "none"
 * @param alpha - significance level of the sentences, e.g. 0.05
 * @returns the quadratic (headline), straight-line and the two plateau tests, each with its sentence
 * @example
 * levelResponseTests(site, split, 'auto', 0.05).quadratic.result // { kind: 'f-test', f, df1: 2, df2, p }
 */
export function levelResponseTests(
  site: SitePlots,
  split: SiteLevelSplit,
  blocks: BlockChoice,
  alpha: number,
): LevelResponseTests {
  const keep: number[] = [];
  split.levelIndex.forEach((k, i) => {
    if (k !== -2) keep.push(i);
  });
  const x = Float64Array.from(keep, (i) => site.rateKgHa[i]);
  const y = Float64Array.from(keep, (i) => site.yieldKgHa[i]);
  const level = Int32Array.from(keep, (i) => split.levelIndex[i]);
  const labels = keep.map((i) => site.block[i]);
  const fixed = blocks === 'auto' && defaultBlockTerms(labels) === 'fixed';
  const base = levelColumns(labels, fixed);
  const levelCount = split.levels.length;
  const test = (model: LevelTestModel) =>
    levelCount < 2
      ? (() => {
          const result: NoTest = { kind: 'no-test', reason: 'fewer than two levels' };
          return {
            model,
            n: keep.length,
            common: null,
            perLevel: null,
            result,
            sentence: describeFTest(result, readings(model, split.factor), alpha),
          };
        })()
      : model === 'quadraticPlateau' || model === 'linearPlateau'
        ? plateauCurveTest(model, x, y, level, levelCount, base, split.factor, alpha)
        : curveTest(model, x, y, level, levelCount, base, split.factor, alpha);
  return {
    factor: split.factor,
    levels: split.levels.map((l) => l.level),
    blocks: fixed ? 'fixed' : 'none',
    quadratic: test('quadratic'),
    linear: test('linear'),
    quadraticPlateau: test('quadraticPlateau'),
    linearPlateau: test('linearPlateau'),
    plotsWithoutLevel: [...split.withoutLevel],
    crossings: [],
    alpha,
  };
}
