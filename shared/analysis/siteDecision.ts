/**
 * What a site's recommendation rests on: the one owner of the decision that the priced view
 * (priceSite: optimum, interval, profitable range), the regional rate (regionalCurves), the
 * report, the grower page, the JSON and the screen all read. DESIGN.md, "Decisions are
 * statistics too":
 *
 * 1. Respond or not is a test: a site responds when the rate effect (the RCBD F of rate as a
 *    factor, siteRateEffect) is significant at the analysis' alpha (`SiteAnalysis.responded`).
 *    A site whose test was made and failed gets no N ("no-response"), whatever curve fits
 *    best; its curves and model table stay as they are. A site where the test could not be
 *    made (too few plots) is not called non-responding: the curves decide.
 * 2. Otherwise the model rule (recommendationModel / chooseModel) decides: a curve with an
 *    optimum ("curve"), a full response by the lowest non-zero rate ("full-response": the
 *    optimum lies at or below the second-lowest tested rate), or a straight line's corner
 *    when no curve levelled off ("no-plateau").
 * 3. An analyst's pick leads as picked (the analyst has fixed the model); its basis follows
 *    its fit's status, and the no-response rule does not override it.
 *
 * Each basis also fixes the site's gain curve in the regional rate (siteGainCurve): the fitted
 * curve; for a full response a step at the second-lowest rate (the plateau gain from that rate
 * on); for no response a flat gain (zero at every rate).
 */
import { curveValue } from '../models/curveValue';
import { MODEL_CURVES } from '../models/curves';
import type { ModelName } from '../models/modelTypes';
import type { FitData, SiteAnalysis } from './analyzeSite';
import { leadingModel } from './leadingModel';
export { fullResponseSentence, noResponseSentence } from '../economics/decisionSentences';

/** What a site's recommendation rests on (the JSON's `recommendation.basis`). */
export type RecommendationBasis = 'curve' | 'full-response' | 'no-response' | 'no-plateau';

/** The model that leads a site, why, and what the recommendation rests on. */
export interface SiteLead {
  model: ModelName | null;
  /** A phrase without a final stop ("lowest AICc of the curves …", "picked by the analyst …"). */
  reason: string;
  /** True when the analyst's pick leads instead of the rule's model. */
  picked: boolean;
  /** What the recommendation rests on; null without a leading model. */
  basis: RecommendationBasis | null;
}

/**
 * True when the site's rate effect was tested and is not significant at the analysis' alpha.
 * @param s - the site's analysis (rate effect and its verdict)
 * @returns true for a site that showed no response to N
 * @example
 * showedNoResponse(flatSite) // true when the RCBD F of rate has p ≥ alpha
 */
export function showedNoResponse(s: Pick<SiteAnalysis, 'rateEffect' | 'responded'>): boolean {
  return s.rateEffect.test.kind === 'f-test' && !s.responded;
}

/**
 * The site's lead and the basis of its recommendation, by the rule in the file header.
 * @param s - the site's analysis
 * @param choices - site → the analyst's model (may be empty)
 * @returns model, reason, whether picked, and basis
 * @example
 * siteDecision(flatSite, {}).basis // 'no-response'
 */
export function siteDecision(
  s: Pick<SiteAnalysis, 'site' | 'fits' | 'recommended' | 'rateEffect' | 'responded'>,
  choices: Readonly<Record<string, ModelName>>,
): SiteLead {
  const model = leadingModel(s, choices);
  const rec = s.recommended.model;
  const picked = model !== rec;
  const reason = !picked
    ? s.recommended.reason
    : `picked by the analyst instead of ${
        rec
          ? `the ${s.fits!.fits[rec].label.toLowerCase()} (${s.recommended.reason})`
          : `no model (${s.recommended.reason})`
      }`;
  const fit = model && s.fits ? s.fits.fits[model] : null;
  if (!model || !fit) return { model, reason, picked, basis: null };
  if (!picked && showedNoResponse(s)) return { model, reason, picked, basis: 'no-response' };
  const basis: RecommendationBasis =
    fit.status === 'full-response-at-lowest-rate'
      ? 'full-response'
      : MODEL_CURVES[model].isCurve && fit.status === 'ok'
        ? 'curve'
        : 'no-plateau';
  return { model, reason, picked, basis };
}

/**
 * The yield at the check and on the plateau of a full-response fit, kg/ha, from its drawn
 * curve (the data fix these two, not the slope or join, which the fit leaves blank).
 */
function fullResponseLevels(fit: FitData): { check: number; plateau: number } {
  const y = fit.curve.yieldKgHa;
  const check = curveValue(fit.model, fit.params, 0);
  return {
    check: Number.isFinite(check) ? check : y[0],
    plateau: y[y.length - 1],
  };
}

/**
 * The site's gain over its check (kg/ha) at any rate, as its decision fixes it: the fitted
 * curve's gain; a step at the second-lowest rate for a full response; zero for no response.
 * @param fit - the leading model's fit
 * @param basis - the site's basis (siteDecision)
 * @returns rate (kg/ha) → gain (kg/ha)
 * @example
 * siteGainCurve(fit, 'no-response')(120) // 0
 */
export function siteGainCurve(
  fit: FitData,
  basis: RecommendationBasis | null,
): (rateKgHa: number) => number {
  if (basis === 'no-response') return () => 0;
  if (fit.status === 'full-response-at-lowest-rate') {
    const { check, plateau } = fullResponseLevels(fit);
    const step = fit.joinBetweenKgHa?.[1] ?? fit.testedRates.distinctKgHa[1];
    const gain = plateau - check;
    return (x) => (x >= step ? gain : 0);
  }
  const at0 = curveValue(fit.model, fit.params, 0);
  return (x) => curveValue(fit.model, fit.params, x) - at0;
}
