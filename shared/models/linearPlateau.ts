/**
 * The linear-plateau y = a + b·min(x, x0): a straight rise of slope b (kg grain
 * per kg nutrient) up to the join point x0 (kg/ha), flat at the plateau a + b x0
 * beyond it. Fitted globally by profiling x0 (shared/models/solve/searchJoinPoint) with
 * the inner fit of [1, min(x, x0)] by least squares and b > 0 enforced.
 *
 * Statuses (data findings):
 * - join at or past the highest rate: "no-plateau" (the straight line fits as well)
 * - join at or below the second-lowest rate: "full-response-at-lowest-rate" (check vs rest;
 *   every join between the two lowest rates fits equally well)
 * - best fit flat: "no-response"
 *
 * The x0 derivative b·[x > x0] jumps at every rate: the asymptotic errors hold
 * for x0 strictly between rates and are rough with few rates; prefer the
 * bootstrap interval for the optimum.
 */
import {
  blankParameters,
  finishFit,
  tooFewRatesMessage,
  unfittedEstimate,
  unfittedFit,
  type FitStore,
} from './finishFit';
import { linearPlateauCurve } from './curves/linearPlateau';
import { fixedByStatus } from './fixedByStatus';
import type { ModelEntry } from './modelEntry';
import { linearCoefficients, profiledCoefficients } from './solve/linearCoefficients';
import type { CurveEstimate, FitOptions, ModelFit, SiteData } from './modelTypes';
import { plateauEstimate } from './plateauEstimate';
import { prepareSite, type PreparedSite } from './prepareSite';
import type { JoinSseProfile } from './solve/profileInterval';
import { profileSolver, type ProfileSolver } from './solve/profileSolver';
import type { RateFormat } from './rateFormat';
import { relaxedJoinBounds } from './solve/relaxedJoinBounds';
import { searchJoinPoint } from './solve/searchJoinPoint';
import { stationaryJoinPoints } from './solve/stationaryJoinPoints';

const linearPlateauSpec = linearPlateauCurve.spec;
/** The inner fit at a fixed join: intercept and slope b > 0 (and block offsets). */
const INNER = { intercept: true, sign: 'positive' } as const;
/** Degree of the rising piece, for the relaxed bounds and the stationary joins. */
const RISE_DEGREE = 1;

/**
 * The linear-plateau's estimate and status from the profiled search alone.
 * @param site - from prepareSite
 * @param rateFormat - how messages write rates, default kg/ha rounded
 * @returns status, message, params {a, b, x0} (x0 = highest rate for "no-plateau" and
 *   "no-response", the second-lowest rate for "full-response-at-lowest-rate") and SSE
 * @example
 * estimateLinearPlateau(prepareSite({ rateKgHa: [0, 40, 80, 120, 160], yieldKgHa: [6000, 7000, 8000, 8500, 8500] }, 'none')).params.x0 // ≈ 100
 */
export function estimateLinearPlateau(site: PreparedSite, rateFormat?: RateFormat): CurveEstimate {
  const why = tooFewRatesMessage(site, linearPlateauSpec, 3);
  if (why) return unfittedEstimate(site, linearPlateauSpec, why);
  const rates = site.rates;
  const solver = profileSolver(site, INNER);
  const sseAt = joinSse(rates, solver);
  // Candidate joins in closed form in every interval (any design); the bounds, for group
  // sums only, skip intervals that cannot hold the minimum.
  const bounds = site.design === 'full' ? undefined : relaxedJoinBounds(site, RISE_DEGREE);
  const best = searchJoinPoint(
    rates,
    sseAt,
    undefined,
    bounds,
    stationaryJoinPoints(site, RISE_DEGREE),
  );
  return plateauEstimate({
    site,
    spec: linearPlateauSpec,
    solver,
    sseAt,
    best,
    noPlateauDetail,
    rateFormat,
  });
}

/** SSE at a join point x0 (kg/ha): g = min(r, x0) per distinct rate. */
function joinSse(rates: Float64Array, solver: ProfileSolver): (x0: number) => number {
  const m = rates.length;
  const g = new Float64Array(m);
  // Returned unnamed: see profileSolver on tools that keep function names.
  return (x0) => {
    for (let j = 0; j < m; j++) g[j] = rates[j] < x0 ? rates[j] : x0;
    return solver.sse(g);
  };
}

/**
 * The linear-plateau's SSE with the join held fixed, minimized over a, b > 0 and any block
 * offsets (the same inner fit as the search), and where it can have interior minima: what
 * the join's profile interval (shared/models/joinProfile) searches.
 * @param site - from prepareSite
 * @returns S(x0) in (kg/ha)² at a join x0 in kg/ha, and the stationary joins (group sums only)
 * @example
 * linearPlateauJoinSse(site).sse(100) // SSE of the best linear-plateau joined at 100 kg/ha
 */
export function linearPlateauJoinSse(site: PreparedSite): JoinSseProfile {
  return {
    sse: joinSse(site.rates, profileSolver(site, INNER)),
    stationary: site.design === 'full' ? undefined : stationaryJoinPoints(site, RISE_DEGREE),
  };
}

function noPlateauDetail(highest: string): string {
  return `the join lies at or past the highest rate (${highest}), so the straight line fits as well.`;
}

/**
 * Fits the linear-plateau to a prepared site.
 * @param site - from prepareSite
 * @param options - confidence level, curve grid
 * @param store - optional shared buffer for fitted values, residuals and curve (fitAllModelsPrepared passes one per site)
 * @returns the fit with its status; join and plateau only when "ok"
 * @example
 * // see fitLinearPlateau
 */
export function fitLinearPlateauPrepared(
  site: PreparedSite,
  options: FitOptions,
  store?: FitStore,
): ModelFit {
  const est = estimateLinearPlateau(site, options.rateFormat);
  if (est.status === 'too-few-rates') return unfittedFit(site, linearPlateauSpec, est.message);
  const { status } = est;
  const x0 = est.params.x0;
  const gFinal = site.rates.map((r) => Math.min(r, x0));
  const coef = profiledCoefficients(site, est.params.a, est.params.b, gFinal, true);
  // A flat best fit has b = 0 exactly (the constrained optimum).
  const flat = status === 'no-response';
  const lin = flat ? linearCoefficients(site, [], true) : coef;
  const params = Float64Array.of(lin.curve[0], flat ? 0 : coef.curve[1], x0);
  const [a, b] = params;
  const ok = status === 'ok';
  const fit = finishFit({
    site,
    spec: linearPlateauSpec,
    params,
    blockCoefficients: lin.blocks,
    status,
    message: est.message,
    options,
    store,
    joinPoint: ok ? { value: x0, gradient: [0, 0, 1] } : undefined,
    plateauYield:
      ok || status === 'full-response-at-lowest-rate'
        ? { value: a + b * x0, gradient: [1, x0, b] }
        : undefined,
    joinBetweenKgHa: est.joinBetweenKgHa,
    fixed: fixedByStatus(status, 'b', 'x0'),
    stdErrorNote: ok
      ? 'These standard errors assume the join stays between the two tested rates around it; the interval from resampling the plots does not, so read that one for the optimum.'
      : '',
  });
  if (status === 'full-response-at-lowest-rate') {
    // Only the check yield a and the plateau are identified; b and x0 trade off.
    blankParameters(fit, ['b', 'x0']);
  } else if (!ok) {
    blankParameters(fit, ['x0']);
  }
  return fit;
}

/**
 * Fits the linear-plateau y = a + b·min(x, x0) by a global profiled search (no starting values).
 * @param data - rates (kg/ha), yields (kg/ha), optional blocks
 * @param options - blocks, confidence level, curve grid
 * @returns params {a (kg/ha), b (kg/kg), x0 (kg/ha)}, joinPoint and plateauYield when "ok"
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values
 * @example
 * fitLinearPlateau({ rateKgHa: [0, 40, 80, 120, 160], yieldKgHa: [6000, 7000, 8000, 8500, 8500] }).joinPoint?.estimate // ≈ 100
 */
export function fitLinearPlateau(data: SiteData, options: FitOptions = {}): ModelFit {
  return fitLinearPlateauPrepared(prepareSite(data, options.blocks ?? 'none'), options);
}

/** The linear-plateau in the model catalog (shared/models/catalog): its curve and its fits. */
export const linearPlateauModel = {
  ...linearPlateauCurve,
  fit: fitLinearPlateauPrepared,
  estimate: (site, options) => estimateLinearPlateau(site, options.rateFormat),
} satisfies ModelEntry;
