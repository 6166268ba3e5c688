/**
 * Economics of a fitted response: the economic optimum rate (EONR) and its
 * uncertainty. Prices are canonical: currency per kg grain (at the yields'
 * moisture basis), currency per kg nutrient, optional application cost per ha.
 *
 * ```ts
 * priceRatio(prices: Prices): number                       // kg grain per kg nutrient
 * economicOptimum(fit: CurveSummary, prices: Prices): EconomicOptimum
 *   → { status, rateKgHa, uncappedRateKgHa, rangeKgHa, yieldKgHa, netReturnPerHa,
 *       gainOverCheckPerHa, agronomicMaxRateKgHa, cappedAtHighest, explanation, cautions }
 * netReturn(fit, prices, rateKgHa): number                 // currency/ha
 * optimumAcrossModels(fits, ranking, prices, { toleranceKgHa: 20 }): OptimumComparison
 * bootstrapOptimum(data, model, prices, { resamples: 1000, seed: 1, confidence: 0.95, blocks,
 *   withinAmountPerHa: 10, candidateRatesKgHa }): BootstrapOptimum
 *   → { pointEstimate, ciKgHa, medianKgHa, shareNoInteriorOptimum, shareByStatus,
 *       candidateRatesKgHa, probabilityWithin, rateSamplesKgHa, resampling, cautions }
 * ```
 *
 * drawBootstrapEstimates(data, models, { resamples, seed, blocks }): BootstrapDraws  // price-free
 * optimumInterval(draws, model, prices, level, basis = 'model-reselected'): OptimumInterval  // re-priced
 *   → { ciKgHa, basis, shares: { curve, noPlateau, fullResponse, noResponse }, modelShares }
 *
 * optimumProfileInterval(fit, joinProfile, prices, level): OptimumProfileInterval | null  // re-priced
 *   → the profile interval beside it (linear-plateau: its join's; quadratic: Fieller's)
 * decidingModels(draws, model, basis): DrawChoices   // who decides each resample, for both of these
 * priceRatioSensitivity(prices, at, [0.5, 0.75, 1, 1.5, 2])  // the owner's answer at scaled N prices
 * shortfallRisk(draws, model, basis, prices, rates, tolerancePerHa): ShortfallRisk
 *   → { tolerancePerHa, count, rows: { rateKgHa, share }[] }   // share of resamples short
 * shortfallRule: shareFallingShort, toleranceInForce (null → the cost of 10 kg N/ha), candidateRates
 *
 * For the JSON report per model: optimumRate = economicOptimum(fit, prices).rateKgHa,
 * yieldAtOptimum = .yieldKgHa, optimumCI = optimumInterval(...).ciKgHa.
 *
 * `economicOptimum` reads only `model`, `status`, `params`, `testedRates` and
 * `joinBetweenKgHa`, so re-pricing a stored fit costs a few operations (no refit).
 * Every result carries `recommendationCautions`: show them with any rate.
 */
export * from './priceRatio';
export * from './economicOptimum';
export * from './optimumAcrossModels';
export * from './recommendationCautions';
export * from './bootstrapOptimum';
export * from './optimumProfile';
