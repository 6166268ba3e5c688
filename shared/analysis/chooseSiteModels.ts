/**
 * The across-site result with the user's model at some sites, without
 * refitting: only the regional rates (whole set and groups) are rebuilt from
 * the stored fits, because "best" now means the user's model at those sites
 * (leadingModel). The fits, rows and tests do not depend on the choice.
 */
import type { ModelName } from '../models/modelTypes';
import type { AcrossSiteAnalysis } from './acrossSites';
import { regionalAnalysis } from './regionalAnalysis';

function sameChoices(
  a: Readonly<Record<string, ModelName>>,
  b: Readonly<Record<string, ModelName>>,
): boolean {
  const keys = Object.keys(a);
  return keys.length === Object.keys(b).length && keys.every((k) => a[k] === b[k]);
}

/**
 * The same analysis with other per-site model choices.
 * @param analysis - from analyzeAcrossSites (or an earlier chooseSiteModels)
 * @param siteModels - site → the model the user picked; an empty record means every site's
 *   recommendation model
 * @returns the analysis itself when the choices are unchanged, else a new one whose regional
 *   rates use the chosen models (at the analysis' prices; repriceAcrossSites follows prices)
 * @example
 * const mine = chooseSiteModels(a, { 'North field': 'quadratic' });
 * mine.regional.sitesUsed.find((u) => u.site === 'North field')?.model // 'quadratic'
 */
export function chooseSiteModels(
  analysis: AcrossSiteAnalysis,
  siteModels: Readonly<Record<string, ModelName>>,
): AcrossSiteAnalysis {
  if (sameChoices(analysis.options.siteModels, siteModels)) return analysis;
  const options = { ...analysis.options, siteModels: { ...siteModels } };
  const bySite = new Map(analysis.sites.map((s) => [s.site, s]));
  return {
    ...analysis,
    options,
    regional: regionalAnalysis(analysis.sites, options),
    groups: analysis.groups.map((g) => ({
      ...g,
      values: g.values.map((v) => ({
        ...v,
        regional: regionalAnalysis(
          v.sites.flatMap((name) => bySite.get(name) ?? []),
          options,
        ),
      })),
    })),
  };
}
