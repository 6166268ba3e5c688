/**
 * The straight line y = a + b x (a: yield at rate 0, kg/ha; b: kg grain per kg
 * nutrient), fitted by least squares through Householder QR.
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

/** The straight line's curve. */
export const linearSpec: CurveSpec = {
  model: 'linear',
  label: 'Straight line',
  formula: 'a + b·x',
  paramNames: ['a', 'b'],
  value: (x, p) => p[0] + p[1] * x,
  values: (xs, p, out) => {
    for (let i = 0; i < xs.length; i++) out[i] = p[0] + p[1] * xs[i];
  },
  gradient: (x, _p, out) => {
    out[0] = 1;
    out[1] = x;
  },
  r2Kind: 'centered',
};

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
