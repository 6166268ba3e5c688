/**
 * The first step of the across-site analysis: the options a caller may give, their defaults,
 * and the checks made once before any fitting (prices, alpha, band, rate grid). It also
 * decides which group columns are analyzed by default: only those that are a property of the
 * site (one value across its plots).
 */
import { assertPrices, type Prices } from '../economics/priceRatio';
import { assertTolerance } from '../economics/shortfallRule';
import type { BlockTerms, ModelName } from '../models/modelTypes';
import { ANALYSIS_DEFAULTS } from './analysisSettings';
import type { PlotTable } from '../table/plotTable';
import type { LevelTerms } from './commonResponseTests';
import { rateGrid } from './rateGrid';
import { sitePlots, type SitePlots } from './sitePlots';
import { SitesInputError } from './sitesInputError';

/**
 * Which curve each site contributes to the regional return: "best" is the site's
 * recommendation model (recommendationModel: the lowest-AICc curve with a usable
 * rate, else a straight line), the same model the report recommends from; or
 * one model for all sites.
 */
export type RegionalModelChoice = 'best' | ModelName;

export interface AcrossSiteOptions {
  /** Grain and nutrient prices (currency/kg) and optional application cost (currency/ha). */
  prices: Prices;
  /** Block terms in the site fits: "auto" (default) uses fixed blocks where every plot has a label. */
  blocks?: 'auto' | BlockTerms;
  /** Default "best" (each site's recommendation model, see recommendationModel). */
  regionalModel?: RegionalModelChoice;
  /**
   * The user's model per site, used instead of the site's recommendation model wherever "best"
   * applies (a model the site has no fit of is ignored); default none. See leadingModel.
   */
  siteModels?: Readonly<Record<string, ModelName>>;
  /** Points on each fitted curve kept for charts; default that of shared/models (61). */
  curvePoints?: number;
  /**
   * Bootstrap resamples kept per site for the optimum's interval (drawBootstrapEstimates);
   * default 0, none. analyzeTrial passes the run's count (ANALYSIS_DEFAULTS: 200).
   */
  resamples?: number;
  /** Seed of the run (bootstrapSeed derives each site's); default 1. */
  seed?: number;
  /**
   * Level of the joins' profile intervals (shared/models/joinProfile), made with the fits so
   * they sit beside the optimum's bootstrap interval at the same level; default
   * ANALYSIS_DEFAULTS.intervalLevel (0.9).
   */
  intervalLevel?: number;
  /** Grid spacing, kg/ha; default 1 (1 lb/ac is 1.120851 kg/ha). */
  gridStepKgHa?: number;
  /** Grid start, kg/ha; default 0. */
  gridFromKgHa?: number;
  /** Grid end, kg/ha; default the lowest of the sites' highest tested rates (no curve extrapolated). */
  gridToKgHa?: number;
  /**
   * The user's tolerance, currency/ha: a rate returning less than the best by more than this
   * falls short (the risk tables), and the rates within it of the best regional return are the
   * profitable range; default null: the cost of 10 kg N/ha at the prices in force
   * (defaultShortfallTolerancePerHa).
   */
  shortfallTolerancePerHa?: number | null;
  /** Significance level of every test and of "responded", default 0.05. */
  alpha?: number;
  /** Level terms of the common-response tests, default "site". */
  levels?: LevelTerms;
  /**
   * Group columns to analyze (Plot.groups keys, or "year"). Default: every column that is a
   * property of the site, i.e. whose value never differs between the plots of one site; a
   * column that varies within sites (a treatment attribute such as source or timing) is
   * listed in `groupKeysSkipped` with the reason.
   */
  groupKeys?: readonly string[];
  /**
   * Treatment-factor columns (PlotTable.factorKeys): they split a site into levels
   * (analyzeLevels), so they are neither groups nor listed as skipped.
   */
  factorKeys?: readonly string[];
}

/** The options of an analysis with every default filled in. */
export type AcrossSiteSettings = Required<
  Omit<AcrossSiteOptions, 'gridToKgHa' | 'groupKeys' | 'curvePoints' | 'factorKeys'>
> & {
  gridToKgHa: number | null;
  groupKeys: readonly string[];
  curvePoints?: number;
};

/** What the per-site and across steps share: the sites' plots and the settings with defaults. */
export interface AcrossSitePlan {
  plots: readonly SitePlots[];
  options: AcrossSiteSettings;
  groupKeysSkipped: { key: string; reason: string }[];
}

/**
 * Checks the options and lays out the analysis, before any fitting: the first of the three
 * steps analyzeAcrossSites() takes in one call (planAcrossSites, analyzeSite per site,
 * acrossSites), for a caller that reports progress per site or can stop between sites.
 * @param source - a plot table (rates and yields in kg/ha), or its sites from sitePlots()
 * @param options - as analyzeAcrossSites
 * @returns the sites' plots, the settings with every default, the group columns left out
 * @throws {StatsInputError} "bad-argument" for a price that is not positive (shared/economics)
 * @throws {SitesInputError} "bad-grid" for a bad grid; "bad-argument" for alpha outside (0, 1) or a negative band
 * @example
 * const plan = planAcrossSites(table, { prices });
 * const sites = plan.plots.map((p) => analyzeSite(p, plan.options));
 * acrossSites(plan, sites).regional.regional.bestRateKgHa // as analyzeAcrossSites(table, { prices })
 */
export function planAcrossSites(
  source: PlotTable | readonly SitePlots[],
  options: AcrossSiteOptions,
): AcrossSitePlan {
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) {
    throw new SitesInputError(
      'bad-argument',
      `alpha is ${alpha}; it must lie strictly between 0 and 1.`,
    );
  }
  const intervalLevel = options.intervalLevel ?? ANALYSIS_DEFAULTS.intervalLevel;
  if (!(intervalLevel > 0 && intervalLevel < 1)) {
    throw new SitesInputError(
      'bad-argument',
      `intervalLevel is ${intervalLevel}; it must lie strictly between 0 and 1.`,
    );
  }
  const plots = Array.isArray(source)
    ? (source as readonly SitePlots[])
    : sitePlots(source as PlotTable);
  const keys = new Set<string>();
  for (const p of plots) for (const k of Object.keys(p.groups)) keys.add(k);
  for (const k of options.factorKeys ?? []) keys.delete(k);
  // sitePlots maps a column that differs within a site to null for that site.
  const groupKeysSkipped = options.groupKeys
    ? []
    : [...keys]
        .filter((k) => plots.some((p) => k in p.groups && p.groups[k] === null))
        .map((key) => ({
          key,
          reason: `its value differs between the plots of ${plots.filter((p) => key in p.groups && p.groups[key] === null).length} site(s), so it is not a property of the site`,
        }));
  const skipped = new Set(groupKeysSkipped.map((k) => k.key));
  const o: AcrossSiteSettings = {
    prices: { ...options.prices },
    blocks: options.blocks ?? 'auto',
    regionalModel: options.regionalModel ?? 'best',
    siteModels: { ...options.siteModels },
    curvePoints: options.curvePoints,
    resamples: options.resamples ?? 0,
    seed: options.seed ?? 1,
    intervalLevel,
    gridStepKgHa: options.gridStepKgHa ?? 1,
    gridFromKgHa: options.gridFromKgHa ?? 0,
    gridToKgHa: options.gridToKgHa ?? null,
    shortfallTolerancePerHa: options.shortfallTolerancePerHa ?? null,
    alpha,
    levels: options.levels ?? 'site',
    groupKeys: options.groupKeys ?? [...keys].filter((k) => !skipped.has(k)),
  };
  // Check prices, tolerance and grid once, before any fitting.
  assertPrices(o.prices);
  if (o.shortfallTolerancePerHa !== null) assertTolerance(o.shortfallTolerancePerHa);
  rateGrid(o.gridFromKgHa, o.gridToKgHa ?? o.gridFromKgHa, o.gridStepKgHa);
  return { plots, options: o, groupKeysSkipped };
}
