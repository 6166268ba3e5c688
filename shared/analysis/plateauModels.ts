/**
 * The models compared across sites (and across groups) by pooled-versus-separate fits: those
 * not linear in all their parameters, which the F tests of commonResponseTests cannot cover.
 * Each is fitted here to pooled plots without block terms, and a fit is reduced to what
 * pooledCurveTest needs (its SSE and parameter count, or why there is none).
 */
import { fitExponential } from '../models/exponential';
import { fitLinearPlateau } from '../models/linearPlateau';
import { fitQuadraticPlateau } from '../models/quadraticPlateau';
import type { ModelFit } from '../models/modelTypes';
import type { FitData } from './analyzeSite';
import { MODEL_LABEL } from './modelLabel';
import type { CurveFitOutcome } from './pooledCurveTest';

/** Models compared across sites by pooled-versus-separate fits (not linear in all parameters). */
export type PlateauModel = 'linearPlateau' | 'quadraticPlateau' | 'exponential';
export const PLATEAU_MODELS: readonly PlateauModel[] = [
  'linearPlateau',
  'quadraticPlateau',
  'exponential',
];

const PLATEAU_FITTERS: Record<PlateauModel, (x: Float64Array, y: Float64Array) => ModelFit> = {
  linearPlateau: (x, y) => fitLinearPlateau({ rateKgHa: x, yieldKgHa: y }),
  quadraticPlateau: (x, y) => fitQuadraticPlateau({ rateKgHa: x, yieldKgHa: y }),
  exponential: (x, y) => fitExponential({ rateKgHa: x, yieldKgHa: y }),
};

/**
 * What a pooled test needs of one fit: its SSE and parameter count, or why it gives none.
 * @param fit - a fit as plain data (kg/ha)
 * @returns `{ sse, parameters }`, or `{ problem }` for too few rates or a fit that failed
 * @example
 * curveFitOutcome(site.fits.fits.linearPlateau) // { sse: 1.2e5, parameters: 3 }
 */
export function curveFitOutcome(fit: FitData): CurveFitOutcome {
  if (fit.status === 'too-few-rates') return { problem: fit.message };
  if (!Number.isFinite(fit.sse))
    return { problem: `the ${MODEL_LABEL[fit.model]} could not be fitted` };
  return { sse: fit.sse, parameters: fit.parameterCount };
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
  return (x, y) => curveFitOutcome(PLATEAU_FITTERS[model](x, y));
}
