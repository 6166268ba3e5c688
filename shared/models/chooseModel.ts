/**
 * The rule that picks the model a recommendation rests on, from what a model table
 * says of each fit: its status and its AICc (shared/models/aicc, Hurvich & Tsai 1989).
 * It is applied to a site's own fits (shared/analysis/recommendationModel, which
 * adds the reason) and to every bootstrap resample's re-estimates
 * (shared/economics/drawChoices), so the interval of the optimum repeats the
 * site's own choice inside each resample.
 *
 * 1. Candidates are the fits whose AICc is finite (n large enough to rank them) and
 *    that give a usable answer: status "ok" (the economic optimum is one number at
 *    any prices) or, for a curve, "full-response-at-lowest-rate" (the whole
 *    response came by the lowest non-zero rate, so the optimum lies at or below the
 *    second-lowest tested rate: a range, which is an answer a grower can use).
 * 2. The curves (the catalog's `isCurve`: quadratic, linear-plateau,
 *    quadratic-plateau, exponential rise, check vs fertilized step) come first,
 *    lowest AICc first: a straight line never levels off and only gives a corner
 *    rate. A full response (the step, or a plateau whose join fell in the first
 *    interval) leads unless an "ok" curve fits better by more than
 *    FULL_RESPONSE_DELTA_AICC (4): a curve whose join or bend lies just past the
 *    second-lowest rate fits a step about as well (one data point between them),
 *    4 AICc units is where a model starts to have clearly less support (Burnham &
 *    Anderson, Model Selection and Multimodel Inference, 2nd ed., 2002, §2.6), and
 *    when the data cannot tell the two apart the lower answer is the cautious one.
 *    Measured on simulated full responses (scripts/validate, 200 sites), the share
 *    recommended above the second-lowest rate: 98 % with no full-response answer,
 *    48 % with the plateaus' three-parameter full response alone; with the
 *    two-coefficient step, 9 % at a tolerance of 0, 6 % at 2 and 2.5 % at 4, with
 *    the curved truths' coverage and bias unchanged (the step led 2 of 600 curved sites).
 * 3. With no curve left, the lowest-AICc straight line (or line through the origin).
 * 4. With no candidate, none (null).
 *
 * Ties keep the order of the list (the ranking's order for a site, the catalog's
 * order for a resample). The rule depends on the fits only, never on prices.
 */
import { MODEL_CURVES } from './curves';
import type { FitStatus, ModelName } from './modelTypes';

/** AICc units an "ok" curve must beat a full response by to lead instead (see the header). */
export const FULL_RESPONSE_DELTA_AICC = 4;

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
 * @returns the chosen model, or null when no fit gives a usable answer and has a finite AICc
 * @example
 * chooseModel([
 *   { model: 'linear', status: 'ok', aicc: 300 },
 *   { model: 'quadraticPlateau', status: 'ok', aicc: 301.2 },
 *   { model: 'linearPlateau', status: 'full-response-at-lowest-rate', aicc: 290 },
 * ]) // 'linearPlateau' (a full response that fits best)
 */
export function chooseModel(candidates: readonly ModelCandidate[]): ModelName | null {
  let curve: ModelCandidate | null = null;
  let full: ModelCandidate | null = null;
  let line: ModelCandidate | null = null;
  for (const c of candidates) {
    if (!Number.isFinite(c.aicc)) continue;
    const isCurve = MODEL_CURVES[c.model].isCurve;
    if (isCurve && c.status === 'full-response-at-lowest-rate') {
      if (!full || c.aicc < full.aicc) full = c;
    } else if (c.status !== 'ok') {
      continue;
    } else if (isCurve) {
      if (!curve || c.aicc < curve.aicc) curve = c;
    } else if (!line || c.aicc < line.aicc) {
      line = c;
    }
  }
  if (full && (!curve || full.aicc <= curve.aicc + FULL_RESPONSE_DELTA_AICC)) return full.model;
  return (curve ?? line)?.model ?? null;
}

/** A curve the rule can lead with: finite AICc and a usable answer ("ok" or a full response). */
function usableCurve(c: ModelCandidate): boolean {
  return (
    Number.isFinite(c.aicc) &&
    MODEL_CURVES[c.model].isCurve &&
    (c.status === 'ok' || c.status === 'full-response-at-lowest-rate')
  );
}

/**
 * The rule's candidates weighted by their Akaike weights, exp(−Δᵢ/2) / Σ exp(−Δⱼ/2) with Δ the
 * AICc above the best candidate (Burnham & Anderson, 2002, §2.9): the curves with a usable
 * answer when there are any, else all the weight on the straight line chooseModel takes, else
 * none. The optimum's interval mixes the resamples' candidates by these weights
 * (shared/economics/drawChoices) instead of taking each resample's single winner, which
 * under-covered curved truths (scripts/validate).
 * @param candidates - one entry per fitted model
 * @param out - receives one weight per candidate, in the candidates' order (zeros when none)
 * @returns nothing; `out` is filled and sums to 1 or to 0
 * @example
 * const w = new Float64Array(2);
 * ruleWeights([{ model: 'quadratic', status: 'ok', aicc: 100 }, { model: 'linearPlateau', status: 'ok', aicc: 102 }], w)
 * // w ≈ [0.731, 0.269]
 */
export function ruleWeights(candidates: readonly ModelCandidate[], out: Float64Array): void {
  out.fill(0);
  let best = Infinity;
  for (const c of candidates) if (usableCurve(c) && c.aicc < best) best = c.aicc;
  if (best === Infinity) {
    const line = chooseModel(candidates);
    const at = candidates.findIndex((c) => c.model === line);
    if (at >= 0) out[at] = 1;
    return;
  }
  let total = 0;
  candidates.forEach((c, i) => {
    if (!usableCurve(c)) return;
    out[i] = Math.exp(-(c.aicc - best) / 2);
    total += out[i];
  });
  for (let i = 0; i < out.length; i++) out[i] /= total;
}
