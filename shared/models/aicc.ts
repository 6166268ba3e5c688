/**
 * The small-sample corrected Akaike information criterion of a least-squares fit
 * with normal errors (Hurvich & Tsai, Biometrika 76, 1989, 297–307):
 *
 *   logLik = −n/2 · (ln 2π + ln(SSE/n) + 1)
 *   AICc   = −2·logLik + 2k + 2k(k + 1)/(n − k − 1),   k = p + 1
 *
 * where p counts the estimated coefficients (curve parameters and any block offsets)
 * and the + 1 is the error variance, as R's AIC() of lm and nls counts it. The one
 * owner of the formula: every fit (finishFit) and every bootstrap resample's model
 * choice (shared/economics/drawChoices) compute AICc here.
 *
 * Edge cases:
 * - n − k − 1 ≤ 0: the correction is undefined; Infinity (the model cannot be ranked).
 * - SSE = 0: −Infinity (an exact fit), as the formula gives.
 */

/**
 * AICc of a least-squares fit from its residual sum of squares.
 * @param sse - residual sum of squares, (kg/ha)² (any unit: a unit change shifts every model by n·ln of the factor²)
 * @param n - observations (plots)
 * @param coefficients - estimated coefficients p (curve parameters plus block offsets); k = p + 1
 * @returns AICc; Infinity when n − p − 2 ≤ 0
 * @example
 * aiccFromSse(7967863.36633332, 24, 2) // 380.418003992674 (R 4.2: AIC(lm) + 2k(k+1)/(n−k−1), k = 3)
 */
export function aiccFromSse(sse: number, n: number, coefficients: number): number {
  const k = coefficients + 1;
  const logLik = -0.5 * n * (Math.log(2 * Math.PI) + Math.log(sse / n) + 1);
  const aic = -2 * logLik + 2 * k;
  return n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : Infinity;
}
