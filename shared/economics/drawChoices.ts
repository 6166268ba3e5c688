/**
 * Which models decide each bootstrap resample, so the optimum's interval carries the
 * uncertainty of the model choice too (the model-selection bootstrap: Buckland,
 * Burnham & Augustin, Biometrics 53, 1997, 603–618; Efron, JASA 109, 2014, 991–1007):
 * - `decisive`: the site's own rule (shared/models/chooseModel) repeated inside every
 *   resample, its single winner;
 * - `weights`: the rule's candidates in that resample with their Akaike weights
 *   (ruleWeights), which the interval mixes (shared/economics/optimumInterval). Both
 *   were measured on simulated sites of known truth (scripts/validate, 400 sites per
 *   truth): the 90 % interval from the winners covered 0.89, 0.845 and 0.78 of
 *   linear-plateau, quadratic-plateau and exponential truths, the weighted mixture 0.917,
 *   0.935 and 0.807. A resample whose data sit between two curves gives both their due,
 *   where the winner alone made the resamples stick to the model the site's own noise
 *   favoured.
 *
 * AICc per resample from its SSE, the plots per resample (`draws.n`) and the
 * coefficients of the site's fit of each model (`ModelDraws.parameterCount`:
 * curve parameters plus block offsets, k = p + 1 with the variance), through the
 * one formula of shared/models/aicc, so the resample's numbers are the site's
 * own AICc when a resample repeats the site's plots.
 *
 * A full response by the lowest non-zero rate is one of the rule's answers (a curve
 * with status "full-response-at-lowest-rate" that fits best among the curves), so a
 * resample that the rule hands to it counts at the second-lowest rate
 * (countedOptimum), as the site's own recommendation would.
 *
 * The choice depends on the fits only, not on prices, so it is made once per set of
 * draws and kept (a price change re-prices the chosen draws and nothing else).
 */
import { aiccFromSse } from '../models/aicc';
import { chooseModel, ruleWeights, type ModelCandidate } from '../models/chooseModel';
import type { ModelName } from '../models/modelTypes';
import { drawStatus, type BootstrapDraws } from './bootstrapDraws';

/**
 * How a site's resamples are decided: "model-reselected", by the site's own rule in every
 * resample (drawChoices), or "fixed-model", by one model throughout (the analyst's pick).
 */
export type IntervalBasis = 'model-reselected' | 'fixed-model';

/** The deciding model of every resample of one site, and the rule's weights. */
export interface DrawChoices {
  /** The drawn models, in the draws' order. */
  models: ModelName[];
  /** Per resample: index into `models` of the model that decides it, or −1 for none. */
  decisive: Int8Array;
  /**
   * Per resample, the Akaike weight of each drawn model among the rule's candidates
   * (shared/models/chooseModel ruleWeights), resample-major: resample b's weight of model i is
   * weights[b × models.length + i]. A resample's weights sum to 1, or to 0 when no fit gives a
   * usable answer.
   */
  weights: Float64Array;
}

const cache = new WeakMap<BootstrapDraws, DrawChoices>();

/**
 * The deciding model of each resample, by the rule in the file header.
 * @param draws - a site's bootstrap draws (drawBootstrapEstimates)
 * @returns per resample, which drawn model decides it (−1: no fit gives a usable answer)
 * @example
 * const c = drawChoices(draws);
 * c.models[c.decisive[0]] // e.g. 'quadraticPlateau'
 */
export function drawChoices(draws: BootstrapDraws): DrawChoices {
  const known = cache.get(draws);
  if (known) return known;
  const models = Object.keys(draws.models) as ModelName[];
  const all = models.map((m) => draws.models[m]!);
  const decisive = new Int8Array(draws.resamples);
  const weights = new Float64Array(draws.resamples * models.length);
  const row = new Float64Array(models.length);
  const candidates: ModelCandidate[] = models.map((model) => ({ model, status: 'ok', aicc: NaN }));
  for (let b = 0; b < draws.resamples; b++) {
    for (let i = 0; i < all.length; i++) {
      const c = candidates[i];
      c.status = drawStatus(all[i], b);
      c.aicc = aiccFromSse(all[i].sse[b], draws.n, all[i].parameterCount);
    }
    const chosen = chooseModel(candidates);
    const pick = chosen === null ? -1 : models.indexOf(chosen);
    decisive[b] = pick;
    ruleWeights(candidates, row);
    weights.set(row, b * models.length);
  }
  const out = { models, decisive, weights };
  cache.set(draws, out);
  return out;
}

/**
 * The deciding models of each resample for a basis: the rule's candidates in every resample
 * with their weights ("model-reselected", drawChoices) or one model throughout, weight 1
 * ("fixed-model"). The interval
 * (optimumInterval) and the shortfall risk (shortfallRisk) read the resamples through this one
 * function, so both speak of the same resamples.
 * @param draws - a site's bootstrap draws
 * @param model - the model of "fixed-model" (the analyst's pick); ignored otherwise
 * @param basis - "model-reselected" or "fixed-model"
 * @returns per resample, which model decides it; null when "fixed-model" names a model that was
 *   not drawn, or no model was drawn at all
 * @example
 * decidingModels(draws, 'quadratic', 'fixed-model')!.decisive[0] // 0: the quadratic decides
 */
export function decidingModels(
  draws: BootstrapDraws,
  model: ModelName,
  basis: IntervalBasis,
): DrawChoices | null {
  if (basis === 'fixed-model') {
    return draws.models[model]
      ? {
          models: [model],
          decisive: new Int8Array(draws.resamples),
          weights: new Float64Array(draws.resamples).fill(1),
        }
      : null;
  }
  return Object.keys(draws.models).length === 0 ? null : drawChoices(draws);
}
