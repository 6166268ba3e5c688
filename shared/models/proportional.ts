/**
 * The line through the origin y = b x (b: kg grain per kg nutrient). Used for a
 * response over the check (a gain that is zero at rate zero). Its R² is the
 * uncentered one (about zero), labelled so: it must never be ranked against a
 * centered R².
 */
import {
  finishFit,
  solvedEstimate,
  tooFewRatesMessage,
  unfittedEstimate,
  unfittedFit,
  type FitStore,
} from './finishFit';
import { proportionalCurve } from './curves/proportional';
import type { ModelEntry } from './modelEntry';
import { groupLinearCoefficients, linearCoefficients } from './solve/linearCoefficients';
import type { CurveEstimate, FitOptions, ModelFit, SiteData } from './modelTypes';
import { prepareSite, type PreparedSite } from './prepareSite';

const proportionalSpec = proportionalCurve.spec;

/** Why a site cannot carry the line through the origin, or null. */
function whyNotFitted(site: PreparedSite): string | null {
  return site.testedRates.highestKgHa > 0
    ? tooFewRatesMessage(site, proportionalSpec, 1)
    : `The ${proportionalSpec.label.toLowerCase()} needs at least one rate above zero.`;
}

/**
 * Fits y = b x to a prepared site. With block terms the block offsets sum to
 * zero, so the curve still passes through the origin on average.
 * @param site - from prepareSite
 * @param options - confidence level, curve grid
 * @param store - optional shared buffer for fitted values, residuals and curve (fitAllModelsPrepared passes one per site)
 * @returns the fit; "too-few-rates" unless some rate is above zero
 * @example
 * fitProportionalPrepared(prepareSite({ rateKgHa: [50, 100], yieldKgHa: [100, 210] }, 'none'), {}).params.b // ≈ 2.08
 */
export function fitProportionalPrepared(
  site: PreparedSite,
  options: FitOptions,
  store?: FitStore,
): ModelFit {
  const why = whyNotFitted(site);
  if (why) return unfittedFit(site, proportionalSpec, why);
  const coef = linearCoefficients(site, [site.rates], false);
  return finishFit({
    site,
    spec: proportionalSpec,
    params: coef.curve,
    blockCoefficients: coef.blocks,
    designQr: coef.qr ?? undefined,
    status: 'ok',
    message: 'Line through the origin fitted (R² is uncentered: about zero, not the mean).',
    options,
    store,
  });
}

/**
 * Fits the line through the origin y = b x to a site's plots.
 * @param data - rates (kg/ha), yields or yield gains (kg/ha), optional blocks
 * @param options - blocks, confidence level, curve grid
 * @returns params {b (kg grain/kg nutrient)}, r2Kind "uncentered"
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values
 * @example
 * fitProportional({ rateKgHa: [50, 100], yieldKgHa: [100, 210] }).r2Kind // 'uncentered'
 */
export function fitProportional(data: SiteData, options: FitOptions = {}): ModelFit {
  return fitProportionalPrepared(prepareSite(data, options.blocks ?? 'none'), options);
}

/**
 * The line through the origin's estimate (no errors or residuals), from the weighted fit of the per-rate means.
 * @param site - from prepareSite
 * @returns status "ok" with params {b} and SSE, or "too-few-rates"
 * @example
 * estimateProportional(prepareSite({ rateKgHa: [50, 100], yieldKgHa: [100, 210] }, 'none')).params.b // ≈ 2.08
 */
export function estimateProportional(site: PreparedSite): CurveEstimate {
  const why = whyNotFitted(site);
  if (why) return unfittedEstimate(site, proportionalSpec, why);
  const r = groupLinearCoefficients(site, [site.rates], false);
  return solvedEstimate(site, proportionalSpec, { b: r.curve[0] }, r.sse, 'ok', '');
}

/** The line through the origin in the model catalog (shared/models/catalog): its curve and its fits. */
export const proportionalModel = {
  ...proportionalCurve,
  fit: fitProportionalPrepared,
  estimate: estimateProportional,
} satisfies ModelEntry;
