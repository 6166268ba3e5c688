/**
 * The quadratic-plateau with a smooth join: y = P + c·min(x − x0, 0)², c < 0.
 * It rises as a parabola to its vertex at the join point x0 (kg/ha), where the
 * slope is zero, and stays at the plateau P (kg/ha) beyond. In the usual
 * a + b x + c x² form, b = −2 c x0 and a = P + c x0².
 *
 * Fitted globally by profiling x0 with the inner fit of [1, min(x − x0, 0)²] by
 * least squares, c < 0 enforced, interval by interval (searchJoinPoint). Limits:
 * a join at or past the highest rate is a quadratic (or straight line) that has
 * not levelled off within the tested rates: "no-plateau". A join at or below the
 * second-lowest rate is check against the rest: "full-response-at-lowest-rate".
 *
 * The x0 derivative −2c(x − x0)·[x < x0] is continuous here (it is zero at the
 * join), so the asymptotic errors are better behaved than the linear-plateau's.
 */
import {
  blankParameters,
  finishFit,
  tooFewRatesMessage,
  unfittedEstimate,
  unfittedFit,
  type FitStore,
} from './finishFit';
import { quadraticPlateauCurve } from './curves/quadraticPlateau';
import type { ModelEntry } from './modelEntry';
import {
  groupLinearCoefficients,
  linearCoefficients,
  profiledCoefficients,
} from './solve/linearCoefficients';
import type { CurveEstimate, FitOptions, ModelFit, SiteData } from './modelTypes';
import { plateauEstimate } from './plateauEstimate';
import { prepareSite, type PreparedSite } from './prepareSite';
import type { JoinSseProfile } from './solve/profileInterval';
import { profileSolver, type ProfileSolver } from './solve/profileSolver';
import type { RateFormat } from './rateFormat';
import { relaxedJoinBounds } from './solve/relaxedJoinBounds';
import { searchJoinPoint } from './solve/searchJoinPoint';
import { stationaryJoinPoints } from './solve/stationaryJoinPoints';

const quadraticPlateauSpec = quadraticPlateauCurve.spec;
/** The inner fit at a fixed join: plateau P and curvature c < 0 (and block offsets). */
const INNER = { intercept: true, sign: 'negative' } as const;
/** Degree of the rising piece, for the relaxed bounds and the stationary joins. */
const RISE_DEGREE = 2;

/**
 * The quadratic-plateau's estimate and status from the profiled search alone.
 * @param site - from prepareSite
 * @param tolerance - Brent's relative tolerance on x0, default 1e-10 (the bootstrap uses 1e-7);
 *   only the full block design searches by Brent, group sums give the join in closed form
 * @param rateFormat - how messages write rates, default kg/ha rounded
 * @returns status, message, params {P, c, x0} (x0 = highest rate for "no-plateau" and
 *   "no-response", the second-lowest rate for "full-response-at-lowest-rate") and SSE
 * @example
 * estimateQuadraticPlateau(prepareSite({ rateKgHa: [0, 50, 100, 150, 200], yieldKgHa: [6300, 7800, 8700, 9000, 9000] }, 'none')).params.x0 // ≈ 150
 */
export function estimateQuadraticPlateau(
  site: PreparedSite,
  tolerance = 1e-10,
  rateFormat?: RateFormat,
): CurveEstimate {
  const why = tooFewRatesMessage(site, quadraticPlateauSpec, 3);
  if (why) return unfittedEstimate(site, quadraticPlateauSpec, why);
  const rates = site.rates;
  const m = rates.length;
  const solver = profileSolver(site, INNER);
  const sseAt = joinSse(rates, solver);
  const bounds = site.design === 'full' ? undefined : relaxedJoinBounds(site, RISE_DEGREE);
  const stationary = bounds ? stationaryJoinPoints(site, RISE_DEGREE) : undefined;
  const best = searchJoinPoint(rates, sseAt, tolerance, bounds, stationary);
  const rMax = rates[m - 1];

  // The limit x0 ≥ r_max: the quadratic with its vertex past the data, or the
  // rising straight line as x0 → ∞ with c → 0 (each from its own least-squares fit).
  let limitSse = sseAt(rMax);
  // Both are quadratics through all rates, so their SSE is at least the bound of the
  // last interval (a quadratic through all rates but the highest): a best join
  // clearly below that bound beats them, and the two fits need not be made.
  const lastBound = bounds ? bounds[m - 2] * (1 - 1e-7) : -Infinity;
  if (!(best.sse < lastBound)) {
    const line = groupLinearCoefficients(site, [rates], true);
    if (line.curve[1] > 0) limitSse = Math.min(limitSse, line.sse);
    const quad = groupLinearCoefficients(site, [rates, rates.map((r) => r * r)], true);
    if (quad.curve[2] < 0 && -quad.curve[1] / (2 * quad.curve[2]) >= rMax) {
      limitSse = Math.min(limitSse, quad.sse);
    }
  }

  return plateauEstimate({
    site,
    spec: quadraticPlateauSpec,
    solver,
    sseAt,
    best,
    limitSse,
    noPlateauDetail,
    rateFormat,
  });
}

/** SSE at a join point x0 (kg/ha): g = min(r − x0, 0)² per distinct rate. */
function joinSse(rates: Float64Array, solver: ProfileSolver): (x0: number) => number {
  const m = rates.length;
  const g = new Float64Array(m);
  // Returned unnamed: see profileSolver on tools that keep function names.
  return (x0) => {
    for (let j = 0; j < m; j++) {
      const d = rates[j] < x0 ? rates[j] - x0 : 0;
      g[j] = d * d;
    }
    return solver.sse(g);
  };
}

/**
 * The quadratic-plateau's SSE with the join held fixed, minimized over P, c < 0 and any
 * block offsets (the same inner fit as the search), and where it can have interior minima:
 * what the join's profile interval (shared/models/joinProfile) searches.
 * @param site - from prepareSite
 * @returns S(x0) in (kg/ha)² at a join x0 in kg/ha, and the stationary joins (group sums only)
 * @example
 * quadraticPlateauJoinSse(site).sse(150) // SSE of the best quadratic-plateau joined at 150 kg/ha
 */
export function quadraticPlateauJoinSse(site: PreparedSite): JoinSseProfile {
  return {
    sse: joinSse(site.rates, profileSolver(site, INNER)),
    stationary: site.design === 'full' ? undefined : stationaryJoinPoints(site, RISE_DEGREE),
  };
}

function noPlateauDetail(highest: string): string {
  return `the curve has not levelled off by the highest rate (${highest}).`;
}

/**
 * Fits the quadratic-plateau to a prepared site.
 * @param site - from prepareSite
 * @param options - confidence level, curve grid
 * @param store - optional shared buffer for fitted values, residuals and curve (fitAllModelsPrepared passes one per site)
 * @returns the fit with its status; join and plateau only when "ok"
 * @example
 * // see fitQuadraticPlateau
 */
export function fitQuadraticPlateauPrepared(
  site: PreparedSite,
  options: FitOptions,
  store?: FitStore,
): ModelFit {
  const est = estimateQuadraticPlateau(site, undefined, options.rateFormat);
  if (est.status === 'too-few-rates') return unfittedFit(site, quadraticPlateauSpec, est.message);
  const { status } = est;
  const x0 = est.params.x0;
  const gFinal = site.rates.map((r) => (r < x0 ? (r - x0) ** 2 : 0));
  const flat = status === 'no-response';
  // A flat best fit has c = 0 exactly (the constrained optimum).
  const coef = flat
    ? linearCoefficients(site, [], true)
    : profiledCoefficients(site, est.params.P, est.params.c, gFinal, true);
  const P = coef.curve[0];
  const c = flat ? 0 : coef.curve[1];
  const params = Float64Array.of(P, c, x0);
  const ok = status === 'ok';
  const fit = finishFit({
    site,
    spec: quadraticPlateauSpec,
    params,
    blockCoefficients: coef.blocks,
    status,
    message: est.message,
    options,
    store,
    joinPoint: ok ? { value: x0, gradient: [0, 0, 1] } : undefined,
    plateauYield:
      ok || status === 'full-response-at-lowest-rate'
        ? { value: P, gradient: [1, 0, 0] }
        : undefined,
    joinBetweenKgHa: est.joinBetweenKgHa,
  });
  if (status === 'full-response-at-lowest-rate') blankParameters(fit, ['c', 'x0']);
  else if (!ok) blankParameters(fit, ['x0']);
  return fit;
}

/**
 * Fits the quadratic-plateau y = P + c·min(x − x0, 0)² by a global profiled search.
 * @param data - rates (kg/ha), yields (kg/ha), optional blocks
 * @param options - blocks, confidence level, curve grid
 * @returns params {P (kg/ha), c (kg/ha per (kg/ha)²), x0 (kg/ha)}, joinPoint and plateauYield when "ok"
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values
 * @example
 * fitQuadraticPlateau({ rateKgHa: [0, 50, 100, 150, 200], yieldKgHa: [6300, 7800, 8700, 9000, 9000] }).joinPoint?.estimate // ≈ 150
 */
export function fitQuadraticPlateau(data: SiteData, options: FitOptions = {}): ModelFit {
  return fitQuadraticPlateauPrepared(prepareSite(data, options.blocks ?? 'none'), options);
}

/** The quadratic-plateau in the model catalog (shared/models/catalog): its curve and its fits. */
export const quadraticPlateauModel = {
  ...quadraticPlateauCurve,
  fit: fitQuadraticPlateauPrepared,
  estimate: (site, options) =>
    estimateQuadraticPlateau(site, options.searchTolerance, options.rateFormat),
} satisfies ModelEntry;
