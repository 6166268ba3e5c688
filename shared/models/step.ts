/**
 * The step y = a + d·[x > 0] (shared/models/curves/step), fitted by least squares: one
 * indicator column for the fertilized plots beside the intercept (and the block offsets), so
 * a is the check's yield and d the gain every fertilized rate shares. It needs check plots at
 * rate 0 and at least three distinct rates (with two, the step is the straight line).
 *
 * Status: "full-response-at-lowest-rate" when the fertilized plots yield more (d > 0), else
 * "no-response"; never "ok", because a step says the response ended somewhere at or below
 * the lowest non-zero rate and no more.
 */
import {
  finishFit,
  solvedEstimate,
  tooFewRatesMessage,
  unfittedEstimate,
  unfittedFit,
  type FitStore,
} from './finishFit';
import { stepCurve } from './curves/step';
import type { ModelEntry } from './modelEntry';
import { groupLinearCoefficients, linearCoefficients } from './solve/linearCoefficients';
import type { CurveEstimate, FitOptions, FitStatus, ModelFit, SiteData } from './modelTypes';
import { prepareSite, type PreparedSite } from './prepareSite';

const stepSpec = stepCurve.spec;

/** Why the step cannot be fitted at this site, or null when it can. */
function stepUnfittable(site: PreparedSite): string | null {
  const few = tooFewRatesMessage(site, stepSpec, 3);
  if (few) return few;
  return site.rates[0] === 0
    ? null
    : 'The check vs fertilized step needs check plots at rate 0; this site has none.';
}

/** The fertilized indicator per distinct rate (rates are sorted, the first is 0). */
function fertilized(site: PreparedSite): Float64Array {
  return site.rates.map((r) => (r > 0 ? 1 : 0));
}

function stepStatus(d: number): { status: FitStatus; message: string } {
  return d > 0
    ? {
        status: 'full-response-at-lowest-rate',
        message:
          'The fertilized rates yield alike above the check: the whole response came by the lowest non-zero rate.',
      }
    : {
        status: 'no-response',
        message: 'The fertilized plots yield no more than the check.',
      };
}

/**
 * Fits the step to a prepared site.
 * @param site - from prepareSite
 * @param options - confidence level, curve grid
 * @param store - optional shared buffer for fitted values, residuals and curve
 * @returns the fit: params {a, d}; "too-few-rates" without check plots or with fewer than 3 rates
 * @example
 * fitStepPrepared(prepareSite({ rateKgHa: [0, 50, 100, 0, 50, 100], yieldKgHa: [5, 8, 8.1, 5.2, 8.1, 7.9] }, 'none'), {}).status
 * // 'full-response-at-lowest-rate'
 */
export function fitStepPrepared(
  site: PreparedSite,
  options: FitOptions,
  store?: FitStore,
): ModelFit {
  const why = stepUnfittable(site);
  if (why) return unfittedFit(site, stepSpec, why);
  const coef = linearCoefficients(site, [fertilized(site)], true);
  const [a, d] = coef.curve;
  const { status, message } = stepStatus(d);
  const full = status === 'full-response-at-lowest-rate';
  return finishFit({
    site,
    spec: stepSpec,
    params: coef.curve,
    blockCoefficients: coef.blocks,
    designQr: coef.qr ?? undefined,
    status,
    message,
    options,
    store,
    plateauYield: full ? { value: a + d, gradient: [1, 1] } : undefined,
    joinBetweenKgHa: full ? [site.rates[0], site.rates[1]] : null,
  });
}

/**
 * Fits the step y = a + d·[x > 0] to a site's plots.
 * @param data - rates (kg/ha), yields (kg/ha), optional blocks
 * @param options - blocks, confidence level, curve grid
 * @returns params {a (kg/ha), d (kg/ha)}
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values
 * @example
 * fitStep({ rateKgHa: [0, 50, 100, 0, 50, 100], yieldKgHa: [5, 8, 8.1, 5.2, 8.1, 7.9] }).params.d // ≈ 2.9
 */
export function fitStep(data: SiteData, options: FitOptions = {}): ModelFit {
  return fitStepPrepared(prepareSite(data, options.blocks ?? 'none'), options);
}

/**
 * The step's estimate (no errors or residuals), from the weighted fit of the per-rate means.
 * @param site - from prepareSite
 * @returns params {a, d} and SSE, with the fit's status
 * @example
 * estimateStep(prepareSite({ rateKgHa: [0, 50, 100, 0, 50, 100], yieldKgHa: [5, 8, 8.1, 5.2, 8.1, 7.9] }, 'none')).sse
 */
export function estimateStep(site: PreparedSite): CurveEstimate {
  const why = stepUnfittable(site);
  if (why) return unfittedEstimate(site, stepSpec, why);
  const r = groupLinearCoefficients(site, [fertilized(site)], true);
  const [a, d] = r.curve;
  const { status, message } = stepStatus(d);
  return solvedEstimate(site, stepSpec, { a, d }, r.sse, status, message);
}

/** The step in the model catalog (shared/models/catalog): its curve and its fits. */
export const stepModel = {
  ...stepCurve,
  fit: fitStepPrepared,
  estimate: estimateStep,
} satisfies ModelEntry;
