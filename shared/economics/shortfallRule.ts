/**
 * What "falls short" means wherever Plotrate reports a shortfall risk (a site's resamples,
 * shared/economics/shortfallRisk; the sites of a region, shared/analysis/regionalShortfallRisk):
 * a rate falls short when its net return is below the best return by more than a tolerance
 * (currency/ha, strictly more). Also the tolerance's default, the candidate rates and the
 * result type. Reads no draws and fits nothing, so the report can use it.
 */
import { StatsInputError } from '../stats/errors';
import { assertPrices, type Prices } from './priceRatio';

/**
 * Nitrogen whose cost is the default tolerance, kg N/ha. A return that differs from the best
 * by less than the cost of about 10 kg N/ha is within what a grower can act on: spreaders are
 * set and rates are quoted in steps of about that size, and trial curves rarely place an
 * optimum more precisely (Plotrate's choice; common practice, no document). Priced in the
 * user's own nitrogen price, it needs no currency of its own and follows the prices.
 */
export const DEFAULT_TOLERANCE_N_KG_HA = 10;

/**
 * The default shortfall tolerance: the cost of DEFAULT_TOLERANCE_N_KG_HA of nitrogen.
 * @param prices - canonical prices (currency per kg N)
 * @returns currency/ha
 * @throws {StatsInputError} "bad-argument" for a price that is not positive
 * @example
 * defaultShortfallTolerancePerHa({ grainPricePerKg: 0.2, nutrientPricePerKg: 1.2 }) // 12
 */
export function defaultShortfallTolerancePerHa(prices: Prices): number {
  assertPrices(prices);
  return DEFAULT_TOLERANCE_N_KG_HA * prices.nutrientPricePerKg;
}

/**
 * The tolerance in force: the one given, else (null or absent) the default. Every caller that
 * takes an optional tolerance resolves it here, so "null means the default" lives once.
 * @param given - currency/ha, or null/undefined for the default
 * @param prices - canonical prices (for the default)
 * @returns currency/ha
 * @throws {StatsInputError} "bad-argument" for a negative tolerance or a bad price
 * @example
 * toleranceInForce(null, { grainPricePerKg: 0.2, nutrientPricePerKg: 1.2 }) // 12
 */
export function toleranceInForce(given: number | null | undefined, prices: Prices): number {
  if (given === null || given === undefined) return defaultShortfallTolerancePerHa(prices);
  assertTolerance(given);
  return given;
}

/**
 * Checks a tolerance given by a caller.
 * @param tolerancePerHa - currency/ha
 * @throws {StatsInputError} "bad-argument" unless it is a finite number ≥ 0
 * @returns nothing; returns normally for a usable tolerance
 * @example
 * assertTolerance(12) // no error
 */
export function assertTolerance(tolerancePerHa: number): void {
  if (!(Number.isFinite(tolerancePerHa) && tolerancePerHa >= 0)) {
    throw new StatsInputError(
      'bad-argument',
      `shortfallTolerancePerHa must be zero or a positive number; got ${tolerancePerHa}.`,
    );
  }
}

/** One candidate rate and its risk. */
export interface ShortfallRow {
  /** The candidate rate, kg/ha. */
  rateKgHa: number;
  /** Share of the units (resamples, or sites) in which the rate falls short, in [0, 1]. */
  share: number;
}

/** The shortfall risk of a set of candidate rates. */
export interface ShortfallRisk {
  /** Shortfall beyond which a rate counts as falling short, currency/ha. */
  tolerancePerHa: number;
  /** Units the shares are of: a site's resamples, or the sites of a region. */
  count: number;
  /** One row per candidate rate, ascending. */
  rows: ShortfallRow[];
}

/**
 * The one comparison every shortfall risk makes: for each candidate rate, the share of units
 * whose return there falls short of the unit's best by more than the tolerance (strictly),
 * each unit counted by its weight (1 each without weights).
 * @param best - each unit's best return, currency/ha
 * @param returns - unit u's return at candidate j is returns[u × rates + j], currency/ha
 * @param rates - number of candidate rates
 * @param tolerancePerHa - currency/ha
 * @param weights - each unit's weight (a resample's share of a candidate model); all 1 if absent
 * @returns per candidate, the share in [0, 1] (NaN without units)
 * @example
 * shareFallingShort(Float64Array.of(10, 10), Float64Array.of(10, 0, 9, 5), 2, 2) // [0, 1]
 */
export function shareFallingShort(
  best: Float64Array,
  returns: Float64Array,
  rates: number,
  tolerancePerHa: number,
  weights?: Float64Array,
): Float64Array {
  const counts = new Float64Array(rates);
  const units = best.length;
  let total = 0;
  for (let u = 0; u < units; u++) {
    const w = weights ? weights[u] : 1;
    total += w;
    for (let j = 0; j < rates; j++) {
      if (best[u] - returns[u * rates + j] > tolerancePerHa) counts[j] += w;
    }
  }
  for (let j = 0; j < rates; j++) counts[j] /= total;
  return counts;
}

/**
 * Whether two rates are the same candidate (within 1e-9, relative above 1 kg/ha): how the
 * candidate list drops a recommended rate equal to a tested one, and how a view finds the
 * recommended rate's row.
 * @param aKgHa - a rate, kg/ha
 * @param bKgHa - another rate, kg/ha, or null (never the same)
 * @returns true when they are the same rate
 * @example
 * sameRate(40, 40 + 1e-12) // true
 */
export function sameRate(aKgHa: number, bKgHa: number | null): boolean {
  return bKgHa !== null && Math.abs(aKgHa - bKgHa) <= 1e-9 * Math.max(1, Math.abs(aKgHa));
}

/**
 * The candidate rates of a site: its tested rates and the recommended rate, ascending, once each.
 * @param testedKgHa - the tested rates, kg/ha
 * @param recommendedKgHa - the recommended rate, kg/ha, or null when there is none
 * @returns rates, kg/ha
 * @example
 * candidateRates([0, 40, 80], 61.5) // [0, 40, 61.5, 80]
 */
export function candidateRates(
  testedKgHa: readonly number[],
  recommendedKgHa: number | null,
): number[] {
  const all = recommendedKgHa === null ? [...testedKgHa] : [...testedKgHa, recommendedKgHa];
  all.sort((a, b) => a - b);
  return all.filter((x, i) => i === 0 || !sameRate(x, all[i - 1]));
}
