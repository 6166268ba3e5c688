/**
 * Any model's estimate without the reporting (no errors, residuals or curve):
 * the fast path that a bootstrap resample or a re-fit after an exclusion needs.
 * Same search and statuses as the full fits; the straight lines and the
 * quadratic come from the weighted fit of the per-rate means. Each model's
 * estimate is its catalog entry's (shared/models/catalog).
 */
import { MODEL_CATALOG } from './catalog';
import type { CurveEstimate, FitOptions, ModelName } from './modelTypes';
import type { PreparedSite } from './prepareSite';

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
  return MODEL_CATALOG[model].estimate(site, options);
}
