/**
 * The quadratic-plateau with a smooth join: y = P + c·min(x − x0, 0)², c < 0.
 * It rises as a parabola to its vertex at the join point x0 (kg/ha), where the
 * slope is zero, and stays at the plateau P (kg/ha) beyond. In the usual
 * a + b x + c x² form, b = −2 c x0 and a = P + c x0².
 *
 * Fitted globally by profiling x0 with the inner fit of [1, min(x − x0, 0)²] by
 * least squares, c < 0 enforced, interval by interval (searchJoinPoint), over the
 * tested range: x0 in [lowest, highest rate]. The reported fit is the least-squares
 * minimum on that constrained domain, so no join in the range fits better. A best
 * join at the highest rate is a quadratic whose vertex is the highest rate: it has not
 * levelled off within the tested rates, "no-plateau" (the quadratic and the straight
 * line, whose vertex may lie beyond, are models of their own in the table). A join at or
 * below the second-lowest rate is check against the rest: "full-response-at-lowest-rate".
 *
 * Until the search kept to that domain, a best join that the straight line or a quadratic
 * peaking beyond the highest rate fitted better was reported as "no-plateau" with the join
 * at the highest rate, a fit worse than the best join: on 2,000 simulated flat sites (seed
 * 20261203) 0.75 % had a better join inside the range and 1.35 % a better one in the first
 * interval (a full response). tests/models.joinSearch.test.ts checks every fit against a
 * grid of joins.
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

const quadraticPlateauSpec = quadraticPlateauCurve.spec;
/** The inner fit at a fixed join: plateau P and curvature c < 0 (and block offsets). */
const INNER = { intercept: true, sign: 'negative' } as const;
/** Degree of the rising piece, for the relaxed bounds and the stationary joins. */
const RISE_DEGREE = 2;

/**
 * The quadratic-plateau's estimate and status from the profiled search alone.
 * @param site - from prepareSite
 * @param rateFormat - how messages write rates, default kg/ha rounded
 * @returns status, message, params {P, c, x0} (x0 = highest rate for "no-plateau" and
 *   "no-response", the second-lowest rate for "full-response-at-lowest-rate") and SSE
 * @example
 * estimateQuadraticPlateau(prepareSite({ rateKgHa: [0, 50, 100, 150, 200], yieldKgHa: [6300, 7800, 8700, 9000, 9000] }, 'none')).params.x0 // ≈ 150
 */
export function estimateQuadraticPlateau(
  site: PreparedSite,
  rateFormat?: RateFormat,
): CurveEstimate {
  const why = tooFewRatesMessage(site, quadraticPlateauSpec, 3);
  if (why) return unfittedEstimate(site, quadraticPlateauSpec, why);
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
    spec: quadraticPlateauSpec,
    solver,
    sseAt,
    best,
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
  const est = estimateQuadraticPlateau(site, options.rateFormat);
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
    fixed: fixedByStatus(status, 'c', 'x0'),
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
  estimate: (site, options) => estimateQuadraticPlateau(site, options.rateFormat),
} satisfies ModelEntry;
