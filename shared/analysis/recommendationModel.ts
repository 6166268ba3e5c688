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
 *    shared/models rankByAicc) and give a usable answer are candidates: status
 *    "ok" (the economic optimum is one number at any prices: interior, no N,
 *    capped at the highest tested rate, or a corner) or a curve's full response
 *    by the lowest non-zero rate (the optimum lies at or below the second-lowest
 *    tested rate, a range); no plateau, an upward-opening quadratic and no
 *    response give none.
 * 2. Among the candidates the curves (the models whose curve entry says
 *    `isCurve`: the quadratic, linear-plateau, quadratic-plateau, exponential
 *    rise and the check vs fertilized step) come first, lowest AICc first (a full
 *    response leads unless a curve with one rate fits better by more than
 *    FULL_RESPONSE_DELTA_AICC, shared/models/chooseModel): a
 *    straight line never levels off and only gives a corner (no N or the
 *    highest tested rate), which is no recommendation a grower can use when a
 *    curve is available.
 * 3. With no curve left, the lowest-AICc straight line (or line through the
 *    origin) is taken and the reason says it gives only a corner.
 * 4. With no candidate at all there is no recommendation model (null).
 * When the chosen model lies more than 4 AICc units behind the best fit (Burnham &
 * Anderson, Model Selection and Multimodel Inference, 2nd ed., 2002, §2.6: beyond
 * about 4 a model has clearly less support), the reason names the better fit and
 * why it gives no usable rate, so a reader never meets a poorly fitting lead unexplained.
 *
 * The rule depends on the fits alone, not on prices, so a re-priced analysis
 * (repriceAcrossSites) keeps the same model at every site and agrees with a
 * fresh analysis at the new prices.
 */
import { chooseModel, FULL_RESPONSE_DELTA_AICC } from '../models/chooseModel';
import type { ModelRank } from '../models/fitAllModels';
import { MODEL_CURVES, modelLabelInText } from '../models/curves';
import type { FitStatus, ModelName } from '../models/modelTypes';

/** ΔAICc beyond which the reason must say why a better fit does not lead. */
export const EXPLAINED_DELTA_AICC = 4;

/** Why a fit with this status gives no usable rate, as a clause. */
const NO_RATE: Record<FitStatus, string> = {
  ok: 'it is a straight line and gives only a corner rate',
  'no-plateau': 'its yields rise without levelling off within the tested rates',
  'full-response-at-lowest-rate': 'it places the whole response by the lowest non-zero rate',
  convex: 'it opens upward, so it has no maximum',
  'no-response': 'it shows no response',
  'too-few-rates': 'there are too few rates for it',
};

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
  const chosen = ranked.find((r) => r.model === model)!;
  const best = ranked[0];
  // A better fit that does not lead is named, with why, when it is clearly better.
  const why =
    best.model !== model && chosen.aicc - best.aicc > EXPLAINED_DELTA_AICC
      ? `; the better-fitting ${modelLabelInText(best.model)} gives no usable rate: ${NO_RATE[all.fits[best.model].status]}`
      : '';
  if (!MODEL_CURVES[model].isCurve) {
    return {
      model,
      reason: `no curve gave an optimum; a straight line gives only a corner rate${why}`,
    };
  }
  const isFull = all.fits[model].status === 'full-response-at-lowest-rate';
  // A full response leads over a curve that fits better by up to FULL_RESPONSE_DELTA_AICC
  // (shared/models/chooseModel): say which curve, and why the full response still leads.
  const closeCurve = isFull
    ? ranked.find(
        (r) =>
          r.aicc < chosen.aicc &&
          MODEL_CURVES[r.model].isCurve &&
          all.fits[r.model].status === 'ok',
      )
    : undefined;
  const lead =
    best.model === model
      ? `lowest AICc of the models fitted, Akaike weight ${chosen.weight.toFixed(2)}`
      : closeCurve
        ? `ΔAICc ${chosen.deltaAicc.toFixed(1)} behind the ${modelLabelInText(closeCurve.model)}, within ${FULL_RESPONSE_DELTA_AICC} units: the data cannot tell the two apart, and the lower answer is kept`
        : `lowest AICc among the curves with a usable rate, ΔAICc ${chosen.deltaAicc.toFixed(1)} from the best`;
  const full = isFull ? 'full response by the lowest non-zero rate, ' : '';
  return { model, reason: `${full}${lead}${why}` };
}
