/**
 * Everything a fit reports once the parameters are known: fitted values and
 * residuals, SSE and residual df, asymptotic standard errors s²(JᵀJ)⁻¹ from the
 * Jacobian of the estimated parameters (curve and block offsets) at the optimum (Bates &
 * Watts, Nonlinear Regression Analysis and Its Applications, 1988, §2.3),
 * t intervals, R², AICc and BIC (counted as in shared/stats/leastSquares: the
 * residual variance is a parameter, k = p + 1), the lack-of-fit F test against
 * the pure error of replicated rates (Draper & Smith, 3rd ed., §2.1), the curve
 * on a grid and a prediction function.
 *
 * A fit whose status holds some curve parameters at a bound or a limit (the fitter names
 * them in `fixed`: a join at the highest rate, the slope 0 of a flat fit) estimates only the
 * others. The residual df, the residual variance and the standard errors count the estimated
 * parameters (`estimatedParameterCount`), as the limiting model's own least-squares fit
 * would (a flat fit: n − 1; a straight line or a step: n − 2). AICc and BIC keep every
 * parameter of the model (`parameterCount`), as the resamples' AICc does
 * (shared/economics/drawChoices), so that reaching a limit does not move a fit up the ranking.
 */
import { fisherFUpperP, studentTQuantile } from '../stats/distributions';
import { qrDecompose, type QrDecomposition } from '../stats/qr';
import type {
  CurveEstimate,
  FitOptions,
  FitStatus,
  IntervalEstimate,
  LackOfFit,
  ModelFit,
  ModelName,
} from './modelTypes';
import { aiccFromSse } from './aicc';
import { pureError } from './pureError';
import type { PreparedSite } from './prepareSite';
import type { CurveSpec } from './modelCurve';
import type { FitStore } from './modelEntry';

export type { FitStore } from './modelEntry';
import { exactScratch } from './solve/exactScratch';
import { blockColumns } from './solve/profileSolver';

/** A derived quantity (join point, plateau yield) as a function of the curve parameters. */
export interface DerivedQuantity {
  value: number;
  /** ∂value/∂p_k, for the delta-method standard error. */
  gradient: number[];
}

export interface FinishInput {
  site: PreparedSite;
  spec: CurveSpec<ModelName>;
  params: Float64Array;
  /** Effect-coded block coefficients (B − 1), empty without blocks. */
  blockCoefficients: Float64Array;
  status: FitStatus;
  message: string;
  options: FitOptions;
  joinPoint?: DerivedQuantity;
  plateauYield?: DerivedQuantity;
  joinBetweenKgHa?: [number, number] | null;
  stdErrorNote?: string;
  /**
   * For a curve linear in its parameters (straight lines, quadratic): the QR of
   * its least-squares design, which is also the QR of its Jacobian, so it is not
   * decomposed twice (linearCoefficients returns it).
   */
  designQr?: QrDecomposition;
  /** Where the fitted values, residuals and curve go; a buffer of their own by default. */
  store?: FitStore;
  /**
   * Curve parameters the status holds at a bound or a limit instead of estimating them (x0 at
   * the highest rate; b = 0 of a flat fit): left out of the Jacobian, so the others keep their
   * standard errors, given none of their own, and not counted as estimated. Not combined with
   * `designQr` (the models linear in their parameters fix none).
   */
  fixed?: readonly string[];
}

/**
 * Doubles needed per fit in a FitStore.
 * @param n - plots
 * @param options - curvePoints is read
 * @returns fitted values, residuals and the two curve arrays, in doubles
 * @example
 * fitStoreDoubles(24, {}) // 2·24 + 2·61 = 170
 */
export function fitStoreDoubles(n: number, options: FitOptions): number {
  return 2 * n + 2 * Math.max(options.curvePoints ?? 61, 2);
}

function carve(store: FitStore | undefined, doubles: number): FitStore {
  const bytes = 8 * doubles;
  if (store && store.buffer.byteLength - store.byteOffset >= bytes) {
    const part = { buffer: store.buffer, byteOffset: store.byteOffset };
    store.byteOffset += bytes;
    return part;
  }
  return { buffer: new ArrayBuffer(bytes), byteOffset: 0 };
}

const tCache = new Map<number, number>();
function tCritical(level: number, df: number): number {
  // df is a whole number and 0 < level < 1, so df + level is a unique key.
  const key = df + level;
  let t = tCache.get(key);
  if (t === undefined) {
    t = studentTQuantile(1 - (1 - level) / 2, df);
    tCache.set(key, t);
  }
  return t;
}

/**
 * Assembles a ModelFit from fitted parameters.
 * @param input - the site, the curve, its parameters and status
 * @returns the complete fit
 * @example
 * // Used by every fitX function; see fitLinear for the simplest caller.
 */
export function finishFit(input: FinishInput): ModelFit {
  const { site, spec, params, blockCoefficients, options } = input;
  const { n, x, y, blockOf } = site;
  const q = spec.paramNames.length;
  const nbCoef = blockCoefficients.length;
  const p = q + nbCoef;
  // The estimated curve parameters, by index; the Jacobian has their columns only.
  const free: number[] = [];
  for (let k = 0; k < q; k++) if (!input.fixed?.includes(spec.paramNames[k])) free.push(k);
  const qe = free.length;
  const pe = qe + nbCoef;
  const nb = site.blockLabels.length;
  const offsets = new Float64Array(Math.max(nb, 1));
  if (nbCoef > 0) {
    let s = 0;
    for (let b = 0; b < nbCoef; b++) {
      offsets[b] = blockCoefficients[b];
      s += blockCoefficients[b];
    }
    offsets[nb - 1] = -s;
  }

  // Curve values once per distinct rate, then per plot with its block offset.
  // Fitted values, residuals and the curve grid share one buffer: a typed array
  // of more than a few numbers gets its own off-heap store, which costs more to
  // allocate and collect than the numbers it holds.
  const m = site.rates.length;
  const points = Math.max(options.curvePoints ?? 61, 2);
  const { buffer: store, byteOffset: at } = carve(input.store, 2 * n + 2 * points);
  const fitted = new Float64Array(store, at, n);
  const residuals = new Float64Array(store, at + 8 * n, n);
  const curveRate = new Float64Array(store, at + 16 * n, points);
  const curveYield = new Float64Array(store, at + 16 * n + 8 * points, points);
  const atRate = scratch(AT_RATE, m);
  spec.values(site.rates, params, atRate);
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const f = atRate[site.groupOf[i]] + offsets[blockOf[i]];
    fitted[i] = f;
    const r = y[i] - f;
    residuals[i] = r;
    sse += r * r;
  }
  const dfResidual = n - pe;
  const s2 = sse / dfResidual;

  // Jacobian of all parameters: curve parameters, then block columns. With
  // orthogonal blocks (or none) JᵀJ is block diagonal and the curve block is
  // Σ_j n_j J_j J_jᵀ over distinct rates, so the QR of the m rows √n_j·J_j gives
  // the same covariance of the curve parameters at a fraction of the cost.
  const row = scratch(ROW, q);
  let qr: QrDecomposition;
  if (input.designQr) {
    qr = input.designQr;
  } else if (site.orthogonalBlockOffsets) {
    const jac = exactScratch(m * qe);
    for (let j = 0; j < m; j++) {
      spec.gradient(site.rates[j], params, row);
      const w = Math.sqrt(site.counts[j]);
      for (let k = 0; k < qe; k++) jac[k * m + j] = w * row[free[k]];
    }
    qr = qrDecompose(jac, m, qe, scratch(QR_WORK, m * qe));
  } else {
    const jac = scratch(JACOBIAN, n * pe).subarray(0, n * pe);
    jac.fill(0);
    for (let i = 0; i < n; i++) {
      spec.gradient(x[i], params, row);
      for (let k = 0; k < qe; k++) jac[k * n + i] = row[free[k]];
    }
    if (nbCoef > 0) blockColumns(site).forEach((c, k) => jac.set(c, (qe + k) * n));
    qr = qrDecompose(jac, n, pe, scratch(QR_WORK, n * pe));
  }
  const identified = qr.rank === qr.cols;
  const covariance = expandCovariance(curveCovariance(qr, qe, identified ? s2 : NaN), free, q);

  const level = options.confidence ?? 0.95;
  const tCrit = dfResidual > 0 ? tCritical(level, dfResidual) : NaN;
  const paramRecord: Record<string, number> = {};
  const stdErrors: Record<string, number> = {};
  const confidenceIntervals: Record<string, [number, number]> = {};
  for (let k = 0; k < q; k++) {
    const name = spec.paramNames[k];
    const se = Math.sqrt(covariance[k][k]);
    paramRecord[name] = params[k];
    stdErrors[name] = se;
    confidenceIntervals[name] = [params[k] - tCrit * se, params[k] + tCrit * se];
  }

  let mean = 0;
  if (spec.r2Kind === 'centered') {
    for (let i = 0; i < n; i++) mean += y[i];
    mean /= n;
  }
  let sst = 0;
  for (let i = 0; i < n; i++) sst += (y[i] - mean) ** 2;
  const r2 = sst > 0 ? 1 - sse / sst : NaN;

  const k = p + 1;
  const logLik = -0.5 * n * (Math.log(2 * Math.PI) + Math.log(sse / n) + 1);
  const aicc = aiccFromSse(sse, n, p);
  const bic = -2 * logLik + k * Math.log(n);

  const blockOffsets: Record<string, number> = {};
  if (nbCoef > 0) site.blockLabels.forEach((label, b) => (blockOffsets[label] = offsets[b]));

  let stdErrorNote = input.stdErrorNote ?? '';
  if (!identified) {
    stdErrorNote +=
      (stdErrorNote ? ' ' : '') +
      'The parameters are not all identified by these rates, so no standard errors are given.';
  }
  const lo = site.testedRates.lowestKgHa;
  const hi = site.testedRates.highestKgHa;
  for (let i = 0; i < points; i++) curveRate[i] = lo + ((hi - lo) * i) / (points - 1);
  spec.values(curveRate, params, curveYield);
  // `params` is the caller's fresh array and is not changed later, so predict keeps it.
  return {
    model: spec.model,
    label: spec.label,
    formula: spec.formula,
    status: input.status,
    message: input.message,
    blocks: site.blocks,
    params: paramRecord,
    stdErrors,
    confidenceIntervals,
    blockOffsets,
    joinPoint: intervalOf(input.joinPoint, covariance, free, tCrit),
    plateauYield: intervalOf(input.plateauYield, covariance, free, tCrit),
    joinBetweenKgHa: input.joinBetweenKgHa ?? null,
    stdErrorNote,
    testedRates: site.testedRates,
    n,
    parameterCount: p,
    estimatedParameterCount: pe,
    sse,
    dfResidual,
    rmse: Math.sqrt(s2),
    r2,
    r2Kind: spec.r2Kind,
    aicc,
    bic,
    lackOfFit: lackOfFitTest(site, sse, dfResidual),
    residuals,
    fitted,
    curve: { rateKgHa: curveRate, yieldKgHa: curveYield },
    covariance,
    paramNames: spec.paramNames.slice(),
    // A method, not a named arrow: see profileSolver on tools that keep function names.
    predict(rateKgHa: number): number {
      return spec.value(rateKgHa, params);
    },
  };
}

/** Reused buffers, one per purpose (the engine is single-threaded within a worker). */
const ROW = { buffer: new Float64Array(8) };
const R_INVERSE = { buffer: new Float64Array(64) };
const AT_RATE = { buffer: new Float64Array(16) };
// The Jacobian and its QR are read only here (curveCovariance), never kept with the fit.
const JACOBIAN = { buffer: new Float64Array(0) };
const QR_WORK = { buffer: new Float64Array(0) };
function scratch(holder: { buffer: Float64Array }, length: number): Float64Array {
  if (holder.buffer.length < length) holder.buffer = new Float64Array(2 * length);
  return holder.buffer;
}

/**
 * s²·(RᵀR)⁻¹ for the first q parameters, from R of the Jacobian's QR: R⁻¹ by
 * back substitution, then (R⁻¹R⁻ᵀ)_ab = Σ_k R⁻¹_ak R⁻¹_bk (the same sums, in the
 * same order, as shared/stats unscaledCovariance, which builds all p × p).
 * @param qr - QR of the Jacobian (curve columns first)
 * @param q - curve parameters
 * @param s2 - residual variance; NaN when the parameters are not identified
 * @returns q × q covariance, row-major arrays
 */
function curveCovariance(qr: QrDecomposition, q: number, s2: number): number[][] {
  const covariance: number[][] = [];
  if (!(s2 === s2)) {
    for (let a = 0; a < q; a++) covariance.push(new Array<number>(q).fill(NaN));
    return covariance;
  }
  const p = qr.cols;
  const rows = qr.rows;
  const { packed, rDiagonal } = qr;
  const rInv = scratch(R_INVERSE, p * p);
  for (let col = 0; col < p; col++) {
    for (let i = col; i >= 0; i--) {
      let s = i === col ? 1 : 0;
      for (let j = i + 1; j <= col; j++) s -= packed[j * rows + i] * rInv[j * p + col];
      rInv[i * p + col] = s / rDiagonal[i];
    }
  }
  for (let a = 0; a < q; a++) covariance.push(new Array<number>(q));
  for (let a = 0; a < q; a++) {
    for (let b = a; b < q; b++) {
      let s = 0;
      for (let k = b; k < p; k++) s += rInv[a * p + k] * rInv[b * p + k];
      covariance[a][b] = s * s2;
      covariance[b][a] = s * s2;
    }
  }
  return covariance;
}

/**
 * The covariance of the estimated curve parameters placed in the q × q matrix of all of them,
 * NaN in the rows and columns of the fixed ones.
 */
function expandCovariance(estimated: number[][], free: readonly number[], q: number): number[][] {
  if (free.length === q) return estimated;
  const all = Array.from({ length: q }, () => new Array<number>(q).fill(NaN));
  free.forEach((a, i) => free.forEach((b, j) => (all[a][b] = estimated[i][j])));
  return all;
}

/** A derived quantity with its delta-method standard error and t interval. */
function intervalOf(
  d: DerivedQuantity | undefined,
  covariance: number[][],
  free: readonly number[],
  tCrit: number,
): IntervalEstimate | null {
  if (!d) return null;
  let v = 0;
  // A fixed parameter is a constant here: only the estimated ones vary.
  for (const a of free) {
    for (const b of free) v += d.gradient[a] * covariance[a][b] * d.gradient[b];
  }
  const se = Math.sqrt(v);
  return {
    estimate: d.value,
    stdError: se,
    ciLow: d.value - tCrit * se,
    ciHigh: d.value + tCrit * se,
  };
}

/**
 * The lack-of-fit F test from the site's pure error (the within-rate SS of the
 * prepared group sums, or the saturated fit's for the full design).
 */
function lackOfFitTest(site: PreparedSite, sse: number, dfResidual: number): LackOfFit | null {
  const pe = pureError(site);
  const dfLack = dfResidual - pe.df;
  if (!(pe.df > 0 && dfLack > 0)) return null;
  const ssLack = Math.max(sse - pe.ss, 0);
  const f = ssLack / dfLack / (pe.ss / pe.df);
  // The p-value (an incomplete beta, about a microsecond) is computed on first
  // read: batch runs that only rank and price the fits never need it.
  let p: number | null = null;
  return {
    ssLackOfFit: ssLack,
    dfLackOfFit: dfLack,
    ssPureError: pe.ss,
    dfPureError: pe.df,
    f,
    get p(): number {
      if (p === null) p = fisherFUpperP(f, dfLack, pe.df);
      return p;
    },
  };
}

/**
 * A fit that could not be made (status "too-few-rates"): every number is NaN,
 * the curve is empty, and predict returns NaN, so the screen can list the model
 * with its reason.
 * @param site - from prepareSite
 * @param spec - the model's curve
 * @param message - why, e.g. "The quadratic needs at least 3 distinct rates; this site has 2."
 * @returns the placeholder fit
 * @example
 * unfittedFit(site, quadraticSpec, 'needs 3 rates').status // 'too-few-rates'
 */
export function unfittedFit(
  site: PreparedSite,
  spec: CurveSpec<ModelName>,
  message: string,
): ModelFit {
  const nan: Record<string, number> = {};
  const ci: Record<string, [number, number]> = {};
  for (const name of spec.paramNames) {
    nan[name] = NaN;
    ci[name] = [NaN, NaN];
  }
  return {
    model: spec.model,
    label: spec.label,
    formula: spec.formula,
    status: 'too-few-rates',
    message,
    blocks: site.blocks,
    params: nan,
    stdErrors: { ...nan },
    confidenceIntervals: ci,
    blockOffsets: {},
    joinPoint: null,
    plateauYield: null,
    joinBetweenKgHa: null,
    stdErrorNote: '',
    testedRates: site.testedRates,
    n: site.n,
    parameterCount: spec.paramNames.length + site.blockDf,
    estimatedParameterCount: spec.paramNames.length + site.blockDf,
    sse: NaN,
    dfResidual: site.n - spec.paramNames.length - site.blockDf,
    rmse: NaN,
    r2: NaN,
    r2Kind: spec.r2Kind,
    aicc: NaN,
    bic: NaN,
    lackOfFit: null,
    residuals: new Float64Array(site.n).fill(NaN),
    fitted: new Float64Array(site.n).fill(NaN),
    curve: { rateKgHa: new Float64Array(0), yieldKgHa: new Float64Array(0) },
    covariance: spec.paramNames.map(() => spec.paramNames.map(() => NaN)),
    paramNames: spec.paramNames.slice(),
    predict: () => NaN,
  };
}

/**
 * The reason a site cannot carry a model, or null when it can.
 * @param site - from prepareSite
 * @param spec - the model's curve
 * @param minRates - distinct rates the model needs
 * @returns a message for "too-few-rates", or null
 * @example
 * tooFewRatesMessage(site, quadraticSpec, 3) // null when the site has 3 or more rates and enough plots
 */
export function tooFewRatesMessage(
  site: PreparedSite,
  spec: CurveSpec<ModelName>,
  minRates: number,
): string | null {
  const m = site.rates.length;
  const p = spec.paramNames.length + site.blockDf;
  if (m < minRates) {
    return `The ${spec.label.toLowerCase()} model needs at least ${minRates} distinct rates; this site has ${m}.`;
  }
  if (site.n <= p) {
    return `The ${spec.label.toLowerCase()} model has ${p} parameters, so it needs more than ${p} plots; this site has ${site.n}.`;
  }
  return null;
}

/**
 * Replaces the named parameters by NaN in a finished fit (a join point that the
 * rates do not identify must not be shown as a number), with their errors and
 * their rows and columns of the covariance.
 * @param fit - a finished fit
 * @param names - parameters to blank
 * @returns the same fit, changed in place
 * @example
 * blankParameters(fit, ['x0']).params.x0 // NaN
 */
export function blankParameters(fit: ModelFit, names: readonly string[]): ModelFit {
  for (const name of names) {
    fit.params = { ...fit.params, [name]: NaN };
    fit.stdErrors[name] = NaN;
    fit.confidenceIntervals[name] = [NaN, NaN];
    const k = fit.paramNames.indexOf(name);
    if (k >= 0) {
      for (const row of fit.covariance) row[k] = NaN;
      fit.covariance[k].fill(NaN);
    }
  }
  return fit;
}

/**
 * An estimate from parameters already solved (the straight lines and the quadratic,
 * from the weighted fit of the per-rate means).
 * @param site - from prepareSite
 * @param spec - the model's curve
 * @param params - its parameters by name
 * @param sse - residual sum of squares, (kg/ha)²
 * @param status - "ok", or "convex" for an upward-opening quadratic
 * @param message - the status sentence, "" for a plain fit
 * @returns the estimate
 * @example
 * solvedEstimate(site, linearSpec, { a: 5000, b: 21 }, 3.2e4, 'ok', '').params.b // 21
 */
export function solvedEstimate(
  site: PreparedSite,
  spec: CurveSpec<ModelName>,
  params: Record<string, number>,
  sse: number,
  status: FitStatus,
  message: string,
): CurveEstimate {
  return {
    model: spec.model,
    status,
    message,
    params,
    sse,
    testedRates: site.testedRates,
    joinBetweenKgHa: null,
  };
}

/**
 * The estimate of a model that could not be fitted (status "too-few-rates", NaN parameters).
 * @param site - from prepareSite
 * @param spec - the model's curve
 * @param message - why
 * @returns the placeholder estimate
 * @example
 * unfittedEstimate(site, quadraticSpec, 'needs 3 rates').status // 'too-few-rates'
 */
export function unfittedEstimate(
  site: PreparedSite,
  spec: CurveSpec<ModelName>,
  message: string,
): CurveEstimate {
  const params: Record<string, number> = {};
  for (const name of spec.paramNames) params[name] = NaN;
  return {
    model: spec.model,
    status: 'too-few-rates',
    message,
    params,
    sse: NaN,
    testedRates: site.testedRates,
    joinBetweenKgHa: null,
  };
}
