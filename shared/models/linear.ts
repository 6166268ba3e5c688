/**
 * The straight line y = a + b x (a: yield at rate 0, kg/ha; b: kg grain per kg
 * nutrient), fitted by least squares through Householder QR.
 */
import {
  finishFit,
  solvedEstimate,
  tooFewRatesMessage,
  unfittedEstimate,
  unfittedFit,
  type FitStore,
} from './finishFit';
import { linearCurve } from './curves/linear';
import type { ModelEntry } from './modelEntry';
import { groupLinearCoefficients, linearCoefficients } from './solve/linearCoefficients';
import type { CurveEstimate, FitOptions, ModelFit, SiteData } from './modelTypes';
import { prepareSite, type PreparedSite } from './prepareSite';

const linearSpec = linearCurve.spec;

/**
 * Fits the straight line to a prepared site.
 * @param site - from prepareSite
 * @param options - confidence level, curve grid
 * @param store - optional shared buffer for fitted values, residuals and curve (fitAllModelsPrepared passes one per site)
 * @returns the fit; status "too-few-rates" with fewer than 2 distinct rates
 * @example
 * fitLinearPrepared(prepareSite({ rateKgHa: [0, 50, 100], yieldKgHa: [5000, 6000, 7100] }, 'none'), {}).params.b // ≈ 21
 */
export function fitLinearPrepared(
  site: PreparedSite,
  options: FitOptions,
  store?: FitStore,
): ModelFit {
  const why = tooFewRatesMessage(site, linearSpec, 2);
  if (why) return unfittedFit(site, linearSpec, why);
  const coef = linearCoefficients(site, [site.rates], true);
  return finishFit({
    site,
    spec: linearSpec,
    params: coef.curve,
    blockCoefficients: coef.blocks,
    designQr: coef.qr ?? undefined,
    status: 'ok',
    message: 'Straight line fitted.',
    options,
    store,
  });
}

/**
 * Fits the straight line y = a + b x to a site's plots.
 * @param data - rates (kg/ha), yields (kg/ha), optional blocks
 * @param options - blocks, confidence level, curve grid
 * @returns params {a (kg/ha), b (kg grain/kg nutrient)} with errors, SSE, AICc, …
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values
 * @example
 * fitLinear({ rateKgHa: [0, 50, 100], yieldKgHa: [5000, 6000, 7100] }).params.a // ≈ 4983
 */
export function fitLinear(data: SiteData, options: FitOptions = {}): ModelFit {
  return fitLinearPrepared(prepareSite(data, options.blocks ?? 'none'), options);
}

/**
 * The straight line's estimate (no errors or residuals), from the weighted fit of the per-rate means.
 * @param site - from prepareSite
 * @returns status "ok" with params {a, b} and SSE, or "too-few-rates"
 * @example
 * estimateLinear(prepareSite({ rateKgHa: [0, 50, 100], yieldKgHa: [5000, 6000, 7100] }, 'none')).params.b // ≈ 21
 */
export function estimateLinear(site: PreparedSite): CurveEstimate {
  const why = tooFewRatesMessage(site, linearSpec, 2);
  if (why) return unfittedEstimate(site, linearSpec, why);
  const r = groupLinearCoefficients(site, [site.rates], true);
  return solvedEstimate(site, linearSpec, { a: r.curve[0], b: r.curve[1] }, r.sse, 'ok', '');
}

/** The straight line in the model catalog (shared/models/catalog): its curve and its fits. */
export const linearModel = {
  ...linearCurve,
  fit: fitLinearPrepared,
  estimate: estimateLinear,
} satisfies ModelEntry;
