/**
 * The models compared across sites (and across groups) by pooled-versus-separate fits: those
 * not linear in all their parameters (their curve entry says so), which the F tests of
 * commonResponseTests cannot cover. Each is fitted here to pooled plots without block terms,
 * and a fit is reduced to what pooledCurveTest needs (its SSE and parameter count, or why there
 * is none).
 */
import { MODEL_CATALOG } from '../models/catalog';
import { modelLabelInText, PLATEAU_MODELS, type PlateauModel } from '../models/curves';
import { prepareSite, type PreparedSite } from '../models/prepareSite';
import type { FitData } from './analyzeSite';
import type { CurveFitOutcome, CurveFitter } from './pooledCurveTest';

export { PLATEAU_MODELS, type PlateauModel } from '../models/curves';

/**
 * What a pooled test needs of one fit: its SSE and the parameters it estimates, or why it gives
 * none. A fit at a limit counts its limiting model's parameters (shared/models/fixedByStatus:
 * a straight line or a step two, a flat fit one), not the model's three, so the F test's
 * degrees of freedom are those of the fits actually made.
 * @param fit - a fit as plain data (kg/ha)
 * @returns `{ sse, parameters }`, or `{ problem }` for too few rates or a fit that failed
 * @example
 * curveFitOutcome(site.fits.fits.linearPlateau) // { sse: 1.2e5, parameters: 3 }, or 2 with no plateau
 */
export function curveFitOutcome(fit: FitData): CurveFitOutcome {
  if (fit.status === 'too-few-rates') return { problem: fit.message };
  if (!Number.isFinite(fit.sse))
    return { problem: `the ${modelLabelInText(fit.model)} could not be fitted` };
  return { sse: fit.sse, parameters: fit.estimatedParameterCount };
}

/**
 * The pooled tests' fitters for the plateau models, fitting rates and yields without block terms.
 * The three share each set of plots' preparation (prepareSite: the plots ordered by rate, the
 * rate groups): the across-site tests fit every site three times, and the preparation was about
 * 0.5 of their 1.1 s at 10,000 sites (a CPU profile of 5 December 2026) when made for each fit.
 * @returns one fitter per model, each giving the fit's outcome (curveFitOutcome) for rates and
 *   yields (kg/ha); a set of plots is known by its yield array, so pass the same arrays to each
 * @example
 * plateauFitters().exponential(rateKgHa, yieldKgHa) // { sse, parameters: 3 } or { problem }
 */
export function plateauFitters(): Record<PlateauModel, CurveFitter> {
  const prepared = new WeakMap<Float64Array, { rates: Float64Array; site: PreparedSite }>();
  const prepare = (x: Float64Array, y: Float64Array): PreparedSite => {
    const kept = prepared.get(y);
    if (kept && kept.rates === x) return kept.site;
    const site = prepareSite({ rateKgHa: x, yieldKgHa: y }, 'none');
    prepared.set(y, { rates: x, site });
    return site;
  };
  const fitter =
    (model: PlateauModel): CurveFitter =>
    (x, y) =>
      // Only the status, SSE and parameter count are read: no curve to draw, so two points of it.
      curveFitOutcome(MODEL_CATALOG[model].fit(prepare(x, y), { curvePoints: 2 }));
  return Object.fromEntries(PLATEAU_MODELS.map((m) => [m, fitter(m)])) as Record<
    PlateauModel,
    CurveFitter
  >;
}
