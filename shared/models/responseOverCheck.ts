/**
 * Response over the check: each fertilized plot's yield gain over the zero-rate
 * plot of its own block (the mean of the block's zero-rate plots; without
 * blocks, or for a block with no zero-rate plot, the mean of all of them),
 * fitted by the line through the origin (a gain that is zero at rate zero).
 * The intercept test (shared/stats/interceptTest: t-test of the straight line's
 * intercept, F = t²) says whether a non-zero gain at rate zero is present, i.e.
 * whether the proportional model is adequate.
 */
import { testIntercept, type InterceptTestResult } from '../stats/interceptTest';
import type { FitOptions, ModelFit, SiteData } from './modelTypes';
import { fitProportional } from './proportional';
import { prepareSite } from './prepareSite';

export interface ResponseOverCheck {
  /** "ok", or why no fit was made. */
  status: 'ok' | 'no-check-plots' | 'too-few-rates';
  message: string;
  /** One entry per fertilized plot: its rate (kg/ha) and gain over its check (kg/ha). */
  gains: { rateKgHa: number; gainKgHa: number; block: string | null; checkFromBlock: boolean }[];
  /** The line through the origin fitted to the gains (R² uncentered); null unless "ok". */
  proportional: ModelFit | null;
  /** Straight line vs line through the origin on the gains; null unless "ok". */
  interceptTest: InterceptTestResult | null;
  /** True when the gains show a non-zero intercept at the test's alpha; null unless "ok". */
  gainAtZeroPresent: boolean | null;
}

/**
 * Fits the response over the check plot.
 * @param data - rates (kg/ha), yields (kg/ha), optional block labels
 * @param options - alpha of the intercept test (default 0.05); fit options for the proportional model
 * @returns the gains, their proportional fit and the intercept test
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values
 * @example
 * fitResponseOverCheck({ rateKgHa: [0, 60, 120, 0, 60, 120], yieldKgHa: [5000, 6100, 7300, 5200, 6200, 7400], block: ['1', '1', '1', '2', '2', '2'] }).proportional?.params.b // ≈ 18.5
 */
export function fitResponseOverCheck(
  data: SiteData,
  options: FitOptions & { alpha?: number } = {},
): ResponseOverCheck {
  const site = prepareSite(data, 'none');
  const labels = data.block ?? null;
  const checkSum = new Map<string, { sum: number; count: number }>();
  let allSum = 0;
  let allCount = 0;
  for (let i = 0; i < site.n; i++) {
    if (site.x[i] !== 0) continue;
    allSum += site.y[i];
    allCount++;
    const b = labels?.[i] ?? null;
    if (b !== null) {
      const e = checkSum.get(b) ?? { sum: 0, count: 0 };
      e.sum += site.y[i];
      e.count++;
      checkSum.set(b, e);
    }
  }
  const gains: ResponseOverCheck['gains'] = [];
  const empty = (status: ResponseOverCheck['status'], message: string): ResponseOverCheck => ({
    status,
    message,
    gains,
    proportional: null,
    interceptTest: null,
    gainAtZeroPresent: null,
  });
  if (allCount === 0) {
    return empty(
      'no-check-plots',
      'No plot has rate zero, so there is no check to measure gains from.',
    );
  }
  for (let i = 0; i < site.n; i++) {
    if (site.x[i] === 0) continue;
    const b = labels?.[i] ?? null;
    const own = b !== null ? checkSum.get(b) : undefined;
    const check = own ? own.sum / own.count : allSum / allCount;
    gains.push({
      rateKgHa: site.x[i],
      gainKgHa: site.y[i] - check,
      block: b,
      checkFromBlock: own !== undefined,
    });
  }
  const rates = gains.map((g) => g.rateKgHa);
  if (new Set(rates).size < 2 || gains.length < 3) {
    return empty(
      'too-few-rates',
      'The intercept test needs at least two different non-zero rates and three fertilized plots.',
    );
  }
  const gainValues = gains.map((g) => g.gainKgHa);
  const proportional = fitProportional(
    { rateKgHa: rates, yieldKgHa: gainValues },
    { ...options, blocks: 'none' },
  );
  const interceptTest = testIntercept(rates, gainValues, options.alpha ?? 0.05);
  return {
    status: 'ok',
    message: interceptTest.verdict,
    gains,
    proportional,
    interceptTest,
    gainAtZeroPresent: interceptTest.interceptNeeded,
  };
}
