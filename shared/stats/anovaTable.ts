/**
 * The pieces every ANOVA result in this folder shares: a line of the table and
 * a treatment mean with its standard error. Types only.
 */

/** One source of variation: degrees of freedom, sum of squares, mean square = ss / df. */
export interface AnovaSource {
  df: number;
  /** Sum of squares, in the square of the response's unit. */
  ss: number;
  /** Mean square ss / df; for the total line the total variance ss / df. */
  ms: number;
}

/** A treatment's mean and the standard error the ANOVA's error mean square gives it. */
export interface TreatmentMean {
  /** The treatment label as text. */
  level: string;
  /** Plots that were observed for this treatment. */
  n: number;
  /** The mean used for comparisons: the plain mean, or the least-squares mean when plots are missing. */
  mean: number;
  /** The plain average of the observed plots. */
  rawMean: number;
  /** Standard error of `mean` from the pooled error mean square. */
  se: number;
}
