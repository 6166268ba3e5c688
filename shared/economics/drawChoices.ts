/**
 * Which model decides each bootstrap resample: the site's own model choice
 * (shared/models/chooseModel: lowest AICc among the curves with status "ok", a
 * straight line only when no curve is left) repeated inside every resample, so
 * the optimum's interval carries the uncertainty of the model choice too
 * (the model-selection bootstrap: Buckland, Burnham & Augustin, Biometrics 53,
 * 1997, 603–618; Efron, JASA 109, 2014, 991–1007).
 *
 * AICc per resample from its SSE, the plots per resample (`draws.n`) and the
 * coefficients of the site's fit of each model (`ModelDraws.parameterCount`:
 * curve parameters plus block offsets, k = p + 1 with the variance), through the
 * one formula of shared/models/aicc, so the resample's numbers are the site's
 * own AICc when a resample repeats the site's plots.
 *
 * One addition to the rule, for resamples where no curve has an optimum: when a
 * curve says the whole response came by the lowest non-zero rate ("full response",
 * check against the rest) and fits better by AICc than the straight line the rule
 * would fall back to (or no line is left), that curve decides the resample, because
 * a line through a step would put the optimum at the highest rate. The optimum of
 * such a resample is counted at the second-lowest rate (countedOptimum).
 *
 * The choice depends on the fits only, not on prices, so it is made once per set of
 * draws and kept (a price change re-prices the chosen draws and nothing else).
 */
import { aiccFromSse } from '../models/aicc';
import { chooseModel, type ModelCandidate } from '../models/chooseModel';
import { MODEL_CURVES } from '../models/curves';
import type { ModelName } from '../models/modelTypes';
import { drawStatus, type BootstrapDraws } from './bootstrapDraws';

/** The deciding model of every resample of one site. */
export interface DrawChoices {
  /** The drawn models, in the draws' order. */
  models: ModelName[];
  /** Per resample: index into `models` of the model that decides it, or −1 for none. */
  decisive: Int8Array;
}

const cache = new WeakMap<BootstrapDraws, DrawChoices>();

/**
 * The deciding model of each resample, by the rule in the file header.
 * @param draws - a site's bootstrap draws (drawBootstrapEstimates)
 * @returns per resample, which drawn model decides it (−1: none has an optimum or a full response)
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
  const candidates: ModelCandidate[] = models.map((model) => ({ model, status: 'ok', aicc: NaN }));
  for (let b = 0; b < draws.resamples; b++) {
    for (let i = 0; i < all.length; i++) {
      const c = candidates[i];
      c.status = drawStatus(all[i], b);
      c.aicc = aiccFromSse(all[i].sse[b], draws.n, all[i].parameterCount);
    }
    const chosen = chooseModel(candidates);
    let pick = chosen === null ? -1 : models.indexOf(chosen);
    if (chosen === null || !MODEL_CURVES[chosen].isCurve) {
      // No curve has an optimum: a full response that beats the line decides.
      let limit = chosen === null ? Infinity : candidates[pick].aicc;
      for (let i = 0; i < candidates.length; i++) {
        const c = candidates[i];
        if (c.status === 'full-response-at-lowest-rate' && c.aicc < limit) {
          limit = c.aicc;
          pick = i;
        }
      }
    }
    decisive[b] = pick;
  }
  const out = { models, decisive };
  cache.set(draws, out);
  return out;
}
