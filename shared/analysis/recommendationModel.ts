/**
 * The model a site's recommendation rests on: the one definition that the
 * report (bestModel, the JSON's `bestModel`), the regional return with
 * `regionalModel: 'best'` and anything else that speaks of "the chosen model"
 * share.
 *
 * The rule itself is shared/models/chooseModel (the bootstrap applies the same
 * rule inside every resample); this file ranks the site's fits for it and says
 * why in words. Rule, in the order an agronomist reads a model table:
 * 1. Only models that take part in the AICc ranking (Hurvich & Tsai 1989;
 *    shared/models rankByAicc) and give a usable rate are candidates. A fit gives
 *    a usable rate when its status is "ok": its economic optimum is then one
 *    number at any prices (interior, no N, capped at the highest tested rate, or
 *    a corner). A full response by the lowest non-zero rate only places the
 *    optimum between the two lowest rates; no plateau, an upward-opening
 *    quadratic and no response give none.
 * 2. Among the candidates the curves (the models whose curve entry says
 *    `isCurve`: the quadratic, linear-plateau, quadratic-plateau and exponential
 *    rise) come first, lowest AICc first: a
 *    straight line never levels off and only gives a corner (no N or the
 *    highest tested rate), which is no recommendation a grower can use when a
 *    curve is available.
 * 3. With no curve left, the lowest-AICc straight line (or line through the
 *    origin) is taken and the reason says it gives only a corner.
 * 4. With no candidate at all there is no recommendation model (null).
 *
 * The rule depends on the fits alone, not on prices, so a re-priced analysis
 * (repriceAcrossSites) keeps the same model at every site and agrees with a
 * fresh analysis at the new prices.
 */
import { chooseModel } from '../models/chooseModel';
import { MODEL_CURVES } from '../models/curves';
import type { ModelRank } from '../models/fitAllModels';
import type { FitStatus, ModelName } from '../models/modelTypes';

/** What the rule reads of a site's fits: each fit's status and the AICc ranking. */
export interface RankedFits {
  fits: Readonly<Record<ModelName, { status: FitStatus }>>;
  ranking: readonly ModelRank[];
}

export interface RecommendationModel {
  /** The model the site's recommendation uses; null when no model gives a usable rate. */
  model: ModelName | null;
  /** Why, a phrase without a final stop ("lowest AICc of the models fitted, …"). */
  reason: string;
}

/**
 * Chooses the model for a site's recommendation by the rule in the file header.
 * @param all - the site's fits (statuses) and AICc ranking, e.g. fitAllModels' result or its plain-data copy
 * @returns the model and the reason, or null with the reason when no model gives a usable rate
 * @example
 * recommendationModel(fitAllModels(site)) // { model: 'quadraticPlateau', reason: 'lowest AICc of the models fitted, Akaike weight 0.61' }
 */
export function recommendationModel(all: RankedFits): RecommendationModel {
  const ranked = all.ranking.filter((r) => r.rank !== null);
  const model = chooseModel(
    ranked.map((r) => ({ model: r.model, status: all.fits[r.model]?.status, aicc: r.aicc })),
  );
  if (model === null) return { model: null, reason: 'no model gave an economic optimum' };
  if (!MODEL_CURVES[model].isCurve) {
    return { model, reason: 'no curve gave an optimum; a straight line gives only a corner rate' };
  }
  const curve = ranked.find((r) => r.model === model)!;
  return {
    model,
    reason:
      ranked[0].model === model
        ? `lowest AICc of the models fitted, Akaike weight ${curve.weight.toFixed(2)}`
        : `lowest AICc among the curves with an economic optimum, ΔAICc ${curve.deltaAicc.toFixed(1)} from the best`,
  };
}
