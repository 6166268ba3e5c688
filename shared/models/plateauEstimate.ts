/**
 * The step both plateau models take after their profiled search: judge the best
 * join of the constrained domain (x0 in [lowest, highest rate]) and turn it into a
 * status, a message and the parameters. The linear-plateau and the quadratic-plateau
 * differ only in their curve (the inner regressor g(x0)), so the judging lives here once:
 * - best SSE not below the flat fit's: "no-response" (x0 kept at the highest rate)
 * - join at the highest rate, or SSE not below the fit with the join there: "no-plateau"
 *   (for the linear-plateau that fit is the straight line)
 * - join at or below the second-lowest rate: "full-response-at-lowest-rate"
 *   (check against the rest; x0 kept at the second-lowest rate)
 * - otherwise "ok"
 */
import type { CurveSpec } from './modelCurve';
import type { CurveEstimate, FitStatus, ModelName } from './modelTypes';
import type { PreparedSite } from './prepareSite';
import type { ProfileSolver } from './solve/profileSolver';
import { KG_HA_FORMAT, rateRangeText, rateText, type RateFormat } from './rateFormat';
import type { JoinSearchResult } from './solve/searchJoinPoint';

/** Relative SSE difference below which two fits count as equally good. */
const TIE = 1e-10;

export interface PlateauJudgement {
  site: PreparedSite;
  /** The model's curve (its name, label and the first two parameter names are used). */
  spec: CurveSpec<ModelName>;
  solver: ProfileSolver;
  /** SSE at a join point, kg/ha (leaves the inner fit in solver.last). */
  sseAt: (x0: number) => number;
  best: JoinSearchResult;
  /** The rest of the "no-plateau" sentence after its colon, given the highest rate as text. */
  noPlateauDetail: (highestRate: string) => string;
  rateFormat?: RateFormat;
}

/**
 * Status, message and parameters of a plateau model from its search.
 * @param j - the site, curve, solver, search result and the limit's SSE
 * @returns the estimate: params [first, second, x0] by the spec's names, SSE at the reported x0
 * @example
 * // see estimateLinearPlateau and estimateQuadraticPlateau
 */
export function plateauEstimate(j: PlateauJudgement): CurveEstimate {
  const { site, spec, solver, best } = j;
  const rates = site.rates;
  const rMax = rates[rates.length - 1];
  const format = j.rateFormat ?? KG_HA_FORMAT;
  let x0 = best.x0;
  let status: FitStatus = 'ok';
  let message: string;
  if (best.sse >= solver.flatSse * (1 - TIE)) {
    status = 'no-response';
    message = `Yield does not rise with rate: the best ${spec.label.toLowerCase()} is flat.`;
    x0 = rMax;
  } else if (x0 >= rMax * (1 - 1e-9) || best.sse >= j.sseAt(rMax) * (1 - TIE)) {
    status = 'no-plateau';
    message = `No plateau within the tested rates: ${j.noPlateauDetail(rateText(format, rMax))}`;
    x0 = rMax;
  } else if (x0 <= rates[1] * (1 + 1e-9)) {
    status = 'full-response-at-lowest-rate';
    message = `Full response by the lowest non-zero rate: the join lies between ${rateRangeText(format, rates[0], rates[1])} and these rates cannot place it more precisely.`;
    x0 = rates[1];
  } else {
    message = `${spec.label} fitted; join point between tested rates.`;
  }
  const sse = j.sseAt(x0);
  return {
    model: spec.model,
    status,
    message,
    params: {
      [spec.paramNames[0]]: solver.last.intercept,
      [spec.paramNames[1]]: solver.last.beta,
      x0,
    },
    sse,
    testedRates: site.testedRates,
    joinBetweenKgHa: status === 'full-response-at-lowest-rate' ? [rates[0], rates[1]] : null,
  };
}
