/**
 * The one analysis run and its priced view, then its parts.
 *
 * ```ts
 * analyzeTrial(table: PlotTable, settings: AnalysisSettings, onSite?): TrialAnalysis
 *   settings = analysisSettings({ prices, blocks?: 'auto' | 'none', resamples?: 200, seed?: 1,
 *                                 intervalLevel?: 0.9, siteModels?: {} })   // ANALYSIS_DEFAULTS
 *   result   = { settings, crop, table, plots: SitePlots[], findings: QualityFinding[],
 *                across: AcrossSiteAnalysis }   // sites carry anova, treatmentMeans and draws too
 * analyzeTrialSteps(table, settings)          // the same as a generator: sites fitted, preview,
 *                                             // draws wanted, sites resampled, draws (withDraws
 *                                             // lays them in)
 * analyzeTrialDrawnBy(table, settings, drawSites, onSite?): Promise<TrialAnalysis>
 *                                             // the same, the draws made by drawSites(jobs)
 *                                             // (the command line's threads: same draws)
 * priceTrial(analysis, prices, picks, { shortfallTolerancePerHa?: null }): PricedTrial
 *   = { prices, shortfallTolerance { perHa, isDefault }, choices,
 *       across (rows, regional rate at these prices and picks),
 *       sites: { site, lead { model, reason, picked }, optimum, interval, profitableRangeKgHa,
 *                acrossModels, priceRatioSensitivity { ratioMultiplier, priceRatio, rateKgHa,
 *                intervalKgHa }[], shortfallRisk { tolerancePerHa, count, rows { rateKgHa,
 *                share }[] } }[] }           // no refit, no new bootstrap
 * ```
 *
 * Across sites: every site fitted with every model side by side, tests of
 * whether the sites share one response, the regional rate by maximum return to
 * N (Sawyer et al., 2006), the share of sites that responded, and the same per
 * group (previous crop, soil, year). Rates and yields in kg/ha, prices in one
 * currency per kg (shared/economics Prices), returns in currency/ha.
 *
 * ```ts
 * analyzeAcrossSites(source: PlotTable | SitePlots[], options: AcrossSiteOptions): AcrossSiteAnalysis
 *   options = { prices: { grainPricePerKg, nutrientPricePerKg, applicationCostPerHa? },
 *               blocks?: 'auto' | 'none' | 'fixed',        // 'auto': fixed where every plot has a block
 *               regionalModel?: 'best' | ModelName,         // each site's recommendationModel, or one model for all
 *               curvePoints?: 61,                           // points kept on each fitted curve
 *               gridStepKgHa?: 1, gridFromKgHa?: 0, gridToKgHa?: lowest of the sites' highest rates,
 *               shortfallTolerancePerHa?: null (the cost of 10 kg N/ha at the prices; also the
 *                 profitable range's band below the best return),
 *               alpha?: 0.05, levels?: 'site' | 'blockWithinSite', groupKeys?: every site-level Plot.groups key + 'year' }
 *   result  = { sites: SiteAnalysis[]          // one per site: fits (AllModelsFitData), recommended
 *                                              //   (recommendationModel), rateEffect, responded,
 *                                              //   intercept, correlation, responseOverCheck
 *                                              //   (slope over each block's check, bias test),
 *                                              //   groups, or the problem
 *               groupKeysSkipped: { key, reason }[]  // columns varying within a site (treatment attributes)
 *               rows: SiteModelRow[]           // site × model: optimum, yield at optimum, plateau,
 *                                              //   AICc rank/winner, intercept p, CV%, rate-effect p
 *               sharedResponse: { linear, proportional, quadratic: CommonResponseTests,
 *                                 plateau: { linearPlateau, quadraticPlateau, exponential: PooledCurveTest } }
 *               regional: { regional: RegionalReturn, text: { sentence, cautions }, sitesUsed: { site, model,
 *                           note }[], sitesLeftOut, gridNote, prepared, atTestedRates,
 *                           priceRatioSensitivity { ratioMultiplier, priceRatio, rateKgHa,
 *                           profitableRangeKgHa }[], shortfallRisk (share of sites short) }
 *               response: { definition, responded, assessed, share, notAssessed }
 *               groups: { key, values: [{ value, sites, regional, response, sharedResponse }],
 *                         sitesWithoutValue, differ: { linear, quadratic, plateau } }[] }
 * repriceAcrossSites(analysis, prices, { rows?: true, shortfallTolerancePerHa? }): AcrossSiteAnalysis
 *   // no refit; rows: false re-prices only the regional curves (about 2 ms at 500 sites)
 * sortSiteRows(rows, key: SiteRowKey, 'asc' | 'desc'): SiteModelRow[]       // stable, empty values last
 * filterSiteRows(rows, { sites?, models?, statuses?, aiccWinnersOnly?, responded?, group?, siteContains?,
 *                        optimumBetweenKgHa? }): SiteModelRow[]
 * ```
 *
 * Every test is { result: { kind: 'f-test', df1, df2, f, p, extraSse } | { kind: 'no-test', reason },
 * sentence } and lists the sites it left out with the reason. RegionalReturn holds the mean
 * return curve (gridKgHa, meanReturnPerHa), bestRateKgHa, profitableRange { lowKgHa, highKgHa,
 * bandPerHa (the tolerance in force), contiguous }, siteOptima and siteOptimumDistribution (min, quartiles, median, max).
 * Show `regional.text.cautions` wherever the regional rate is shown. "Responded" = the site's rate
 * effect (yield on rate as a factor, with blocks) is significant at alpha. With one model for all
 * sites, a site where that model reaches no plateau enters the regional mean through its limit
 * curve, with a note ('best' never picks such a fit: recommendationModel wants a usable rate).
 * The analysis is plain data (fits without `predict`, see FitData): a worker can post it, and
 * the window can call repriceAcrossSites on the copy.
 *
 * In steps, for progress per site: planAcrossSites(source, options) → analyzeSite(plot, plan.options)
 * for each plan.plots[i] → acrossSites(plan, sites); analyzeAcrossSites is the one-call form.
 * chooseSiteModels(analysis, { site: model }) rebuilds the regional rates with the user's model at
 * those sites (no refit); leadingModel(site, choices) is that model, else the recommendation model.
 *
 * recommendationModel(fits): { model, reason }  // the one "chosen model" of a site: the lowest-AICc
 *   // curve whose optimum is a rate, else a straight line (a corner only); the report, the JSON's
 *   // bestModel and regionalModel 'best' all use it
 *
 * Building blocks, usable alone: sitePlots, testCommonResponse, groupResponseTest,
 * pooledCurveTest, siteRateEffect, siteResponseOverCheck, extraSumOfSquaresTest,
 * prepareRegionalReturn + regionalReturnAtPrices, rateGrid, regionalRecommendation.
 */
export * from './sitesInputError';
export * from './sitePlots';
export * from './extraSumOfSquaresTest';
export * from './describeFTest';
export * from './commonResponseTests';
export * from './groupResponseTest';
export * from './pooledCurveTest';
export * from './siteRateEffect';
export * from './siteResponseOverCheck';
export * from './rateGrid';
export * from './regionalReturn';
export * from './regionalRecommendation';
export * from './recommendationModel';
export * from './siteModelRows';
export * from './yearsCompared';
export * from './analyzeAcrossSites';
export * from './leadingModel';
export * from './chooseSiteModels';
export * from './repriceAcrossSites';
export * from './analysisSettings';
export * from './analyzeTrial';
export * from './siteLevels';
export * from './levelResponseTest';
export * from './analyzeLevels';
export * from './priceLevels';
export * from './priceTrial';
