/**
 * Any model's estimate without the reporting (no errors, residuals or curve):
 * the fast path that a bootstrap resample or a re-fit after an exclusion needs.
 * Same search and statuses as the full fits; the straight lines and the
 * quadratic come from the weighted fit of the per-rate means.
 */
import { estimateExponential } from './exponential';
import { linearSpec } from './linear';
import { groupLinearCoefficients } from './solve/linearCoefficients';
import { estimateLinearPlateau } from './linearPlateau';
import type { CurveEstimate, FitOptions, ModelName } from './modelTypes';
import type { PreparedSite } from './prepareSite';
import { proportionalSpec } from './proportional';
import { quadraticSpec } from './quadratic';
import { estimateQuadraticPlateau } from './quadraticPlateau';
import { tooFewRatesMessage, unfittedEstimate } from './finishFit';

/**
 * Estimates one model on a prepared site.
 * @param site - from prepareSite
 * @param model - which model
 * @param options - exponentialIntercept, searchTolerance and rateFormat are read
 * @returns status, params by name, SSE, tested rates
 * @throws {StatsInputError} "bad-argument" for exponentialIntercept 'zero' with block terms
 * @example
 * estimateCurve(prepareSite({ rateKgHa: [0, 50, 100], yieldKgHa: [5000, 6000, 7100] }, 'none'), 'linear').params.b // ≈ 21
 */
export function estimateCurve(
  site: PreparedSite,
  model: ModelName,
  options: FitOptions = {},
): CurveEstimate {
  switch (model) {
    case 'linearPlateau':
      return estimateLinearPlateau(site, options.searchTolerance, options.rateFormat);
    case 'quadraticPlateau':
      return estimateQuadraticPlateau(site, options.searchTolerance, options.rateFormat);
    case 'exponential':
      return estimateExponential(
        site,
        options.exponentialIntercept ?? 'free',
        options.searchTolerance,
        options.rateFormat,
      );
    case 'linear': {
      const why = tooFewRatesMessage(site, linearSpec, 2);
      if (why) return unfittedEstimate(site, linearSpec, why);
      const r = groupLinearCoefficients(site, [site.rates], true);
      return lean(site, model, { a: r.curve[0], b: r.curve[1] }, r.sse, 'ok');
    }
    case 'proportional': {
      const why =
        site.testedRates.highestKgHa > 0
          ? tooFewRatesMessage(site, proportionalSpec, 1)
          : 'The proportional model needs at least one rate above zero.';
      if (why) return unfittedEstimate(site, proportionalSpec, why);
      const r = groupLinearCoefficients(site, [site.rates], false);
      return lean(site, model, { b: r.curve[0] }, r.sse, 'ok');
    }
    case 'quadratic': {
      const why = tooFewRatesMessage(site, quadraticSpec, 3);
      if (why) return unfittedEstimate(site, quadraticSpec, why);
      const r = groupLinearCoefficients(site, [site.rates, site.rates.map((x) => x * x)], true);
      const c = r.curve[2];
      return lean(site, model, { a: r.curve[0], b: r.curve[1], c }, r.sse, c < 0 ? 'ok' : 'convex');
    }
  }
}

function lean(
  site: PreparedSite,
  model: ModelName,
  params: Record<string, number>,
  sse: number,
  status: CurveEstimate['status'],
): CurveEstimate {
  return {
    model,
    status,
    message: status === 'convex' ? 'The quadratic opens upward (c ≥ 0).' : '',
    params,
    sse,
    testedRates: site.testedRates,
    joinBetweenKgHa: null,
  };
}
