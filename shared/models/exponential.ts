/**
 * The exponential rise to a plateau (Mitscherlich): y = a + b(1 − e^(−k x)),
 * a the yield at rate 0 (kg/ha), b the largest possible gain (kg/ha), k the
 * rate constant (ha/kg). The asymptote a + b is approached but never reached,
 * so the model has no join point. Optionally a = 0 (y = b(1 − e^(−k x)), the
 * form of NIST StRD Misra1a).
 *
 * Fitted globally by profiling u = ln k: SSE(u) with the inner fit of
 * [1, 1 − e^(−k x)] by least squares (b > 0 enforced) is evaluated on an even
 * grid of u from k·x_max = 10⁻³ (almost straight) to k·x₁ = 50 (x₁ the lowest
 * non-zero rate; e^(−50) ≈ 2·10⁻²², full response by x₁), and Brent's method
 * refines every grid point lower than its neighbours. The two limits are
 * statuses, not numbers:
 * - k → 0: the curve tends to the straight line: "no-plateau" (best SSE not below the line's,
 *   or the best k at the grid's end, k·x_max = 10⁻³, where the curve bends by under 0.05 % of
 *   its rise over the tested rates)
 * - k → ∞: the curve tends to check against the rest: "full-response-at-lowest-rate"
 *   (best SSE not below check-vs-rest, or e^(−k x₁) < 10⁻³: 99.9 % of the gain by the
 *   lowest non-zero rate x₁, which the higher rates cannot tell from a step)
 * - best SSE not below the flat fit's (b held at 0 by its sign): "no-response"
 *
 * At a limit b and k run off to 0 or infinity together (the line has b·k as its slope while
 * b → ∞), and their last values on the search grid mean nothing (b of millions, or
 * negative for a flat site refitted without the sign). The fit reports the limiting model
 * itself, fitted exactly by least squares, in the exponential's parameters where they have a
 * meaning and blank (NaN) where they have none:
 * - "no-plateau": the straight line; a is its yield at rate 0, b and k are blank (the line's
 *   slope is the straight-line model's b in the same table);
 * - "full-response-at-lowest-rate": the step; a is the check yield, b the gain of every
 *   non-zero rate over it, k blank (a site without a zero rate has no step: its best k is
 *   kept, blank);
 * - "no-response": the flat fit; a is the mean, b = 0, k blank.
 * Each estimates two parameters (the flat fit one) and counts them in its residual df and in
 * the pooled tests (fixedByStatus). The estimate (the bootstrap's path) keeps the last grid
 * values of b and k, so its curve can still be evaluated, with the limit's SSE.
 */
import { minimizeBrent } from '../optimize/minimizeBrent';
import { StatsInputError } from '../stats/errors';
import {
  blankParameters,
  finishFit,
  tooFewRatesMessage,
  unfittedEstimate,
  unfittedFit,
  type FitStore,
} from './finishFit';
import { exponentialCurve } from './curves/exponential';
import type { CurveSpec } from './modelCurve';
import type { ModelEntry } from './modelEntry';
import { linearCoefficients, profiledCoefficients } from './solve/linearCoefficients';
import { fixedByStatus } from './fixedByStatus';
import type {
  CurveEstimate,
  FitOptions,
  FitStatus,
  ModelFit,
  ModelName,
  SiteData,
} from './modelTypes';
import { prepareSite, type PreparedSite } from './prepareSite';
import { profileSolver, type ProfileSolver } from './solve/profileSolver';
import { KG_HA_FORMAT, rateRangeText, type RateFormat } from './rateFormat';

const exponentialSpec = exponentialCurve.spec;

/** The exponential through the origin, parameters [b, k]. */
export const exponentialThroughOriginSpec: CurveSpec<ModelName> = {
  model: 'exponential',
  label: exponentialSpec.label,
  formula: 'b·(1 − e^(−k·x))',
  paramNames: ['b', 'k'],
  dimensions: exponentialSpec.dimensions,
  value: (x, p) => p[0] * -Math.expm1(-p[1] * x),
  values: (xs, p, out) => {
    for (let i = 0; i < xs.length; i++) out[i] = p[0] * -Math.expm1(-p[1] * xs[i]);
  },
  gradient: (x, p, out) => {
    out[0] = -Math.expm1(-p[1] * x);
    out[1] = p[0] * x * Math.exp(-p[1] * x);
  },
  r2Kind: 'uncentered',
};

const GRID = 16;
const TIE = 1e-10;

/**
 * The exponential's estimate and status from the profiled search alone.
 * @param site - from prepareSite
 * @param interceptMode - 'free' (estimate a) or 'zero' (a = 0)
 * @param tolerance - Brent's tolerance on ln k, default 1e-10 (the bootstrap uses 1e-7)
 * @param rateFormat - how messages write rates, default kg/ha rounded
 * @returns status, message, params {a, b, k} (a = 0 for 'zero'; k at the searched limit for
 *   "no-plateau" or "full-response-at-lowest-rate") and SSE
 * @throws {StatsInputError} "bad-argument" for 'zero' with block terms
 * @example
 * estimateExponential(prepareSite({ rateKgHa: [0, 50, 100, 150, 200], yieldKgHa: [5000, 7256, 8494, 9174, 9546] }, 'none'), 'free').params.k // ≈ 0.012
 */
export function estimateExponential(
  site: PreparedSite,
  interceptMode: 'free' | 'zero' = 'free',
  tolerance = 1e-10,
  rateFormat: RateFormat = KG_HA_FORMAT,
): CurveEstimate {
  const intercept = interceptMode === 'free';
  if (!intercept && site.blocks === 'fixed') {
    throw new StatsInputError(
      'bad-argument',
      "exponentialIntercept: 'zero' cannot be combined with blocks: 'fixed' (the offsets need an intercept).",
    );
  }
  const spec = intercept ? exponentialSpec : exponentialThroughOriginSpec;
  const rates = site.rates;
  const m = rates.length;
  const why = tooFewRatesMessage(site, spec, intercept ? 3 : 2);
  if (why) return unfittedEstimate(site, spec, why);
  const rMax = rates[m - 1];
  const rLow = rates[0] > 0 ? rates[0] : rates[1];
  const uLow = Math.log(1e-3 / rMax);
  const uHigh = Math.log(50 / rLow);

  const solver = profileSolver(site, { intercept, sign: 'positive' });
  const sseAt = rateConstantSse(rates, solver);
  const step = (uHigh - uLow) / (GRID - 1);
  let previous = sseAt(uLow);
  let current = sseAt(uLow + step);
  let bestU = uLow;
  let bestSse = previous;
  // Walk the grid keeping three values; refine every grid point lower than both neighbours.
  for (let i = 1; i < GRID; i++) {
    const next = i + 1 < GRID ? sseAt(uLow + (i + 1) * step) : Infinity;
    const refine = (i === 1 && previous <= current) || (current <= previous && current <= next);
    if (refine) {
      const center = i === 1 && previous <= current ? 0 : i;
      const r = minimizeBrent(
        sseAt,
        uLow + Math.max(center - 1, 0) * step,
        uLow + Math.min(center + 1, GRID - 1) * step,
        { relativeTolerance: tolerance, absoluteTolerance: tolerance },
      );
      if (r.fx < bestSse) {
        bestSse = r.fx;
        bestU = r.x;
      }
    }
    previous = current;
    current = next;
  }

  // The limits are reached numerically well before the grid's ends: compare SSEs.
  // k → 0: the straight line (b > 0); k → ∞: check against the rest, g = [x > 0].
  const kBest = Math.exp(bestU);
  const line = solver.sse(rates);
  const stepFit = rates[0] === 0 ? solver.sse(rates.map((r) => (r > 0 ? 1 : 0))) : Infinity;
  const atLow = bestU <= uLow + 1e-6 * step || bestSse >= line * (1 - TIE);
  // With 99.9 % of the gain reached by the lowest non-zero rate (e^(−k x₁) < 10⁻³),
  // the other rates cannot tell k from infinity.
  const atHigh =
    bestU >= uHigh - 1e-6 * step ||
    bestSse >= stepFit * (1 - TIE) ||
    Math.exp(-kBest * rLow) < 1e-3;

  let status: FitStatus = 'ok';
  let message = 'Exponential rise to a plateau fitted.';
  if (bestSse >= solver.flatSse * (1 - TIE)) {
    status = 'no-response';
    message = 'Yield does not rise with rate: the best exponential is flat.';
  } else if (atLow) {
    status = 'no-plateau';
    message =
      'No plateau within the tested rates: the rate constant tends to zero and the curve to the straight line.';
  } else if (atHigh) {
    status = 'full-response-at-lowest-rate';
    message = `Full response by the lowest non-zero rate: the rate constant runs to infinity (check against the rest); the bend lies between ${rateRangeText(rateFormat, rates[0], rLow)}.`;
  }
  // At a limit, the limiting model's own SSE (the best grid value only comes close to it);
  // without a zero rate there is no step, and the full response keeps its best k.
  const sse =
    status === 'no-response'
      ? solver.flatSse
      : status === 'no-plateau'
        ? line
        : status === 'full-response-at-lowest-rate' && rates[0] === 0
          ? stepFit
          : bestSse;
  sseAt(bestU); // leaves solver.last at the best k for the parameters below
  return {
    model: 'exponential',
    status,
    message,
    params: { a: solver.last.intercept, b: solver.last.beta, k: kBest },
    sse,
    testedRates: site.testedRates,
    joinBetweenKgHa: status === 'full-response-at-lowest-rate' ? [rates[0], rLow] : null,
  };
}

/** SSE at u = ln k: g = 1 − e^(−k r) per distinct rate. */
function rateConstantSse(rates: Float64Array, solver: ProfileSolver): (u: number) => number {
  const m = rates.length;
  const g = new Float64Array(m);
  // Returned unnamed: see profileSolver on tools that keep function names.
  return (u) => {
    const k = Math.exp(u);
    for (let j = 0; j < m; j++) g[j] = -Math.expm1(-k * rates[j]);
    return solver.sse(g);
  };
}

/**
 * Fits the exponential to a prepared site.
 * @param site - from prepareSite
 * @param options - exponentialIntercept, confidence level, curve grid
 * @param store - optional shared buffer for fitted values, residuals and curve (fitAllModelsPrepared passes one per site)
 * @returns the fit with its status; plateauYield (the asymptote a + b) when "ok"
 * @throws {StatsInputError} "bad-argument" for exponentialIntercept 'zero' with block terms
 * @example
 * // see fitExponential
 */
export function fitExponentialPrepared(
  site: PreparedSite,
  options: FitOptions,
  store?: FitStore,
): ModelFit {
  const intercept = (options.exponentialIntercept ?? 'free') === 'free';
  const spec = intercept ? exponentialSpec : exponentialThroughOriginSpec;
  const est = estimateExponential(site, intercept ? 'free' : 'zero', undefined, options.rateFormat);
  if (est.status === 'too-few-rates') return unfittedFit(site, spec, est.message);
  const { status } = est;
  const rates = site.rates;
  // The fitted curve and its coefficients ([a,] b, k): at a limit, the limiting model's.
  let curveSpec = spec;
  let k = est.params.k;
  let coef: { curve: Float64Array; blocks: Float64Array };
  if (status === 'no-response') {
    // The flat fit: b = 0 (its sign constraint), k has no effect.
    k = 0;
    coef = intercept
      ? linearCoefficients(site, [], true)
      : { curve: new Float64Array(0), blocks: new Float64Array(0) };
    coef = { curve: Float64Array.of(...coef.curve, 0), blocks: coef.blocks };
  } else if (status === 'no-plateau') {
    // k → 0: the straight line, its slope in b's slot (lineLimitSpec).
    curveSpec = lineLimitSpec(spec);
    k = 0;
    coef = linearCoefficients(site, [rates], intercept);
  } else if (status === 'full-response-at-lowest-rate' && rates[0] === 0) {
    // k → ∞: e^(−k x) underflows to 0 at every non-zero rate, so g is the step [x > 0].
    k = STEP_EXPONENT / rates[1];
    coef = linearCoefficients(site, [rates.map((r) => -Math.expm1(-k * r))], intercept);
  } else {
    const gFinal = rates.map((r) => -Math.expm1(-k * r));
    coef = profiledCoefficients(site, est.params.a, est.params.b, gFinal, intercept);
  }
  const params = intercept
    ? Float64Array.of(coef.curve[0], coef.curve[1], k)
    : Float64Array.of(coef.curve[0], k);
  const ok = status === 'ok';
  const fit = finishFit({
    site,
    spec: curveSpec,
    params,
    blockCoefficients: coef.blocks,
    status,
    message: est.message,
    options,
    store,
    plateauYield:
      ok || status === 'full-response-at-lowest-rate'
        ? intercept
          ? { value: params[0] + params[1], gradient: [1, 1, 0] }
          : { value: params[0], gradient: [1, 0] }
        : undefined,
    joinBetweenKgHa: est.joinBetweenKgHa,
    fixed: fixedByStatus(status, 'b', 'k'),
  });
  if (status === 'no-plateau') blankParameters(fit, ['b', 'k']);
  else if (!ok) blankParameters(fit, ['k']);
  if (!intercept) {
    // Economics reads params.a; the fixed intercept is exactly zero.
    fit.params = { a: 0, ...fit.params };
  }
  return fit;
}

/** k·x₁ of the step limit: e^(−1000) is 0 in double precision, so every non-zero rate has g = 1. */
const STEP_EXPONENT = 1000;

/**
 * The straight-line limit (k → 0 while b·k tends to the slope s) in the exponential's parameter
 * slots: [a, s, k], or [s, k] through the origin, with k fixed and without effect. Only
 * finishFit evaluates it; the fit then blanks b and k.
 */
function lineLimitSpec(spec: CurveSpec<ModelName>): CurveSpec<ModelName> {
  // The slope's slot: 1 after the intercept, 0 through the origin.
  const s = spec.paramNames.length - 2;
  const at = (x: number, p: Float64Array) => (s === 1 ? p[0] : 0) + p[s] * x;
  return {
    ...spec,
    value: at,
    values: (xs, p, out) => {
      for (let i = 0; i < xs.length; i++) out[i] = at(xs[i], p);
    },
    gradient: (x, _p, out) => {
      if (s === 1) out[0] = 1;
      out[s] = x;
      out[s + 1] = 0;
    },
  };
}

/**
 * Fits the exponential rise y = a + b(1 − e^(−k x)) by a global profiled search (no starting values).
 * @param data - rates (kg/ha), yields (kg/ha), optional blocks
 * @param options - exponentialIntercept ('free' or 'zero'), blocks, confidence level, curve grid
 * @returns params {a (kg/ha), b (kg/ha), k (ha/kg)}; plateauYield is the asymptote a + b
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values, or
 *   exponentialIntercept 'zero' with blocks 'fixed'
 * @example
 * fitExponential({ rateKgHa: [0, 50, 100, 150, 200], yieldKgHa: [5000, 7256, 8494, 9174, 9546] }).params.k // ≈ 0.012
 */
export function fitExponential(data: SiteData, options: FitOptions = {}): ModelFit {
  return fitExponentialPrepared(prepareSite(data, options.blocks ?? 'none'), options);
}

/** The exponential rise in the model catalog (shared/models/catalog): its curve and its fits. */
export const exponentialModel = {
  ...exponentialCurve,
  fit: fitExponentialPrepared,
  estimate: (site, options) =>
    estimateExponential(
      site,
      options.exponentialIntercept ?? 'free',
      options.searchTolerance,
      options.rateFormat,
    ),
} satisfies ModelEntry;
