/**
 * The risk that a rate returns clearly less than the best rate would have: for each candidate
 * rate (a site's tested rates and its recommended rate), the share of the bootstrap resamples
 * in which the net return at that rate falls short of that resample's own best net return by
 * more than a tolerance (currency/ha). A rate with a small share is a safe choice whatever the
 * resamples say the curve is; a rate with a large share loses money in most of them.
 *
 * Each resample b is read the way its optimum is counted in the interval (countedOptimum, with
 * the deciding models of decidingModels: the rule's candidates in every resample, each by its
 * Akaike weight in that resample, or the analyst's model throughout), so the risk and the
 * interval speak of the same resamples and the shares are shares of the resamples' weight:
 *
 *   R_b(x) = p_grain · g_b(x) − p_N · x − A·[x > 0]          (currency/ha)
 *   short_b(x) = R_b(r_b) − R_b(x),  counted when short_b(x) > tolerance
 *
 * where r_b is the resample's counted optimum (its best rate over 0 to the highest tested rate
 * by the counting rules) and g_b its gain over its own check, by the kind it is counted as:
 * - a fit with status "ok" or "no-plateau": the fitted curve, g_b(x) = ŷ_b(x) − ŷ_b(0);
 * - a full response by the lowest non-zero rate: the whole gain from the second-lowest rate on
 *   (a step there), the dearest case the counting and the regional rate take too;
 * - no response (a flat or upward-opening fit) or no usable fit: no gain at any rate, so the
 *   best is no nitrogen and any rate falls short by its nitrogen and application cost.
 * A curve without a finite value at 0 or at the highest tested rate counts as no usable fit.
 *
 * r_b is taken as the resample's best, as the counting rules name it; where the counted rate
 * is not the maximum of R_b (a curve counted at the highest rate because it did not level off,
 * whose slope no longer pays there) a rate can return more than "the best", and it is then
 * simply not short.
 *
 * What "falls short" means, the tolerance's default and the candidate rates are
 * shared/economics/shortfallRule. Prices only, no refit or new resample: one pass of closed
 * forms over the stored draws.
 */
import { curveValue } from '../models/curveValue';
import type { CurveSummary, ModelName } from '../models/modelTypes';
import { drawSummaries, type BootstrapDraws } from './bootstrapDraws';
import { countedOptimum } from './countedOptimum';
import { decidingModels, type IntervalBasis } from './drawChoices';
import { assertPrices, rateCostPerHa, type Prices } from './priceRatio';
import { assertTolerance, shareFallingShort, type ShortfallRisk } from './shortfallRule';

/**
 * How one resample's gain over its own check is read (the rules in the header): its fitted
 * curve, a step of `fullKgHa` at `stepKgHa`, or no gain. One object is refilled per resample.
 */
interface GainReading {
  kind: 'curve' | 'step' | 'none';
  /** The curve's yield at rate 0, kg/ha. */
  at0: number;
  stepKgHa: number;
  fullKgHa: number;
}

function readGain(fit: CurveSummary | null, g: GainReading): void {
  g.kind = 'none';
  if (!fit) return;
  const { model, params, status, testedRates } = fit;
  g.at0 = curveValue(model, params, 0);
  if (status === 'full-response-at-lowest-rate') {
    g.stepKgHa = fit.joinBetweenKgHa?.[1] ?? testedRates.distinctKgHa[1];
    g.fullKgHa = curveValue(model, params, g.stepKgHa) - g.at0;
    if (Number.isFinite(g.fullKgHa)) g.kind = 'step';
  } else if (status === 'ok' || status === 'no-plateau') {
    if (Number.isFinite(g.at0 + curveValue(model, params, testedRates.highestKgHa))) {
      g.kind = 'curve';
    }
  }
}

/** The gain at a rate, kg/ha, as `g` reads the resample's fit. */
function gainAt(fit: CurveSummary | null, g: GainReading, rateKgHa: number): number {
  if (g.kind === 'curve') return curveValue(fit!.model, fit!.params, rateKgHa) - g.at0;
  if (g.kind === 'step') return rateKgHa >= g.stepKgHa ? g.fullKgHa : 0;
  return 0;
}

/**
 * The shortfall risk of candidate rates at one site, from its stored draws.
 * @param draws - the site's bootstrap draws
 * @param model - the analyst's model with "fixed-model"; the site's model otherwise (unused)
 * @param basis - "model-reselected" (the site's rule in every resample) or "fixed-model"
 * @param prices - canonical prices (currency per kg grain and per kg N, per ha application)
 * @param ratesKgHa - candidate rates, kg/ha (see candidateRates)
 * @param tolerancePerHa - shortfall beyond which a rate counts as short, currency/ha
 * @returns the share of resamples short at each rate; null when decidingModels has none
 * @throws {StatsInputError} "bad-argument" for a price that is not positive or a negative tolerance
 * @example
 * shortfallRisk(draws, 'quadraticPlateau', 'model-reselected', prices, [0, 150], 12).rows
 * // e.g. [{ rateKgHa: 0, share: 1 }, { rateKgHa: 150, share: 0.04 }]
 */
export function shortfallRisk(
  draws: BootstrapDraws,
  model: ModelName,
  basis: IntervalBasis,
  prices: Prices,
  ratesKgHa: readonly number[],
  tolerancePerHa: number,
): ShortfallRisk | null {
  assertPrices(prices);
  assertTolerance(tolerancePerHa);
  const choices = decidingModels(draws, model, basis);
  if (!choices || draws.resamples === 0) return null;
  const readers = choices.models.map((m) => drawSummaries(draws, m)!);
  const pg = prices.grainPricePerKg;
  const cost = ratesKgHa.map((x) => rateCostPerHa(prices, x));
  const r = ratesKgHa.length;
  const k = choices.models.length;
  // One unit per resample and candidate model with weight (the interval's mixture): a
  // resample's weight 1 is shared among its candidates; with none, it reads as no usable fit.
  const units = draws.resamples * Math.max(k, 1);
  const best = new Float64Array(units);
  const returns = new Float64Array(units * r);
  const weight = new Float64Array(units);
  const g: GainReading = { kind: 'none', at0: NaN, stepKgHa: NaN, fullKgHa: NaN };
  const read = (u: number, fit: CurveSummary | null, w: number) => {
    readGain(fit, g);
    // A resample read as no usable fit is counted as no response (rate 0), as the interval does.
    const x = g.kind === 'none' ? 0 : countedOptimum(fit, prices).rateKgHa;
    best[u] = pg * gainAt(fit, g, x) - rateCostPerHa(prices, x);
    for (let j = 0; j < r; j++) returns[u * r + j] = pg * gainAt(fit, g, ratesKgHa[j]) - cost[j];
    weight[u] = w;
  };
  for (let b = 0; b < draws.resamples; b++) {
    let held = 0;
    for (let i = 0; i < k; i++) {
      const w = choices.weights[b * k + i];
      if (!(w > 0)) continue;
      read(b * k + i, readers[i](b), w);
      held += w;
    }
    if (held === 0) read(b * Math.max(k, 1), null, 1);
  }
  const shares = shareFallingShort(best, returns, r, tolerancePerHa, weight);
  return {
    tolerancePerHa,
    count: draws.resamples,
    rows: ratesKgHa.map((rateKgHa, j) => ({ rateKgHa, share: shares[j] })),
  };
}
