/**
 * The whole across-site analysis of a plot table in one call: every site fitted
 * with every model (shared/models), the side-by-side rows, the tests of whether
 * the sites share one response, the regional rate by maximum return to N, the
 * share of sites that responded, and the same per group (previous crop, soil,
 * year) with tests of whether the groups differ. Everything that depends on
 * prices is kept apart so that repriceAcrossSites() can follow a price slider
 * without refitting.
 * The result is plain data (fits are stored without `predict`; curves are
 * evaluated with curveValue from the parameters), so a worker can post it with
 * structuredClone.
 *
 * This is the one place where sites are fitted and their models ranked: the
 * report (shared/report/analyzeTrials) builds on this result, and each site's
 * recommendation model comes from recommendationModel, so the report and the
 * regional return ('best') speak of the same curve.
 *
 * No site is dropped silently: a site with nothing to fit keeps its rows (status
 * "not-fitted" and the reason), and every test or average that leaves a site out
 * lists it with the reason.
 *
 * "Responded" means (analyzeSite sets it, responseShare counts it): the site's rate effect (one-way ANOVA of yield
 * on rate as a factor, with blocks when present; siteRateEffect) is significant
 * at alpha (default 0.05). It needs no curve, so it does not depend on which
 * model wins. Sites where it cannot be tested are counted apart, not as "no".
 *
 * The steps live in their own files, in the order they run: planAcrossSites (options, defaults,
 * checks), analyzeSite (one site), acrossSites (siteModelRows, sharedResponse, regionalAnalysis,
 * responseShare, groupAnalysis). This file is the one-call form and re-exports the steps and
 * their types, so callers can keep importing them from here.
 */
import type { PlotTable } from '../table/plotTable';
import { acrossSites, type AcrossSiteAnalysis } from './acrossSites';
import { analyzeSite } from './analyzeSite';
import { planAcrossSites, type AcrossSiteOptions } from './planAcrossSites';
import type { SitePlots } from './sitePlots';

export { acrossSites, type AcrossSiteAnalysis } from './acrossSites';
export {
  analyzeSite,
  type AllModelsFitData,
  type FitData,
  type InterceptOutcome,
  type SiteAnalysis,
} from './analyzeSite';
export type { GroupAnalysis, GroupValueAnalysis } from './groupAnalysis';
export {
  planAcrossSites,
  type AcrossSiteOptions,
  type AcrossSitePlan,
  type AcrossSiteSettings,
  type RegionalModelChoice,
} from './planAcrossSites';
export { PLATEAU_MODELS, type PlateauModel } from './plateauModels';
export { regionalAnalysis, type RegionalAnalysis } from './regionalAnalysis';
export type { ResponseShare } from './responseShare';
export type { SharedResponseTests } from './sharedResponse';
export { siteModelRows } from './siteModelRows';

/**
 * The across-site analysis of a plot table, in one call (planAcrossSites, analyzeSite for
 * every site, acrossSites).
 * @param source - a plot table (rates and yields in kg/ha), or its sites from sitePlots()
 * @param options - prices (currency/kg; application cost currency/ha), block terms, regional
 *   model choice, the user's site models, grid (kg/ha), profitable band (currency/ha), alpha,
 *   level terms, group columns
 * @returns sites, side-by-side rows, shared-response tests, regional rate, response share, groups
 * @throws {StatsInputError} "bad-argument" for a price that is not positive (shared/economics)
 * @throws {SitesInputError} "bad-grid" for a bad grid; "bad-argument" for alpha outside (0, 1) or a negative band
 * @example
 * const a = analyzeAcrossSites(table, { prices: { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 } });
 * a.regional.regional.bestRateKgHa   // e.g. 168
 * a.regional.text.cautions           // always shown with the rate
 */
export function analyzeAcrossSites(
  source: PlotTable | readonly SitePlots[],
  options: AcrossSiteOptions,
): AcrossSiteAnalysis {
  const plan = planAcrossSites(source, options);
  return acrossSites(
    plan,
    plan.plots.map((p, i) => analyzeSite(p, plan.options, i)),
  );
}
