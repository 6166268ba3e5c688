/**
 * The line through the origin y = b x (b: kg grain per kg nutrient). Used for a
 * response over the check (a gain that is zero at rate zero). Its R² is the
 * uncentered one (about zero), labelled so: it must never be ranked against a
 * centered R².
 */
import {
  finishFit,
  tooFewRatesMessage,
  unfittedFit,
  type CurveSpec,
  type FitStore,
} from './finishFit';
import { linearCoefficients } from './solve/linearCoefficients';
import type { FitOptions, ModelFit, SiteData } from './modelTypes';
import { prepareSite, type PreparedSite } from './prepareSite';

/** The proportional model's curve. */
export const proportionalSpec: CurveSpec = {
  model: 'proportional',
  label: 'Proportional',
  formula: 'b·x',
  paramNames: ['b'],
  value: (x, p) => p[0] * x,
  values: (xs, p, out) => {
    for (let i = 0; i < xs.length; i++) out[i] = p[0] * xs[i];
  },
  gradient: (x, _p, out) => {
    out[0] = x;
  },
  r2Kind: 'uncentered',
};

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
  const why =
    site.testedRates.highestKgHa > 0
      ? tooFewRatesMessage(site, proportionalSpec, 1)
      : 'The proportional model needs at least one rate above zero.';
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
