/**
 * Fisher's least significant difference: two treatment means differ at level
 * alpha when |mean_i − mean_j| > t(1 − α/2, df_error) · SE(mean_i − mean_j)
 * (Steel, Torrie & Dickey, Principles and Procedures of Statistics, 3rd ed.,
 * §8.4; Gomez & Gomez, Statistical Procedures for Agricultural Research, 2nd
 * ed., §5.1.1). In a balanced trial every pair shares SE = √(2 MSE / r), so one
 * LSD serves the whole table; with unequal replication or missing plots each
 * pair has its own and the single figure is withheld. The comparisons are
 * "protected" only when the ANOVA F-test is significant first (Fisher's rule;
 * Steel, Torrie & Dickey §8.4): the caller reads that from the ANOVA.
 */
import { assertLevel, StatsInputError } from './errors';
import { studentTQuantile } from './distributions';

export interface LsdComparison {
  first: string;
  second: string;
  /** mean(first) − mean(second), in the response's unit. */
  difference: number;
  /** Standard error of the difference. */
  seDifference: number;
  /** The least significant difference for this pair. */
  lsd: number;
  /** |difference| > lsd. */
  significant: boolean;
}

export interface FisherLsdResult {
  alpha: number;
  dfError: number;
  /** t(1 − α/2, dfError). */
  tCritical: number;
  /** The LSD shared by every pair, or null when pairs differ in their standard error. */
  lsd: number | null;
  /** Every pair i < j in the order the means were given. */
  comparisons: LsdComparison[];
}

export interface FisherLsdInput {
  levels: readonly string[];
  /** One mean per level, in the response's unit. */
  means: readonly number[];
  /** Standard error of mean_i − mean_j, for i < j. */
  seDifference: (i: number, j: number) => number;
  /** Error degrees of freedom of the ANOVA (≥ 1). */
  dfError: number;
  /** Significance level, strictly between 0 and 1. */
  alpha: number;
}

/**
 * All pairwise comparisons of treatment means by Fisher's LSD.
 * @param input - levels, means, a function giving SE of each difference, error df and alpha
 * @returns the critical t, the common LSD when there is one, and every pair
 * @throws {StatsInputError} "bad-argument" for alpha outside (0, 1), dfError < 1, or means and
 *   levels of different lengths
 * @example
 * fisherLsd({ levels: ['0', '60'], means: [5200, 6900], seDifference: () => 250, dfError: 6, alpha: 0.05 }).lsd // ≈ 611.7
 */
export function fisherLsd(input: FisherLsdInput): FisherLsdResult {
  const { levels, means, seDifference, dfError, alpha } = input;
  assertLevel(alpha, 'fisherLsd: alpha');
  if (!(dfError >= 1)) {
    throw new StatsInputError(
      'bad-argument',
      `fisherLsd: dfError is ${String(dfError)}; comparisons need at least 1 error degree of freedom.`,
    );
  }
  if (levels.length !== means.length) {
    throw new StatsInputError(
      'bad-argument',
      `fisherLsd: ${levels.length} levels but ${means.length} means; give one mean per level.`,
    );
  }
  const tCritical = studentTQuantile(1 - alpha / 2, dfError);
  const comparisons: LsdComparison[] = [];
  for (let i = 0; i < means.length; i++) {
    for (let j = i + 1; j < means.length; j++) {
      const se = seDifference(i, j);
      const lsd = tCritical * se;
      const difference = means[i] - means[j];
      comparisons.push({
        first: levels[i],
        second: levels[j],
        difference,
        seDifference: se,
        lsd,
        significant: Math.abs(difference) > lsd,
      });
    }
  }
  const first = comparisons[0]?.lsd ?? NaN;
  const common = comparisons.every((c) => Math.abs(c.lsd - first) <= 1e-12 * Math.abs(first));
  return {
    alpha,
    dfError,
    tCritical,
    lsd: comparisons.length > 0 && common ? first : null,
    comparisons,
  };
}
