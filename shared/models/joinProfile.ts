/**
 * The profile interval of the join x0 of the linear-plateau and the quadratic-plateau
 * (shared/models/solve/profileInterval: {x0 : (S(x0) − S_min)/(S_min/df) ≤ F(1, df; level)}).
 * S(x0) is the models' own profiled SSE (linearPlateauJoinSse, quadraticPlateauJoinSse):
 * the same inner least-squares fit, sign constraint and block offsets as the search that
 * found the join, so the interval is of the fitted model and not of a second fitter.
 *
 * Why not estimate ± t·SE: the linear-plateau's SSE has a kink at every tested rate, and a
 * join at or near a rate makes the asymptotic error meaningless on one side; the profile
 * follows S as it is, and is asymmetric where S is.
 *
 * Where S can bend, the search looks (profileInterval needs S monotone between its points):
 * - the tested rates (S is smooth between them, with kinks at them);
 * - S's interior stationary joins of each interval (stationaryJoinPoints, group sums);
 * - 8 even points per interval besides (32 for the full block design, which has no
 *   stationary joins), for a maximum of S, where the inner slope changes sign and the fit
 *   turns flat, which the stationary joins do not list.
 * Ends of the range:
 * - any join in (r₀, r₁] fits the same (check against the rest), so S is flat there: an
 *   interval that reaches r₁ runs down to the lowest rate r₀ and is open there;
 * - a join at or past the highest rate is the straight line (linear-plateau) or a quadratic
 *   whose vertex lies past the data (quadratic-plateau): the interval stops at the highest
 *   rate and is open there.
 */
import { StatsInputError } from '../stats/errors';
import { linearPlateauJoinSse } from './linearPlateau';
import type { ModelFit, ModelName } from './modelTypes';
import type { PreparedSite } from './prepareSite';
import { quadraticPlateauJoinSse } from './quadraticPlateau';
import { profileInterval, type JoinSseProfile } from './solve/profileInterval';

/** A profile interval of a rate (a join or an optimum), kg/ha. */
export interface RateProfileInterval {
  /** The estimate the interval is about, kg/ha. */
  estimateKgHa: number;
  lowKgHa: number;
  highKgHa: number;
  /** True when the data do not close the interval below: it runs to the lowest tested rate. */
  lowOpen: boolean;
  /** True when the data do not close the interval above: it runs to the highest tested rate. */
  highOpen: boolean;
  /** Level, e.g. 0.9. */
  level: number;
}

/** The models whose curve has a join point. */
type JoinModel = 'linearPlateau' | 'quadraticPlateau';

const JOIN_SSE: Record<JoinModel, (site: PreparedSite) => JoinSseProfile> = {
  linearPlateau: linearPlateauJoinSse,
  quadraticPlateau: quadraticPlateauJoinSse,
};

/** Whether a model has a join point whose profile interval joinProfileInterval gives. */
function isJoinModel(model: ModelName): model is JoinModel {
  return model in JOIN_SSE;
}

/** Even points per interval between rates besides the stationary joins. */
const EVEN_POINTS = 8;
/** Even points per interval for the full block design (no stationary joins known). */
const EVEN_POINTS_FULL = 32;

/**
 * The profile interval of a plateau model's join at one site.
 * @param site - from prepareSite, the site the fit was made on (same block terms)
 * @param fit - the model's fit of that site: model, status, parameters (x0 in kg/ha), residual df
 * @param level - level in (0, 1), e.g. 0.9
 * @returns the interval in kg/ha with its open ends; null unless the model has a join (the
 *   linear-plateau, the quadratic-plateau) and its status is "ok" (every other status reports
 *   no join) with residual df left
 * @throws {StatsInputError} "bad-argument" for a level outside (0, 1)
 * @example
 * const site = prepareSite(data, 'fixed');
 * joinProfileInterval(site, fitAllModelsPrepared(site).fits.linearPlateau, 0.9)
 * // e.g. { estimateKgHa: 128.4, lowKgHa: 112.0, highKgHa: 151.3, lowOpen: false, highOpen: false, level: 0.9 }
 */
export function joinProfileInterval(
  site: PreparedSite,
  fit: Pick<ModelFit, 'model' | 'status' | 'params' | 'dfResidual'>,
  level: number,
): RateProfileInterval | null {
  if (!(level > 0 && level < 1)) {
    throw new StatsInputError(
      'bad-argument',
      `level must lie strictly between 0 and 1; got ${level}.`,
    );
  }
  if (!isJoinModel(fit.model) || fit.status !== 'ok' || !(fit.dfResidual > 0)) return null;
  const x0 = fit.params.x0;
  const rates = site.rates;
  const profile = JOIN_SSE[fit.model](site);
  // S is flat on (r₀, r₁]; at r₀ itself the regressor is constant and the fit is flat, so
  // the range's low end takes the value S has just above it.
  const sse = (x: number): number => profile.sse(x > rates[1] ? x : rates[1]);
  const bounds = profileInterval({
    sse,
    estimate: x0,
    // The search's own value at the join (the fit's SSE differs from it only by rounding).
    sseMin: sse(x0),
    df: fit.dfResidual,
    level,
    points: searchPoints(rates, profile),
  });
  return {
    estimateKgHa: x0,
    lowKgHa: bounds.low,
    highKgHa: bounds.high,
    lowOpen: bounds.lowOpen,
    highOpen: bounds.highOpen,
    level,
  };
}

/** The rates, S's stationary joins and even points between, ascending (see the file's note). */
function searchPoints(rates: Float64Array, profile: JoinSseProfile): number[] {
  const m = rates.length;
  const even = profile.stationary ? EVEN_POINTS : EVEN_POINTS_FULL;
  const points = [rates[0], rates[1]];
  const stationary = new Float64Array(4);
  for (let j = 1; j < m - 1; j++) {
    const h = rates[j + 1] - rates[j];
    for (let k = 1; k < even; k++) points.push(rates[j] + (h * k) / even);
    const count = profile.stationary ? profile.stationary(j, stationary) : 0;
    for (let k = 0; k < count; k++) points.push(stationary[k]);
    points.push(rates[j + 1]);
  }
  return points.sort((a, b) => a - b);
}
