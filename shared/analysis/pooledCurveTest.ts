/**
 * One curve for all, or one per part? The extra-sum-of-squares comparison for
 * models that are not linear in their parameters (linear-plateau,
 * quadratic-plateau, exponential rise), where no nested linear design exists:
 *
 *   reduced: one curve fitted to the pooled plots of every part, p parameters
 *   full:    one curve per part, Σ p_i parameters, SSE_full = Σ SSE_i
 *   F = [(SSE_pooled − Σ SSE_i) / (Σ p_i − p)] / [Σ SSE_i / (N − Σ p_i)]
 *
 * p and p_i are the parameters each fit estimates: a fit that reaches a limit is its limiting
 * model and counts that model's (a straight line or a step 2, a flat fit 1; curveFitOutcome,
 * shared/models/fixedByStatus), so a site with no response does not add three.
 *
 * (Draper & Smith, Applied Regression Analysis, 3rd ed., §6.1, applied to
 * nonlinear least squares as in Bates & Watts, Nonlinear Regression Analysis
 * and Its Applications, 1988, §3.10, section from memory: the F distribution then holds only
 * approximately, and for the plateau models the join point makes it rougher;
 * read p as a guide.) The parts are sites (do the sites share one curve?) or
 * groups of sites (do the groups differ?).
 *
 * A part its fitter cannot fit is left out of both the pooled and the separate
 * fits, so the two stay comparable, and is listed with the reason.
 */
import { describeFTest, type TestReadings } from './describeFTest';
import { extraSumOfSquaresTest, type FTestResult, type NoTest } from './extraSumOfSquaresTest';
import type { SiteLeftOut } from './commonResponseTests';

/** A set of plots fitted as one: a site, or the pooled plots of a group. */
export interface CurvePart {
  label: string;
  /** Rates, kg/ha. */
  rateKgHa: ArrayLike<number>;
  /** Yields, kg/ha. */
  yieldKgHa: ArrayLike<number>;
  /** This part's own fit when already made (e.g. by the site table), so it is not fitted again. */
  known?: CurveFitOutcome;
}

/** What a fitter gives back: the SSE and parameter count, or why it could not fit. */
export type CurveFitOutcome = { sse: number; parameters: number } | { problem: string };

/**
 * Fits one model to a set of plots.
 * @param rateKgHa - rates, kg/ha
 * @param yieldKgHa - yields, kg/ha
 */
export type CurveFitter = (rateKgHa: Float64Array, yieldKgHa: Float64Array) => CurveFitOutcome;

export interface PooledCurveTest {
  /** Parts in both fits. */
  partsUsed: string[];
  partsLeftOut: SiteLeftOut[];
  n: number;
  pooled: { sse: number; df: number; parameters: number } | null;
  separate: { sse: number; df: number; parameters: number } | null;
  result: FTestResult | NoTest;
  sentence: string;
}

/** The numbers as a Float64Array: the array itself when it is one (fitters only read it). */
function float64(values: ArrayLike<number>): Float64Array {
  return values instanceof Float64Array ? values : Float64Array.from(values);
}

/**
 * Pooled curve against one curve per part.
 * @param parts - the sites or groups, plots in kg/ha
 * @param fit - fits the model to a set of plots (SSE in (kg/ha)²)
 * @param readings - what the test compares and how to read it
 * @param alpha - significance level, e.g. 0.05
 * @returns the two fits, the F-test and a sentence
 * @example
 * pooledCurveTest(sites, (x, y) => fitLinearPlateau({ rateKgHa: x, yieldKgHa: y }), readings, 0.05)
 */
export function pooledCurveTest(
  parts: readonly CurvePart[],
  fit: CurveFitter,
  readings: TestReadings,
  alpha: number,
): PooledCurveTest {
  const partsLeftOut: SiteLeftOut[] = [];
  const used: CurvePart[] = [];
  let sse = 0;
  let parameters = 0;
  for (const part of parts) {
    const out = part.known ?? fit(float64(part.rateKgHa), float64(part.yieldKgHa));
    if ('problem' in out) {
      partsLeftOut.push({ site: part.label, reason: out.problem });
      continue;
    }
    used.push(part);
    sse += out.sse;
    parameters += out.parameters;
  }
  const n = used.reduce((s, p) => s + p.yieldKgHa.length, 0);
  const none = (reason: string): PooledCurveTest => {
    const result: NoTest = { kind: 'no-test', reason };
    return {
      partsUsed: used.map((p) => p.label),
      partsLeftOut,
      n,
      pooled: null,
      separate: null,
      result,
      sentence: describeFTest(result, readings, alpha),
    };
  };
  if (used.length < 2) return none('fewer than two parts can be fitted');
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  let offset = 0;
  for (const p of used) {
    x.set(float64(p.rateKgHa), offset);
    y.set(float64(p.yieldKgHa), offset);
    offset += p.yieldKgHa.length;
  }
  const pooledOut = fit(x, y);
  if ('problem' in pooledOut)
    return none(`the pooled curve could not be fitted: ${pooledOut.problem}`);
  const pooled = {
    sse: pooledOut.sse,
    df: n - pooledOut.parameters,
    parameters: pooledOut.parameters,
  };
  const separate = { sse, df: n - parameters, parameters };
  const result = extraSumOfSquaresTest(pooled, separate);
  return {
    partsUsed: used.map((p) => p.label),
    partsLeftOut,
    n,
    pooled,
    separate,
    result,
    sentence: describeFTest(result, readings, alpha),
  };
}
