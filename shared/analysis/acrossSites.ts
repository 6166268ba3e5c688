/**
 * The across step of the analysis: from every site's analysis (analyzeSite) to what needs
 * them all together: the side-by-side rows, the tests of a shared response, the regional rate,
 * the share of sites that responded, the same per group of sites, and the years of each site
 * seen in several years compared.
 */
import type { SiteAnalysis } from './analyzeSite';
import { groupAnalysis, type GroupAnalysis } from './groupAnalysis';
import { mixedModelAcrossSites } from './mixedModelAcrossSites';
import { plateauMixedModelsAcrossSites } from './plateauMixedModelsAcrossSites';
import type { SitePlots } from './sitePlots';
import type { AcrossSitePlan, AcrossSiteSettings } from './planAcrossSites';
import { regionalAnalysis, type RegionalAnalysis } from './regionalAnalysis';
import type { NoRegionalMixedModel, RegionalMixedModel } from './regionalMixedModel';
import {
  PLATEAU_MIXED_FORMS,
  type NoRegionalPlateauMixedModel,
  type RegionalPlateauMixedModel,
} from './regionalPlateauMixedModel';
import { responseShare, type ResponseShare } from './responseShare';
import { sharedResponse, type SharedResponseTests } from './sharedResponse';
import { siteModelRows, type SiteModelRow } from './siteModelRows';
import { SitesInputError } from './sitesInputError';
import { yearsCompared, type YearComparison } from './yearsCompared';

export interface AcrossSiteAnalysis {
  options: AcrossSiteSettings;
  sites: SiteAnalysis[];
  /** Group columns not analyzed by default, with the reason. */
  groupKeysSkipped: { key: string; reason: string }[];
  /** One row per site and model, at the current prices. */
  rows: SiteModelRow[];
  sharedResponse: SharedResponseTests;
  regional: RegionalAnalysis;
  /** The regional quadratic as a mixed model over the site-years (price-free), or why there is none. */
  mixed: RegionalMixedModel | NoRegionalMixedModel;
  /**
   * The quadratic-plateau and linear-plateau as mixed models over the same site-years (ML,
   * random plateau and join), in PLATEAU_MIXED_FORMS order, each fitted or why not.
   */
  plateauMixed: (RegionalPlateauMixedModel | NoRegionalPlateauMixedModel)[];
  response: ResponseShare;
  groups: GroupAnalysis[];
  /** Each site seen in several years: does its response differ by year? Empty otherwise. */
  yearsCompared: YearComparison[];
}

/**
 * What the regional mixed models and the group comparisons say in a preview (acrossSitesPreview),
 * before they are fitted.
 */
export const PENDING_REASON = 'Still being fitted: the regional models follow the sites.';

/**
 * The across step: from the sites' analyses (analyzeSite, in the plan's order) to the rows,
 * the shared-response tests, the regional rate, the response share and the groups.
 * @param plan - from planAcrossSites
 * @param sites - analyzeSite of each of plan.plots, same order
 * @returns the whole analysis, as analyzeAcrossSites
 * @throws {SitesInputError} "bad-argument" when the sites do not match the plan's plots
 * @example
 * acrossSites(plan, plan.plots.map((p) => analyzeSite(p, plan.options))).response.share // e.g. 0.75
 */
export function acrossSites(
  plan: AcrossSitePlan,
  sites: readonly SiteAnalysis[],
): AcrossSiteAnalysis {
  const preview = acrossSitesPreview(plan, sites);
  return { ...preview, ...regionalModelsAcross(plan, preview) };
}

/**
 * The across step's quick part, for a window that shows each site's result before the rest:
 * the rows, the shared-response tests, the regional rate, the response share and the years
 * compared. The regional mixed models and the group comparisons, most of the step's time (on
 * the demo's six site-years 0.25 of the step's 0.3 s, first run in Node), are left pending: each
 * says PENDING_REASON, and groups is empty. regionalModelsAcross fits them.
 * @param plan - from planAcrossSites
 * @param sites - analyzeSite of each of plan.plots, same order
 * @returns the analysis with the regional mixed models and groups pending
 * @throws {SitesInputError} "bad-argument" when the sites do not match the plan's plots
 */
export function acrossSitesPreview(
  plan: AcrossSitePlan,
  sites: readonly SiteAnalysis[],
): AcrossSiteAnalysis {
  const { plots, options: o, groupKeysSkipped } = plan;
  if (sites.length !== plots.length || sites.some((s, i) => s.site !== plots[i].site)) {
    throw new SitesInputError(
      'bad-argument',
      `sites must be the analyses of the plan's ${plots.length} site(s), in the plan's order.`,
    );
  }
  const analyses = new Map(sites.map((s) => [s.site, s]));
  const checked = checkedPlots(plan, sites);
  return {
    options: o,
    sites: [...sites],
    groupKeysSkipped,
    rows: sites.flatMap((s) => siteModelRows(s, o.prices)),
    sharedResponse: sharedResponse(checked, analyses, o),
    regional: regionalAnalysis(sites, o),
    response: responseShare(sites),
    mixed: { model: null, reason: PENDING_REASON },
    plateauMixed: PLATEAU_MIXED_FORMS.map((form) => ({
      model: null,
      form,
      reason: PENDING_REASON,
    })),
    groups: [],
    yearsCompared: yearsCompared(checked, analyses, o),
  };
}

/** The parts of the across step a preview leaves pending. */
export type AcrossRegionalModels = Pick<AcrossSiteAnalysis, 'mixed' | 'plateauMixed' | 'groups'>;

/**
 * The across step's slow part: the regional mixed models and the group comparisons of the
 * preview's sites; the whole analysis is the preview with these laid over it.
 * @param plan - the plan the preview was made from
 * @param preview - acrossSitesPreview(plan, sites)
 * @returns the parts the preview left pending
 */
export function regionalModelsAcross(
  plan: AcrossSitePlan,
  preview: AcrossSiteAnalysis,
): AcrossRegionalModels {
  const { sites, options: o } = preview;
  const analyses = new Map(sites.map((s) => [s.site, s]));
  const checked = checkedPlots(plan, sites);
  return {
    mixed: mixedModelAcrossSites(checked, sites),
    plateauMixed: plateauMixedModelsAcrossSites(checked, sites),
    groups: o.groupKeys.map((k) => groupAnalysis(k, checked, analyses, o, preview)),
  };
}

/** The plan's plots, a site the models refused (e.g. a negative rate) carrying that reason into every pooled test. */
function checkedPlots(plan: AcrossSitePlan, sites: readonly SiteAnalysis[]): SitePlots[] {
  return plan.plots.map((p, i) =>
    sites[i].problem && !p.problem ? { ...p, problem: sites[i].problem } : p,
  );
}
