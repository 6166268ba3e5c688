/**
 * The models compared across sites (and across groups) by pooled-versus-separate fits: those
 * not linear in all their parameters (their curve entry says so), which the F tests of
 * commonResponseTests cannot cover. Each is fitted here to pooled plots without block terms,
 * and a fit is reduced to what pooledCurveTest needs (its SSE and parameter count, or why there
 * is none).
 */
import { MODEL_CATALOG } from '../models/catalog';
import { modelLabelInText, type PlateauModel } from '../models/curves';
import { prepareSite } from '../models/prepareSite';
import type { FitData } from './analyzeSite';
import type { CurveFitOutcome } from './pooledCurveTest';

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
 * The pooled test's fitter for one plateau model: fits rates and yields without block terms.
 * @param model - one of PLATEAU_MODELS
 * @returns a function of rates and yields (kg/ha) giving the fit's outcome (curveFitOutcome)
 * @example
 * plateauFitter('exponential')(rateKgHa, yieldKgHa) // { sse, parameters: 3 } or { problem }
 */
export function plateauFitter(
  model: PlateauModel,
): (rateKgHa: Float64Array, yieldKgHa: Float64Array) => CurveFitOutcome {
  const { fit } = MODEL_CATALOG[model];
  // Only the status, SSE and parameter count are read: no curve to draw, so two points of it.
  return (x, y) =>
    curveFitOutcome(fit(prepareSite({ rateKgHa: x, yieldKgHa: y }, 'none'), { curvePoints: 2 }));
}
