/**
 * Which curve each site brings to the regional return, and why a site brings none. A curve that
 * never levels off within the tested rates is replaced by its limit curve rather than dropped.
 * With "best", each site's decision (siteDecision) shapes its gain: a site that showed no
 * response brings a flat gain (zero at every rate), a full response by the lowest non-zero
 * rate a step at the second-lowest rate (siteGainCurve).
 */
import { MODEL_CURVES, modelLabelInText } from '../models/curves';
import { curveValue } from '../models/curveValue';
import type { ModelName } from '../models/modelTypes';
import type { FitData, SiteAnalysis } from './analyzeSite';
import type { SiteLeftOut } from './commonResponseTests';
import { siteDecision, siteGainCurve, type RecommendationBasis } from './siteDecision';
import type { RegionalModelChoice } from './planAcrossSites';

/** One site's curve in the regional return: the model, its fit and what to say about it. */
export interface RegionalCurve {
  site: string;
  model: ModelName;
  fit: FitData;
  note: string;
  /** The site's gain over its check at a rate, kg/ha → kg/ha (siteGainCurve). */
  gainKgHa: (rateKgHa: number) => number;
}

/** True when the fit's parameters give a finite curve over its tested rates. */
function gives(fit: FitData): boolean {
  return (
    Number.isFinite(curveValue(fit.model, fit.params, 0)) &&
    Number.isFinite(curveValue(fit.model, fit.params, fit.testedRates.highestKgHa))
  );
}

/**
 * Each site's gain curve for the regional return, or why it has none.
 * @param sites - the sites' analyses (analyzeSite)
 * @param choice - "best" (each site's leading model) or one model for all sites
 * @param siteModels - the user's model per site, used where "best" applies
 * @returns the curves used, with notes, and the sites left out with the reason
 * @example
 * regionalCurves(sites, 'best', {}).leftOut // [{ site: 'B', reason: '…' }]
 */
export function regionalCurves(
  sites: readonly SiteAnalysis[],
  choice: RegionalModelChoice,
  siteModels: Readonly<Record<string, ModelName>>,
): { used: RegionalCurve[]; leftOut: SiteLeftOut[] } {
  const used: RegionalCurve[] = [];
  const leftOut: SiteLeftOut[] = [];
  for (const s of sites) {
    if (!s.fits) {
      leftOut.push({ site: s.site, reason: s.problem ?? 'not fitted' });
      continue;
    }
    const decision = choice === 'best' ? siteDecision(s, siteModels) : null;
    const model: ModelName | null = choice === 'best' ? decision!.model : choice;
    const basis: RecommendationBasis | null = decision?.basis ?? null;
    if (!model) {
      const reasons = [...new Set(s.fits.ranking.map((r) => r.reason).filter((r) => r))].join(' ');
      leftOut.push({ site: s.site, reason: `${s.recommended.reason}. ${reasons}`.trim() });
      continue;
    }
    const notes: string[] = [];
    let fit = s.fits.fits[model];
    // A rise that never levels off within the tested rates is its limit curve
    // (DESIGN.md: the straight line, or the quadratic for the quadratic-plateau);
    // use that rather than drop a strongly responding site from the average.
    const limit = MODEL_CURVES[model].limit;
    if (fit.status === 'no-plateau' && !gives(fit) && limit && gives(s.fits.fits[limit])) {
      notes.push(
        `the ${modelLabelInText(model)} reached no plateau, so its limit, the ${modelLabelInText(limit)}, is used`,
      );
      fit = s.fits.fits[limit];
    }
    const stepOrFlat =
      basis === 'no-response' ||
      (fit.status === 'full-response-at-lowest-rate' && fit.curve.yieldKgHa.length > 0);
    if (fit.status === 'too-few-rates' || (!stepOrFlat && !gives(fit))) {
      leftOut.push({
        site: s.site,
        reason: `the ${modelLabelInText(model)} gives no curve here: ${fit.message}`,
      });
      continue;
    }
    if (fit.testedRates.lowestKgHa > 0) {
      notes.push(
        `no plot at rate 0: the check is the ${modelLabelInText(model)}'s value at 0, below the lowest tested rate`,
      );
    }
    if (basis === 'no-response') {
      notes.push('no yield response to N (rate effect not significant): a flat gain');
    } else if (fit.status === 'full-response-at-lowest-rate' && fit.joinBetweenKgHa) {
      // DESIGN.md, identifiability: any join in the first interval fits equally well, so the
      // dearest case stands in: the whole gain from the second-lowest rate on.
      const [lo, hi] = fit.joinBetweenKgHa;
      notes.push(
        `full response by the lowest non-zero rate: the curve between ${lo} and ${hi} kg/ha is not fixed by the data, so its gain enters as a step at ${hi} kg/ha`,
      );
    }
    const note = notes.join('; ');
    used.push({ site: s.site, model: fit.model, fit, note, gainKgHa: siteGainCurve(fit, basis) });
  }
  return { used, leftOut };
}
