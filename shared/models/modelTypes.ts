/**
 * The types every yield-response model shares: the site data it is fitted to,
 * the options, and the fit it returns. Rates and yields are in the plot table's
 * canonical units (kg/ha nutrient, kg/ha grain at standard moisture); a curve
 * parameter's unit follows from its formula (b of the straight line is kg grain
 * per kg nutrient, x0 is kg/ha, k is ha/kg).
 */
import type { ModelName } from './curves';
import type { RateFormat } from './rateFormat';

// The model names are the keys of the curve list (shared/models/curves), so a new model is
// named once, where its curve is listed.
export { MODEL_NAMES, type ModelName } from './curves';

/**
 * What a fit says about the data. Only "ok" carries a precise join point and
 * optimum; every other status is a data finding the screen explains:
 * - "ok": an identified fit with the maximum (if the model has one) inside the tested rates
 * - "no-plateau": the best join of the tested range is the highest rate (or the exponential's
 *   rate constant runs to 0): the data are fitted as well by the straight line (or the
 *   quadratic); no join is reported
 * - "full-response-at-lowest-rate": the join lies between the two lowest rates (or the
 *   exponential's rate constant runs to infinity): the curve is "check against the rest",
 *   so any join in that interval fits equally well; `joinBetweenKgHa` says where
 * - "convex": the quadratic opens upward (c ≥ 0), so it has no maximum
 * - "no-response": the best rising curve is flat: yield does not increase with rate
 * - "too-few-rates": not enough distinct rates or plots to fit the model with residual df
 * A fit of the profiled models with "no-plateau", "full-response-at-lowest-rate" or
 * "no-response" is its limiting model and estimates only that model's parameters
 * (shared/models/fixedByStatus).
 */
export type FitStatus =
  'ok' | 'no-plateau' | 'full-response-at-lowest-rate' | 'convex' | 'no-response' | 'too-few-rates';

/** Block terms: none, or one fixed offset per block (effect coded: offsets sum to zero). */
export type BlockTerms = 'none' | 'fixed';

/**
 * One site's plots, in canonical units. Arrays are parallel, one entry per plot.
 * Excluded plots must already be left out (the across-site plan's `sitePlots` does).
 */
export interface SiteData {
  /** Nutrient rate of each plot, kg/ha. */
  rateKgHa: ArrayLike<number>;
  /** Yield of each plot, kg/ha at standard moisture. */
  yieldKgHa: ArrayLike<number>;
  /** Block (replicate) label of each plot; needed when blocks are 'fixed'. */
  block?: ArrayLike<string | null> | null;
}

export interface FitOptions {
  /** Fixed block offsets as extra linear columns, default 'none'. */
  blocks?: BlockTerms;
  /** Confidence level for parameter intervals, default 0.95. */
  confidence?: number;
  /**
   * Exponential only: 'zero' fixes a = 0, the form y = b(1 − e^(−k x)) (e.g. NIST
   * StRD Misra1a); default 'free'.
   */
  exponentialIntercept?: 'free' | 'zero';
  /** Points on the fitted-curve grid from the lowest to the highest rate, default 61. */
  curvePoints?: number;
  /**
   * Relative tolerance of Brent's search on the exponential's ln k in estimateCurve, default
   * 1e-10. The bootstrap uses 1e-7: ample for percentiles, and fewer evaluations. The plateau
   * models find their join in closed form and do not use it.
   */
  searchTolerance?: number;
  /**
   * How status messages write rates (number and unit); default kg/ha rounded to
   * whole kilograms from 100 up (shared/models/rateFormat).
   */
  rateFormat?: RateFormat;
}

/** An estimate with its asymptotic standard error and confidence interval. */
export interface IntervalEstimate {
  estimate: number;
  stdError: number;
  ciLow: number;
  ciHigh: number;
}

/** Lack-of-fit F test: residual SS split into pure error (replicates) and lack of fit. */
export interface LackOfFit {
  ssLackOfFit: number;
  dfLackOfFit: number;
  ssPureError: number;
  dfPureError: number;
  f: number;
  p: number;
}

/** The tested rates of a site, kg/ha, sorted and distinct. */
export interface TestedRates {
  lowestKgHa: number;
  highestKgHa: number;
  /** Every distinct rate, ascending. */
  distinctKgHa: readonly number[];
}

/**
 * What economics needs from a fit: enough to re-price without refitting.
 * A full ModelFit satisfies it; so does a stored summary.
 */
export interface CurveSummary {
  model: ModelName;
  status: FitStatus;
  /** Curve parameters by name (see each model's file for names and units). */
  params: Readonly<Record<string, number>>;
  testedRates: TestedRates;
  /** For "full-response-at-lowest-rate": the two rates the join lies between, kg/ha. */
  joinBetweenKgHa: [number, number] | null;
}

/** Everything one model fit reports. */
export interface ModelFit extends CurveSummary {
  /** The model's display name (its curve's, shared/models/curves), e.g. "Linear-plateau". */
  label: string;
  /** The formula in the names of `params`, e.g. "a + b·min(x, x0)". */
  formula: string;
  /** One sentence on the status for the screen. */
  message: string;
  blocks: BlockTerms;
  /** Asymptotic standard errors s²(JᵀJ)⁻¹ of the curve parameters, by name. */
  stdErrors: Record<string, number>;
  /** Confidence intervals (estimate ± t·SE) of the curve parameters, by name. */
  confidenceIntervals: Record<string, [number, number]>;
  /** Block label → fixed offset, kg/ha (sum to zero); empty without block terms. */
  blockOffsets: Record<string, number>;
  /** Join point x0 (kg/ha) with interval; null unless status is "ok" and the model has one. */
  joinPoint: IntervalEstimate | null;
  /** Plateau (or asymptote) yield, kg/ha, with interval; null unless "ok" and the model has one. */
  plateauYield: IntervalEstimate | null;
  /** A note on the standard errors, e.g. where the x0 derivative jumps; "" when none. */
  stdErrorNote: string;
  n: number;
  /** Parameters of the model: curve parameters plus block offsets (AICc and BIC count these). */
  parameterCount: number;
  /**
   * Parameters this fit estimates: parameterCount less the curve parameters its status holds
   * at a bound or a limit (a flat fit estimates the mean; a straight-line or step limit two
   * curve parameters). Residual df and tests that compare fits (pooled against separate
   * curves) count these.
   */
  estimatedParameterCount: number;
  sse: number;
  /** n − estimatedParameterCount. */
  dfResidual: number;
  /** √(SSE / dfResidual), kg/ha. */
  rmse: number;
  r2: number;
  /** "uncentered" for the proportional model (about zero): never rank it against centered R². */
  r2Kind: 'centered' | 'uncentered';
  aicc: number;
  bic: number;
  /** Null when no rate is replicated or the model has as many parameters as rates. */
  lackOfFit: LackOfFit | null;
  /**
   * Observed minus fitted, one per plot in input order, kg/ha. `residuals`, `fitted` and
   * `curve` are views into one buffer shared by the fits of a site (fitAllModels), so
   * transfer a copy, not `.buffer`, to another thread.
   */
  residuals: Float64Array;
  fitted: Float64Array;
  /** The fitted curve (block average) on an even grid of rates across the tested range. */
  curve: { rateKgHa: Float64Array; yieldKgHa: Float64Array };
  /** Covariance of the curve parameters in `paramNames` order, row-major. */
  covariance: number[][];
  paramNames: string[];
  /** The fitted curve (block average), kg/ha, at any rate in kg/ha. */
  predict: (rateKgHa: number) => number;
}

/**
 * A model's estimate without the reporting (errors, residuals, curve): what a
 * bootstrap resample or a quick re-fit needs. Parameters are the internal ones:
 * where a status blanks a parameter in the full fit (x0 for "no-plateau"), the
 * estimate keeps the limiting value used (x0 = the highest rate), so the curve
 * can still be evaluated. With block terms the intercept is that of the
 * block-adjusted fit.
 */
export interface CurveEstimate extends CurveSummary {
  message: string;
  sse: number;
}
