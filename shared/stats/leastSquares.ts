/**
 * Ordinary least squares for any design matrix, through a Householder QR
 * decomposition (never the normal equations). With `intercept: true` a column of
 * ones is put first; without it the fit goes through the origin and R² is the
 * uncentered one, labelled so, because it compares against y = 0 rather than
 * against the mean and cannot be ranked against a centered R².
 *
 * Formulas: Draper & Smith, Applied Regression Analysis, 3rd ed., ch. 2–8;
 * information criteria count the residual variance as a parameter
 * (k = p + 1), as R's logLik/AIC do; AICc = AIC + 2k(k+1)/(n − k − 1)
 * (Hurvich & Tsai 1989); BIC = −2 lnL + k ln n.
 */
import { assertFinite, StatsInputError } from './errors';
import { studentTQuantile, studentTTwoSidedP, fisherFUpperP } from './distributions';
import {
  qrDecompose,
  applyQTranspose,
  solveUpperTriangular,
  unscaledCovariance,
  hatDiagonal,
} from './qr';

export interface LeastSquaresInput {
  /** The regressors, one array per column, each of length n (the intercept is not among them). */
  columns: ReadonlyArray<ArrayLike<number>>;
  /** Names of the columns, in the same order; defaults to x1, x2, … */
  columnNames?: readonly string[];
  /** The response, length n. */
  y: ArrayLike<number>;
  /** Put a column of ones first (the usual model) or fit through the origin. */
  intercept: boolean;
  /** Confidence level for the coefficient intervals, default 0.95. */
  confidence?: number;
  /**
   * Default true. False leaves each coefficient's p-value and interval and the overall F's
   * p-value NaN (estimates, standard errors, t and F are kept): for callers that read only the
   * fit and its residuals, since each p-value is an incomplete beta function.
   */
  inference?: boolean;
}

export interface CoefficientEstimate {
  name: string;
  estimate: number;
  stdError: number;
  t: number;
  /** Two-sided p-value of t with the residual degrees of freedom. */
  p: number;
  ciLow: number;
  ciHigh: number;
}

/** One line of the regression ANOVA table. */
export interface AnovaLine {
  source: 'regression' | 'residual' | 'total';
  df: number;
  ss: number;
  /** Mean square; NaN for the total line. */
  ms: number;
}

export interface LeastSquaresFit {
  n: number;
  /** Number of estimated coefficients, intercept included. */
  parameters: number;
  intercept: boolean;
  coefficients: CoefficientEstimate[];
  /** Residual sum of squares. */
  sse: number;
  dfResidual: number;
  /** Residual standard deviation √(SSE / df). */
  sigma: number;
  /** Regression ANOVA: about the mean with an intercept, about zero without. */
  anova: AnovaLine[];
  /** Overall F for the regression and its p-value (NaN if no regressor besides the intercept). */
  fStatistic: number;
  fP: number;
  r2: number;
  /** "centered" (about the mean) with an intercept; "uncentered" (about zero) without. */
  r2Kind: 'centered' | 'uncentered';
  adjustedR2: number;
  logLikelihood: number;
  aic: number;
  aicc: number;
  bic: number;
  fitted: Float64Array;
  residuals: Float64Array;
  leverage: Float64Array;
  /**
   * Internally studentized (standardized) residuals e / (σ √(1 − h)). A point with
   * leverage 1 (it alone fixes a parameter, e.g. the only plot at a rate) has no
   * residual to judge: its entries here, in studentizedResiduals and in
   * cooksDistance are NaN or ±Infinity, and a caller must skip them.
   */
  standardizedResiduals: Float64Array;
  /** Externally studentized residuals, each with its own point left out of σ. */
  studentizedResiduals: Float64Array;
  cooksDistance: Float64Array;
  /** σ² (XᵀX)⁻¹, row-major, in coefficient order. */
  covariance: number[][];
  /**
   * (XᵀX)⁻¹ itself, for contrasts scaled by another error estimate (and defined when the fit is
   * exact and σ² is 0, where covariance ÷ σ² is not).
   */
  unscaledCovariance: number[][];
}

/**
 * Fits y = Xb + e by least squares.
 * @param input - the regressor columns (in their own units, e.g. rate in kg N/ha), the response
 *   (e.g. yield in kg/ha), whether to add an intercept, and the confidence level of the intervals
 * @returns coefficients with SEs, t, p and intervals; the ANOVA; R² (centered or uncentered, labelled);
 *   information criteria; fitted values, residuals and influence measures
 * @throws {StatsInputError} "length-mismatch" when a column's length differs from y's;
 *   "non-finite" for NaN or ±Infinity; "too-few-points" when n ≤ parameters (no residual df);
 *   "rank-deficient" when a column is constant (with an intercept) or a combination of others.
 * @example
 * fitLeastSquares({ columns: [[1, 2, 3]], y: [2, 4.1, 5.9], intercept: true }).coefficients[1].estimate // ≈ 1.95
 */
/** The working buffer of fitLeastSquares (no fit calls another, so one is enough). */
let scratch = new Float64Array(0);

function scratchFor(doubles: number): Float64Array {
  if (scratch.length < doubles) scratch = new Float64Array(Math.max(doubles, 2 * scratch.length));
  return scratch;
}

export function fitLeastSquares(input: LeastSquaresInput): LeastSquaresFit {
  const { y, intercept } = input;
  const n = y.length;
  const names = [
    ...(intercept ? ['intercept'] : []),
    ...input.columns.map((_, j) => input.columnNames?.[j] ?? `x${j + 1}`),
  ];
  const p = names.length;
  assertFinite(y, 'response');
  input.columns.forEach((c, j) => {
    if (c.length !== n) {
      throw new StatsInputError(
        'length-mismatch',
        `Column "${names[j + (intercept ? 1 : 0)]}" has ${c.length} values but the response has ${n}.`,
      );
    }
    assertFinite(c, `column "${names[j + (intercept ? 1 : 0)]}"`);
  });
  if (p === 0) throw new StatsInputError('bad-argument', 'A model needs at least one column.');
  if (n <= p) {
    throw new StatsInputError(
      'too-few-points',
      `${n} points cannot fit ${p} coefficients with any residual degrees of freedom; at least ${p + 1} are needed.`,
    );
  }

  // The design, its QR, Qᵀy and the leverages' working column are used only inside this call:
  // they live in one buffer kept from fit to fit.
  const work = scratchFor(2 * n * p + 2 * n);
  const x = work.subarray(0, n * p);
  let offset = 0;
  if (intercept) {
    x.fill(1, 0, n);
    offset = 1;
  }
  input.columns.forEach((c, j) => {
    for (let i = 0; i < n; i++) x[(j + offset) * n + i] = c[i];
  });

  const qr = qrDecompose(x, n, p, work.subarray(n * p, 2 * n * p));
  if (qr.rank < p) {
    throw new StatsInputError(
      'rank-deficient',
      intercept && p === 2
        ? 'All x values are equal, so no slope can be estimated.'
        : `The design has rank ${qr.rank} but ${p} columns: a column is constant or a combination of others.`,
    );
  }

  const qty = work.subarray(2 * n * p, 2 * n * p + n);
  for (let i = 0; i < n; i++) qty[i] = y[i];
  applyQTranspose(qr, qty);
  const b = solveUpperTriangular(qr, qty);

  // The six per-point results share one store (one allocation instead of six).
  const store = new ArrayBuffer(6 * 8 * n);
  const perPoint = (k: number) => new Float64Array(store, k * 8 * n, n);
  const fitted = perPoint(0);
  for (let j = 0; j < p; j++) {
    const bj = b[j];
    for (let i = 0; i < n; i++) fitted[i] += x[j * n + i] * bj;
  }
  const residuals = perPoint(1);
  // SSE from the trailing part of Qᵀy is exact in exact arithmetic and less
  // sensitive to cancellation than Σ(y − ŷ)² when the fit is nearly perfect.
  let sse = 0;
  for (let i = p; i < n; i++) sse += qty[i] * qty[i];
  for (let i = 0; i < n; i++) residuals[i] = y[i] - fitted[i];

  const dfResidual = n - p;
  const s2 = sse / dfResidual;
  const sigma = Math.sqrt(s2);
  const unscaled = unscaledCovariance(qr);
  const covariance = unscaled.map((row) => row.map((v) => v * s2));
  const level = input.confidence ?? 0.95;
  const inference = input.inference ?? true;
  const tCrit = inference ? studentTQuantile(1 - (1 - level) / 2, dfResidual) : NaN;
  const coefficients = names.map((name, j) => {
    const stdError = Math.sqrt(covariance[j][j]);
    const t = b[j] / stdError;
    return {
      name,
      estimate: b[j],
      stdError,
      t,
      p: inference ? studentTTwoSidedP(t, dfResidual) : NaN,
      ciLow: b[j] - tCrit * stdError,
      ciHigh: b[j] + tCrit * stdError,
    };
  });

  // Total sum of squares about the mean (two-pass) or about zero.
  let mean = 0;
  if (intercept) {
    for (let i = 0; i < n; i++) mean += y[i];
    mean /= n;
  }
  let sst = 0;
  for (let i = 0; i < n; i++) sst += (y[i] - mean) ** 2;
  const dfTotal = intercept ? n - 1 : n;
  const dfRegression = intercept ? p - 1 : p;
  const ssRegression = Math.max(sst - sse, 0);
  const r2 = sst > 0 ? 1 - sse / sst : NaN;
  const adjustedR2 = 1 - (1 - r2) * (dfTotal / dfResidual);
  const msRegression = dfRegression > 0 ? ssRegression / dfRegression : NaN;
  const fStatistic = dfRegression > 0 ? msRegression / s2 : NaN;
  const fP =
    inference && dfRegression > 0 ? fisherFUpperP(fStatistic, dfRegression, dfResidual) : NaN;

  const k = p + 1;
  const logLikelihood = -0.5 * n * (Math.log(2 * Math.PI) + Math.log(sse / n) + 1);
  const aic = -2 * logLikelihood + 2 * k;
  const aicc = n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : Infinity;
  const bic = -2 * logLikelihood + k * Math.log(n);

  const leverage = hatDiagonal(qr, perPoint(2), work.subarray(2 * n * p + n));
  const standardizedResiduals = perPoint(3);
  const studentizedResiduals = perPoint(4);
  const cooksDistance = perPoint(5);
  for (let i = 0; i < n; i++) {
    const h = leverage[i];
    const r = residuals[i] / (sigma * Math.sqrt(1 - h));
    standardizedResiduals[i] = r;
    const dfLeaveOut = dfResidual - 1;
    studentizedResiduals[i] =
      dfLeaveOut > 0 ? r * Math.sqrt(dfLeaveOut / Math.max(dfResidual - r * r, 0)) : NaN;
    cooksDistance[i] = ((r * r) / p) * (h / (1 - h));
  }

  return {
    n,
    parameters: p,
    intercept,
    coefficients,
    sse,
    dfResidual,
    sigma,
    anova: [
      { source: 'regression', df: dfRegression, ss: ssRegression, ms: msRegression },
      { source: 'residual', df: dfResidual, ss: sse, ms: s2 },
      { source: 'total', df: dfTotal, ss: sst, ms: NaN },
    ],
    fStatistic,
    fP,
    r2,
    r2Kind: intercept ? 'centered' : 'uncentered',
    adjustedR2,
    logLikelihood,
    aic,
    aicc,
    bic,
    fitted,
    residuals,
    leverage,
    standardizedResiduals,
    studentizedResiduals,
    cooksDistance,
    covariance,
    unscaledCovariance: unscaled,
  };
}
