/**
 * The model that leads a site: the user's choice when the site has a fit of
 * that model, else the site's recommendation model (recommendationModel). The
 * screen, the report and the regional return with "best" all take a site's
 * model from here, so they speak of the same curve.
 */
import type { ModelName } from '../models/modelTypes';
import type { SiteAnalysis } from './analyzeSite';

/**
 * The leading model of one site.
 * @param site - the site's analysis (analyzeSite or analyzeAcrossSites)
 * @param siteModels - site → the model the user picked (may be empty)
 * @returns the picked model when it was fitted, else the recommendation model, or null
 * @example
 * leadingModel(a.sites[0], {})                        // a.sites[0].recommended.model
 * leadingModel(a.sites[0], { [a.sites[0].site]: 'quadratic' }) // 'quadratic'
 */
export function leadingModel(
  site: Pick<SiteAnalysis, 'site' | 'fits' | 'recommended'>,
  siteModels: Readonly<Record<string, ModelName>>,
): ModelName | null {
  const picked = Object.hasOwn(siteModels, site.site) ? siteModels[site.site] : undefined;
  if (picked && site.fits?.fits[picked]) return picked;
  return site.recommended.model;
}
