/**
 * Is the intercept needed? Fits the straight line y = a + b x and the line
 * through the origin y = b x to the same points and compares them three ways:
 * - the t-test of a = 0 in the straight line (df n − 2);
 * - the extra-sum-of-squares F-test of the proportional model against the
 *   straight line, F = (SSE₀ − SSE₁) / (SSE₁ / (n − 2)) on (1, n − 2) df, which
 *   equals t² with the same p-value (Draper & Smith, Applied Regression
 *   Analysis, 3rd ed., §6.1, the "extra sum of squares" principle);
 * - the AICc difference (Hurvich & Tsai 1989; Burnham & Anderson, Model
 *   Selection and Multimodel Inference, 2nd ed., §2.4), an information-criterion
 *   view for readers who distrust a single p-value.
 * The decision (interceptNeeded) follows the t-test at the chosen alpha; the
 * R² values of the two fits are not compared, because the line through the
 * origin reports an uncentered R² that is not on the same scale.
 */
import {
  assertAtLeast,
  assertFinite,
  assertNotConstant,
  assertLevel,
  assertSameLength,
} from './errors';
import { fitLeastSquares, type CoefficientEstimate, type LeastSquaresFit } from './leastSquares';
import { fisherFUpperP } from './distributions';
import { formatPValue, formatStatistic } from './formatStatistic';

export interface InterceptTestResult {
  n: number;
  /** Significance level the decision used. */
  alpha: number;
  /** The intercept of the straight line: estimate, SE, t, p, interval. */
  intercept: CoefficientEstimate;
  /** t statistic of the intercept (straight line), df2 degrees of freedom. */
  t: number;
  /** Extra-sum-of-squares F of the line through the origin against the straight line. */
  F: number;
  /** Numerator degrees of freedom of F (always 1: one parameter dropped). */
  df1: number;
  /** Denominator degrees of freedom, n − 2 (residual df of the straight line). */
  df2: number;
  /** p-value of the F-test, equal to the two-sided p of t. */
  p: number;
  /**
   * AICc(line through the origin) − AICc(straight line). Positive favors keeping
   * the intercept; within about ±2 the two are hard to tell apart (Burnham &
   * Anderson §2.6). Null when n < 5, where the straight line's AICc is undefined.
   */
  aiccDifference: number | null;
  /** True when the intercept differs from zero at alpha. */
  interceptNeeded: boolean;
  /** One plain-language sentence with the statistics behind it. */
  verdict: string;
  straightLine: LeastSquaresFit;
  throughOrigin: LeastSquaresFit;
}

/**
 * Tests whether a straight-line fit needs its intercept.
 * @param x - the regressor, e.g. rate in kg N/ha; at least two different values
 * @param y - the response, same length, e.g. yield in kg/ha
 * @param alpha - significance level, strictly between 0 and 1, default 0.05
 * @returns the t-test, F-test, AICc difference, decision and verdict, with both fits
 * @throws {StatsInputError} "length-mismatch"; "non-finite"; "too-few-points" for n < 3;
 *   "constant-values" when every x is the same; "bad-argument" for alpha outside (0, 1)
 * @example
 * testIntercept([1, 2, 3, 4, 5, 6], [3.1, 5.0, 7.2, 8.9, 11.1, 13.0]).verdict
 * // "The intercept differs from zero (t = 10, p < 0.001): keep it."
 */
export function testIntercept(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  alpha = 0.05,
): InterceptTestResult {
  assertSameLength(x, y, ['testIntercept: x', 'y']);
  assertFinite(x, 'testIntercept: x');
  assertFinite(y, 'testIntercept: y');
  assertAtLeast(
    x.length,
    3,
    'testIntercept: x and y',
    'the straight line needs 1 residual degree of freedom',
  );
  assertNotConstant(x, 'testIntercept: x', 'a slope needs at least two different x values');
  assertLevel(alpha, 'testIntercept: alpha');
  const n = x.length;
  const straightLine = fitLeastSquares({ columns: [x], columnNames: ['x'], y, intercept: true });
  const throughOrigin = fitLeastSquares({ columns: [x], columnNames: ['x'], y, intercept: false });
  const intercept = straightLine.coefficients[0];
  const df2 = straightLine.dfResidual;
  // The extra sum of squares cannot be negative in exact arithmetic (the origin
  // line is a special case of the straight line); clamp rounding below zero.
  const extra = Math.max(throughOrigin.sse - straightLine.sse, 0);
  const F = extra / (straightLine.sse / df2);
  const p = fisherFUpperP(F, 1, df2);
  const aiccDifference =
    Number.isFinite(straightLine.aicc) && Number.isFinite(throughOrigin.aicc)
      ? throughOrigin.aicc - straightLine.aicc
      : null;
  const interceptNeeded = intercept.p < alpha;
  const stats = `t = ${formatStatistic(intercept.t)}, p ${formatPValue(intercept.p, alpha)}`;
  const verdict = interceptNeeded
    ? `The intercept differs from zero (${stats}): keep it.`
    : `No evidence the intercept differs from zero (${stats}): the line through the origin is adequate.`;
  return {
    n,
    alpha,
    intercept,
    t: intercept.t,
    F,
    df1: 1,
    df2,
    p,
    aiccDifference,
    interceptNeeded,
    verdict,
    straightLine,
    throughOrigin,
  };
}
