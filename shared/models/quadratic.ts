/**
 * The quadratic y = a + b x + c x² (c in kg grain per (kg nutrient)² per ha),
 * fitted by least squares through Householder QR. With c ≥ 0 the curve opens
 * upward and has no maximum: status "convex".
 */
import {
  finishFit,
  solvedEstimate,
  tooFewRatesMessage,
  unfittedEstimate,
  unfittedFit,
  type FitStore,
} from './finishFit';
import { quadraticCurve } from './curves/quadratic';
import type { ModelEntry } from './modelEntry';
import { groupLinearCoefficients, linearCoefficients } from './solve/linearCoefficients';
import type { CurveEstimate, FitOptions, ModelFit, SiteData } from './modelTypes';
import { prepareSite, type PreparedSite } from './prepareSite';

const quadraticSpec = quadraticCurve.spec;

/**
 * Fits the quadratic to a prepared site.
 * @param site - from prepareSite
 * @param options - confidence level, curve grid
 * @param store - optional shared buffer for fitted values, residuals and curve (fitAllModelsPrepared passes one per site)
 * @returns the fit; "convex" when c ≥ 0; "too-few-rates" with fewer than 3 rates
 * @example
 * fitQuadraticPrepared(prepareSite({ rateKgHa: [0, 100, 200, 0, 100, 200], yieldKgHa: [5, 8, 9, 5.2, 8.1, 8.9] }, 'none'), {}).status // 'ok'
 */
export function fitQuadraticPrepared(
  site: PreparedSite,
  options: FitOptions,
  store?: FitStore,
): ModelFit {
  const why = tooFewRatesMessage(site, quadraticSpec, 3);
  if (why) return unfittedFit(site, quadraticSpec, why);
  const x2 = site.rates.map((r) => r * r);
  const coef = linearCoefficients(site, [site.rates, x2], true);
  const [a, b, c] = coef.curve;
  const convex = !(c < 0);
  const xMax = -b / (2 * c);
  return finishFit({
    site,
    spec: quadraticSpec,
    params: coef.curve,
    blockCoefficients: coef.blocks,
    designQr: coef.qr ?? undefined,
    status: convex ? 'convex' : 'ok',
    message: convex
      ? 'The quadratic opens upward (c ≥ 0): it has no maximum, so it gives no optimum.'
      : 'Quadratic fitted.',
    options,
    store,
    // The vertex −b/(2c) and its yield a − b²/(4c) play the join and plateau roles.
    joinPoint: convex ? undefined : { value: xMax, gradient: [0, -1 / (2 * c), b / (2 * c * c)] },
    plateauYield: convex
      ? undefined
      : {
          value: a - (b * b) / (4 * c),
          gradient: [1, -b / (2 * c), (b * b) / (4 * c * c)],
        },
  });
}

/**
 * Fits the quadratic y = a + b x + c x² to a site's plots.
 * @param data - rates (kg/ha), yields (kg/ha), optional blocks
 * @param options - blocks, confidence level, curve grid
 * @returns params {a, b, c}; joinPoint is the vertex −b/(2c) and plateauYield its yield when c < 0
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values
 * @example
 * fitQuadratic({ rateKgHa: [0, 100, 200, 0, 100, 200], yieldKgHa: [5, 8, 9, 5.2, 8.1, 8.9] }).params.c < 0 // true
 */
export function fitQuadratic(data: SiteData, options: FitOptions = {}): ModelFit {
  return fitQuadraticPrepared(prepareSite(data, options.blocks ?? 'none'), options);
}

/**
 * The quadratic's estimate (no errors or residuals), from the weighted fit of the per-rate means.
 * @param site - from prepareSite
 * @returns params {a, b, c} and SSE; status "ok", "convex" when c ≥ 0, or "too-few-rates"
 * @example
 * estimateQuadratic(prepareSite({ rateKgHa: [0, 100, 200, 0, 100, 200], yieldKgHa: [5, 8, 9, 5.2, 8.1, 8.9] }, 'none')).status // 'ok'
 */
export function estimateQuadratic(site: PreparedSite): CurveEstimate {
  const why = tooFewRatesMessage(site, quadraticSpec, 3);
  if (why) return unfittedEstimate(site, quadraticSpec, why);
  const r = groupLinearCoefficients(site, [site.rates, site.rates.map((x) => x * x)], true);
  const [a, b, c] = r.curve;
  return c < 0
    ? solvedEstimate(site, quadraticSpec, { a, b, c }, r.sse, 'ok', '')
    : solvedEstimate(
        site,
        quadraticSpec,
        { a, b, c },
        r.sse,
        'convex',
        'The quadratic opens upward (c ≥ 0).',
      );
}

/** The quadratic in the model catalog (shared/models/catalog): its curve and its fits. */
export const quadraticModel = {
  ...quadraticCurve,
  fit: fitQuadraticPrepared,
  estimate: estimateQuadratic,
} satisfies ModelEntry;
