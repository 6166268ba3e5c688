/**
 * The rule that picks the model a recommendation rests on, from what a model table
 * says of each fit: its status and its AICc (shared/models/aicc, Hurvich & Tsai 1989).
 * It is applied to a site's own fits (shared/analysis/recommendationModel, which
 * adds the reason) and to every bootstrap resample's re-estimates
 * (shared/economics/drawChoices), so the interval of the optimum repeats the
 * site's own choice inside each resample.
 *
 * 1. Candidates are the fits whose status is "ok" (the economic optimum is one
 *    number at any prices) and whose AICc is finite (n large enough to rank them).
 * 2. The curves (the catalog's `isCurve`: quadratic, linear-plateau,
 *    quadratic-plateau, exponential rise) come first, lowest AICc first: a
 *    straight line never levels off and only gives a corner rate.
 * 3. With no curve left, the lowest-AICc straight line (or line through the origin).
 * 4. With no candidate, none (null).
 *
 * Ties keep the order of the list (the ranking's order for a site, the catalog's
 * order for a resample). The rule depends on the fits only, never on prices.
 */
import { MODEL_CURVES } from './curves';
import type { FitStatus, ModelName } from './modelTypes';

/** What the rule reads of one fit. */
export interface ModelCandidate {
  model: ModelName;
  status: FitStatus;
  /** AICc of the fit (NaN or ±Infinity when it cannot be ranked). */
  aicc: number;
}

/**
 * Picks the recommendation's model by the rule in the file header.
 * @param candidates - one entry per fitted model (any order; ties keep it)
 * @returns the chosen model, or null when no fit has status "ok" and a finite AICc
 * @example
 * chooseModel([
 *   { model: 'linear', status: 'ok', aicc: 300 },
 *   { model: 'quadraticPlateau', status: 'ok', aicc: 301.2 },
 *   { model: 'linearPlateau', status: 'full-response-at-lowest-rate', aicc: 290 },
 * ]) // 'quadraticPlateau'
 */
export function chooseModel(candidates: readonly ModelCandidate[]): ModelName | null {
  let curve: ModelCandidate | null = null;
  let line: ModelCandidate | null = null;
  for (const c of candidates) {
    if (c.status !== 'ok' || !Number.isFinite(c.aicc)) continue;
    if (MODEL_CURVES[c.model].isCurve) {
      if (!curve || c.aicc < curve.aicc) curve = c;
    } else if (!line || c.aicc < line.aicc) {
      line = c;
    }
  }
  return (curve ?? line)?.model ?? null;
}
